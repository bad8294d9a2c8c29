/**
 * Typed, located errors for bad input. The first of the two tiers of trouble
 * (DEVELOPERS.md): anything the user can fix throws an {@link InputError}
 * whose message names the file, line, column, what is wrong and what to do.
 * Recoverable oddities are {@link Warning}s carried in results instead.
 */

/** Where in an input something was found. Lines and columns are 1-based. */
export interface SourceLocation {
  file?: string;
  line?: number;
  column?: number;
}

/** A problem with the user's input (file contents, options, descriptions). */
export class InputError extends Error {
  override readonly name = 'InputError';
  /** Where the problem is, as far as known. */
  readonly location: SourceLocation;
  /** What is wrong, one sentence. */
  readonly problem: string;
  /** What the user can do about it, one sentence. */
  readonly hint: string;
  /** Stable machine-readable code, e.g. `non-numeric-value`. */
  readonly code: string;

  constructor(code: string, problem: string, hint: string, location: SourceLocation = {}) {
    super(formatLocated(location, problem, hint));
    this.code = code;
    this.problem = problem;
    this.hint = hint;
    this.location = location;
  }

  /** The same error with a file name filled in (parsers often do not know it). */
  withFile(file: string): InputError {
    if (this.location.file) return this;
    return new InputError(this.code, this.problem, this.hint, { ...this.location, file });
  }
}

/** `file:line:column: problem. hint` with the parts that are known. */
export function formatLocated(location: SourceLocation, problem: string, hint: string): string {
  const where = [location.file, location.line, location.column].filter((p) => p !== undefined && p !== '').join(':');
  const head = where ? `${where}: ` : '';
  const sentence = (s: string): string => (s === '' || /[.!?]$/.test(s) ? s : `${s}.`);
  return `${head}${sentence(problem)}${hint ? ` ${sentence(hint)}` : ''}`;
}

/** A recoverable oddity: counted, carried in the result and shown to the user. */
export interface Warning {
  /** Stable machine-readable code, e.g. `skipped-bad-rows`. */
  code: string;
  /** One readable sentence. */
  message: string;
  /** How many times it happened, when counted. */
  count?: number;
  location?: SourceLocation;
}
