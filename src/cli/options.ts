import { parseOverride, type Override } from '../format/overrides.js';
import { UsageError } from './main.js';
import { Option, type Command } from 'commander';
// the study modules themselves, not studies/index.ts, so that `fray run` loads none of the others
import { parseCondition, type Condition } from '../studies/conditions.js';
import { parseMetric, type Metric } from '../studies/metrics.js';
import type { StudyTarget } from '../studies/variant.js';

/**
 * Option parsers shared by the commands (run, compare, sweep, budget, threshold): each turns
 * one command-line value into a typed value or throws UsageError (exit status 2).
 */

/** The repeatable `--set KEY=VALUE` values as overrides, in order. */
export function parseSetOptions(values: unknown): Override[] {
  return ((values as string[] | undefined) ?? []).map((s) => {
    const o = parseOverride(s);
    if (o === undefined) throw new UsageError(`--set ${s}: expected KEY=VALUE, e.g. --set theta=0.4 or --set qubits.all.t1=50us`);
    return o;
  });
}

/** `--observe` values (repeatable or comma-separated) as a list of Pauli strings. */
export function parseObserveOptions(values: unknown): string[] {
  return ((values as string[] | undefined) ?? []).flatMap((s) => s.split(',')).map((s) => s.trim()).filter((s) => s !== '');
}

/** `--noise-scale C`: a finite number ≥ 0. */
export function parseNoiseScale(v: string): number {
  const c = Number(v);
  if (v.trim() === '' || !Number.isFinite(c) || c < 0) throw new UsageError(`--noise-scale ${v}: expected a number ≥ 0 (1 = the noise as written, 0 = none)`);
  return c;
}

/** `--layout P0,P1,…`: the device qubit of each circuit qubit. */
export function parseLayout(v: string): number[] {
  const parts = v.split(',').map((s) => s.trim());
  if (parts.some((p) => !/^\d+$/.test(p))) throw new UsageError(`--layout ${v}: expected device qubit numbers separated by commas, e.g. --layout 2,3,4`);
  return parts.map(Number);
}

/** Every `--layout` given (repeatable for compare), each parsed. */
export function collectLayout(v: string, previous: number[][] | undefined): number[][] {
  return [...(previous ?? []), parseLayout(v)];
}

/** Repeatable string option collector. */
export function collect(v: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), v];
}

/** A whole number ≥ 1 (jobs, points). */
export function parsePositiveInt(name: string): (v: string) => number {
  return (v: string) => {
    const n = Number(v);
    if (!/^\d+$/.test(v) || !Number.isSafeInteger(n) || n < 1) throw new UsageError(`${name} ${v}: expected a whole number, 1 or more`);
    return n;
  };
}

/** A metric option (`--by`, `--metric`). */
export function parseMetricOption(option: string, text: string): Metric {
  const m = parseMetric(text);
  if ('error' in m) throw new UsageError(`${option} ${text}: ${m.error}`);
  return m;
}

/** A condition option (`--require`, `--target`). */
export function parseConditionOption(option: string, text: string): Condition {
  const c = parseCondition(text);
  if ('error' in c) throw new UsageError(`${option} ${c.error}`);
  return c;
}

/** The options every study command shares with run: --set, --device, --noise-scale, --layout. */
export function addTargetOptions(cmd: Command, scaleHelp: string): Command {
  return cmd
    .addOption(new Option('--set <key=value...>', 'fixed overrides of a parameter or profile field (as in run)'))
    .option('--device <file>', "noise profile to use instead of the circuit's 'device:'")
    .option('--noise-scale <c>', scaleHelp, parseNoiseScale)
    .option('--layout <p0,p1,...>', 'place circuit qubit i on device qubit P_i', parseLayout);
}

/** The values of addTargetOptions's options, as a study target for `file`. */
export function targetOf(file: string, opts: Record<string, unknown>): StudyTarget {
  return {
    file,
    ...(opts['device'] !== undefined ? { device: String(opts['device']) } : {}),
    set: parseSetOptions(opts['set']),
    ...(opts['noiseScale'] !== undefined ? { noiseScale: opts['noiseScale'] as number } : {}),
    ...(opts['layout'] !== undefined ? { layout: opts['layout'] as number[] } : {}),
  };
}
