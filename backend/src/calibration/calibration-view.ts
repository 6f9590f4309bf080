import type {
  AnalysisSettingsValues,
  CalibrationCheckView,
  CalibrationRunView,
} from '@gyre/shared';
import type { CalibrationRun } from './calibration-run.entity';

/** A run as the API sends it; the site code and the requester's name are read beside it. */
export function toCalibrationRunView(
  run: CalibrationRun,
  siteCode: string,
  requestedByName: string | null,
): CalibrationRunView {
  return {
    id: run.id,
    studyId: run.studyId,
    siteId: run.siteId,
    siteCode,
    state: run.state,
    signalName: run.signalName,
    checks: JSON.parse(run.checksJson) as CalibrationCheckView[],
    error: run.error,
    gyreVersion: run.gyreVersion,
    settingsVersionId: run.settingsVersionId,
    settingsVersion: run.settingsVersion,
    settings: JSON.parse(run.settingsJson) as AnalysisSettingsValues,
    requestedById: run.requestedById,
    requestedByName,
    requestedAt: run.requestedAt,
    finishedAt: run.finishedAt,
  };
}
