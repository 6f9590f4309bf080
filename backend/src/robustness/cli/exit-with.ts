/**
 * Runs a command line's `main` and exits with its code (1 after printing an unexpected
 * error). The exit is forced: a server or browser child the command stopped may still hold
 * a handle open for a moment.
 */
export function exitWith(main: () => Promise<number>): void {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      console.error(error);
      process.exit(1);
    },
  );
}
