import type { ErrorBody } from '@gyre/shared';
import { HttpResponse } from 'msw';

/** An error answer in the API's one error shape (`ErrorBody`), for a mocked handler to return. */
export function errorResponse(
  status: number,
  code: string,
  message: string,
  details: ErrorBody['details'] = null,
) {
  return HttpResponse.json<ErrorBody>({ statusCode: status, code, message, details }, { status });
}

/**
 * A handler's resolver for a retry test: the first request fails with `status`, `code` and
 * `message`; every later one gets `answer()`.
 */
export function failingOnce(status: number, code: string, message: string, answer: () => Response) {
  let calls = 0;
  return () => {
    calls += 1;
    return calls === 1 ? errorResponse(status, code, message) : answer();
  };
}
