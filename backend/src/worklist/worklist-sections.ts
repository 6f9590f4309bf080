import type {
  RecordingKind,
  VisitReviewView,
  WorklistItem,
  WorklistSectionKey,
  WorklistSort,
} from '@gyre/shared';
import { formatDeltaHz } from '@gyre/shared';
import { shownVisitFacts, type BlindedVisit } from '../blinding/blinded-visit-facts';
import type { Flag } from '../flags/flag.entity';
import { reviewFingerprintOf } from '../visit-reviews/review-fingerprint';
import type { ReportHead } from '../signoff/report-heads.reads';
import type { CurrentRecordingRow, UploadRow, VisitFacts } from './worklist-sources';

/** Every item of every section, before sorting and paging. */
export type SectionItems = Partial<Record<WorklistSectionKey, WorklistItem[]>>;

export const SECTION_TITLES: Record<WorklistSectionKey, string> = {
  unreviewed: 'Results not reviewed',
  suggestions: 'Suggestions without a decision',
  awaitingSignature: 'Reports waiting for a signature',
  changedSinceSigning: 'Results changed since signing',
  failed: 'Failed computations',
  rejected: 'Rejected uploads',
  warnings: 'Uploads with warnings',
  missingKinds: 'Visits missing a recording',
};

const KIND_WORD: Record<RecordingKind, string> = { resting: 'resting', task: 'task' };

export interface ReviewInput {
  recordings: CurrentRecordingRow[];
  reports: Omit<ReportHead, 'participantId'>[];
  reviews: Map<string, VisitReviewView>;
  /** Flags of the visits whose task run suggests slowing, any order. */
  flags: Flag[];
}

/** The visits behind current recordings, each with its recordings. */
function byVisit<T extends VisitFacts>(rows: readonly T[]): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const row of rows) {
    const list = out.get(row.visitId);
    if (list === undefined) out.set(row.visitId, [row]);
    else list.push(row);
  }
  return out;
}

function item(
  facts: VisitFacts,
  extra: Pick<WorklistItem, 'key' | 'what' | 'since'> &
    Partial<Pick<WorklistItem, 'kind' | 'recordingId'>>,
  screen: 'review' | 'intake',
): WorklistItem {
  return {
    participantId: facts.participantId,
    participantCode: facts.participantCode,
    visitId: facts.visitId,
    visitLabel: facts.visitLabel,
    visitDate: facts.visitDate,
    schedule: facts.schedule,
    blindCode: null,
    siteId: facts.siteId,
    kind: extra.kind ?? null,
    recordingId: extra.recordingId ?? null,
    key: extra.key,
    what: extra.what,
    since: extra.since,
    link: { screen, participantId: facts.participantId, visitId: facts.visitId },
  };
}

/** An intake item about one upload, keyed by its recording. */
function uploadItem(row: UploadRow, since: string, what: string): WorklistItem {
  const { recordingId, kind } = row;
  return item(row, { key: recordingId, kind, recordingId, since, what }, 'intake');
}

const day = (iso: string): string => iso.slice(0, 10);

/** The suggestion's headline Δf, written as on every screen (shared number-format.ts). */
export function signedHz(value: number): string {
  return formatDeltaHz(value);
}

/**
 * The sections of analysts and monitors, from the rows WorklistSources read:
 * - unreviewed: the visit has results and no review of exactly these runs;
 * - suggestions: the current task run suggests slowing and there is no decision on it: no
 *   flag raised, none cleared since that run, and the visit not reviewed with that run;
 * - awaitingSignature: a draft report whose visit has results;
 * - changedSinceSigning: a signed (or sent) report whose visit has a run newer than the
 *   newest signature;
 * - failed: current recordings whose computation failed.
 */
