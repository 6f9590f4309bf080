/**
 * The recordings of one demo visit, generated on demand from the scenario (never kept in
 * the repository), and the deliberately broken copy used to show a rejection.
 */
import {
  generateRestingRecording,
  generateTaskRecording,
  GeneratedRecording,
} from '../generator/recording-generator';
import type { DemoParticipant, DemoScenario, DemoVisit } from './demo-scenario';

/** The two conditions every demo task alternates, so Review's conditions table has rows. */
const DEMO_CONDITIONS = ['Tone', 'Word'] as const;

export interface VisitRecordings {
  resting: GeneratedRecording;
  task: GeneratedRecording;
}

/** Both recordings of a visit; the same scenario always gives the same bytes. */
export function generateVisitRecordings(
  scenario: DemoScenario,
  participant: DemoParticipant,
  visit: DemoVisit,
): VisitRecordings {
  const key = `${scenario.seedKey}/${participant.code}/${visit.label}`;
  // EDF+ patient subfields: code, sex, birth date, name; only the pseudonymous code is known.
  const patientId = `${participant.code} X X X`;
  const { sampleRateHz, restDurationS, taskTrialCount } = scenario.recording;
  return {
    resting: generateRestingRecording({
      seedKey: `${key}/resting`,
      startDate: visit.restStart,
      patientId,
      sampleRateHz,
      durationS: restDurationS,
      iafHz: visit.iafHz,
      alphaAmplitudeUv: participant.restAlphaUv,
    }),
    task: generateTaskRecording({
      seedKey: `${key}/task`,
      startDate: visit.taskStart,
      patientId,
      sampleRateHz,
      trialCount: taskTrialCount,
      iafHz: visit.iafHz,
      deltaFHz: visit.deltaFHz,
      alphaAmplitudeUv: participant.taskAlphaUv,
      onsetLabels: DEMO_CONDITIONS,
    }),
  };
}

/**
 * The same visit's resting block recorded a second time (its own random streams, the same
 * generated truth), as a technician sends it to replace the first take.
 */
export function generateRetakeResting(
  scenario: DemoScenario,
  participant: DemoParticipant,
  visit: DemoVisit,
): GeneratedRecording {
  const key = `${scenario.seedKey}/${participant.code}/${visit.label}`;
  const { sampleRateHz, restDurationS } = scenario.recording;
  return generateRestingRecording({
    seedKey: `${key}/resting/retake`,
    startDate: visit.restStart,
    patientId: `${participant.code} X X X`,
    sampleRateHz,
    durationS: restDurationS,
    iafHz: visit.iafHz,
    alphaAmplitudeUv: participant.restAlphaUv,
  });
}

/**
 * A copy cut off in the middle of its last data record, as an interrupted transfer leaves
 * it: the header's record count no longer agrees with the file size (Kemp et al. 1992).
 */
export function truncatedCopy(edf: Uint8Array): Uint8Array {
  const headerBytes = Number(new TextDecoder().decode(edf.subarray(184, 192)).trim());
  const recordCount = Number(new TextDecoder().decode(edf.subarray(236, 244)).trim());
  const recordBytes = (edf.length - headerBytes) / recordCount;
  return edf.slice(0, edf.length - Math.floor(recordBytes / 2));
}
