// The worker API's answers (the bodies are generated into the OpenAPI schemas by
// scripts/api-schemas.mjs, like the shared API types).

/** What the server did with a posted result. */
export interface WorkerResultView {
  /** The run that holds the numbers. */
  runId: string | null;
  /** False when the computation reproduced the current numbers. */
  newRun: boolean;
  /** True when this attempt’s result had been stored before. */
  duplicate: boolean;
}

/** What the server did with a posted failure. */
export interface WorkerFailureView {
  recorded: true;
}
