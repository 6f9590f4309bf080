import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { JobDto } from '@gyre/shared';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { Recording } from '../recordings/recording.entity';
import { toJobDto } from '../recordings/recording.view';
import { Visit } from '../visits/visit.entity';
import { Job } from './job.entity';
import { JobsError } from './jobs.errors';
import { JobsService } from './jobs.service';

/** Analyst re-runs: one recording, or every computable recording of a visit. */
@Injectable()
export class RunsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobsService,
  ) {}

  async rerunRecording(
    caller: Caller,
    recordingId: string,
    reason: string | null,
  ): Promise<JobDto> {
    const recording = await this.dataSource.getRepository(Recording).findOne({
      where: scopedWhere<Recording>(caller.ability, 'rerun', 'AnalysisRun', { id: recordingId }),
    });
    if (recording === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        JobsError.RecordingNotFound,
        `No recording ${recordingId}.`,
        {
          recordingId,
        },
      );
    }
    const [job] = await this.jobs.requeue(caller, [recording], 'rerun', reason);
    return (await this.views([job.id]))[0];
  }

  /** Every recording of the visit that has an accepted file and is not already in the queue. */
  async rerunVisit(caller: Caller, visitId: string, reason: string | null): Promise<JobDto[]> {
    const visit = await this.dataSource.getRepository(Visit).findOne({
      where: scopedWhere<Visit>(caller.ability, 'rerun', 'AnalysisRun', { id: visitId }),
    });
    if (visit === null) {
      throw new GyreException(ErrorKind.NotFound, JobsError.VisitNotFound, `No visit ${visitId}.`, {
        visitId,
      });
    }
    const recordings = await this.dataSource.getRepository(Recording).find({
      where: { visitId, state: In(['ready', 'failed']) },
      order: { createdAt: 'ASC' },
    });
    if (recordings.length === 0) {
      throw new GyreException(
        ErrorKind.Conflict,
        JobsError.NotComputable,
        `Visit ${visitId} has no ready or failed recording to compute again.`,
        { visitId },
      );
    }
    const jobs = await this.jobs.requeue(caller, recordings, 'rerun', reason);
    return this.views(jobs.map((j) => j.id));
  }

  private async views(jobIds: string[]): Promise<JobDto[]> {
    const jobs = await this.dataSource
      .getRepository(Job)
      .find({ where: { id: In(jobIds) }, order: { createdAt: 'ASC' } });
    const settings = await this.dataSource
      .getRepository(AnalysisSettings)
      .find({ where: { id: In([...new Set(jobs.map((j) => j.settingsId))]) } });
    const versions = new Map(settings.map((s) => [s.id, s.version]));
    return jobs.map((job) => toJobDto(job, versions.get(job.settingsId) ?? 0));
  }
}
