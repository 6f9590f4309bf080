/**
 * How one computation is cut into parts (one per analysis thread) and each part into
 * batches of channels decoded together, from the analysed channels' sizes in the header.
 */
import type { ChannelRange } from '../../signal/pipeline/analyze-edf-recording';

/**
 * Decoded samples one part holds at once, bytes (Float32). Two parts of a 64-channel,
 * 60-minute, 500 Hz recording then decode 9 channels at a time each instead of 32, in four
 * passes over the file; one pass (0.3 s of CPU on that 220 MiB file) costs about a fifth
 * of one channel's analysis.
 */
export const PART_BATCH_BYTES = 64 * 2 ** 20;

/** Work of one pass over the file, in channels' analyses (see above; for progress only). */
const PASS_WORK = 0.25;

/**
 * Contiguous parts of about equal samples (at most `parts`, at least one channel each) and
 * their batches of at most `batchBytes` decoded (at least one channel each).
 * `channelSamples[i]`: samples of analysed channel i.
 */
export function layoutParts(
  channelSamples: readonly number[],
  parts: number,
  batchBytes = PART_BATCH_BYTES,
): ChannelRange[][] {
  const count = channelSamples.length;
  const n = Math.max(1, Math.min(Math.floor(parts), count));
  const prefix = [0];
  for (const samples of channelSamples) prefix.push(prefix[prefix.length - 1] + samples);
  const bounds = [0];
  for (let k = 1; k < n; k++) {
    // The channel boundary nearest k/n of the samples, leaving at least one channel per part.
    const target = (prefix[count] * k) / n;
    let bound = bounds[k - 1] + 1;
    while (
      bound < count - (n - k) &&
      Math.abs(prefix[bound + 1] - target) < Math.abs(prefix[bound] - target)
    ) {
      bound++;
    }
    bounds.push(bound);
  }
  bounds.push(count);
  return bounds
    .slice(0, -1)
    .map((from, k) => batchesOf(channelSamples, from, bounds[k + 1], batchBytes));
}

function batchesOf(
  channelSamples: readonly number[],
  from: number,
  to: number,
  batchBytes: number,
): ChannelRange[] {
  const batches: ChannelRange[] = [];
  let start = from;
  let bytes = 0;
  for (let i = from; i < to; i++) {
    const size = 4 * channelSamples[i];
    if (i > start && bytes + size > batchBytes) {
      batches.push({ from: start, to: i });
      start = i;
      bytes = 0;
    }
    bytes += size;
  }
  batches.push({ from: start, to: Math.max(start, to) });
  return batches;
}

/** A part's whole work for progress: its channels' analyses and its passes over the file. */
export function partWork(batches: readonly ChannelRange[]): number {
  return batches.reduce((sum, b) => sum + PASS_WORK + (b.to - b.from), 0);
}

/** Work done after `passes` passes and `channels` channels analysed. */
export function workDone(passes: number, channels: number): number {
  return passes * PASS_WORK + channels;
}
