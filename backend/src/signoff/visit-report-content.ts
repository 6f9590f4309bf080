import { createHash } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EntityManager, In } from 'typeorm';
import type { FlagSuggestion, QualityDto, RecordingResultsDto } from '@gyre/shared';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { toResultsDto } from '../analysis/analysis-runs.service';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { Flag } from '../flags/flag.entity';
import { Participant } from '../participants/participant.entity';
import { Report } from '../reports/report.entity';
import {
  FlagEntry,
  ProvenanceEntry,
  QualitySection,
  RestSection,
  TaskSection,
  VisitReportModel,
} from '../report-document/visit-report-model';
import { Site } from '../sites/site.entity';
import { Study } from '../studies/study.entity';
import { User } from '../users/user.entity';
import { Visit } from '../visits/visit.entity';

/** What a report says, before it gets a revision number, a date and a signature. */
export type ReportBody = Omit<
  VisitReportModel,
  'revision' | 'generatedAtIso' | 'supersedes' | 'signature'
>;

export interface ReportContent {
  body: ReportBody;
  /** SHA-256 over the body: equal bodies, equal fingerprints; any printed change alters it. */
  fingerprint: string;
  /** Whether any recording of the visit has a result (without one there is nothing to sign). */
  hasResults: boolean;
  visit: Visit;
  participant: Participant;
  site: Site;
  study: Study;
}

/**
 * Builds a visit report's content from the database: the latest result of each recording
 * kind (the same numbers `GET /api/recordings/:id/results` gives), the visit's flags, and
 * the provenance of every run. Reads through the given manager so that, inside a write
 * transaction, what is signed is exactly what was checked.
 */
