/**
 * The HTML report of a sweep (`fray sweep --html FILE`): the metrics against the varied
 * key (two keys: a heat map), and every point as the table the text report prints.
 */
import { plotSweep } from '../plots/index.js';
import { metricName, metricValue, type Condition, type Metric, type SweepCheck, type SweepPlan, type SweepRow } from '../studies/index.js';
import { studyFooter, type StudyTable } from './comparePage.js';
import { esc, figure, keyValueList, page, table, type PageSection } from './page.js';

/** A sweep's points in grid order: the varied keys (base units, 6 significant digits), then each metric (6 decimals). */
export function sweepTable(plan: SweepPlan, rows: readonly SweepRow[], metrics: readonly Metric[]): StudyTable {
  const head = [...plan.spec.vary.map((v) => (v.unit !== null ? `${v.key} (${v.unit})` : v.key)), ...metrics.map(metricName)];
  const sorted = [...rows].sort((a, b) => a.index - b.index);
  return {
    head,
    rows: sorted.map((r) => [...plan.spec.vary.map((v) => String(Number(r.values[v.key]!.toPrecision(6)))), ...metrics.map((m) => metricValue(r.result, m).toFixed(6))]),
    numeric: head.map((_, c) => c),
  };
}

/** What a sweep page draws: the plan, its check, its rows, the metrics shown and the optional target line. */
export interface SweepPageInput {
  readonly plan: SweepPlan;
  readonly check: SweepCheck;
  readonly rows: readonly SweepRow[];
  readonly metrics: readonly Metric[];
  readonly target?: Condition;
}

/** Builds the self-contained HTML page of a sweep; a sweep of more than two keys gets the table only (no picture draws three axes and a colour well). */
export async function sweepPage(s: SweepPageInput, version: string): Promise<string> {
  const vary = s.plan.spec.vary;
  const t = sweepTable(s.plan, s.rows, s.metrics);
  const who = `${s.check.name ?? s.plan.spec.file} on ${s.check.device ?? 'the noise written in the circuit'}`;
  const drawn =
    vary.length <= 2
      ? figure(await plotSweep(s.plan, s.check, s.rows, s.metrics, s.target), vary.length === 1 ? 'Each metric against the varied key (one line style and marker per metric).' : 'The first metric over both varied keys; each cell prints its value.')
      : `<p class="note">${esc(`This sweep varies ${vary.length} keys: the page shows the table (a picture draws one key, or two as a heat map).`)}</p>`;
  const sections: PageSection[] = [
    {
      id: 'sweep',
      heading: 'Sweep',
      body: keyValueList([
        ['circuit', s.plan.spec.file],
        ['device', s.check.device ?? 'the noise written in the circuit'],
        ...vary.map((v) => ['varied', v.text] as const),
        ['points', `${s.rows.length} of ${s.plan.total}`],
        ['metrics', s.metrics.map(metricName).join(', ')],
        ...(s.target !== undefined ? [['target', s.target.text] as const] : []),
        ['fingerprint', s.plan.fingerprint],
      ]),
    },
    { id: 'plot', heading: 'Picture', body: drawn },
    { id: 'points', heading: `Points (${s.rows.length})`, note: 'Varied keys in base units (ns, Hz, probabilities), in grid order (first key outermost).', body: table(t.head, t.rows, t.numeric, 'sweep') },
  ];
  return page(`Sweep of ${s.check.name ?? s.plan.spec.file}`, who, sections, studyFooter(version));
}
