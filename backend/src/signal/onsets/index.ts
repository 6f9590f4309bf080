export { OnsetCsvError, parseOnsetCsv } from './onset-csv';
export type { ParseOnsetCsvOptions, StimulusOnset } from './onset-csv';
