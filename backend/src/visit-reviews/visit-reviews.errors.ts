import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of the "visit reviewed" act. */
export enum VisitReviewsError {
  VisitNotFound = 'VISIT_REVIEW_VISIT_NOT_FOUND',
  NoResults = 'VISIT_REVIEW_NO_RESULTS',
  ResultsChanged = 'VISIT_REVIEW_RESULTS_CHANGED',
  Computing = 'VISIT_REVIEW_COMPUTING',
  AlreadyReviewed = 'VISIT_REVIEW_ALREADY_REVIEWED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const VISIT_REVIEWS_ERROR_KINDS = {
  [VisitReviewsError.VisitNotFound]: ErrorKind.NotFound,
  [VisitReviewsError.NoResults]: ErrorKind.Conflict,
  [VisitReviewsError.ResultsChanged]: ErrorKind.Conflict,
  [VisitReviewsError.Computing]: ErrorKind.Conflict,
  [VisitReviewsError.AlreadyReviewed]: ErrorKind.Conflict,
} as const satisfies Record<VisitReviewsError, ErrorKind>;

/** A GyreException of this module: the kind comes from VISIT_REVIEWS_ERROR_KINDS. */
export const visitReviewsError = errorFactory(VISIT_REVIEWS_ERROR_KINDS);
