export type {
  EdfAnnotation,
  EdfHeader,
  EdfHeaderInfo,
  EdfRecording,
  EdfSignal,
  EdfSignalHeader,
} from './edf.types';
export { EdfFormatError } from './edf-format-error';
export { EDF_ANNOTATIONS_LABEL, readEdfHeader } from './edf-header';
export { readEdf } from './edf-reader';
export type { ReadEdfOptions } from './edf-reader';
export { writeEdf } from './edf-writer';
export type { EdfWriteSignal, EdfWriteSpec } from './edf-writer';
export { blankPatientField, blankRecordingField } from './edf-patient-field';
export { toMicrovolts } from './edf-units';
export { EdfStreamReader } from './edf-stream-reader';
