/** What a command may touch of the outside world; tests pass their own. */
export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** Directory relative paths are resolved against. */
  cwd: string;
  /** Whether stdout is a terminal (progress displays only then). */
  isTty: boolean;
}

/** A subcommand of `lagbench`. */
export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Full `--help` text, examples included. */
  help: string;
  /** Runs the command; returns the exit code. Throws InputError/UsageError for bad input. */
  run: (args: string[], io: CliIo) => Promise<number>;
}

/** Wrong command-line usage: exit 2, show the message and a pointer to --help. */
export class UsageError extends Error {
  override readonly name = 'UsageError';
  constructor(message: string, readonly command?: string) {
    super(message);
  }
}

/** Documented exit codes (README). */
export const EXIT = {
  ok: 0,
  internalError: 1,
  badInput: 2,
  /** `qc`: at least one chip failed. */
  qcFailed: 3,
  /** `qc`: no chip failed, but at least one was inconclusive. */
  qcInconclusive: 4,
} as const;
