import { Injectable } from '@nestjs/common';
import {
  subject,
  type CompletionState,
  type OverviewCell,
  type OverviewMeasure,
  type OverviewParticipant,
  type OverviewStat,
  type SiteQuality,
  type StudyOverviewView,
} from '@gyre/shared';
import type { Caller } from '../auth/decorators';
import type { ReportHead } from '../signoff/report-heads.reads';
import { reviewFingerprintOf } from '../visit-reviews/review-fingerprint';
import { meanWithInterval } from './group-stats';
import { StudyOverviewError, studyOverviewError } from './study-overview.errors';
import {
  StudyOverviewSources,
  type LiveRecordingRow,
  type VisitRow,
} from './study-overview-sources';

const MEASURES: readonly OverviewMeasure[] = ['paf', 'cog', 'deltaF'];

/** Doubts as the overview words them (the notes count them study-wide). */
export const DOUBT = {
  noRestingIaf: 'Δf in the 8–13 Hz band: the visit has no resting IAF to follow.',
  staleSettings: 'Computed with settings older than the study’s or the visit’s current ones.',
  partialRoi: 'Region of interest incomplete: some of its channels were left out.',
  noRoi: 'No region-of-interest channel remained.',
} as const;

/**
 * The study overview (docs/user-guide.md "Study overview", docs/method.md §5): per planned
 * visit each participant's PAF, CoG and Δf from the current runs, group and site means with
 * 95 % Student t intervals, the completion matrix and the site quality comparison. Reads only;
 * nine statements whatever the size of the study (study-overview-sources.ts).
 */
@Injectable()
export class StudyOverviewService {
  constructor(private readonly sources: StudyOverviewSources) {}

  overview(caller: Caller, studyId: string): StudyOverviewView {
    if (
      !caller.ability.can('read', subject('StudyOverview', { studyId })) ||
      !this.sources.studyExists(studyId)
    ) {
      throw studyOverviewError(StudyOverviewError.StudyNotFound, `No study ${studyId}.`, {
        studyId,
      });
    }
    const planned = this.sources.plannedVisits(studyId);
    const groups = this.sources.groups(studyId);
    const sites = this.sources.sites(caller, studyId);
    const participants = this.sources.participants(caller, studyId);
    const visits = this.sources.visits(caller, studyId);
    const recordings = this.sources.liveRecordings(caller, studyId);
    const reviews = new Map(
      this.sources.latestReviews(caller, studyId).map((r) => [r.visitId, r.fingerprint]),
    );
    const reports = new Map(this.sources.reports(caller, studyId).map((r) => [r.visitId, r]));
    const newestSettings = this.sources.newestSettingsId(studyId);
    const overrides = this.sources.newestOverrideRevisions(studyId);

    const recordingsOf = groupBy(recordings, (r) => r.visitId);
    const visitsOf = groupBy(visits, (v) => v.participantId);
    const plannedIds = new Set(planned.map((p) => p.id));
    const context = { recordingsOf, reviews, reports, newestSettings, overrides };

    const rows: OverviewParticipant[] = participants.map((p) => {
      const own = visitsOf.get(p.id) ?? [];
      // Visits come in date order: the last one on a planned visit is the one counted.
      const onPlanned = new Map<string, VisitRow>();
      for (const v of own) {
        if (v.plannedVisitId !== null && plannedIds.has(v.plannedVisitId)) {
          onPlanned.set(v.plannedVisitId, v);
        }
      }
      return {
        id: p.id,
        code: p.code,
        siteId: p.siteId,
        groupId: p.groupId,
        cells: planned.map((pv) => cellOf(pv.id, onPlanned.get(pv.id) ?? null, context)),
        unplannedVisits: own.filter((v) => v.plannedVisitId === null).length,
      };
    });

    return {
      studyId,
      plannedVisits: planned,
      groups,
      sites,
      participants: rows,
      byGroup: statsBy(rows, planned, (p) => p.groupId),
      bySite: statsBy(rows, planned, (p) => p.siteId),
      siteQuality: siteQualityOf(sites, recordings, this.sources.uploadCounts(caller, studyId)),
      notes: notesOf(rows, planned.length),
    };
  }
}

