/**
 * Which EDF+ annotations are stimulus onsets: those with text that do not match the
 * artefact pattern and do not mark a long stretch (a state such as "Eyes closed" over the
 * whole rest). One rule for the upload check (it counts them) and the analysis (it epochs
 * around them), so both see the same onsets.
 */

/**
 * An annotation lasting this long or longer marks a state or a block, not a stimulus
 * (common practice: a stimulus lasts a few seconds at most).
 */
export const MAX_STIMULUS_DURATION_S = 10;

/** The case-insensitive regular expression of artefact annotations; null for invalid source. */
export function artefactRegExp(pattern: string): RegExp | null {
  try {
    return new RegExp(pattern, 'i');
  } catch {
    return null;
  }
}

/** Whether an annotation marks a stimulus (text, not an artefact, not a long stretch). */
export function isStimulusAnnotation(
  annotation: { text: string; durationS?: number | null },
  artefact: RegExp,
): boolean {
  const text = annotation.text;
  const durationS = annotation.durationS ?? 0;
  return text.trim() !== '' && !artefact.test(text) && durationS < MAX_STIMULUS_DURATION_S;
}

/** The stimulus annotations, in their order. */
export function stimulusAnnotations<T extends { text: string; durationS?: number | null }>(
  annotations: readonly T[],
  artefact: RegExp,
): T[] {
  return annotations.filter((a) => isStimulusAnnotation(a, artefact));
}
