import { Injectable, Logger, OnApplicationBootstrap } from '@nestjs/common';
import { OnEvent } from '@nestjs/event-emitter';
import { AnalysisEvents } from '../analysis/analysis.events';
import type { VisitResultsChanged } from '../analysis/analysis.events';
import { AnalysisRunsService } from '../analysis/analysis-runs.service';
import { VisitAnalysisOverridesService } from '../analysis/visit-analysis-overrides.service';
import { RecordingsService } from '../recordings/recordings.service';

/**
 * Upload order must not change a number: a task recording's band follows its visit's resting
 * IAF, so whenever the resting result appears, changes or is replaced, every task recording of
 * the visit whose numbers used another IAF is computed again (automatic, audited with why).
 */
@Injectable()
export class RestFollowListener implements OnApplicationBootstrap {
  private readonly logger = new Logger('RestFollow');

  constructor(
    private readonly recordings: RecordingsService,
    private readonly runs: AnalysisRunsService,
    private readonly overrides: VisitAnalysisOverridesService,
  ) {}

  /** A stop between a resting result and this reaction must not leave a task behind. */
  async onApplicationBootstrap(): Promise<void> {
    const visits = await this.recordings.visitsWithCurrentKind('task');
    let queued = 0;
    for (const visitId of visits) {
      queued += await this.follow(visitId).catch((error: unknown) => {
        this.logger.error(`Visit ${visitId}: ${String(error)}`);
        return 0;
      });
    }
    if (queued > 0) this.logger.warn(`Queued ${queued} task recording(s) behind their resting IAF`);
  }

  @OnEvent(AnalysisEvents.VisitResultsChanged, { async: true, promisify: true })
  async onResults(event: VisitResultsChanged): Promise<void> {
    try {
      await this.follow(event.visitId);
    } catch (error) {
      this.logger.error(`Visit ${event.visitId}: ${String(error)}`);
    }
  }

  /** Computes again the visit's task recordings whose band no longer matches its resting IAF. */
  async follow(visitId: string): Promise<number> {
    const current = await this.recordings.currentOfVisits([visitId]);
    const tasks = current.filter(
      (r) => r.kind === 'task' && (r.state === 'ready' || r.state === 'failed'),
    );
    if (tasks.length === 0) return 0;
    const { settings } = await this.overrides.effectiveFor(tasks[0].studyId, visitId);
    // A fixed band in the settings does not follow the IAF.
    if (settings.bandHz !== null) return 0;
    const iafHz = await this.runs.currentIafOfVisit(visitId);
    const runs = await this.runs.iafUsedByRuns(tasks.flatMap((t) => t.latestRunId ?? []));
    const behind = tasks.filter((t) => t.latestRunId === null || runs.get(t.latestRunId) !== iafHz);
    if (behind.length === 0) return 0;
    const used = behind.map((t) => (t.latestRunId === null ? null : runs.get(t.latestRunId)));
    const before = used.find((v) => v !== undefined && v !== null) ?? null;
    await this.recordings.requestComputations(behind, {
      trigger: 'rest-changed',
      actor: null,
      reason:
        iafHz === null
          ? `The visit's resting IAF is no longer known (was ${hz(before)}): the task band returns to 8–13 Hz.`
          : `The visit's resting IAF is now ${hz(iafHz)} (was ${hz(before)}): the task band follows it.`,
    });
    return behind.length;
  }
}

function hz(value: number | null): string {
  return value === null ? 'none' : `${value.toFixed(2)} Hz`;
}
