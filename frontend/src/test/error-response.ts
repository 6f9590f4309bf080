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
