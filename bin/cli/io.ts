/** What a subcommand may touch of the outside world; tests pass their own. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /** Progress bars are drawn only on a terminal. */
  stderrIsTTY: boolean;
}

/** A wrong command line: exit code 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export const EXIT_OK = 0;
export const EXIT_DATA = 1;
export const EXIT_USAGE = 2;
