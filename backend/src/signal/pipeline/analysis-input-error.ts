/** Input that cannot be analysed; `field` names what is wrong. */
export class AnalysisInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'AnalysisInputError';
  }
}
