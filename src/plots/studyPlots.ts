import type { BudgetResult, CompareResult, Condition, Metric, SweepCheck, SweepPlan, SweepRow, Varied } from '../studies/index.js';
import { basename } from 'node:path';
import type { CheckResult } from '../mitigation/check.js';
import { metricTitle, metricValue, NOISE_SCALE_KEY, parseMetric, variantLabel } from '../studies/index.js';
import { barChart, heatMap, lineChart } from './charts.js';
import { NOISE_KIND_KEYS } from '../noise/kinds.js';
import { renderSvg } from './render.js';

/** The ranking metric of a comparison as bars, best first, coloured by whether the variant met every requirement. */
export async function plotCompare(r: CompareResult): Promise<string> {
  const m = parseMetric(r.by);
  const title = 'error' in m ? r.by : metricTitle(m);
  return renderSvg(
    barChart(
      r.variants.map((v) => ({ label: `${v.rank}. ${variantLabel(v)}`, value: v.value, group: v.failed.length > 0 ? 'fails a requirement' : 'meets every requirement' })),
      { title: `Variants ranked by ${title}`, subtitle: `devices: ${[...new Set(r.variants.map((v) => v.device ?? 'none'))].join('; ')}`, valueTitle: title },
    ),
  );
}

/** Profile fields whose values are probabilities (the unit an axis names for them). */
const PROBABILITY_FIELDS: ReadonlySet<string> = new Set([...NOISE_KIND_KEYS, 'readout', 'excited', 'x', 'y', 'z', 'zero_as_one', 'one_as_zero']);

/** The axis title of a varied key: the key and its unit (base unit, probability, or none for a parameter). */
function keyTitle(v: Varied): string {
  if (v.key === NOISE_SCALE_KEY) return 'noise scale C (× every noise strength)';
  if (v.unit !== null) return `${v.key} (${v.unit})`;
  const field = v.key.split('.').pop()!;
  return v.key.includes('.') && PROBABILITY_FIELDS.has(field) ? `${v.key} (probability)` : v.key;
}

/**
 * A sweep's plot: one varied key → each metric against it (a log axis for a log range) with
 * the target line when given; two keys → a heat map of the first metric over both.
 */
export async function plotSweep(plan: SweepPlan, check: SweepCheck, rows: readonly SweepRow[], metrics: readonly Metric[], target?: Condition): Promise<string> {
  const who = `${check.name ?? plan.spec.file} on ${check.device ?? 'the noise written in the circuit'}`;
  const vary = plan.spec.vary;
  if (vary.length === 1) {
    const v = vary[0]!;
    const points = rows.flatMap((r) => metrics.map((m) => ({ x: r.values[v.key]!, series: metricTitle(m), y: metricValue(r.result, m) })));
    const fidelities = metrics.every((m) => m.kind === 'state' || m.kind === 'classical');
    const yTitle = metrics.length === 1 ? metricTitle(metrics[0]!) : fidelities ? 'fidelity' : 'value';
    return renderSvg(
      lineChart(points, {
        title: `${metrics.map(metricTitle).join(', ')} against ${v.key}`,
        subtitle: who,
        xTitle: keyTitle(v),
        yTitle,
        logX: v.log,
        ...(target !== undefined ? { target: { y: target.value, label: `target ${target.text}` } } : {}),
      }),
    );
  }
  const [vx, vy] = [vary[1]!, vary[0]!];
  const m = metrics[0]!;
  return renderSvg(
    heatMap(
      rows.map((r) => ({ x: r.values[vx.key]!, y: r.values[vy.key]!, value: metricValue(r.result, m) })),
      { title: `${metricTitle(m)} over ${vy.key} and ${vx.key}`, subtitle: who, xTitle: keyTitle(vx), yTitle: keyTitle(vy), valueTitle: metricTitle(m) },
    ),
  );
}

/** A budget's sources as bars (loss with only that source on), then the remainder, then the total. */
export async function plotBudget(r: BudgetResult): Promise<string> {
  const m = parseMetric(r.by);
  const loss = 'error' in m ? r.by : `loss of ${metricTitle(m)}`;
  return renderSvg(
    barChart(
      [
        // a loss within rounding of zero is drawn as zero
        ...r.sources.map((s) => ({ label: s.label, value: Math.abs(s.only_on) < 1e-12 ? 0 : s.only_on, group: 'source alone' })),
        { label: 'remainder (interaction)', value: r.remainder, group: 'remainder' },
        { label: 'total', value: r.total, group: 'total' },
      ],
      { title: `Noise budget: ${loss}`, subtitle: `${r.name ?? r.file} on ${r.device ?? 'the noise written in the circuit'}`, valueTitle: `${loss} (only this source on)` },
    ),
  );
}

/** A check's expectations as bars of the value each one read, grouped (and labelled) by whether it holds. */
export async function plotCheck(r: CheckResult): Promise<string> {
  const many = r.files.length > 1;
  const bars = r.files.flatMap((f) =>
    f.expectations.map((e) => ({ label: `${e.pass ? 'pass' : 'FAIL'} · ${many ? `${basename(f.file)} · ` : ''}${e.expectation}`, value: e.value, group: e.pass ? 'holds' : 'fails' })),
  );
  return renderSvg(
    barChart(bars, { title: 'Expectations and the values they read', subtitle: `${r.files.length} file${r.files.length === 1 ? '' : 's'}; ${r.passed ? 'all pass' : 'not all pass'}`, valueTitle: 'value of the expectation\u2019s figure' }),
  );
}
