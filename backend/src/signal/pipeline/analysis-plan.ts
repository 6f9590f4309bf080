/**
 * The first step of a run: everything decided before any sample is looked at (the settings
 * checked, the band, the kind, the onsets and the trials every channel drops, which signals
 * are analysed). A plan is plain data, so the same plan can travel to every part of a run
 * (`analyzeChannels`) and to its merge (`mergeChannelParts`).
 */
import { normaliseChannelLabel, roiChannels } from '../channels';
import { DataSegmentS, EpochDropReason, screenTrials } from '../trials/epochs';
import { artefactRegExp, stimulusAnnotations } from '../onsets/stimulus-annotations';
import { conditionKey } from '../trials/condition-statistics';
import {
  AnalysisComputation,
  AnalysisComputationOptions,
  resolveComputation,
} from './analysis-computation';
import { AnalysisInputError } from './analysis-input-error';
import {
  AnalysisBandSource,
  AnalysisSettings,
  copyAnalysisSettings,
  resolveAnalysisBand,
} from './analysis-settings';
import type {
  AnalysisAnnotation,
  AnalysisContext,
  AnalysisRecording,
  OnsetInput,
} from './analysis.types';

/** What a plan reads of a recording: everything but the samples. */
export interface RecordingOutline {
  signals: readonly { label: string; sampleRateHz: number }[];
  annotations?: readonly AnalysisAnnotation[];
  /** Seconds. */
  durationS: number;
  /** Start of each data record, s (EDF+D may have gaps between records). */
  recordStartsS?: Float64Array;
  header?: { recordDurationS: number };
}

/** One channel a run analyses. */
export interface PlannedChannel {
  /** Index of the signal in the recording (`RecordingOutline.signals`). */
  signalIndex: number;
  label: string;
  /** Canonical 10-10 name, null when the label is not one. */
  electrode: string | null;
  sampleRateHz: number;
  /**
   * A region-of-interest channel present in the file: the merge may average it (if it is
   * neither flat nor saturated), so a task run keeps its epochs until then.
   */
  roiCandidate: boolean;
}

export interface AnalysisPlan {
  kind: 'task' | 'rest';
  /** The settings the run was given (a copy). */
  settings: AnalysisSettings;
  iafHz: number | null;
  bandHz: [number, number];
  bandSource: AnalysisBandSource;
  computation: AnalysisComputation;
  /** Centre of the Morlet wavelet, Hz; null for 'filter'. */
  morletCentreHz: number | null;
  durationS: number;
  /** The channels analysed, in the recording's order. */
  channels: PlannedChannel[];
  /** The chosen stimulus onsets in time order, s from the recording start. */
  onsetsS: number[];
  /** The label (annotation text, CSV label) of each chosen onset: its condition. */
  onsetLabels: string[];
  /** The two conditions the caller asked to compare (over the settings' pair); null: none. */
  requestedConditions: [string, string] | null;
  /** The same onsets in the time of the concatenated samples (gaps of EDF+D left out), s. */
  dataOnsetsS: number[];
  /** Why each trial is dropped on every channel (edge, artefact); null: not (yet) dropped. */
  trialReasons: (EpochDropReason | null)[];
  /** Warnings known before any sample is read, in the order a result lists them. */
  warnings: { channels: string[]; gaps: string[] };
}

/** The outline of a recording in memory (duration: the longest signal when not given). */
export function outlineOf(recording: AnalysisRecording): RecordingOutline {
  return {
    signals: recording.signals,
    annotations: recording.annotations,
    durationS:
      recording.durationS ??
      Math.max(...recording.signals.map((s) => s.samples.length / s.sampleRateHz)),
    recordStartsS: recording.recordStartsS,
    header: recording.header,
  };
}

/**
 * Indices of the signals a run analyses: the 10-10 scalp electrodes, or every signal when
 * no label is one (`isAnalysedSignal` makes the same choice from an EDF header).
 */
export function analysedSignalIndices(labels: readonly string[]): number[] {
  const electrodes = labels.map((label) => normaliseChannelLabel(label));
  const none = electrodes.every((e) => e === null);
  return labels.flatMap((_, i) => (none || electrodes[i] !== null ? [i] : []));
}

/**
 * Checks the inputs of a run and decides everything that does not depend on the samples
 * (docs/method.md §2–§4): the band only from `resolveAnalysisBand(settings, iafHz)`, the
 * Morlet centre (the IAF when known, else the band centre), the kind, the onsets and the
 * reasons that drop a trial on every channel. Throws `AnalysisInputError` naming what is
 * wrong, in the order `analyzeRecording` always checked.
 */
