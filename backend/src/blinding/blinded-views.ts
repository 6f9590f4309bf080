import type {
  AnalysisRunView,
  FlagView,
  JobView,
  RecordingResultsView,
  RecordingView,
  ReportView,
  VisitAnalysisOverrideView,
  VisitReviewView,
} from '@gyre/shared';
import type { BlindedClock } from './blinded-visit-facts';

/**
 * The answers Review reads about a visit, as an analyst it is blinded for gets them: no
 * participant, no uploaded file name (it may carry a date), and every time stamp shown by
 * the visit's blinded clock (its distance from the first upload), since upload and
 * computation times give away the visit date; so do the times of what colleagues did on the
 * visit (a flag, a "reviewed" mark, an override). The numbers are untouched.
 */
export function blindedRecordingView(view: RecordingView, clock: BlindedClock): RecordingView {
  return {
    ...view,
    participantId: null,
    fileName: null,
    latestJob: view.latestJob === null ? null : blindedJobView(view.latestJob, clock),
    createdAt: clock(view.createdAt),
    updatedAt: clock(view.updatedAt),
  };
}

function blindedJobView(job: JobView, clock: BlindedClock): JobView {
  return {
    ...job,
    createdAt: clock(job.createdAt),
    startedAt: job.startedAt === null ? null : clock(job.startedAt),
    finishedAt: job.finishedAt === null ? null : clock(job.finishedAt),
  };
}

export function blindedRunView(run: AnalysisRunView, clock: BlindedClock): AnalysisRunView {
  return { ...run, participantId: null, createdAt: clock(run.createdAt) };
}

export function blindedResultsView(
  results: RecordingResultsView,
  clock: BlindedClock,
): RecordingResultsView {
  return {
    ...results,
    run: blindedRunView(results.run, clock),
    source: { ...results.source, uploadedAt: clock(results.source.uploadedAt) },
  };
}

export function blindedReportView(report: ReportView, clock: BlindedClock): ReportView {
  return {
    ...report,
    participantId: null,
    createdAt: clock(report.createdAt),
    updatedAt: clock(report.updatedAt),
  };
}

export function blindedFlagView(flag: FlagView, clock: BlindedClock): FlagView {
  return {
    ...flag,
    raisedAt: clock(flag.raisedAt),
    clearedAt: flag.clearedAt === null ? null : clock(flag.clearedAt),
  };
}

export function blindedVisitReviewView(
  review: VisitReviewView,
  clock: BlindedClock,
): VisitReviewView {
  return { ...review, reviewedAt: clock(review.reviewedAt) };
}

export function blindedOverrideView(
  view: VisitAnalysisOverrideView,
  clock: BlindedClock,
): VisitAnalysisOverrideView {
  return { ...view, updatedAt: view.updatedAt === null ? null : clock(view.updatedAt) };
}
