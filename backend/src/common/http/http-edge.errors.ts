import { ErrorKind, errorFactory } from '../errors/gyre.exception';

/** Codes of refusals made at the HTTP edge, before a request reaches a controller. */
export enum HttpEdgeError {
  BodyTooDeep = 'REQUEST_BODY_TOO_DEEP',
  /** A body, query or route parameter failed its DTO's or the id check: `details.problems`. */
  ValidationFailed = 'VALIDATION_FAILED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const HTTP_EDGE_ERROR_KINDS = {
  [HttpEdgeError.BodyTooDeep]: ErrorKind.BadInput,
  [HttpEdgeError.ValidationFailed]: ErrorKind.BadInput,
} as const satisfies Record<HttpEdgeError, ErrorKind>;

/** A GyreException of this module: the kind comes from HTTP_EDGE_ERROR_KINDS. */
export const httpEdgeError = errorFactory(HTTP_EDGE_ERROR_KINDS);