interface CellContext {
  recordingsOf: Map<string, LiveRecordingRow[]>;
  reviews: Map<string, string>;
  reports: Map<string, ReportHead>;
  newestSettings: string | null;
  overrides: Map<string, number>;
}

/** One participant at one planned visit; the states are defined in shared/src/study-overview.ts. */
function cellOf(plannedVisitId: string, visit: VisitRow | null, ctx: CellContext): OverviewCell {
  const empty: OverviewCell = {
    plannedVisitId,
    visitId: visit?.id ?? null,
    visitDate: visit?.visitDate ?? null,
    state: 'missing',
    changedSinceSigning: false,
    paf: null,
    cog: null,
    deltaF: null,
    doubts: [],
  };
  if (visit === null) return empty;
  const live = ctx.recordingsOf.get(visit.id) ?? [];
  // A registered visit without a recording has nothing uploaded yet: still missing.
  if (live.length === 0) return empty;
  const withRuns = live.filter((r) => r.latestRunId !== null);
  if (withRuns.length === 0) return { ...empty, state: 'uploaded' };
  const rest = withRuns.find((r) => r.kind === 'resting');
  const task = withRuns.find((r) => r.kind === 'task');
  let state: CompletionState = 'computed';
  const fingerprint = reviewFingerprintOf(withRuns);
  if (fingerprint !== null && ctx.reviews.get(visit.id) === fingerprint.fingerprint) {
    state = 'reviewed';
  }
  let changedSinceSigning = false;
  const report = ctx.reports.get(visit.id);
  if (report !== undefined && report.state !== 'draft' && report.lastSignedAt !== null) {
    const newestRun = withRuns
      .map((r) => r.runCreatedAt ?? '')
      .sort()
      .at(-1) as string;
    if (newestRun <= report.lastSignedAt) state = 'signed';
    else changedSinceSigning = true;
  }
  const doubts = new Set<string>();
  for (const run of withRuns) {
    if (run.kind === 'task' && run.bandSource === 'default') doubts.add(DOUBT.noRestingIaf);
    if (
      (ctx.newestSettings !== null && run.settingsId !== ctx.newestSettings) ||
      (run.overrideRevision ?? null) !== (ctx.overrides.get(visit.id) ?? null)
    ) {
      doubts.add(DOUBT.staleSettings);
    }
    if (run.roiStatus === 'partial') doubts.add(DOUBT.partialRoi);
    if (run.roiStatus === 'none') doubts.add(DOUBT.noRoi);
  }
  return {
    ...empty,
    state,
    changedSinceSigning,
    paf: rest?.pafHz ?? null,
    cog: rest?.cogHz ?? null,
    deltaF: task?.roiDeltaFHz ?? null,
    doubts: [...doubts],
  };
}

function statsBy(
  rows: readonly OverviewParticipant[],
  planned: ReadonlyArray<{ id: string }>,
  keyOf: (p: OverviewParticipant) => string | null,
): OverviewStat[] {
  const byKey = groupBy(rows, keyOf);
  const out: OverviewStat[] = [];
  for (const measure of MEASURES) {
    planned.forEach((pv, index) => {
      for (const [key, members] of byKey) {
        const cells = members.map((m) => m.cells[index]);
        const withValue = cells.filter((c) => c[measure] !== null);
        const stat = meanWithInterval(withValue.map((c) => c[measure] as number));
        out.push({
          measure,
          plannedVisitId: pv.id,
          key,
          ...stat,
          doubtful: withValue.filter((c) => c.doubts.length > 0).length,
        });
      }
    });
  }
  return out;
}

