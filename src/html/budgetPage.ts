/**
 * The HTML report of a noise budget (`fray budget --html FILE`): the sources as bars, and
 * the tables the text report prints (sources, by where they act, by qubit).
 */
import { plotBudget } from '../plots/index.js';
import type { BudgetResult, BudgetSource } from '../studies/index.js';
import { studyFooter, type StudyTable } from './comparePage.js';
import { esc, figure, page, table, type PageSection } from './page.js';

/** Losses below this show as zero (rounding in the last bits of a fidelity, not a loss). */
export const SHOWN_ZERO_LOSS = 1e-12;
const clean = (x: number) => (Math.abs(x) < SHOWN_ZERO_LOSS ? 0 : x);

/** A loss as the budget tables print it (six decimals, rounding noise as 0). */
export function lossText(x: number): string {
  return clean(x).toFixed(6);
}

/** A budget table: per source the loss with only it on, the loss removed when it is off, and (optionally) its share of the total. */
export function budgetTable(rows: readonly BudgetSource[], withShare: boolean): StudyTable {
  return {
    head: ['source', 'loss, only this on', 'removed when off', ...(withShare ? ['share'] : [])],
    rows: rows.map((s) => [s.label, lossText(s.only_on), lossText(s.removed_when_off), ...(withShare ? [`${(100 * clean(s.share)).toFixed(1)}%`] : [])]),
    numeric: withShare ? [1, 2, 3] : [1, 2],
  };
}

/** The loss a budget splits, in words (1 − state fidelity, tvd, …). */
export function lossName(r: BudgetResult): string {
  return r.by === 'state' || r.by === 'classical' || r.by === 'purity' ? `1 − ${r.by === 'purity' ? 'purity' : `${r.by} fidelity`}` : r.by;
}

/** Builds the self-contained HTML page of a noise budget. */
export async function budgetPage(r: BudgetResult, version: string): Promise<string> {
  const show = (t: StudyTable, cls: string) => table(t.head, t.rows, t.numeric, cls);
  const sections: PageSection[] = [
    {
      id: 'sources',
      heading: `Sources of the loss (${lossName(r)})`,
      note: 'Each source alone: the loss with only that source on. The remainder is the total minus the single-source losses: what the sources do together. Every bar is labelled, so the chart reads without colour.',
      body:
        figure(await plotBudget(r), `Loss with only this source on, the remainder, and the total.`) +
        show(budgetTable(r.sources, true), 'budget-sources') +
        `<p>${esc(`Total loss ${lossText(r.total)}; the sources alone sum to ${lossText(r.sum_only_on)}; remainder (interaction between sources) ${lossText(r.remainder)}.`)}</p>`,
    },
  ];
  if (r.where.length > 0) sections.push({ id: 'where', heading: 'Relaxation and dephasing by where they act', body: show(budgetTable(r.where, true), 'budget-where') });
  if (r.qubits.length > 0) sections.push({ id: 'qubits', heading: 'Relaxation and dephasing by qubit (largest first)', body: show(budgetTable(r.qubits, true), 'budget-qubits') });
  return page(
    `Noise budget of ${r.name ?? r.file}`,
    `on ${r.device ?? 'the noise written in the circuit'} · loss = ${lossName(r)} · ${r.runs} runs`,
    sections,
    studyFooter(version),
  );
}
