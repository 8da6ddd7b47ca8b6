/**
 * Input problems as data: every complaint about a user's file carries the file and the
 * 1-based line and column of the offending key or value, a stable code, and a message
 * that says what is wrong and what is expected. Validation collects problems; only the
 * throwing API variants and the CLI turn them into an exception or exit status 2.
 */

/** A 1-based line and column in a named input file. */
export interface SourcePosition {
  readonly file: string;
  readonly line: number;
  readonly col: number;
}

/** One problem found in the input: an error (the run is refused) or a warning (it goes on). */
export interface Problem extends SourcePosition {
  readonly severity: 'error' | 'warning';
  /** Stable machine-readable code, e.g. 'unknown-key', 'bad-duration'. */
  readonly code: string;
  readonly message: string;
}

/** Thrown by the throwing API variants when the input has at least one error. */
export class InputError extends Error {
  readonly problems: readonly Problem[];
  constructor(problems: readonly Problem[]) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'InputError';
    this.problems = problems;
  }
}

/** The one-line form `FILE:LINE:COL: message` (warnings say so after the position). */
export function formatProblem(p: Problem): string {
  const tag = p.severity === 'warning' ? 'warning: ' : '';
  return `${p.file}:${p.line}:${p.col}: ${tag}${p.message}`;
}

/** A position at the start of a file, for problems that concern the file as a whole. */
export function fileStart(file: string): SourcePosition {
  return { file, line: 1, col: 1 };
}

/** Collects problems during validation; `ok` is false once any error was added. */
export class ProblemList {
  readonly items: Problem[] = [];

  /** Records an error at `at`. */
  error(at: SourcePosition, code: string, message: string): void {
    this.items.push({ file: at.file, line: at.line, col: at.col, severity: 'error', code, message });
  }

  /** Records a warning at `at`. */
  warn(at: SourcePosition, code: string, message: string): void {
    this.items.push({ file: at.file, line: at.line, col: at.col, severity: 'warning', code, message });
  }

  /** True while no error has been recorded. */
  get ok(): boolean {
    return !this.items.some((p) => p.severity === 'error');
  }

  /** The errors only. */
  get errors(): Problem[] {
    return this.items.filter((p) => p.severity === 'error');
  }

  /** The warnings only. */
  get warnings(): Problem[] {
    return this.items.filter((p) => p.severity === 'warning');
  }

  /** Throws an InputError carrying every error when there is one. */
  throwIfErrors(): void {
    if (!this.ok) throw new InputError(this.errors);
  }
}