export function reviewSections(input: ReviewInput): SectionItems {
  const unreviewed: WorklistItem[] = [];
  const suggestions: WorklistItem[] = [];
  const awaitingSignature: WorklistItem[] = [];
  const changedSinceSigning: WorklistItem[] = [];
  const failed: WorklistItem[] = [];
  const flagsOf = byVisitId(input.flags);
  const visits = byVisit(input.recordings);
  const newestRunOf = new Map<string, string>();

  for (const [visitId, rows] of visits) {
    const facts = rows[0];
    const current = reviewFingerprintOf(rows);
    const runTimes = rows.flatMap((r) => (r.runCreatedAt === null ? [] : [r.runCreatedAt]));
    const newestRun = runTimes.sort().at(-1);
    if (newestRun !== undefined) newestRunOf.set(visitId, newestRun);
    const review = input.reviews.get(visitId) ?? null;
    const reviewed = current !== null && review?.fingerprint === current.fingerprint;
    if (current !== null && !reviewed && newestRun !== undefined) {
      unreviewed.push(
        item(
          facts,
          {
            key: visitId,
            since: newestRun,
            what:
              review === null
                ? `Results of ${kindsOf(rows)} not reviewed yet`
                : `Results changed since ${review.reviewedByName} reviewed them on ${day(review.reviewedAt)}`,
          },
          'review',
        ),
      );
    }
    const task = rows.find((r) => r.kind === 'task' && r.latestRunId !== null);
    if (task !== undefined && task.suggestsSlowing && task.runCreatedAt !== null) {
      const flags = flagsOf.get(visitId) ?? [];
      const runAt = task.runCreatedAt;
      const decided =
        reviewed ||
        flags.some((f) => f.state === 'raised' || (f.clearedAt !== null && f.clearedAt >= runAt));
      if (!decided) {
        suggestions.push(
          item(
            facts,
            {
              key: visitId,
              kind: 'task',
              recordingId: task.recordingId,
              since: runAt,
              what:
                task.roiDeltaFHz === null
                  ? 'The task result suggests slowing; no flag decision yet'
                  : `The task result suggests slowing (ROI Δf ${signedHz(task.roiDeltaFHz)}); no flag decision yet`,
            },
            'review',
          ),
        );
      }
    }
    for (const row of rows) {
      if (row.state !== 'failed') continue;
      failed.push(
        item(
          facts,
          {
            key: row.recordingId,
            kind: row.kind,
            recordingId: row.recordingId,
            since: row.updatedAt,
            what: failureText(row.kind, row.failureMessage),
          },
          'review',
        ),
      );
    }
  }

  for (const report of input.reports) {
    const rows = visits.get(report.visitId);
    const newestRun = newestRunOf.get(report.visitId);
    if (rows === undefined || newestRun === undefined) continue;
    if (report.state === 'draft') {
      awaitingSignature.push(
        item(
          rows[0],
          {
            key: report.visitId,
            since: report.createdAt,
            what: 'The visit report is a draft waiting for a signature',
          },
          'review',
        ),
      );
    } else if (report.lastSignedAt !== null && newestRun > report.lastSignedAt) {
      changedSinceSigning.push(
        item(
          rows[0],
          {
            key: report.visitId,
            since: newestRun,
            what: `New results since revision ${report.lastRevision ?? '?'} was signed on ${day(report.lastSignedAt)}`,
          },
          'review',
        ),
      );
    }
  }
  return { unreviewed, suggestions, awaitingSignature, changedSinceSigning, failed };
}

export interface UploadInput {
  uploads: UploadRow[];
  /** Visits of the site dated today or earlier. */
  visitsDue: VisitFacts[];
  /** Wording of the warnings of the uploads that have any (by recording id). */
  warnings: Map<string, string[]>;
}

const CURRENT_OR_CHECKING = new Set([
  'received',
  'validating',
  'queued',
  'computing',
  'ready',
  'failed',
]);

/**
 * A technician's sections, from their site's recordings that are not superseded:
 * - rejected: a rejected upload with no later upload of that kind for the visit (one that is
 *   being checked, or current);
 * - warnings: current recordings with standing warnings (the kind confirmed against the
 *   file's look, reader or analysis warnings);
 * - missingKinds: visits dated today or earlier without a resting or a task recording;
 * - failed: current recordings whose computation failed (technicians may retry).
 */
