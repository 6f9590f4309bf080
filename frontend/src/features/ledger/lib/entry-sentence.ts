import type { AuditEntryView } from '@gyre/shared';
import { paths } from '../../../app/paths';
import { changedFields } from './entry-diff';

/** Screens an entry can link to; the page says which of them the viewer may open. */
export type LedgerScreen =
  'review' | 'participant' | 'studySettings' | 'team' | 'studySetup' | 'siteCheck';

/** An entry as one sentence: "‹actor› ‹text› ‹target›: ‹detail›". */
export interface EntrySentence {
  actor: string;
  /** The entry was written by Gyre itself (a computation, an automatic draft). */
  bySystem: boolean;
  text: string;
  /** What the entry is about, linked when the viewer may open it. */
  target: { label: string; to: string | null } | null;
  detail: string | null;
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

const field = (value: unknown, key: string): unknown => (isRecord(value) ? value[key] : undefined);

const text = (value: unknown): string | null =>
  typeof value === 'string' && value.trim() !== '' ? value : null;

/** The sentence as plain text (tests, the list item's accessible description). */
export function sentenceText(sentence: EntrySentence): string {
  const target = sentence.target === null ? '' : ` ${sentence.target.label}`;
  const detail = sentence.detail === null ? '' : `: ${sentence.detail}`;
  return `${sentence.actor} ${sentence.text}${target}${detail}`;
}

/** `resting` → `a resting recording` / `the resting recording`. */
function recordingWords(entry: AuditEntryView, article: 'a' | 'the'): string {
  const kind =
    entry.context?.recordingKind ??
    text(field(entry.after, 'kind')) ??
    text(field(entry.before, 'kind'));
  return kind === null ? `${article} recording` : `${article} ${kind} recording`;
}

const RECORDING_PHRASES: Record<string, (entry: AuditEntryView) => string> = {
  upload: (e) => `uploaded ${recordingWords(e, 'a')} for`,
  validate: (e) => `started checking ${recordingWords(e, 'the')} for`,
  accept: (e) => `accepted ${recordingWords(e, 'the')} for computation for`,
  reject: (e) => `rejected ${recordingWords(e, 'the')} for`,
  compute: (e) => `started computing ${recordingWords(e, 'the')} for`,
  ready: (e) => `computed ${recordingWords(e, 'the')} for`,
  'attempt-failed': (e) =>
    `will try again: a computation of ${recordingWords(e, 'the')} failed for`,
  fail: (e) => `could not compute ${recordingWords(e, 'the')} for`,
  supersede: (e) => `replaced ${recordingWords(e, 'the')} for`,
  rerun: (e) => `asked to compute again ${recordingWords(e, 'the')} for`,
  retry: (e) => `retried ${recordingWords(e, 'the')} for`,
  recompute: (e) => `recomputed ${recordingWords(e, 'the')} for`,
  download: (e) => `downloaded ${recordingWords(e, 'the')} for`,
};

const REPORT_PHRASES: Record<string, (entry: AuditEntryView) => string> = {
  create: () => 'opened the draft report for',
  preview: () => 'previewed the report for',
  sign: (e) => {
    const revision = field(field(e.after, 'revision'), 'revision');
    return typeof revision === 'number'
      ? `signed report revision ${revision} for`
      : 'signed the report for';
  },
  'sign-refused': () => 'was refused signing the report for',
  download: () => 'downloaded the report for',
  notify: () => 'e-mailed the report to the coordinators for',
  sent: () => 'delivered the report to every coordinator for',
};

const SESSION_PHRASES: Record<string, string> = {
  'sign-in': 'signed in',
  'sign-out': 'signed out',
  'sign-in-failed': 'failed to sign in',
  'sign-in-throttled': 'was held back from signing in after too many attempts',
  'refresh-reuse': 'presented a sign-in token that was already used; the session was ended',
};

const ACCOUNT_PHRASES: Record<string, string> = {
  'password-change': 'changed their password',
  'password-reset-request': 'asked for a password reset',
  'password-reset': 'reset their password',
  'invitation-accepted': 'accepted the invitation and set a password',
  'account-locked': 'had the account locked after wrong passwords',
  'sign-in-throttled': 'was held back from signing in after too many attempts',
};

const USER_PHRASES: Record<string, string> = {
  invite: 'invited',
  create: 'created the account of',
  update: 'changed the account of',
  'role-change': 'changed the role of',
};

/** A site's calibration run (calibration/): started by a person, judged by the system. */
const CALIBRATION_PHRASES: Record<string, string> = {
  start: 'started a calibration run of',
  pass: 'found the calibration run passed for',
  fail: 'found the calibration run failed for',
};

const SETUP_NOUNS: Record<string, string> = {
  Study: 'the study',
  Site: 'the site',
  PlannedVisit: 'the planned visit',
  StudyGroup: 'the group',
};

const SETUP_VERBS: Record<string, string> = {
  create: 'added',
  update: 'changed',
  delete: 'removed',
};

/** `VisitAnalysisOverride` → `visit analysis override`. */
const typeWords = (type: string) => type.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();

/** The changed settings in one line: `Band 8.00–13.00 Hz → 7.00–13.00 Hz; Method …`. */
function settingsChanges(entry: AuditEntryView): string | null {
  const rows = changedFields(entry.before, entry.after, entry.context?.people).filter(
    (row) => row.path !== 'version' && row.path !== 'revision',
  );
  if (rows.length === 0) return null;
  return rows.map((row) => `${row.label} ${row.before} → ${row.after}`).join('; ');
}

/**
 * An audit entry as a sentence a monitor reads: who did what to which participant's visit, and
 * why; with a link to the screen where the object is, when the viewer may open it.
 */
export function entrySentence(
  entry: AuditEntryView,
  canOpen: (screen: LedgerScreen) => boolean,
): EntrySentence {
  const context = entry.context;
  const bySystem = entry.actorId === null && entry.actorEmail === null;
  const actor = bySystem
    ? 'The system'
    : (context?.actorName ?? entry.actorEmail ?? 'Someone out of your access');
  const link = (screen: LedgerScreen, to: string) => (canOpen(screen) ? to : null);
  const visitTarget = () => {
    if (context?.visitId && context.participantCode !== null) {
      return {
        label: `${context.participantCode} · ${context.visitLabel ?? 'visit'}`,
        to: link('review', paths.review(context.visitId)),
      };
    }
    return { label: 'a visit outside your access', to: null };
  };
  const sentence = (
    phrase: string,
    target: EntrySentence['target'],
    detail: string | null = entry.reason,
  ): EntrySentence => ({ actor, bySystem, text: phrase, target, detail });
  const objectName = (): string | null =>
    text(field(entry.after, 'name')) ??
    text(field(entry.after, 'code')) ??
    text(field(entry.after, 'label')) ??
    text(field(entry.before, 'name')) ??
    text(field(entry.before, 'code')) ??
    text(field(entry.before, 'label'));

  switch (entry.objectType) {
    case 'Recording':
    case 'AnalysisRun': {
      const phrase = RECORDING_PHRASES[entry.action];
      if (phrase !== undefined) return sentence(phrase(entry), visitTarget());
      break;
    }
    case 'Flag':
      if (entry.action === 'raise') return sentence('raised a slowing flag on', visitTarget());
      if (entry.action === 'clear') return sentence('cleared the slowing flag on', visitTarget());
      break;
    case 'Report': {
      const phrase = REPORT_PHRASES[entry.action];
      if (phrase !== undefined) {
        // The signature's meaning is on the revision itself; the sentence stays short.
        return sentence(
          phrase(entry),
          visitTarget(),
          entry.action === 'sign' ? null : entry.reason,
        );
      }
      break;
    }
    case 'VisitReview':
      if (entry.action === 'review')
        return sentence('marked as reviewed the results of', visitTarget());
      break;
    case 'VisitAnalysisOverride':
      return sentence('changed the analysis settings of', visitTarget(), settingsChanges(entry));
    case 'Visit':
      if (entry.action === 'unblind') {
        // Blinded review: the decision ("flag" / "noFlag") and its reason, after the visit.
        const decision = field(entry.after, 'decision') === 'flag' ? 'a flag' : 'no flag';
        const code = text(field(entry.after, 'code'));
        const target = visitTarget();
        return sentence(
          'unblinded visit',
          { ...target, label: code === null ? target.label : `${code} (${target.label})` },
          `for themselves after recording the decision, ${decision}: ${entry.reason ?? ''}`,
        );
      }
      if (entry.action === 'create' || entry.action === 'update') {
        return sentence(
          entry.action === 'create' ? 'added the visit' : 'changed the visit',
          visitTarget(),
        );
      }
      break;
    case 'Participant':
      if (entry.action === 'create' || entry.action === 'update') {
        const code = context?.participantCode ?? null;
        return sentence(
          entry.action === 'create' ? 'added participant' : 'changed participant',
          code !== null && context?.participantId
            ? { label: code, to: link('participant', paths.participant(context.participantId)) }
            : { label: 'outside your access', to: null },
        );
      }
      break;
    case 'AnalysisSettings':
      return sentence(
        'changed the',
        { label: 'analysis settings', to: link('studySettings', paths.studySettings) },
        settingsChanges(entry),
      );
    case 'Session': {
      const phrase = SESSION_PHRASES[entry.action];
      if (phrase !== undefined) return sentence(phrase, null);
      break;
    }
    case 'User': {
      const own = ACCOUNT_PHRASES[entry.action];
      if (own !== undefined) return sentence(own, null);
      const phrase = USER_PHRASES[entry.action];
      if (phrase !== undefined) {
        const name =
          (entry.objectId !== null ? context?.people[entry.objectId] : undefined) ??
          'an account outside your access';
        return sentence(
          entry.action === 'invite' && entry.reason !== null ? 'sent a new invitation to' : phrase,
          { label: name, to: link('team', paths.team) },
          entry.action === 'invite' ? null : entry.reason,
        );
      }
      break;
    }
    case 'Study':
      if (entry.action === 'bulk-upload')
        return sentence('imported a bulk upload into the study', null);
      if (entry.action === 'export') return sentence("exported the study's results", null);
      break;
    case 'WorkerToken':
      if (entry.action === 'create') return sentence('created a worker token', null);
      if (entry.action === 'revoke') return sentence('revoked a worker token', null);
      break;
    case 'Calibration': {
      const phrase = CALIBRATION_PHRASES[entry.action];
      if (phrase !== undefined) {
        const code = text(field(entry.after, 'siteCode'));
        return sentence(
          phrase,
          {
            label: code === null ? 'a site' : `site ${code}`,
            to: link('siteCheck', paths.siteCheck),
          },
          text(field(entry.after, 'error')),
        );
      }
      break;
    }
    case 'AuditEntry':
      if (entry.action === 'export') {
        return sentence(
          field(entry.after, 'format') === 'csv'
            ? 'exported the Ledger as CSV'
            : "downloaded the Ledger's signed checkpoints",
          null,
          null,
        );
      }
      break;
    default:
      break;
  }
  const noun = SETUP_NOUNS[entry.objectType];
  const verb = SETUP_VERBS[entry.action];
  if (noun !== undefined && verb !== undefined) {
    const name = objectName();
    return sentence(
      `${verb} ${noun}`,
      name === null ? null : { label: name, to: link('studySetup', paths.studySetup) },
    );
  }
  // An action this page has no words for yet: say what was recorded, plainly.
  const onVisit = context?.visitId ? visitTarget() : null;
  return sentence(
    `recorded “${entry.action}” on a ${typeWords(entry.objectType)}${onVisit ? ' of' : ''}`,
    onVisit,
  );
}
