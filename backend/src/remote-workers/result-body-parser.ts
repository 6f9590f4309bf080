import { json } from 'express';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { RemoteWorkersError, remoteWorkersError } from './remote-workers.errors';
import { RESULT_CONTENT_TYPE } from './result-wire';
import { errorMessage } from '../common/errors/error-message';

/**
 * Parses posted results (their own content type, so the API's 100 kB JSON limit does not
 * apply) up to `limitBytes`, and turns the parser's errors into Gyre's 400 and 413.
 */
export function resultBodyParser(limitBytes: number): RequestHandler {
  const parse = json({ limit: limitBytes, type: RESULT_CONTENT_TYPE });
  return (request: Request, response: Response, next: NextFunction) => {
    parse(request, response, (error?: unknown) => {
      if (error === undefined || error === null) return next();
      const type = (error as { type?: unknown }).type;
      if (type === 'entity.too.large') {
        return next(
          remoteWorkersError(
            RemoteWorkersError.ResultTooLarge,
            `The result is larger than WORKER_RESULT_MAX_BYTES (${limitBytes} bytes).`,
            { limitBytes },
          ),
        );
      }
      const reason = errorMessage(error);
      return next(
        remoteWorkersError(
          RemoteWorkersError.ResultInvalid,
          `The result is not valid JSON: ${reason}`,
        ),
      );
    });
  };
}
