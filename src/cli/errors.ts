/**
 * Errors the CLI reports as one plain line. Anything else is a fault of inkroute itself
 * and is reported with exit code 1.
 */

/** A failure with a message meant for the person at the terminal. */
export class CliError extends Error {
  override name = 'CliError';
  constructor(message: string, readonly exitCode = 1) {
    super(message);
  }
}

/** Bad input: a malformed option, a missing or unreadable file, a point off the image. Exit code 2. */
export class UsageError extends CliError {
  override name = 'UsageError';
  constructor(message: string) {
    super(message, 2);
  }
}