export function uploadSections(input: UploadInput): SectionItems {
  const rejected: WorklistItem[] = [];
  const warnings: WorklistItem[] = [];
  const missingKinds: WorklistItem[] = [];
  const failed: WorklistItem[] = [];
  const visits = byVisit(input.uploads);
  for (const [, rows] of visits) {
    for (const row of rows) {
      if (row.state === 'rejected') {
        const fixed = rows.some(
          (r) =>
            r.kind === row.kind && CURRENT_OR_CHECKING.has(r.state) && r.createdAt > row.createdAt,
        );
        if (!fixed) {
          rejected.push(
            uploadItem(
              row,
              row.updatedAt,
              `The ${KIND_WORD[row.kind]} upload was rejected: ${row.rejection ?? 'no reason recorded'}`,
            ),
          );
        }
      } else if (row.state === 'failed') {
        failed.push(uploadItem(row, row.updatedAt, failureText(row.kind, row.failureMessage)));
      }
      const words = input.warnings.get(row.recordingId);
      if (row.hasWarnings && row.state !== 'rejected' && words !== undefined && words.length > 0) {
        warnings.push(
          uploadItem(
            row,
            row.createdAt,
            `${capitalised(KIND_WORD[row.kind])} recording: ${words[0]}${words.length > 1 ? ` (and ${words.length - 1} more)` : ''}`,
          ),
        );
      }
    }
  }
  for (const visit of input.visitsDue) {
    const rows = visits.get(visit.visitId) ?? [];
    const missing = (['resting', 'task'] as const).filter(
      (kind) => !rows.some((r) => r.kind === kind && CURRENT_OR_CHECKING.has(r.state)),
    );
    if (missing.length === 0) continue;
    missingKinds.push(
      item(
        visit,
        {
          key: visit.visitId,
          kind: missing.length === 1 ? missing[0] : null,
          since: visit.visitDate,
          what:
            missing.length === 2
              ? 'No resting and no task recording yet'
              : `No ${KIND_WORD[missing[0]]} recording yet`,
        },
        'intake',
      ),
    );
  }
  return { rejected, warnings, missingKinds, failed };
}

/**
 * The item as the caller may see it: under blinded review, a visit blinded for the caller
 * (`codes`: visit id → code) shows its code only, its link no participant.
 */
export function shownItem(
  item: WorklistItem,
  blinded: ReadonlyMap<string, BlindedVisit>,
): WorklistItem {
  const visit = blinded.get(item.visitId);
  if (visit === undefined) return item;
  return {
    ...shownVisitFacts(item, visit.code),
    // A time stamp of the visit's own rows would give away its date; a plain date is its date.
    since:
      item.since === null || /^\d{4}-\d{2}-\d{2}$/.test(item.since)
        ? null
        : visit.clock(item.since),
    link: { ...item.link, participantId: null },
  };
}

/**
 * Oldest first (whatever waits longest), newest first, or by participant code then visit date;
 * blinded items (no participant, no date) by their code, after the others.
 */
export function sortItems(items: WorklistItem[], sort: WorklistSort): WorklistItem[] {
  const byCode = (a: WorklistItem, b: WorklistItem) =>
    Number(a.blindCode !== null) - Number(b.blindCode !== null) ||
    (a.participantCode ?? '').localeCompare(b.participantCode ?? '') ||
    (a.visitDate ?? '').localeCompare(b.visitDate ?? '') ||
    a.visitLabel.localeCompare(b.visitLabel) ||
    a.key.localeCompare(b.key);
  const compare =
    sort === 'participant'
      ? byCode
      : (a: WorklistItem, b: WorklistItem) => bySince(a, b, sort === 'newest') || byCode(a, b);
  return [...items].sort(compare);
}

/** By time, either way; an item without one (a blinded visit's date) after every timed one. */
function bySince(a: WorklistItem, b: WorklistItem, newestFirst: boolean): number {
  if (a.since === null || b.since === null) {
    return Number(a.since === null) - Number(b.since === null);
  }
  return newestFirst ? b.since.localeCompare(a.since) : a.since.localeCompare(b.since);
}

function byVisitId(flags: readonly Flag[]): Map<string, Flag[]> {
  const out = new Map<string, Flag[]>();
  for (const flag of flags) out.set(flag.visitId, [...(out.get(flag.visitId) ?? []), flag]);
  return out;
}

function kindsOf(rows: readonly CurrentRecordingRow[]): string {
  const kinds = [...new Set(rows.filter((r) => r.latestRunId !== null).map((r) => r.kind))].sort();
  return kinds.length === 2 ? 'the resting and the task recording' : `the ${kinds[0]} recording`;
}

function failureText(kind: RecordingKind, message: string | null): string {
  return `Computing the ${KIND_WORD[kind]} recording failed${message === null ? '' : `: ${message}`}`;
}

function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
