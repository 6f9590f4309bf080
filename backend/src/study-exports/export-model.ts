import type {
  AnalysisRunView,
  ChannelStatsView,
  QualityView,
  RecordingKind,
  RecordingState,
  RestResultsView,
  TaskResultsView,
} from '@gyre/shared';
import type { ScheduleColumns } from './schedule-columns';

/**
 * What an export holds, read once per download: the study's participants and visits in the
 * caller's scope and, per visit, the numbers of its current recordings exactly as the results
 * API gives them (`toResultsView`), without curves. Both exports are written from this.
 */
export interface StudyExportModel {
  study: { id: string; code: string; name: string };
  /** By participant code. */
  participants: ExportParticipant[];
  /** By participant code, then visit date, then label. */
  visits: ExportVisit[];
}

export interface ExportParticipant {
  id: string;
  /** The pseudonymous participant code; never anything from a file's header. */
  code: string;
  siteCode: string;
  /** The participant's group (arm) name; null when none was set. */
  group: string | null;
  /** `YYYY-MM-DD`, day 0 of the schedule; null when not set. */
  enrolmentDate: string | null;
}

export interface ExportVisit {
  id: string;
  participantId: string;
  label: string;
  visitDate: string;
  schedule: ScheduleColumns;
  /** An analyst's slowing flag is raised on the visit. */
  flagged: boolean;
  /** The visit's current recordings that have numbers, in upload order (one per kind at most). */
  recordings: ExportRecording[];
}

/** A current recording's numbers: the results API's `run`, `channels`, `rest` and `quality`. */
export interface ExportRecording {
  recordingId: string;
  kind: RecordingKind;
  state: RecordingState;
  run: AnalysisRunView;
  channels: ChannelStatsView[];
  rest: Pick<RestResultsView, 'pafHz' | 'cogHz' | 'prominenceDb' | 'noPeakReason'> | null;
  /** Task recordings: the conditions, their difference and the cycle-by-cycle estimate. */
  depth: Pick<TaskResultsView, 'conditions' | 'conditionDifference' | 'cycles'> | null;
  quality: QualityView;
}
