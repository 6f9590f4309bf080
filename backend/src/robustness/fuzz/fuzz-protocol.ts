/**
 * Messages between the fuzz runner and its worker thread, and the judgement of one case:
 * what the validation gave and whether that breaks the contract. The contract (the brief of
 * the validation lane): every input ends, within 1 s and 256 MB, in a result or a clear
 * error naming a field; nothing else may be thrown, nothing may crash or hang.
 */
import type { RecordingFacts, ValidateOutcome } from '../../jobs/worker/worker-tasks';

/** Time one case may take (validation is on the upload's path: the technician waits). */
export const CASE_TIME_LIMIT_MS = 1000;
/** Memory one case may use, heap and array buffers together. */
export const CASE_MEMORY_LIMIT_BYTES = 256 * 1024 * 1024;

export interface CaseLimits {
  timeMs: number;
  memoryBytes: number;
}

export const CONTRACT_LIMITS: CaseLimits = {
  timeMs: CASE_TIME_LIMIT_MS,
  memoryBytes: CASE_MEMORY_LIMIT_BYTES,
};

/** Case numbers at which the worker misbehaves on purpose (the runner's own test only). */
export interface InjectedFaults {
  hang: number[];
  heap: number[];
  exception: number[];
}

export const NO_FAULTS: InjectedFaults = { hang: [], heap: [], exception: [] };

export interface CaseRequest {
  index: number;
  edf: Uint8Array;
  kind: 'task' | 'resting';
  onsetsCsv: string | null;
}

/** What escaped `validateRecording`, flattened so it survives the thread boundary. */
export interface ThrownError {
  constructorName: string;
  message: string;
  stack: string;
  /** EdfFormatError or OnsetCsvError (the clear errors of the signal core). */
  clear: boolean;
  field: string | null;
}

export interface CaseReply {
  index: number;
  /** Wall time of `validateRecording` alone (the file is written before the clock starts). */
  elapsedMs: number;
  /** Growth of the worker's heap and array buffers over the case, from a collected heap. */
  memoryGrowthBytes: number;
  outcome: ValidateOutcome | null;
  thrown: ThrownError | null;
}

export type OutcomeKind = 'accepted' | 'rejected' | 'thrown-clear-error';

export type ViolationKind =
  'exception' | 'unclear-rejection' | 'implausible-result' | 'slow' | 'memory' | 'hang' | 'crash';

export interface Judgement {
  kind: OutcomeKind | 'violation';
  /** The field a rejection names, normalised for counting (numbers and labels taken out). */
  field: string | null;
  violations: Array<{ kind: ViolationKind; detail: string }>;
}

/**
 * "signal 3 ('EEG O1-REF') digital minimum" → "signal N digital minimum", so the summary
 * counts reasons rather than individual files.
 */
export function normaliseField(field: string): string {
  return field
    .replace(/'[^']*'/g, '…')
    .replace(/\(record \d+, signal \d+, byte \d+\)/g, '(record N, signal N, byte N)')
    .replace(/\d+/g, 'N')
    .replace(/\s*\(…\)/g, '');
}

/** Why accepted facts could not describe a real recording (null: plausible). */
export function implausibility(facts: RecordingFacts): string | null {
  const finitePositive = (v: number): boolean => Number.isFinite(v) && v > 0;
  if (!finitePositive(facts.durationS)) return `durationS ${facts.durationS}`;
  if (!finitePositive(facts.recordDurationS)) return `recordDurationS ${facts.recordDurationS}`;
  if (!(Number.isSafeInteger(facts.recordCount) && facts.recordCount >= 1)) {
    return `recordCount ${facts.recordCount}`;
  }
  if (facts.channelLabels.length === 0) return 'no channel';
  const badRate = facts.sampleRatesHz.find((r) => !finitePositive(r));
  if (badRate !== undefined) return `sample rate ${badRate}`;
  const badOnset = facts.csvOnsets?.find((o) => !(o.onsetS >= 0 && o.onsetS < facts.durationS));
  if (badOnset !== undefined) return `CSV onset ${badOnset.onsetS} outside 0..${facts.durationS}`;
  return null;
}

function namesItsField(message: string, field: string): boolean {
  if (field === 'onsets' && /^onset CSV, line \d+/.test(message)) return true;
  return message.startsWith(`${field}: `);
}

export function judge(reply: CaseReply, limits: CaseLimits = CONTRACT_LIMITS): Judgement {
  const violations: Judgement['violations'] = [];
  if (reply.elapsedMs > limits.timeMs) {
    violations.push({
      kind: 'slow',
      detail: `${reply.elapsedMs.toFixed(0)} ms (limit ${limits.timeMs} ms)`,
    });
  }
  if (reply.memoryGrowthBytes > limits.memoryBytes) {
    violations.push({
      kind: 'memory',
      detail: `${(reply.memoryGrowthBytes / 2 ** 20).toFixed(0)} MB`,
    });
  }
  if (reply.thrown !== null) {
    if (!reply.thrown.clear) {
      violations.push({
        kind: 'exception',
        detail: `${reply.thrown.constructorName}: ${reply.thrown.message}\n${reply.thrown.stack}`,
      });
      return { kind: 'violation', field: null, violations };
    }
    const field = reply.thrown.field ?? '';
    return {
      kind: violations.length > 0 ? 'violation' : 'thrown-clear-error',
      field: normaliseField(field),
      violations,
    };
  }
  const outcome = reply.outcome as ValidateOutcome;
  if (outcome.ok) {
    const why = implausibility(outcome.facts);
    if (why !== null) violations.push({ kind: 'implausible-result', detail: why });
    return { kind: violations.length > 0 ? 'violation' : 'accepted', field: null, violations };
  }
  // A clear rejection names its field, and its message (what the technician reads) starts
  // with it: "number of data records: 7 found, …"; onset CSV messages name the line instead.
  if (!outcome.field || !namesItsField(outcome.message, outcome.field)) {
    violations.push({
      kind: 'unclear-rejection',
      detail: `field ${JSON.stringify(outcome.field)}, message ${JSON.stringify(outcome.message)}`,
    });
  }
  return {
    kind: violations.length > 0 ? 'violation' : 'rejected',
    field: outcome.field ? normaliseField(outcome.field) : null,
    violations,
  };
}
