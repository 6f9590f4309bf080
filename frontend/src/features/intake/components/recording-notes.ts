import type { RecordingView } from '@gyre/shared';
import { NO_ROI_CHANNEL_REMAINS, roiUsageSentence } from '../../../lib/roi-usage';

/**
 * What a technician should read about a recording while the participant may still be in the
 * room: the server's standing warnings, the reader's, and the region-of-interest usage of the
 * latest run (in the words Review uses), each once.
 */
export function recordingNotes(recording: RecordingView): string[] {
  const notes: string[] = [];
  const usage = recording.roiUsage;
  const serverNotes = [...recording.warnings, ...(recording.facts?.warnings ?? [])];
  if (usage !== null && usage.status !== 'complete') {
    const saidAlready =
      usage.status === 'none'
        ? serverNotes.some((note) => note.includes(NO_ROI_CHANNEL_REMAINS))
        : serverNotes.some((note) => /region-of-interest channels? left out/i.test(note));
    const sentence = roiUsageSentence(usage);
    if (!saidAlready && sentence !== null) notes.push(sentence);
  }
  for (const note of serverNotes) if (!notes.includes(note)) notes.push(note);
  return notes;
}

export function hasStandingWarnings(recording: RecordingView): boolean {
  return recordingNotes(recording).length > 0;
}