export function planAnalysis(
  outline: RecordingOutline,
  settingsIn: Readonly<AnalysisSettings>,
  context: Omit<AnalysisContext, 'onProgress'>,
  computationOptions: AnalysisComputationOptions = {},
): AnalysisPlan {
  if (outline.signals.length === 0) {
    throw new AnalysisInputError('signals', 'recording: expected at least one signal, got none');
  }
  for (const s of outline.signals) {
    if (!(s.sampleRateHz > 0)) {
      throw new AnalysisInputError(
        'sampleRateHz',
        `signal "${s.label}": expected a positive sampling rate, got ${s.sampleRateHz} Hz`,
      );
    }
  }
  const iafHz = context.iafHz;
  checkSettings(settingsIn, iafHz);
  const settings = copyAnalysisSettings(settingsIn);
  const computation = resolveComputation(computationOptions);
  const { durationS } = outline;

  const artefactPattern = artefactRegExp(computation.artefactPattern);
  if (artefactPattern === null) {
    throw new AnalysisInputError(
      'artefactPattern',
      `artefactPattern: expected a regular expression, got "${computation.artefactPattern}"`,
    );
  }
  const onsets = chooseOnsets(outline, settings.onsetLabel, context.onsets, artefactPattern);
  const kind = context.kind === 'auto' ? (onsets.length > 0 ? 'task' : 'rest') : context.kind;
  if (kind === 'task' && onsets.length === 0) {
    const where = context.onsets ? 'the onset list' : 'the annotations';
    const label = settings.onsetLabel ? ` labelled "${settings.onsetLabel}"` : '';
    throw new AnalysisInputError(
      'onsets',
      `onsets: a task analysis needs stimulus onsets, found none${label} in ${where}`,
    );
  }
  const { bandHz, bandSource } = resolveAnalysisBand(settings, iafHz);
  const iafKnown = iafHz !== null && Number.isFinite(iafHz);

  const labels = outline.signals.map((s) => s.label);
  const analysed = analysedSignalIndices(labels);
  const channelWarnings: string[] = [];
  if (labels.every((label) => normaliseChannelLabel(label) === null)) {
    channelWarnings.push('No channel label is a 10-10 electrode: every signal is analysed.');
  }
  const candidates = new Set(
    roiChannels(
      analysed.map((i) => labels[i]),
      settings.roi,
    ).map((r) => r.index),
  );
  const channels: PlannedChannel[] = analysed.map((signalIndex, index) => ({
    signalIndex,
    label: labels[signalIndex],
    electrode: normaliseChannelLabel(labels[signalIndex]),
    sampleRateHz: outline.signals[signalIndex].sampleRateHz,
    roiCandidate: candidates.has(index),
  }));

  const segments = dataSegments(outline);
  const gapWarnings: string[] = [];
  if (segments.length > 1) {
    gapWarnings.push(
      `The recording has ${segments.length - 1} gap(s): epochs across a gap are dropped.`,
    );
  }
  const artefacts = (outline.annotations ?? [])
    .filter((a) => artefactPattern.test(a.text))
    .map((a) => ({ startS: a.onsetS, endS: a.onsetS + Math.max(0, a.durationS ?? 0) }));
  const onsetsS = onsets.map((o) => o.onsetS);
  return {
    kind,
    settings,
    iafHz,
    bandHz,
    bandSource,
    computation,
    morletCentreHz:
      settings.method === 'morlet' ? (iafKnown ? iafHz : (bandHz[0] + bandHz[1]) / 2) : null,
    durationS,
    channels,
    onsetsS,
    onsetLabels: onsets.map((o) => o.label),
    requestedConditions: context.compareConditions
      ? [context.compareConditions[0], context.compareConditions[1]]
      : null,
    dataOnsetsS: onsetsS.map((t) => toDataTimeS(t, segments)),
    trialReasons: screenTrials(onsetsS, {
      recordingDurationS: durationS,
      segmentsS: segments,
      epochWindowS: settings.epochWindowS,
      edgeGuardS: computation.edgeGuardS,
      artefacts,
    }),
    warnings: { channels: channelWarnings, gaps: gapWarnings },
  };
}

const isConditionPair = (v: unknown): boolean =>
  Array.isArray(v) &&
  v.length === 2 &&
  v.every((x) => typeof x === 'string' && x.trim() !== '') &&
  conditionKey(v[0] as string) !== conditionKey(v[1] as string);

