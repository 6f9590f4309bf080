/** Codes of refusals made at the HTTP edge, before a request reaches a controller. */
export enum HttpEdgeError {
  BodyTooDeep = 'REQUEST_BODY_TOO_DEEP',
}
