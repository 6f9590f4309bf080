import { createHash } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EntityManager } from 'typeorm';
import type {
  AnalysisRunView,
  ChannelStatsView,
  QualityView,
  RecordingResultsView,
  RoiUsageView,
} from '@gyre/shared';
import type { AnalysisSettings as AnalysisSettingsValues } from '../signal/pipeline/analysis-settings';
import type { AnalysisRun } from '../analysis/analysis-run.entity';
import { AnalysisRunsService, toResultsView } from '../analysis/analysis-runs.service';
import { parseStoredSettings } from '../analysis/settings-values';
import type { Recording } from '../recordings/recording.entity';
import { RecordingsService } from '../recordings/recordings.service';
import type { Flag } from '../flags/flag.entity';
import { FlagsService } from '../flags/flags.service';
import type { Participant } from '../participants/participant.entity';
import { ParticipantsService } from '../participants/participants.service';
import { scalpMapPartOf } from '../report-document/report-scalp-map';
import type { Report } from '../reports/report.entity';
import {
  FlagEntry,
  ProvenanceEntry,
  RecordingSource,
  QualitySection,
  RestSection,
  TaskDepthSection,
  TaskSection,
  VisitReportModel,
} from '../report-document/visit-report-model';
import type { Site } from '../sites/site.entity';
import { SitesService } from '../sites/sites.service';
import type { Study } from '../studies/study.entity';
import { StudiesService } from '../studies/studies.service';
import { UsersService } from '../users/users.service';
import type { Visit } from '../visits/visit.entity';
import { VisitsService } from '../visits/visits.service';

/** What a report says, before it gets a revision number, a date and a signature. */
export type ReportBody = Omit<
  VisitReportModel,
  'revision' | 'generatedAtIso' | 'supersedes' | 'signature'
>;

export interface ReportContent {
  body: ReportBody;
  /**
   * SHA-256 over what the report states (numbers, quality, flags), not over which run ids
   * carry them: a re-run that reproduces the same numbers leaves the fingerprint, and so the
   * signed revision, as it was.
   */
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
export class VisitReportContentService {
  constructor(
    private readonly runs: AnalysisRunsService,
    private readonly recordings: RecordingsService,
    private readonly visits: VisitsService,
    private readonly participants: ParticipantsService,
    private readonly sites: SitesService,
    private readonly studies: StudiesService,
    private readonly flags: FlagsService,
    private readonly users: UsersService,
  ) {}

