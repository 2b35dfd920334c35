// One way out of the CLI: commands throw, cli/index.ts prints and exits.
//   exit 0 success, 1 a finding or bad input, 2 misuse of the command line.
import type { Finding } from '#shared/findings';

export class ExitError extends Error {
  constructor(
    readonly code: 1 | 2,
    message: string,
    readonly suggestion?: string,
    /** Located findings to print one per line before the message. */
    readonly findings: Finding[] = [],
  ) {
    super(message);
    this.name = 'ExitError';
  }
}

/** Misuse of the command line: wrong or conflicting flags. Exit 2. */
export class UsageError extends ExitError {
  constructor(message: string, suggestion?: string) {
    super(2, message, suggestion);
    this.name = 'UsageError';
  }
}

/** Bad input in a file or a value: exit 1. */
export class InputError extends ExitError {
  constructor(message: string, findings: Finding[] = [], suggestion?: string) {
    super(1, message, suggestion, findings);
    this.name = 'InputError';
  }
}
