// Option parsers of `fray mitigate`, kept apart from src/cli/mitigateCommand.ts so that defining
// the command's options (src/cli/main.ts) loads none of the mitigation code.
import { MAX_FOLD_SCALE } from '../transforms/fold.js';
import { MAX_TWIRL_INSTANCES } from '../transforms/twirl.js';
import { UsageError } from './main.js';

/** `--twirl N`: a whole number of sampled instances, 1 to MAX_TWIRL_INSTANCES. */
export function parseInstances(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || n < 1 || n > MAX_TWIRL_INSTANCES) throw new UsageError(`--twirl ${v}: expected a whole number of instances from 1 to ${MAX_TWIRL_INSTANCES} (or --twirl alone for the exact twirl)`);
  return n;
}

/** `--zne 1,2,3`: distinct noise scales, each a number in [1, MAX_FOLD_SCALE], at least two. */
export function parseScales(v: string): number[] {
  const parts = v.split(',').map((s) => s.trim());
  const scales = parts.map(Number);
  if (parts.some((s) => s === '') || scales.some((x) => !Number.isFinite(x) || x < 1 || x > MAX_FOLD_SCALE)) {
    throw new UsageError(`--zne ${v}: expected comma-separated noise scales from 1 to ${MAX_FOLD_SCALE}, e.g. --zne 1,3,5`);
  }
  if (scales.length < 2) throw new UsageError(`--zne ${v}: extrapolation needs at least 2 noise scales, e.g. --zne 1,3`);
  if (new Set(scales).size !== scales.length) throw new UsageError(`--zne ${v}: the noise scales must be distinct`);
  return scales;
}