function mean(values: ReadonlyArray<number | null>): number | null {
  const present = values.filter((v): v is number => v !== null && Number.isFinite(v));
  return present.length === 0 ? null : present.reduce((a, v) => a + v, 0) / present.length;
}

function siteQualityOf(
  sites: ReadonlyArray<{ id: string; name: string }>,
  recordings: readonly LiveRecordingRow[],
  uploads: ReadonlyArray<{ siteId: string; uploads: number; rejected: number }>,
): SiteQuality[] {
  const runsOf = groupBy(
    recordings.filter((r) => r.latestRunId !== null),
    (r) => r.siteId,
  );
  const countsOf = new Map(uploads.map((u) => [u.siteId, u]));
  return sites.map((site) => {
    const runs = runsOf.get(site.id) ?? [];
    const counts = countsOf.get(site.id) ?? { uploads: 0, rejected: 0 };
    const task = runs.filter((r) => r.kind === 'task');
    return {
      siteId: site.id,
      siteName: site.name,
      uploads: counts.uploads,
      rejected: counts.rejected,
      rejectionRate: counts.uploads === 0 ? null : counts.rejected / counts.uploads,
      runs: runs.length,
      epochsDroppedShare: mean(task.map((r) => r.epochsDroppedShare)),
      lineNoiseRatio50Hz: mean(runs.map((r) => r.lineNoiseRatio50Hz)),
      lineNoiseRatio60Hz: mean(runs.map((r) => r.lineNoiseRatio60Hz)),
      phaseSlipShare: mean(task.map((r) => r.phaseSlipShare)),
      roiChannelsLost: mean(
        runs.map((r) =>
          r.roiWanted === null || r.roiUsed === null ? null : r.roiWanted - r.roiUsed,
        ),
      ),
      runsWithoutRoi: runs.filter((r) => r.roiStatus === 'none').length,
    };
  });
}

function notesOf(rows: readonly OverviewParticipant[], plannedCount: number): string[] {
  const notes: string[] = [];
  if (plannedCount === 0) {
    notes.push(
      'The study has no planned visits yet: add them in the study setup to see courses and completion.',
    );
  }
  const cells = rows.flatMap((r) => r.cells);
  for (const [doubt, text] of [
    [DOUBT.noRestingIaf, 'used the 8–13 Hz band for Δf because the visit has no resting IAF'],
    [DOUBT.staleSettings, '{was} computed with settings older than the current ones'],
    [DOUBT.partialRoi, 'lost some region-of-interest channels'],
    [DOUBT.noRoi, 'kept no region-of-interest channel'],
  ] as const) {
    const count = cells.filter((c) => c.doubts.includes(doubt)).length;
    if (count > 0) {
      const words = text.replace('{was}', count === 1 ? 'was' : 'were');
      notes.push(`${count} ${count === 1 ? 'visit' : 'visits'} ${words}.`);
    }
  }
  const signedThenChanged = cells.filter((c) => c.changedSinceSigning).length;
  if (signedThenChanged > 0) {
    notes.push(
      `${signedThenChanged} signed ${signedThenChanged === 1 ? 'visit has' : 'visits have'} results newer than the signature.`,
    );
  }
  const unplanned = rows.reduce((a, r) => a + r.unplannedVisits, 0);
  if (unplanned > 0) {
    notes.push(
      `${unplanned} ${unplanned === 1 ? 'visit is' : 'visits are'} on no planned visit and ${unplanned === 1 ? 'is' : 'are'} not in these numbers.`,
    );
  }
  return notes;
}

function groupBy<T, K>(items: readonly T[], keyOf: (item: T) => K): Map<K, T[]> {
  const out = new Map<K, T[]>();
  for (const item of items) {
    const key = keyOf(item);
    const list = out.get(key);
    if (list === undefined) out.set(key, [item]);
    else list.push(item);
  }
  return out;
}