  async build(manager: EntityManager, report: Report): Promise<ReportContent> {
    const visit = await this.visits.byId(report.visitId, manager);
    const participant = await this.participants.byId(report.participantId, manager);
    const site = await this.sites.byId(report.siteId, manager);
    const study = await this.studies.byId(report.studyId, manager);

    // The visit's current recordings only: a superseded recording's numbers are not the visit's.
    const current = await this.recordings.currentOfVisits([report.visitId]);
    const runs = await this.runs.currentRunsOfVisits([report.visitId]);
    const used = runs
      .map((run) => {
        const recording = current.find((r) => r.id === run.recordingId) as Recording;
        return { run, recording, results: toResultsView(run, recording, []) };
      })
      .sort((a, b) => (a.run.kind < b.run.kind ? -1 : 1));
    const rest = used.find((u) => u.run.kind === 'resting');
    const task = used.find((u) => u.run.kind === 'task');

    const flags = await this.flags.forVisits([report.visitId], manager);
    const names = await this.users.namesOf(
      flags.flatMap((f) => [f.raisedById, f.clearedById]).filter((id) => id !== null),
      manager,
    );

    const body: ReportBody = {
      reportId: report.id,
      study: { name: study.name, code: study.code },
      site: { name: site.name },
      participantCode: participant.code,
      visit: { label: visit.label, date: visit.visitDate },
      rest: rest === undefined ? null : restSection(rest.results, rest.recording),
      task:
        task === undefined
          ? null
          : taskSection(task.results, task.recording, parseStoredSettings(task.run.settingsJson)),
      quality: used.map((u) => qualitySection(u.run.kind, u.results.quality)),
      flags: flags.map((flag) => flagEntry(flag, names)),
      flagSuggestion: task === undefined ? null : suggestion(task.run),
      provenance: used.map((u) => provenance(u.results.run)),
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
}

/** SHA-256 of the body's JSON without its provenance (built in a fixed key order). */
export function fingerprintOf(body: ReportBody): string {
  const { provenance: _provenance, ...stated } = body;
  return createHash('sha256').update(JSON.stringify(stated)).digest('hex');
}

/** The suggestion the flag form shows (FlagsService), from the current task numbers. */
function suggestion(run: AnalysisRun): VisitReportModel['flagSuggestion'] {
  return {
    suggestsSlowing: run.suggestsSlowing === null ? null : Boolean(run.suggestsSlowing),
    flagThresholdHz: parseStoredSettings(run.settingsJson).flagThresholdHz,
  };
}

function sourceOf(recording: Recording): RecordingSource {
  return {
    recordingId: recording.id,
    uploadedAtIso: recording.createdAt,
    replacesId: recording.replacesId,
    replacementReason: recording.replacementReason,
  };
}

function restSection(results: RecordingResultsView, recording: Recording): RestSection {
  const roiUsage = results.run.roiUsage;
  const rest = results.rest;
  if (rest === null || roiUsage.status === 'none') {
    return {
      pafHz: null,
      cogHz: null,
      prominenceDb: null,
      noPeakReason: rest?.noPeakReason ?? null,
      alphaWindowHz: rest?.alphaWindowHz ?? [7, 13],
      spectrum: { frequencyHz: [], powerUv2PerHz: [] },
      roiUsage,
      source: sourceOf(recording),
    };
  }
  return {
    roiUsage,
    source: sourceOf(recording),
    pafHz: rest.pafHz,
    cogHz: rest.cogHz,
    prominenceDb: rest.prominenceDb,
    noPeakReason: rest.noPeakReason,
    alphaWindowHz: rest.alphaWindowHz,
    spectrum: { frequencyHz: rest.frequencyHz, powerUv2PerHz: rest.powerUv2PerHz },
    ...scalpMapPartOf(results, ['paf', 'cog']),
  };
}

function taskSection(
  results: RecordingResultsView,
  recording: Recording,
  settings: AnalysisSettingsValues,
): TaskSection {
  const task = results.task;
  const run = results.run;
  if (task === null || run.roiUsage.status === 'none') {
    return {
      deltaFHz: null,
      ciHz: null,
      pValue: null,
      trialsKept: null,
      trialsTotal: null,
      droppedByReason: task?.epochs.dropped ?? {},
      bandHz: run.bandHz,
      baselineWindowS: task?.baselineWindowS ?? settings.baselineWindowS,
      postWindowS: task?.postWindowS ?? settings.postWindowS,
      onsetCurve: { timeS: [], meanHz: [], ciLowHz: [], ciHighHz: [] },
      roiUsage: run.roiUsage,
      source: sourceOf(recording),
    };
  }
  const depth = depthOf(results);
  return {
    roiUsage: run.roiUsage,
    source: sourceOf(recording),
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
    ...depth,
    // Under the rule of `depth`: a report of a run made before the depth fields stays as it was.
    ...(depth.depth === undefined ? {} : scalpMapPartOf(results, ['deltaF'])),
  };
}

/**
 * The task's conditions, cycle-by-cycle estimate and amplitude gate, under `depth` only when
 * the run computed any of them: a report of an earlier run keeps its content and fingerprint.
 */
function depthOf(results: RecordingResultsView): { depth?: TaskDepthSection } {
  const task = results.task;
  if (task === null) return {};
  const amplitudeGate = gateOverRoi(results.channels, results.run.roiUsage);
  if (task.conditions.length === 0 && task.cycles === null && amplitudeGate === null) return {};
  return {
    depth: {
      conditions: task.conditions,
      conditionDifference: task.conditionDifference,
      cycles: task.cycles,
      // The run's own threshold: its `cycles.disagrees` was judged by it (docs/method.md §3).
      cycleDisagreementHz: results.run.depthSettings.cycleDisagreementHz,
      amplitudeGate,
    },
  };
}

/** The gate's percentile and the samples it left out, summed over the region's channels used. */
function gateOverRoi(
  channels: ChannelStatsView[],
  usage: RoiUsageView,
): TaskDepthSection['amplitudeGate'] {
  const used = new Set(usage.used);
  let percentile: number | null = null;
  let excludedSamples = 0;
  let totalSamples = 0;
  for (const channel of channels) {
    const gate = channel.amplitudeGate;
    if (!used.has(channel.label) || gate === null || gate.percentile === null) continue;
    percentile = gate.percentile;
    excludedSamples += gate.excludedSamples;
    totalSamples += gate.totalSamples;
  }
  return percentile === null ? null : { percentile, excludedSamples, totalSamples };
}

function qualitySection(kind: AnalysisRun['kind'], quality: QualityView): QualitySection {
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

/** Which run, settings and code a section's numbers come from, with the run's own depth settings. */
function provenance(run: AnalysisRunView): ProvenanceEntry {
  return {
    kind: run.kind,
    analysisRunId: run.id,
    settingsVersion: run.settingsVersion,
    codeVersion: run.codeVersion,
    inputChecksumSha256: run.inputChecksumSha256,
    depthSettings: run.depthSettings,
  };
}
