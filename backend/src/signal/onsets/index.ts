export { OnsetCsvError, parseOnsetCsv } from './onset-csv';
export type { ParseOnsetCsvOptions, StimulusOnset } from './onset-csv';
export { artefactRegExp, isStimulusAnnotation, stimulusAnnotations } from './stimulus-annotations';
