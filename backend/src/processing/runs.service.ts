import { Injectable } from '@nestjs/common';
import type { JobView } from '@gyre/shared';
import type { Caller } from '../auth/decorators';
import { toJobView } from '../recordings/recording-view';
import { RecordingsService } from '../recordings/recordings.service';
import { VisitsService } from '../visits/visits.service';
import { ProcessingError, processingError } from './processing.errors';

/** Analyst re-runs: one recording, or every current recording of a visit. */
@Injectable()
export class RunsService {
  constructor(
    private readonly recordings: RecordingsService,
    private readonly visits: VisitsService,
  ) {}

  async rerunRecording(
    caller: Caller,
    recordingId: string,
    reason: string | null,
  ): Promise<JobView> {
    const recording = await this.recordings.findInScope(
      caller,
      recordingId,
      'rerun',
      'AnalysisRun',
    );
    const [job] = await this.recordings.requestComputations([recording], {
      trigger: 'rerun',
      actor: caller.user,
      reason,
      clientIp: caller.clientIp,
    });
    return toJobView(job);
  }

  /** Every current recording of the visit that is ready or failed. */
  async rerunVisit(caller: Caller, visitId: string, reason: string | null): Promise<JobView[]> {
    const visit = await this.visits.findInScope(caller, 'read', visitId);
    if (!caller.ability.can('rerun', 'AnalysisRun')) {
      throw processingError(ProcessingError.VisitNotFound, `No visit ${visitId}.`, {
        visitId,
      });
    }
    const recordings = (await this.recordings.currentOfVisits([visit.id])).filter(
      (r) => r.state === 'ready' || r.state === 'failed',
    );
    if (recordings.length === 0) {
      throw processingError(
        ProcessingError.NothingToCompute,
        `Visit ${visitId} has no ready or failed recording to compute again.`,
        { visitId },
      );
    }
    const jobs = await this.recordings.requestComputations(recordings, {
      trigger: 'rerun',
      actor: caller.user,
      reason,
      clientIp: caller.clientIp,
    });
    return jobs.map(toJobView);
  }
}
