import type {
  AnalysisSettingsView,
  OnsetCurveView,
  RecordingView,
  RecordingResultsView,
  ReportSignOffView,
  TrialRasterView,
  VisitAnalysisOverrideView,
  VisitBlindingView,
  VisitFlagView,
  VisitReviewStateView,
} from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { http, HttpResponse, type JsonBodyType } from 'msw';
import { STUDY } from '../../../test/fixtures';
import { server } from '../../../test/msw-server';
import {
  CHANNEL_CURVES,
  NO_FLAG,
  NO_OVERRIDE,
  NOT_REVIEWED,
  PARTICIPANT,
  RECORDINGS,
  REPORT,
  REST_RESULTS,
  SETTINGS,
  TASK_RASTER,
  TASK_RESULTS,
  VISIT,
} from './review-fixtures';
import { errorResponse } from '../../../test/error-response';

export interface ReviewServed {
  recordings?: RecordingView[];
  task?: RecordingResultsView;
  rest?: RecordingResultsView;
  /** The task's trial raster; `null` leaves it to the test's own handler. */
  raster?: TrialRasterView | null;
  /** Channel curves by label (default CHANNEL_CURVES); an unknown label answers 404. */
  curves?: Record<string, OnsetCurveView>;
  /** `null` leaves the flag to the test's own handler. */
  flag?: VisitFlagView | null;
  override?: VisitAnalysisOverrideView;
  settings?: AnalysisSettingsView;
  /** `null` leaves the review state to the test's own handler. */
  review?: VisitReviewStateView | null;
  /** The visit's blinded-review state (default: not blinded). */
  blinding?: VisitBlindingView;
  /**
   * Asked on each request for recordings and results: true answers as the server does for an
   * analyst the visit is blinded for, with the times counted from the first upload.
   */
  timesBlinded?: () => boolean;
}

/**
 * An answer with its times as blinded review sends them: counted from the visit's first upload
 * (the fixtures' uploads are at 10:00 on 3 Feb 2025, the runs computed at 10:05).
 */
function withBlindedTimes<T>(view: T): T {
  return JSON.parse(JSON.stringify(view).replaceAll('2025-02-03T10:', '1970-01-01T00:')) as T;
}

/** The caller sees the visit as it is (blinded review off). */
export const NOT_BLINDED: VisitBlindingView = {
  visitId: VISIT.id,
  studyId: VISIT.studyId,
  code: null,
  blinded: false,
  decision: null,
};

/** Every request the Review screen makes for one visit, answered from the fixtures. */
export function serveReview(served: ReviewServed = {}) {
  const recordings = served.recordings ?? RECORDINGS;
  const answer = <T extends JsonBodyType>(view: T) =>
    HttpResponse.json(served.timesBlinded?.() === true ? withBlindedTimes(view) : view);
  if (served.raster !== null) {
    server.use(
      http.get('/api/recordings/rec-task/results/raster', () =>
        HttpResponse.json(served.raster ?? TASK_RASTER),
      ),
    );
  }
  if (served.review !== null) {
    server.use(
      http.get(`/api/visits/${VISIT.id}/review`, () =>
        HttpResponse.json(served.review ?? NOT_REVIEWED),
      ),
    );
  }
  if (served.flag !== null) {
    server.use(
      http.get(`/api/visits/${VISIT.id}/flag`, () => HttpResponse.json(served.flag ?? NO_FLAG)),
    );
  }
  server.use(
    http.get(`/api/visits/${VISIT.id}/blinding`, () =>
      HttpResponse.json(served.blinding ?? NOT_BLINDED),
    ),
    http.get(`/api/visits/${VISIT.id}`, () => HttpResponse.json(VISIT)),
    http.get(`/api/participants/${PARTICIPANT.id}`, () => HttpResponse.json(PARTICIPANT)),
    http.get('/api/recordings', ({ request }) => {
      if (new URL(request.url).searchParams.get('visitId') !== VISIT.id) {
        return HttpResponse.json({ message: 'another visit' }, { status: 400 });
      }
      return answer({ items: recordings, total: recordings.length, page: 1, pageSize: 200 });
    }),
    http.get('/api/recordings/rec-task/results', () => answer(served.task ?? TASK_RESULTS)),
    http.get('/api/recordings/rec-task/results/curves', ({ request }) => {
      const channel = new URL(request.url).searchParams.get('channel') ?? '';
      const curve = (served.curves ?? CHANNEL_CURVES)[channel];
      return curve === undefined
        ? errorResponse(404, 'ANALYSIS_CHANNEL_CURVE_NOT_FOUND', `no curve for "${channel}"`)
        : HttpResponse.json(curve);
    }),
    http.get('/api/recordings/rec-resting/results', () => answer(served.rest ?? REST_RESULTS)),
    http.get(`/api/studies/${STUDY.id}/analysis-settings`, () =>
      HttpResponse.json(served.settings ?? SETTINGS),
    ),
    http.get(`/api/visits/${VISIT.id}/analysis-override`, () =>
      HttpResponse.json(served.override ?? NO_OVERRIDE),
    ),
    http.get(`/api/visits/${VISIT.id}/report`, () => HttpResponse.json(REPORT)),
    // The report card's sign-off panel (features/signoff): a draft nobody has signed yet.
    http.get(`/api/visits/${VISIT.id}/report/sign-off`, () =>
      HttpResponse.json({
        report: REPORT,
        meaning: SIGNATURE_MEANING,
        draftFingerprint: 'f'.repeat(64),
        pendingRevision: 1,
        canSign: true,
        cannotSignReason: null,
        revisions: [],
      } satisfies ReportSignOffView),
    ),
  );
}