const isPair = (v: unknown): v is [number, number] =>
  Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number' && Number.isFinite(x));

/**
 * Settings the computation cannot run with. The server validates settings when they are
 * saved; this catches what reaches the core by another way (command line, tests).
 */
function checkSettings(settings: Readonly<AnalysisSettings>, iafHz: number | null): void {
  const fail = (field: string, found: string, expected: string): never => {
    throw new AnalysisInputError(field, `${field}: ${found} found, ${expected} expected`);
  };
  const text = (v: unknown): string => JSON.stringify(v) ?? String(v);
  if (settings.bandHz !== null) {
    const b = settings.bandHz;
    if (!isPair(b) || !(b[0] > 0 && b[1] > b[0]))
      fail('bandHz', text(b), '[low, high] with 0 < low < high');
  }
  if (settings.method !== 'filter' && settings.method !== 'morlet') {
    fail('method', text(settings.method), '"filter" or "morlet"');
  }
  if (!(settings.morletCycles > 0))
    fail('morletCycles', text(settings.morletCycles), 'a positive number');
  for (const field of ['epochWindowS', 'baselineWindowS', 'postWindowS'] as const) {
    const w = settings[field];
    if (!isPair(w) || !(w[1] > w[0])) fail(field, text(w), '[start, end] with start < end, s');
  }
  const [e0, e1] = settings.epochWindowS;
  for (const field of ['baselineWindowS', 'postWindowS'] as const) {
    const w = settings[field];
    if (w[0] < e0 || w[1] > e1)
      fail(field, text(w), `a window inside the epoch ${text(settings.epochWindowS)}`);
  }
  if (!(settings.rejectionThresholdUv > 0)) {
    fail('rejectionThresholdUv', text(settings.rejectionThresholdUv), 'a positive number of µV');
  }
  if (!Number.isFinite(settings.flagThresholdHz)) {
    fail('flagThresholdHz', text(settings.flagThresholdHz), 'a number of Hz');
  }
  if (!Array.isArray(settings.roi) || settings.roi.some((n) => typeof n !== 'string')) {
    fail('roi', text(settings.roi), 'a list of 10-10 channel names');
  }
  const pair = settings.compareConditions;
  if (pair !== null && pair !== undefined && !isConditionPair(pair)) {
    fail('compareConditions', text(pair), 'null or two different, non-empty onset labels');
  }
  if (iafHz !== null && !(Number.isFinite(iafHz) && iafHz > 0)) {
    fail('iafHz', text(iafHz), 'a positive frequency in Hz or null');
  }
}

/** Gap-free stretches of the recording and how recording time maps to sample time. */
interface Segment extends DataSegmentS {
  /** Time of the segment's first sample in the concatenated samples, s. */
  dataStartS: number;
}

function dataSegments(outline: RecordingOutline): Segment[] {
  const starts = outline.recordStartsS;
  const recordS = outline.header?.recordDurationS;
  if (!starts || starts.length === 0 || !recordS) {
    return [{ startS: 0, endS: outline.durationS, dataStartS: 0 }];
  }
  const segments: Segment[] = [];
  let current: Segment = { startS: starts[0], endS: starts[0] + recordS, dataStartS: 0 };
  for (let r = 1; r < starts.length; r++) {
    if (Math.abs(starts[r] - current.endS) > 1e-6) {
      segments.push(current);
      current = { startS: starts[r], endS: starts[r] + recordS, dataStartS: r * recordS };
    } else {
      current.endS = starts[r] + recordS;
    }
  }
  segments.push(current);
  return segments;
}

function toDataTimeS(t: number, segments: readonly Segment[]): number {
  const g = segments.find((s) => t >= s.startS && t < s.endS) ?? segments[0];
  return g.dataStartS + (t - g.startS);
}

function chooseOnsets(
  outline: RecordingOutline,
  onsetLabel: string | null,
  given: readonly OnsetInput[] | undefined,
  artefactPattern: RegExp,
): OnsetInput[] {
  let onsets: OnsetInput[] = given
    ? given.map((o) => ({ onsetS: o.onsetS, label: o.label }))
    : stimulusAnnotations(outline.annotations ?? [], artefactPattern).map((a) => ({
        onsetS: a.onsetS,
        label: a.text,
      }));
  const wanted = onsetLabel?.trim().toLowerCase();
  if (wanted) onsets = onsets.filter((o) => o.label.trim().toLowerCase() === wanted);
  return onsets.sort((a, b) => a.onsetS - b.onsetS);
}