@Injectable()
export class VisitReportContent {
  async build(manager: EntityManager, report: Report): Promise<ReportContent> {
    const visit = await manager.findOneByOrFail(Visit, { id: report.visitId });
    const participant = await manager.findOneByOrFail(Participant, { id: report.participantId });
    const site = await manager.findOneByOrFail(Site, { id: report.siteId });
    const study = await manager.findOneByOrFail(Study, { id: report.studyId });

    // Heads first: a visit re-run many times must not load every run's curves.
    const heads = await manager.find(AnalysisRun, {
      where: { visitId: report.visitId },
      select: { id: true, kind: true, createdAt: true },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    const latestOf = async (kind: AnalysisRun['kind']): Promise<AnalysisRun | null> => {
      const head = heads.find((run) => run.kind === kind);
      return head === undefined ? null : manager.findOneByOrFail(AnalysisRun, { id: head.id });
    };
    const latestRest = await latestOf('resting');
    const latestTask = await latestOf('task');
    const used = [latestRest, latestTask]
      .filter((run): run is AnalysisRun => run !== null)
      .map((run) => ({ run, results: toResultsDto(run) }));
    const rest = used.find((u) => u.run.kind === 'resting');
    const task = used.find((u) => u.run.kind === 'task');

    const flags = await manager.find(Flag, {
      where: { visitId: report.visitId },
      order: { raisedAt: 'DESC', id: 'DESC' },
    });
    const names = await this.userNames(manager, flags);

    const body: ReportBody = {
      reportId: report.id,
      study: { name: study.name, code: study.code },
      site: { name: site.name },
      participantCode: participant.code,
      visit: { label: visit.label, date: visit.visitDate },
      rest: rest === undefined ? null : restSection(rest.results),
      task: task === undefined ? null : taskSection(task.results),
      quality: used.map((u) => qualitySection(u.run.kind, u.results.quality)),
      flags: flags.map((flag) => flagEntry(flag, names)),
      flagSuggestion: await this.suggestion(manager, latestTask),
      provenance: used.map((u) => provenance(u.run)),
    };
    return {
      body,
      fingerprint: fingerprintOf(body),
      hasResults: used.length > 0,
      visit,
      participant,
      site,
      study,
    };
  }

  private async userNames(manager: EntityManager, flags: Flag[]): Promise<Map<string, string>> {
    const ids = [
      ...new Set(flags.flatMap((f) => [f.raisedById, f.clearedById]).filter((id) => id !== null)),
    ];
    if (ids.length === 0) return new Map();
    const users = await manager.find(User, {
      where: { id: In(ids) },
      select: { id: true, name: true },
    });
    return new Map(users.map((u) => [u.id, u.name]));
  }

  /** The suggestion the flag form shows (FlagsService), from the latest task run. */
  private async suggestion(
    manager: EntityManager,
    run: AnalysisRun | null,
  ): Promise<VisitReportModel['flagSuggestion']> {
    if (run === null) return null;
    const settings = await manager.findOneByOrFail(AnalysisSettings, { id: run.settingsId });
    const suggestion: Pick<FlagSuggestion, 'suggestsSlowing' | 'flagThresholdHz'> = {
      suggestsSlowing: Boolean(run.suggestsSlowing),
      flagThresholdHz: settings.flagThresholdHz,
    };
    return suggestion;
  }
}

/** SHA-256 of the body's JSON (built in a fixed key order, so equal content hashes equal). */
export function fingerprintOf(body: ReportBody): string {
  return createHash('sha256').update(JSON.stringify(body)).digest('hex');
}

function restSection(results: RecordingResultsDto): RestSection | null {
  const rest = results.rest;
  if (rest === null) return null;
  return {
    pafHz: rest.pafHz,
    cogHz: rest.cogHz,
    prominenceDb: rest.prominenceDb,
    noPeakReason: rest.noPeakReason,
    alphaWindowHz: rest.alphaWindowHz,
    spectrum: { frequencyHz: rest.frequencyHz, powerUv2PerHz: rest.powerUv2PerHz },
  };
}

function taskSection(results: RecordingResultsDto): TaskSection | null {
  const task = results.task;
  if (task === null) return null;
  const run = results.run;
  return {
    deltaFHz: run.roiDeltaFHz,
    ciHz: run.roiCiHz,
    pValue: run.roiPValue,
    trialsKept: run.trialsKept,
    trialsTotal: run.trialsTotal,
    droppedByReason: task.epochs.dropped,
    bandHz: run.bandHz,
    baselineWindowS: task.baselineWindowS,
    postWindowS: task.postWindowS,
    onsetCurve: {
      timeS: task.timeS,
      meanHz: task.roi.meanHz,
      ciLowHz: task.roi.ciLowHz,
      ciHighHz: task.roi.ciHighHz,
    },
  };
}

function qualitySection(kind: AnalysisRun['kind'], quality: QualityDto): QualitySection {
  return {
    kind,
    durationS: quality.durationS,
    sampleRatesHz: quality.sampleRatesHz,
    roiChannelsFound: quality.roiChannelsFound,
    roiChannelsMissing: quality.roiChannelsMissing,
    flatChannels: quality.flatChannels,
    saturatedChannels: quality.saturatedChannels,
    lineNoiseRatio50Hz: quality.lineNoiseRatio50Hz,
    lineNoiseRatio60Hz: quality.lineNoiseRatio60Hz,
    epochsDroppedShare: quality.epochsDroppedShare,
    phaseSlipShare: quality.phaseSlipShare,
    alphaPeakProminenceDb: quality.alphaPeakProminenceDb,
    warnings: quality.warnings,
  };
}

function flagEntry(flag: Flag, names: Map<string, string>): FlagEntry {
  return {
    state: flag.state,
    raisedByName: names.get(flag.raisedById) ?? flag.raisedById,
    raisedAtIso: flag.raisedAt,
    raiseReason: flag.raiseReason,
    clearedByName: flag.clearedById === null ? null : (names.get(flag.clearedById) ?? null),
    clearedAtIso: flag.clearedAt,
    clearReason: flag.clearReason,
  };
}

function provenance(run: AnalysisRun): ProvenanceEntry {
  return {
    kind: run.kind,
    analysisRunId: run.id,
    settingsVersion: run.settingsVersion,
    codeVersion: run.codeVersion,
    inputChecksumSha256: run.inputChecksumSha256,
  };
}
