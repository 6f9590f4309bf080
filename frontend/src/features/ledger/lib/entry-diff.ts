import {
  formatBytes,
  formatDeltaHz,
  formatHz,
  formatNumber,
  formatQuantity,
  formatQuantityRange,
  formatSeconds,
  formatSignificant,
  NO_VALUE,
} from '../../../lib/format';
import { formatLedgerTime } from './ledger-time';

/** One changed field of an audit entry, in words: `Band: 8.00–13.00 Hz → 7.00–13.00 Hz`. */
export interface ChangedField {
  /** Dotted path in the recorded JSON (`revision.revision`), for keys and tests. */
  path: string;
  label: string;
  before: string;
  after: string;
}

/** How a recorded field is named and written. Fields not listed get their camelCase in words. */
interface FieldSpec {
  label: string;
  show?: (value: unknown, people: Record<string, string>) => string;
  /** Bookkeeping the reader gains nothing from (ids that stay, time stamps of the write). */
  hidden?: boolean;
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

const isPair = (value: unknown): value is [number, number] =>
  Array.isArray(value) &&
  value.length === 2 &&
  value.every((v) => typeof v === 'number' && Number.isFinite(v));

const hzRange = (value: unknown) =>
  isPair(value) ? formatQuantityRange(value, 'frequencyHz', '–') : plain(value);
const secondsRange = (value: unknown) =>
  isPair(value) ? formatQuantityRange(value, 'timeFromOnsetS', ' to ') : plain(value);
/** A number written by `format`; anything else as it is. */
const numberAs =
  (format: (value: number) => string) =>
  (value: unknown): string =>
    typeof value === 'number' ? format(value) : plain(value);
const hz = numberAs(formatHz);
const deltaHz = numberAs(formatDeltaHz);
const microvolts = numberAs((value) => formatQuantity(value, 'amplitudeUv'));
const seconds = numberAs(formatSeconds);
const bytes = numberAs(formatBytes);
const time = (value: unknown) =>
  typeof value === 'string' && value !== '' ? formatLedgerTime(value) : plain(value);
const person = (value: unknown, people: Record<string, string>) =>
  typeof value === 'string' ? (people[value] ?? `user ${value.slice(0, 8)}`) : plain(value);
const words = (value: unknown) =>
  typeof value === 'string' ? value.replace(/[-_]/g, ' ') : plain(value);

const FIELDS: Record<string, FieldSpec> = {
  state: { label: 'State', show: words },
  reason: { label: 'Reason' },
  raiseReason: { label: 'Reason for raising' },
  clearReason: { label: 'Reason for clearing' },
  replacementReason: { label: 'Reason for replacing' },
  code: { label: 'Code' },
  label: { label: 'Label' },
  name: { label: 'Name' },
  email: { label: 'E-mail' },
  role: { label: 'Role', show: words },
  description: { label: 'Description' },
  visitDate: { label: 'Visit date' },
  kind: { label: 'Kind', show: words },
  kindConfirmed: { label: 'Kind confirmed by the uploader' },
  version: { label: 'Settings version' },
  revision: { label: 'Revision' },
  bandHz: { label: 'Band', show: hzRange },
  method: { label: 'Method', show: words },
  morletCycles: { label: 'Morlet cycles' },
  epochWindowS: { label: 'Epoch window', show: secondsRange },
  baselineWindowS: { label: 'Baseline window', show: secondsRange },
  postWindowS: { label: 'Post-onset window', show: secondsRange },
  rejectionThresholdUv: { label: 'Rejection threshold', show: microvolts },
  flagThresholdHz: { label: 'Flag threshold', show: deltaHz },
  iafHz: { label: 'Resting IAF', show: hz },
  roi: { label: 'Region of interest' },
  onsetLabel: { label: 'Onset label' },
  sizeBytes: { label: 'File size', show: bytes },
  durationS: { label: 'Duration', show: seconds },
  channels: { label: 'Channels' },
  stimulusOnsetCount: { label: 'Stimulus onsets in the file' },
  csvOnsetCount: { label: 'Onsets in the CSV' },
  checksumSha256: { label: 'File checksum (SHA-256)' },
  onsetsChecksumSha256: { label: 'Onsets checksum (SHA-256)' },
  trigger: { label: 'Started by', show: words },
  automatic: { label: 'Automatic' },
  attempt: { label: 'Attempt' },
  newRun: { label: 'New run stored' },
  numbersChanged: { label: 'Numbers changed' },
  raisedById: { label: 'Raised by', show: person },
  clearedById: { label: 'Cleared by', show: person },
  createdById: { label: 'Created by', show: person },
  uploadedById: { label: 'Uploaded by', show: person },
  signedById: { label: 'Signed by', show: person },
  reviewedById: { label: 'Reviewed by', show: person },
  userId: { label: 'User', show: person },
  raisedAt: { label: 'Raised at', show: time },
  clearedAt: { label: 'Cleared at', show: time },
  signedAt: { label: 'Signed at', show: time },
  sentAt: { label: 'Sent at', show: time },
  reviewedAt: { label: 'Reviewed at', show: time },
  lockedUntil: { label: 'Locked until', show: time },
  lastSignInAt: { label: 'Last sign-in', show: time },
  createdAt: { label: 'Created', hidden: true },
  updatedAt: { label: 'Updated', hidden: true },
  id: { label: 'Id', hidden: true },
  studyId: { label: 'Study id', hidden: true },
  siteId: { label: 'Site id', hidden: true },
  participantId: { label: 'Participant id', hidden: true },
  visitId: { label: 'Visit id', hidden: true },
  jobId: { label: 'Job id', hidden: true },
  runId: { label: 'Run id', hidden: true },
};

/** `onsetsChecksumSha256` → `Onsets checksum sha256`. */
function camelToWords(key: string): string {
  const spaced = key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[-_]/g, ' ')
    .toLowerCase();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** A value without a known unit: numbers through the shared formatter, absent as `—`. */
export function plain(value: unknown): string {
  if (value === null || value === undefined || value === '') return NO_VALUE;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') {
    return Number.isInteger(value) ? formatNumber(value, 0) : formatSignificant(value, 4);
  }
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) {
    if (value.length === 0) return NO_VALUE;
    return value.map((item) => (isRecord(item) ? JSON.stringify(item) : plain(item))).join(', ');
  }
  return JSON.stringify(value);
}

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/** Nested records become dotted paths (`revision.revision`); anything else is a leaf. */
function flatten(value: unknown, prefix: string, into: Map<string, unknown>): void {
  if (!isRecord(value)) {
    if (prefix !== '') into.set(prefix, value);
    return;
  }
  for (const [key, field] of Object.entries(value)) {
    flatten(field, prefix === '' ? key : `${prefix}.${key}`, into);
  }
}

