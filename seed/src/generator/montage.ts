/**
 * The demo montage: the 19 electrodes of the 10-20 set plus the six posterior 10-10
 * electrodes that complete Gyre's default region of interest (10-10 names per ACNS
 * Guideline 2, 2016). Each electrode carries how strongly it sees the alpha rhythm, eye
 * blinks and the background, and how far its alpha runs from the participant's IAF.
 */

export interface MontageChannel {
  /** 10-10 electrode name. */
  electrode: string;
  /** Relative alpha amplitude (occipital = 1). Alpha is largest over the back of the head at rest with eyes closed (Klimesch 1999). */
  alphaGain: number;
  /**
   * Offset of this electrode's alpha frequency from the participant's IAF, in Hz.
   * Posterior offsets come in mirrored pairs around zero, so the region-of-interest
   * spectrum still peaks at the IAF; anterior alpha runs a little slower (common practice).
   */
  alphaOffsetHz: number;
  /** Share of the eye-blink potential seen here (Fp = 1; it falls off towards the back; common practice). */
  blinkGain: number;
}

export const DEMO_MONTAGE: readonly MontageChannel[] = Object.freeze([
  { electrode: 'Fp1', alphaGain: 0.12, alphaOffsetHz: -0.5, blinkGain: 1.0 },
  { electrode: 'Fp2', alphaGain: 0.12, alphaOffsetHz: -0.45, blinkGain: 0.97 },
  { electrode: 'F7', alphaGain: 0.15, alphaOffsetHz: -0.4, blinkGain: 0.45 },
  { electrode: 'F3', alphaGain: 0.2, alphaOffsetHz: -0.35, blinkGain: 0.5 },
  { electrode: 'Fz', alphaGain: 0.2, alphaOffsetHz: -0.35, blinkGain: 0.55 },
  { electrode: 'F4', alphaGain: 0.2, alphaOffsetHz: -0.3, blinkGain: 0.5 },
  { electrode: 'F8', alphaGain: 0.15, alphaOffsetHz: -0.4, blinkGain: 0.45 },
  { electrode: 'T7', alphaGain: 0.2, alphaOffsetHz: -0.25, blinkGain: 0.12 },
  { electrode: 'C3', alphaGain: 0.3, alphaOffsetHz: -0.2, blinkGain: 0.2 },
  { electrode: 'Cz', alphaGain: 0.3, alphaOffsetHz: -0.2, blinkGain: 0.22 },
  { electrode: 'C4', alphaGain: 0.3, alphaOffsetHz: -0.15, blinkGain: 0.2 },
  { electrode: 'T8', alphaGain: 0.2, alphaOffsetHz: -0.25, blinkGain: 0.12 },
  { electrode: 'P7', alphaGain: 0.55, alphaOffsetHz: -0.1, blinkGain: 0.05 },
  { electrode: 'P3', alphaGain: 0.65, alphaOffsetHz: -0.04, blinkGain: 0.08 },
  { electrode: 'Pz', alphaGain: 0.7, alphaOffsetHz: 0, blinkGain: 0.08 },
  { electrode: 'P4', alphaGain: 0.65, alphaOffsetHz: 0.04, blinkGain: 0.08 },
  { electrode: 'P8', alphaGain: 0.55, alphaOffsetHz: -0.1, blinkGain: 0.05 },
  { electrode: 'PO7', alphaGain: 0.85, alphaOffsetHz: -0.08, blinkGain: 0.03 },
  { electrode: 'PO3', alphaGain: 0.85, alphaOffsetHz: -0.05, blinkGain: 0.04 },
  { electrode: 'POz', alphaGain: 0.9, alphaOffsetHz: 0, blinkGain: 0.04 },
  { electrode: 'PO4', alphaGain: 0.85, alphaOffsetHz: 0.05, blinkGain: 0.04 },
  { electrode: 'PO8', alphaGain: 0.85, alphaOffsetHz: 0.08, blinkGain: 0.03 },
  { electrode: 'O1', alphaGain: 1.0, alphaOffsetHz: -0.06, blinkGain: 0.02 },
  { electrode: 'Oz', alphaGain: 1.0, alphaOffsetHz: 0, blinkGain: 0.02 },
  { electrode: 'O2', alphaGain: 1.0, alphaOffsetHz: 0.06, blinkGain: 0.02 },
]);

/** EDF+ signal label for an electrode: type, electrode and reference (Kemp & Olivan 2003 label convention). */
export function edfLabel(electrode: string): string {
  return `EEG ${electrode}-REF`;
}
