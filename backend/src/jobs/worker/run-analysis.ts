import { isDeepStrictEqual } from 'node:util';
import { analysedChannelSamples, ChannelRange } from '../../signal/pipeline/analyze-edf-recording';
import { mergeChannelParts } from '../../signal/pipeline/merge-channel-parts';
import { toAnalyzeOutcome } from '../../signal/pipeline/run-summary';
import { layoutParts, PART_BATCH_BYTES, partWork } from './analysis-parts';
import { analyzePart } from './analyze-part';
import type {
  AnalyzeOutcome,
  AnalyzePartTask,
  AnalyzeTask,
  MergeTask,
  PartOutcome,
} from './worker-tasks';

/** Progress when every part is done; the merge brings it to 99 (the server stores the rest). */
const PARTS_DONE_PERCENT = 97;
const MERGED_PERCENT = 99;

/** Where a computation's parts and merge run: the pool's threads, or this thread. */
export interface AnalysisRunner {
  part(
    task: Omit<AnalyzePartTask, 'progressPort'>,
    onProgress: (fraction: number) => void,
    signal: AbortSignal,
  ): Promise<PartOutcome>;
  merge(task: MergeTask): Promise<AnalyzeOutcome>;
}

/** One part done: which channels, on which thread, when. */
export interface PartReport {
  part: number;
  batches: ChannelRange[] | null;
  timing: PartOutcome['timing'];
}

/** The merge of a computation's parts (run in a worker thread by the pool). */
export function mergeParts(task: MergeTask): AnalyzeOutcome {
  return toAnalyzeOutcome(mergeChannelParts(task.plan, task.parts), task.readerWarnings);
}

/**
 * The parts of a computation over `parts` threads, from the file's header: null when the
 * header cannot be read (one part then reads the file and reports what is wrong with it).
 */
export async function layoutFor(
  filePath: string,
  parts: number,
  batchBytes = PART_BATCH_BYTES,
): Promise<ChannelRange[][] | null> {
  try {
    return layoutParts(await analysedChannelSamples(filePath), parts, batchBytes);
  } catch {
    return null;
  }
}

/**
 * One computation as parts that run at once, then their merge: the parts' channels are
 * disjoint, the merge works in channel order, so the numbers are those of one part to the
 * bit. The first part to fail stops the others. Progress is the parts' work summed, 0–97,
 * then 99 once merged.
 */
export async function runAnalysisInParts(
  task: AnalyzeTask,
  layout: ChannelRange[][] | null,
  runner: AnalysisRunner,
  onProgress: (percent: number) => void,
  onPart?: (report: PartReport) => void,
): Promise<AnalyzeOutcome> {
  const parts = layout ?? [null];
  const weights = parts.map((batches) => (batches ? partWork(batches) : 1));
  const totalWeight = weights.reduce((a, b) => a + b, 0);
  const shares = parts.map(() => 0);
  let reported = 0;
  const progress = (part: number, fraction: number): void => {
    shares[part] = Math.max(shares[part], Math.min(1, fraction));
    const done = shares.reduce((sum, share, k) => sum + share * weights[k], 0);
    const percent = (PARTS_DONE_PERCENT * done) / totalWeight;
    if (percent > reported) {
      reported = percent;
      onProgress(percent);
    }
  };
  const abort = new AbortController();
  let outcomes: PartOutcome[];
  try {
    outcomes = await Promise.all(
      parts.map(async (batches, part) => {
        const outcome = await runner.part(
          { ...task, lead: part === 0, batches },
          (fraction) => progress(part, fraction),
          abort.signal,
        );
        onPart?.({ part, batches, timing: outcome.timing });
        return outcome;
      }),
    );
  } catch (error) {
    abort.abort();
    throw error;
  }
  const [lead] = outcomes;
  if (outcomes.some((o) => !isDeepStrictEqual(o.plan, lead.plan))) {
    throw new Error('stored file: it changed between two reads of one computation');
  }
  const outcome = await runner.merge({
    plan: lead.plan,
    parts: outcomes.map((o) => o.channels),
    readerWarnings: lead.readerWarnings ?? [],
  });
  onProgress(MERGED_PERCENT);
  return outcome;
}

/** Runs parts and merge in this thread, one after the other (tests, scripts). */
const inThisThread: AnalysisRunner = {
  part: (task, onProgress) => analyzePart(task, onProgress),
  merge: (task) => Promise.resolve(mergeParts(task)),
};

/**
 * One computation in this thread, in `parts` parts (default 1), as the pool runs it on its
 * threads: read the stored file, check it is the file the run names (SHA-256), then the
 * signal core's path from file to results with the effective settings and the visit's IAF
 * as they came (the core resolves the band), so the command line gives the same numbers.
 */
export async function runAnalysis(
  task: AnalyzeTask,
  onProgress: (percent: number) => void,
  options: { parts?: number; batchBytes?: number } = {},
): Promise<AnalyzeOutcome> {
  const layout = await layoutFor(task.filePath, options.parts ?? 1, options.batchBytes);
  return runAnalysisInParts(task, layout, inThisThread, onProgress);
}
