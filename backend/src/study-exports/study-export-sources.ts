import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { AnalysisRunsService, toResultsView } from '../analysis/analysis-runs.service';
import { applyScope } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { FlagsService } from '../flags/flags.service';
import { Participant } from '../participants/participant.entity';
import { RecordingsService } from '../recordings/recordings.service';
import { PlannedVisitsService } from '../schedule/planned-visits.service';
import { StudyGroupsService } from '../schedule/study-groups.service';
import { Site } from '../sites/site.entity';
import { StudiesService } from '../studies/studies.service';
import { Visit } from '../visits/visit.entity';
import type {
  ExportParticipant,
  ExportRecording,
  ExportVisit,
  StudyExportModel,
} from './export-model';
import { scheduleColumnsOf, type StudySchedule } from './schedule-columns';

/** Visits whose runs are read at a time: a task run carries its curves (≈ 0.6 MB at 64 channels). */
const VISIT_BATCH = 25;

/**
 * The exports' reads, all in the caller's scope for exporting results (`export Result`, applied
 * to the participant and visit rows as the read routes apply theirs). Participants, visits and
 * sites are read here in one narrow query each (as worklist/ does); the numbers come from their
 * owner, analysis/ (`currentRunsOfVisits`, `staleness`, `toResultsView`: the results API's own
 * path), so a superseded recording never counts. Nothing is written.
 */
@Injectable()
export class StudyExportSources {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly studies: StudiesService,
    private readonly runs: AnalysisRunsService,
    private readonly recordings: RecordingsService,
    private readonly flags: FlagsService,
    private readonly plannedVisits: PlannedVisitsService,
    private readonly groups: StudyGroupsService,
  ) {}

  async model(caller: Caller, studyId: string): Promise<StudyExportModel> {
    const study = await this.studies.findInScope(caller, 'read', studyId);
    const schedule = await this.schedule(caller, studyId);
    const sites = new Map(
      (await this.dataSource.getRepository(Site).find({ where: { studyId } })).map((s) => [
        s.id,
        s.code,
      ]),
    );
    const participantRows = await applyScope(
      this.dataSource
        .getRepository(Participant)
        .createQueryBuilder('p')
        .where('p.studyId = :studyId', { studyId }),
      'p',
      caller.ability,
      'export',
      'Result',
    )
      .orderBy('p.code', 'ASC')
      .getMany();
    const participants: ExportParticipant[] = participantRows.map((p) => {
      const columns = scheduleColumnsOf(schedule, p, null);
      return {
        id: p.id,
        code: p.code,
        siteCode: sites.get(p.siteId) ?? p.siteId,
        group: columns.group,
        enrolmentDate: columns.enrolmentDate,
      };
    });
    const byId = new Map(participantRows.map((p) => [p.id, p]));
    const order = new Map(participantRows.map((p, i) => [p.id, i]));
    const visitRows = (
      await applyScope(
        this.dataSource
          .getRepository(Visit)
          .createQueryBuilder('v')
          .where('v.studyId = :studyId', { studyId }),
        'v',
        caller.ability,
        'export',
        'Result',
      )
        .orderBy('v.visitDate', 'ASC')
        .addOrderBy('v.label', 'ASC')
        .addOrderBy('v.id', 'ASC')
        .getMany()
    )
      .filter((v) => byId.has(v.participantId))
      .sort((a, b) => order.get(a.participantId)! - order.get(b.participantId)!);

    const visits: ExportVisit[] = [];
    for (let i = 0; i < visitRows.length; i += VISIT_BATCH) {
      const batch = visitRows.slice(i, i + VISIT_BATCH);
      const numbers = await this.numbersOf(batch.map((v) => v.id));
      const flagged = new Set(
        (await this.flags.forVisits(batch.map((v) => v.id)))
          .filter((f) => f.state === 'raised')
          .map((f) => f.visitId),
      );
      for (const visit of batch) {
        visits.push({
          id: visit.id,
          participantId: visit.participantId,
          label: visit.label,
          visitDate: visit.visitDate,
          schedule: scheduleColumnsOf(schedule, byId.get(visit.participantId)!, visit),
          flagged: flagged.has(visit.id),
          recordings: numbers.filter((r) => r.visitId === visit.id).map((r) => r.recording),
        });
      }
    }
    return { study: { id: study.id, code: study.code, name: study.name }, participants, visits };
  }

  private async schedule(caller: Caller, studyId: string): Promise<StudySchedule> {
    const planned = await this.plannedVisits.ofStudy(studyId);
    const groups = await this.groups.list(caller, studyId);
    return {
      plannedById: new Map(planned.map((p) => [p.id, p])),
      groupById: new Map(groups.map((g) => [g.id, g])),
    };
  }

  /**
   * The current numbers of these visits, as `GET /api/recordings/:id/results` gives them
   * (run, channels, rest numbers and quality; its rounding touches only curves and spectra).
   */
  private async numbersOf(
    visitIds: string[],
  ): Promise<Array<{ visitId: string; recording: ExportRecording }>> {
    const current = await this.recordings.currentOfVisits(visitIds);
    const runs = await this.runs.currentRunsOfVisits(visitIds);
    const stale = await this.runs.staleness(runs);
    const runById = new Map(runs.map((r) => [r.id, r]));
    return current.flatMap((recording) => {
      const run = recording.latestRunId === null ? undefined : runById.get(recording.latestRunId);
      if (run === undefined) return [];
      const results = toResultsView(run, recording, stale.get(run.id) ?? []);
      return [
        {
          visitId: recording.visitId,
          recording: {
            recordingId: recording.id,
            kind: recording.kind,
            state: recording.state,
            run: results.run,
            channels: results.channels,
            rest:
              results.rest === null
                ? null
                : {
                    pafHz: results.rest.pafHz,
                    cogHz: results.rest.cogHz,
                    prominenceDb: results.rest.prominenceDb,
                    noPeakReason: results.rest.noPeakReason,
                  },
            depth:
              results.task === null
                ? null
                : {
                    conditions: results.task.conditions,
                    conditionDifference: results.task.conditionDifference,
                    cycles: results.task.cycles,
                  },
            quality: results.quality,
          },
        },
      ];
    });
  }
}
