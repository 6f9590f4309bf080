import { createHash } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import { threadId } from 'node:worker_threads';
import type { AnalysisPlan } from '../../signal/pipeline/analysis-plan';
import {
  analyzeChannels,
  ChannelAnalysisWorkspace,
  ChannelPart,
} from '../../signal/pipeline/analyze-channels';
import {
  AnalysisRunRequest,
  ChannelRange,
  edfRecordingPart,
  planEdfAnalysis,
  readRecordingForAnalysis,
} from '../../signal/pipeline/analyze-edf-recording';
import { SampleArena } from '../../signal/pipeline/read-edf-file';
import { partWork, workDone } from './analysis-parts';
import type { AnalyzePartTask, AnalyzeTask, PartOutcome } from './worker-tasks';

/** The signal core's request for a computation: settings and IAF as they came. */
export function runRequest(task: AnalyzeTask): AnalysisRunRequest {
  return {
    kind: task.kind === 'task' ? 'task' : 'rest',
    settings: task.settings,
    iafHz: task.iafHz,
    onsets: task.csvOnsets,
  };
}

/**
 * One part of a computation in a worker thread: its channels are read from the stored
 * file one batch at a time (streamed; only the batch's channels decoded), then analysed
 * (`analyzeChannels`) against the plan the part makes from the same file. The lead part
 * hashes the file during its first pass and fails before using anything it read when the
 * file is not the one the run names; it also keeps the reader's warnings for the whole file.
 * Every batch decodes into the same sample buffers and is analysed in the same workspace,
 * so only the first batch touches fresh memory. `onProgress` receives the share of the
 * part done, 0…1.
 */
export async function analyzePart(
  task: Omit<AnalyzePartTask, 'progressPort'>,
  onProgress: (fraction: number) => void,
): Promise<PartOutcome> {
  const startedMs = Date.now();
  const request = runRequest(task);
  const batches: (ChannelRange | null)[] = task.batches ?? [null];
  let plan: AnalysisPlan | null = null;
  let readerWarnings: string[] | null = null;
  const channels: ChannelPart[] = [];
  const samples = new SampleArena();
  const workspace = new ChannelAnalysisWorkspace();
  for (const [pass, batch] of batches.entries()) {
    const first = pass === 0;
    const hash = task.lead && first ? createHash('sha256') : null;
    const read = await readRecordingForAnalysis(task.filePath, {
      channels: batch ?? undefined,
      onChunk: hash ? (chunk): void => void hash.update(chunk) : undefined,
      // Out-of-range samples of every signal are counted once, by the lead's first pass.
      warnAboutLeftOut: task.lead && first,
      allocateSamples: samples.allocate,
    });
    if (hash) {
      const actual = hash.digest('hex');
      if (actual !== task.checksumSha256) {
        throw new Error(
          `stored file: SHA-256 ${actual} found, ${task.checksumSha256} expected (the file changed on disk)`,
        );
      }
    }
    const recording = read.finish();
    const passPlan = planEdfAnalysis(read, recording, request);
    if (plan === null) {
      plan = passPlan;
      if (task.lead) readerWarnings = recording.warnings;
    } else if (!isDeepStrictEqual(plan, passPlan)) {
      throw new Error('stored file: it changed between two reads of one computation');
    }
    const range = batch ?? { from: 0, to: plan.channels.length };
    const total = partWork(task.batches ?? [range]);
    const before = channels.length;
    onProgress(workDone(pass + 1, before) / total);
    const analysed = analyzeChannels(edfRecordingPart(recording, plan, range), plan, {
      onChannel: (done) => onProgress(workDone(pass + 1, before + done) / total),
      workspace,
    });
    channels.push(...analysed);
  }
  return {
    plan: plan as AnalysisPlan,
    channels,
    readerWarnings,
    timing: { threadId, startedMs, endedMs: Date.now() },
  };
}
