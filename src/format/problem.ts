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
  /** One line: control characters (newlines, tabs, …) are escaped when the problem is recorded. */
  readonly message: string;
  /** How many times this same warning arose (e.g. once per application of a gate); absent means 1. */
  readonly count?: number;
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

/** The one-line form `FILE:LINE:COL: message` (warnings say so after the position, repeated ones how often). */
export function formatProblem(p: Problem): string {
  const tag = p.severity === 'warning' ? 'warning: ' : '';
  const times = (p.count ?? 1) > 1 ? ` (${p.count} times)` : '';
  return `${oneLine(p.file)}:${p.line}:${p.col}: ${tag}${p.message}${times}`;
}

const SHORT_ESCAPES: Readonly<Record<string, string>> = { '\n': '\\n', '\r': '\\r', '\t': '\\t' };

/**
 * `text` with every control character escaped as in a JSON string (a newline becomes the two
 * characters \n), so a value quoted in a message can never split one problem over two lines.
 */
export function oneLine(text: string): string {
  return text.replace(/[\u0000-\u001f\u007f\u0085\u2028\u2029]/g, (c) => SHORT_ESCAPES[c] ?? `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** A warning as the JSON of `fray run --json` lists it: where it arose (a step or a profile entry), its code, its message, and how often it arose. */
export interface WarningJson {
  readonly code: string;
  readonly message: string;
  readonly file: string;
  readonly line: number;
  readonly col: number;
  readonly count: number;
}

/** The JSON form of a warning (count 1 when it arose once). */
export function warningJson(p: Problem): WarningJson {
  return { code: p.code, message: p.message, file: p.file, line: p.line, col: p.col, count: p.count ?? 1 };
}

/** A JSON warning as one line `FILE:LINE:COL: message` (without its count). */
export function warningText(w: WarningJson): string {
  return `${w.file}:${w.line}:${w.col}: ${w.message}`;
}

/** A position at the start of a file, for problems that concern the file as a whole. */
export function fileStart(file: string): SourcePosition {
  return { file, line: 1, col: 1 };
}

/**
 * Collects problems during validation; `ok` is false once any error was added. Every problem
 * enters through error(), warn() or add(), which make its message one line; a warning equal
 * to one already recorded (same position, code and message) raises that one's count instead
 * of being listed again.
 */
export class ProblemList {
  readonly items: Problem[] = [];
  private readonly warningIndex = new Map<string, number>();

  /** Records an error at `at`. */
  error(at: SourcePosition, code: string, message: string): void {
    this.add({ file: at.file, line: at.line, col: at.col, severity: 'error', code, message });
  }

  /** Records a warning at `at` (or counts it again when the same warning is already recorded). */
  warn(at: SourcePosition, code: string, message: string): void {
    this.add({ file: at.file, line: at.line, col: at.col, severity: 'warning', code, message });
  }

  /** Records a problem made elsewhere (e.g. the warnings of an earlier stage), merging repeated warnings. */
  add(p: Problem): void {
    const clean: Problem = { ...p, message: oneLine(p.message) };
    if (clean.severity === 'error') {
      this.items.push(clean);
      return;
    }
    const key = JSON.stringify([clean.file, clean.line, clean.col, clean.code, clean.message]);
    const seen = this.warningIndex.get(key);
    if (seen === undefined) {
      this.warningIndex.set(key, this.items.length);
      this.items.push(clean);
      return;
    }
    const before = this.items[seen]!;
    this.items[seen] = { ...before, count: (before.count ?? 1) + (clean.count ?? 1) };
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
