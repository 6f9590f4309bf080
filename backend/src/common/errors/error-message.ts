/** What a caught value says: an `Error`'s message, anything else as text. */
export function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * The message of a computation that failed on a worker thread: errors cross the thread
 * boundary as text, so the class name piscina puts in front ("Error: ") is dropped.
 */
export function threadErrorMessage(error: unknown): string {
  return errorMessage(error).replace(/^Error: /, '');
}
