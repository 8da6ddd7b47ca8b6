import { MAX_DATA_FILE_BYTES, readBounded } from '../api/readInput.js';
import { fileStart, InputError } from '../format/problem.js';
import { baselineOf, check, DEFAULT_BASELINE_TOLERANCE, type Baseline, type CheckResult } from '../mitigation/check.js';
import { toJson } from '../results/json.js';
import { checkToJunit } from './junit.js';
import { makeStyle, wantColor, type Style } from './style.js';
import { EXIT, UsageError, VERSION, type CliIO } from './main.js';
import { writeHtmlReport } from './htmlReport.js';
import { writeOutputFile } from './outputFiles.js';
import { checkPage } from '../html/index.js';
import { targetOf } from './options.js';

/** `fray check FILE…`: evaluates every expectation (and baseline figure), writes the table/JSON/JUnit, returns the exit status. */
export async function checkCommand(files: readonly string[], opts: Record<string, unknown>, io: CliIO): Promise<number> {
  const tolerance = opts['tolerance'] === undefined ? DEFAULT_BASELINE_TOLERANCE : parseTolerance(String(opts['tolerance']));
  const baseline = opts['baseline'] === undefined ? undefined : readBaseline(String(opts['baseline']));
  const { file: _f, ...load } = targetOf(files[0]!, opts);
  const result = check(files, { load, tolerance, ...(baseline !== undefined ? { baseline } : {}) });
  if (opts['writeBaseline'] !== undefined) writeOutputFile('--write-baseline', String(opts['writeBaseline']), toJson(baselineOf(result)) + '\n');
  if (opts['junit'] !== undefined) writeOutputFile('--junit', String(opts['junit']), checkToJunit(result));
  await writeHtmlReport(opts, io, () => checkPage(result, VERSION));
  if (opts['json']) io.stdout.write(toJson(result) + '\n');
  else io.stdout.write(renderCheck(result, makeStyle(wantColor(process.stdout, opts['color'] !== false) && io.stdout === process.stdout)));
  return result.passed ? EXIT.ok : EXIT.requirement;
}

function parseTolerance(v: string): number {
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x) || x < 0) throw new UsageError(`--tolerance ${v}: expected a number ≥ 0, e.g. 1e-6`);
  return x;
}

/** A baseline file written by --write-baseline; anything else is an input error located at the file. */
function readBaseline(path: string): Baseline {
  const refuse = (why: string) => new InputError([{ ...fileStart(path), severity: 'error', code: 'bad-baseline', message: `--baseline: ${why}` }]);
  let data: unknown;
  const read = readBounded(path, MAX_DATA_FILE_BYTES);
  if ('error' in read) throw refuse(`cannot read '${path}': ${read.error}`);
  try {
    data = JSON.parse(read.text);
  } catch (e) {
    throw refuse(`not JSON (${(e as Error).message})`);
  }
  const b = data as Partial<Baseline>;
  const ok =
    typeof b === 'object' && b !== null && b.fray_baseline === 1 && typeof b.files === 'object' && b.files !== null &&
    Object.values(b.files).every((f) => typeof f === 'object' && f !== null && Object.values(f).every((x) => typeof x === 'number'));
  if (!ok) throw refuse('not a fray baseline (write one with --write-baseline)');
  return b as Baseline;
}

/** One table: file, expectation, value, pass/fail; then the baseline figures that moved. */
function renderCheck(r: CheckResult, style: Style): string {
  const lines: string[] = [];
  const fw = Math.max(4, ...r.files.map((f) => f.file.length));
  const ew = Math.max(11, ...r.files.flatMap((f) => [...f.expectations.map((e) => e.expectation.length), ...(f.baseline ?? []).filter((b) => !b.pass).map((b) => `baseline ${b.figure}`.length)]));
  lines.push(`${style.dim('file'.padEnd(fw))}  ${style.dim('expectation'.padEnd(ew))}  ${style.dim('value'.padStart(12))}  ${style.dim('result')}`);
  for (const f of r.files) {
    if (f.expectations.length === 0) lines.push(`${f.file.padEnd(fw)}  ${style.yellow('no expect: block — nothing checked'.padEnd(ew + 14))}`);
    for (const e of f.expectations) {
      lines.push(`${f.file.padEnd(fw)}  ${e.expectation.padEnd(ew)}  ${e.value.toPrecision(6).padStart(12)}  ${e.pass ? style.green('pass') : style.red('FAIL')}`);
    }
    const moved = (f.baseline ?? []).filter((b) => !b.pass);
    for (const b of moved) {
      lines.push(`${f.file.padEnd(fw)}  ${`baseline ${b.figure}`.padEnd(ew)}  ${(b.value === null ? 'missing' : b.value.toPrecision(6)).padStart(12)}  ${style.red(`FAIL (was ${b.baseline.toPrecision(6)})`)}`);
    }
    if (f.baseline !== undefined && moved.length === 0) lines.push(`${f.file.padEnd(fw)}  ${style.dim(`baseline: ${f.baseline.length} figures within tolerance`)}`);
  }
  const failed = r.files.filter((f) => f.status !== 'pass').length;
  lines.push('', r.passed ? style.green(`all ${r.files.length} file${r.files.length === 1 ? '' : 's'} pass`) : style.red(`${failed} of ${r.files.length} file${r.files.length === 1 ? '' : 's'} did not pass`));
  return lines.join('\n') + '\n';
}
