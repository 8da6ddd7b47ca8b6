import type { RunResult } from '../api/simulate.js';
import { failedConditions, type Condition } from './conditions.js';
import { higherIsBetter, metricName, metricTitle, metricValue, observablesOf, type Metric } from './metrics.js';
import { countOperations, runVariant, SourceCache, type OperationCounts, type VariantChoice } from './variant.js';

/**
 * `fray compare`: runs every circuit with every device and every layout (a cross
 * product; without devices each circuit's own) and ranks the variants by one metric.
 */

/** Options of a comparison. */
export interface CompareOptions {
  /** Device profiles replacing each circuit's own (each one a variant). */
  readonly devices?: readonly string[];
  /** Placements (each one a variant). */
  readonly layouts?: readonly (readonly number[])[];
  /** The ranking metric (default state fidelity). */
  readonly by?: Metric;
  /** Conditions every variant must meet. */
  readonly require?: readonly Condition[];
  /** Overrides and noise scale applied to every variant. */
  readonly common?: Omit<VariantChoice, 'layout'>;
}

/** One ranked variant: the figures of `fray run FILE --json` plus its rank, counts and failed conditions. */
export interface ComparedVariant {
  readonly rank: number;
  readonly file: string;
  /** The device's name (or null), and the path given with --device when there were several. */
  readonly device: string | null;
  readonly device_file?: string;
  readonly layout?: readonly number[];
  readonly name: string | null;
  readonly qubits: number;
  readonly measured: readonly number[];
  readonly duration_ns: number;
  readonly operations: OperationCounts;
  readonly fidelity: RunResult['fidelity'];
  readonly tvd: number;
  readonly purity: number;
  readonly observables?: RunResult['observables'];
  /** The ranking metric's value. */
  readonly value: number;
  /** The conditions this variant fails, as written (empty when it meets all). */
  readonly failed: readonly string[];
  /** The run's warnings (`FILE:LINE:COL: message`), as `fray run --json` gives them. */
  readonly warnings: readonly string[];
}

/** The outcome of a comparison, best first. */
export interface CompareResult {
  readonly by: string;
  readonly variants: readonly ComparedVariant[];
  /** False when the variants differ in qubit count or measured qubits (each is then compared with its own ideal run). */
  readonly comparable: boolean;
  /** One sentence naming the winner and its margin over the runner-up. */
  readonly verdict: string;
}

/** Metric values closer than this rank as a tie (rounding in the last bits, not a difference). */
export const RANK_TIE_TOLERANCE = 1e-12;

/** Runs and ranks the variants. Throws InputError on bad input in any of them. */
export function compareVariants(files: readonly string[], options: CompareOptions = {}): CompareResult {
  const by = options.by ?? { kind: 'state' };
  const conditions = options.require ?? [];
  const observe = observablesOf([by, ...conditions.map((c) => c.metric)]);
  const cache = new SourceCache();
  const devices: (string | undefined)[] = options.devices !== undefined && options.devices.length > 0 ? [...options.devices] : [undefined];
  const layouts: (readonly number[] | undefined)[] = options.layouts !== undefined && options.layouts.length > 0 ? [...options.layouts] : [undefined];
  const rows: Omit<ComparedVariant, 'rank'>[] = [];
  for (const file of files) {
    for (const device of devices) {
      for (const layout of layouts) {
        const source = cache.get(file, device);
        const choice: VariantChoice = { ...options.common, ...(layout !== undefined ? { layout } : {}) };
        const sim = runVariant(source, choice, { observe }, [by, ...conditions.map((c) => c.metric)]);
        const r = sim.result;
        rows.push({
          file,
          device: r.device,
          ...(devices.length > 1 && device !== undefined ? { device_file: device } : {}),
          ...(layout !== undefined ? { layout: [...layout] } : {}),
          name: r.name,
          qubits: r.qubits,
          measured: r.measured,
          duration_ns: r.duration_ns,
          operations: countOperations(sim.circuit),
          fidelity: r.fidelity,
          tvd: r.tvd,
          purity: r.purity,
          ...(r.observables !== undefined ? { observables: r.observables } : {}),
          value: metricValue(r, by),
          failed: failedConditions(r, conditions),
          warnings: r.warnings,
        });
      }
    }
  }
  const sign = higherIsBetter(by) ? -1 : 1;
  // Stable: values within RANK_TIE_TOLERANCE keep the order they were given in.
  const order = rows
    .map((r, i) => ({ r, i }))
    .sort((a, b) => (Math.abs(a.r.value - b.r.value) <= RANK_TIE_TOLERANCE ? a.i - b.i : sign * (a.r.value - b.r.value)));
  const variants = order.map(({ r }, k) => ({ rank: k + 1, ...r }));
  const first = rows[0]!;
  const comparable = rows.every((r) => r.qubits === first.qubits && r.measured.join(',') === first.measured.join(','));
  return { by: metricName(by), variants, comparable, verdict: verdictOf(variants, by) };
}

/** A short label of a variant: its file, then device and layout when they distinguish it. */
export function variantLabel(v: Pick<ComparedVariant, 'file' | 'device_file' | 'layout'>): string {
  return [v.file, ...(v.device_file !== undefined ? [`on ${v.device_file}`] : []), ...(v.layout !== undefined ? [`layout ${v.layout.join(',')}`] : [])].join(' ');
}

/** "A wins on state fidelity: 0.9312 against 0.9011 for B (+0.0301)." */
function verdictOf(variants: readonly ComparedVariant[], by: Metric): string {
  const best = variants[0]!;
  const title = metricTitle(by);
  if (variants.length === 1) return `${variantLabel(best)}: ${title} ${fmt(best.value)} (the only variant).`;
  const next = variants[1]!;
  const margin = best.value - next.value;
  if (Math.abs(margin) <= RANK_TIE_TOLERANCE) return `${variantLabel(best)} and ${variantLabel(next)} tie on ${title} at ${fmt(best.value)}.`;
  return `${variantLabel(best)} wins on ${title}: ${fmt(best.value)} against ${fmt(next.value)} for ${variantLabel(next)} (${margin > 0 ? '+' : '−'}${fmt(Math.abs(margin))}).`;
}

/** Six significant digits, as the tables print. */
export function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6)));
}
