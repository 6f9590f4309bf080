/** Error codes of the "visit reviewed" act. */
export enum VisitReviewsError {
  VisitNotFound = 'VISIT_REVIEW_VISIT_NOT_FOUND',
  NoResults = 'VISIT_REVIEW_NO_RESULTS',
  ResultsChanged = 'VISIT_REVIEW_RESULTS_CHANGED',
  Computing = 'VISIT_REVIEW_COMPUTING',
  AlreadyReviewed = 'VISIT_REVIEW_ALREADY_REVIEWED',
}
