/** The command line's exit codes (documented in the README and in `yieldloop help`). */
export const EXIT = {
  ok: 0,
  /** The input was read but rejected: a field out of range, a bad CSV row, an unknown id. */
  invalidInput: 1,
  /** The command line itself was wrong: an unknown command or option, a missing argument. */
  usage: 2,
  /** Something failed inside yieldloop (a bug, a full disk): the message says what. */
  internal: 3,
  /** Interrupted (Ctrl-C) before finishing. */
  interrupted: 130,
} as const;

/** An error that ends the command with a given exit code and a one-line message. */
export class CliError extends Error {
  constructor(
    message: string,
    readonly code: number,
  ) {
    super(message);
  }
}