function labelOf(path: string): { label: string; spec: FieldSpec | undefined } {
  const keys = path.split('.');
  const spec = FIELDS[keys[keys.length - 1]];
  const label = keys.map((key) => FIELDS[key]?.label ?? camelToWords(key)).join(' › ');
  return { label, spec };
}

/**
 * The fields an entry changed, in words, with labels and units: fields that hold the same value
 * before and after are left out, and so is bookkeeping (ids, write time stamps). A create has
 * "—" before; a value that is not an object (e.g. `null` → `{…}`) is compared field by field.
 */
export function changedFields(
  before: unknown,
  after: unknown,
  people: Record<string, string> = {},
): ChangedField[] {
  const old = new Map<string, unknown>();
  const next = new Map<string, unknown>();
  if (isRecord(before) || isRecord(after)) {
    flatten(isRecord(before) ? before : {}, '', old);
    flatten(isRecord(after) ? after : {}, '', next);
  } else if (!same(before, after)) {
    old.set('value', before);
    next.set('value', after);
  }
  const paths = [...new Set([...old.keys(), ...next.keys()])];
  const rows: ChangedField[] = [];
  for (const path of paths) {
    const a = old.get(path);
    const b = next.get(path);
    if (same(a, b)) continue;
    const { label, spec } = labelOf(path);
    if (spec?.hidden === true) continue;
    const show = spec?.show ?? plain;
    rows.push({ path, label, before: show(a, people), after: show(b, people) });
  }
  return rows;
}
