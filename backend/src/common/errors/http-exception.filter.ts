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
import { assertUnreachable, ErrorKind, GyreException } from './gyre.exception';

export function statusForKind(kind: ErrorKind): HttpStatus {
  switch (kind) {
    case ErrorKind.BadInput:
      return HttpStatus.BAD_REQUEST;
    case ErrorKind.Unprocessable:
      return HttpStatus.UNPROCESSABLE_ENTITY;
    case ErrorKind.Unauthenticated:
      return HttpStatus.UNAUTHORIZED;
    case ErrorKind.Forbidden:
      return HttpStatus.FORBIDDEN;
    case ErrorKind.NotFound:
      return HttpStatus.NOT_FOUND;
    case ErrorKind.Conflict:
      return HttpStatus.CONFLICT;
    case ErrorKind.PayloadTooLarge:
      return HttpStatus.PAYLOAD_TOO_LARGE;
    case ErrorKind.TooManyRequests:
      return HttpStatus.TOO_MANY_REQUESTS;
    case ErrorKind.Locked:
      return HttpStatus.LOCKED;
    case ErrorKind.Unavailable:
      return HttpStatus.SERVICE_UNAVAILABLE;
    default:
      return assertUnreachable(kind);
  }
}

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
        statusCode: statusForKind(exception.kind),
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
      // ValidationPipe answers with a list of messages, one per field problem.
      if (Array.isArray(messages)) {
        return {
          statusCode,
          code: 'VALIDATION_FAILED',
          message: messages.join('; '),
          details: { problems: messages },
        };
      }
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
