import {
  ArgumentsHost,
  Catch,
  ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import type { Response } from 'express';
import { ErrorBody } from '@gyre/shared';
import { ErrorKind, GyreException } from './gyre.exception';

/** The HTTP status of each kind of failure (one entry per kind, checked by the compiler). */
export const STATUS_FOR_KIND = {
  [ErrorKind.BadInput]: HttpStatus.BAD_REQUEST,
  [ErrorKind.Unprocessable]: HttpStatus.UNPROCESSABLE_ENTITY,
  [ErrorKind.Unauthenticated]: HttpStatus.UNAUTHORIZED,
  [ErrorKind.Forbidden]: HttpStatus.FORBIDDEN,
  [ErrorKind.NotFound]: HttpStatus.NOT_FOUND,
  [ErrorKind.Conflict]: HttpStatus.CONFLICT,
  [ErrorKind.PayloadTooLarge]: HttpStatus.PAYLOAD_TOO_LARGE,
  [ErrorKind.TooManyRequests]: HttpStatus.TOO_MANY_REQUESTS,
  [ErrorKind.Locked]: HttpStatus.LOCKED,
  [ErrorKind.Unavailable]: HttpStatus.SERVICE_UNAVAILABLE,
} as const satisfies Record<ErrorKind, HttpStatus>;

const CODE_FOR_STATUS: Partial<Record<number, string>> = {
  400: 'BAD_REQUEST',
  401: 'UNAUTHENTICATED',
  403: 'FORBIDDEN',
  404: 'NOT_FOUND',
  409: 'CONFLICT',
  413: 'PAYLOAD_TOO_LARGE',
  422: 'UNPROCESSABLE',
  423: 'LOCKED',
  429: 'TOO_MANY_REQUESTS',
};

/** Every error leaves the API as `{ statusCode, code, message, details }`. */
@Catch()
export class HttpExceptionFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const response = host.switchToHttp().getResponse<Response>();
    const body = this.toBody(exception);
    if (body.statusCode >= 500) {
      this.logger.error(
        exception instanceof Error ? (exception.stack ?? exception.message) : exception,
      );
    }
    if (response.headersSent) return;
    response.status(body.statusCode).json(body);
  }

  private toBody(exception: unknown): ErrorBody {
    if (exception instanceof GyreException) {
      return {
        statusCode: STATUS_FOR_KIND[exception.kind],
        code: exception.code,
        message: exception.message,
        details: exception.details ?? null,
      };
    }
    if (exception instanceof HttpException) {
      const statusCode = exception.getStatus();
      const raw = exception.getResponse();
      const messages =
        typeof raw === 'object' && raw !== null && 'message' in raw ? raw.message : raw;
      return {
        statusCode,
        code: CODE_FOR_STATUS[statusCode] ?? (statusCode >= 500 ? 'INTERNAL' : 'HTTP_ERROR'),
        message: typeof messages === 'string' ? messages : exception.message,
        details: null,
      };
    }
    return {
      statusCode: HttpStatus.INTERNAL_SERVER_ERROR,
      code: 'INTERNAL',
      message: 'Something went wrong on the server; the error has been logged.',
      details: null,
    };
  }
}
