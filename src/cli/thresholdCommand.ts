import { findThreshold, parseInterval, parseQuantity, type ThresholdResult } from '../studies/index.js';
import { toJson } from '../results/json.js';
import { EXIT, UsageError, type CliIO } from './main.js';
import { parseConditionOption, targetOf } from './options.js';
import { renderTable } from './table.js';

/** `fray threshold FILE --target COND --vary KEY=A..B`: exit status 3 when the target is met nowhere in the range. */
export async function thresholdCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<number> {
  const target = parseConditionOption('--target', String(opts['target']));
  const vary = parseInterval(String(opts['vary']));
  if ('error' in vary) throw new UsageError(`--vary ${vary.error}`);
  let tol: number | undefined;
  if (opts['tol'] !== undefined) {
    const q = parseQuantity(String(opts['tol']));
    if ('error' in q || !(q.value > 0) || q.unit !== vary.unit) throw new UsageError(`--tol ${String(opts['tol'])}: expected a positive number${vary.unit !== null ? ` with a unit like the range's (${vary.unit})` : ''}`);
    tol = q.value;
  }
  const r = findThreshold({
    ...targetOf(file, opts),
    target,
    vary,
    ...(tol !== undefined ? { tol } : {}),
  });
  io.stdout.write(opts['json'] ? toJson(r) + '\n' : renderThreshold(r));
  return r.status === 'met-nowhere' ? EXIT.requirement : EXIT.ok;
}

/** The verdict, then every sample taken. */
export function renderThreshold(r: ThresholdResult): string {
  const key = r.unit !== null ? `${r.key} (${r.unit})` : r.key;
  const rows = r.samples.map((s) => [String(Number(s.value.toPrecision(10))), s.metric.toFixed(6), s.meets ? 'yes' : 'no']);
  return `${r.verdict}\n\nSamples (${r.samples.length}):\n${renderTable([key, r.target.replace(/(>=|<=|>|<).*/, ''), `meets ${r.target}`], rows, [true, true, false])}`;
}
