import { noiseBudget, type BudgetResult, type BudgetSource } from '../studies/index.js';
import { toJson } from '../results/json.js';
import { UsageError, type CliIO } from './main.js';
import { parseMetricOption, targetOf } from './options.js';
import { writeOutput } from './outputFiles.js';
import { renderTable } from './table.js';

/** `fray budget FILE`: where the loss of a metric comes from. */
export async function budgetCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const by = opts['by'] !== undefined ? parseMetricOption('--by', String(opts['by'])) : undefined;
  if (by?.kind === 'duration') throw new UsageError('--by duration: the budget splits a loss caused by noise; use state, classical, tvd, purity or observable:P');
  const r = noiseBudget(file, {
    ...targetOf(file, opts),
    ...(by !== undefined ? { by } : {}),
  });
  if (opts['plot'] !== undefined) writeOutput('--plot', String(opts['plot']), await (await import('../plots/index.js')).plotBudget(r));
  io.stdout.write(opts['json'] ? toJson(r) + '\n' : renderBudget(r));
}

/** Losses below this print as zero (rounding in the last bits of a fidelity, not a loss). */
const SHOWN_ZERO = 1e-12;
const clean = (x: number) => (Math.abs(x) < SHOWN_ZERO ? 0 : x);
const pct = (x: number) => `${(100 * clean(x)).toFixed(1)}%`;
const num = (x: number) => clean(x).toFixed(6);

/** The source table, the remainder line, then the split by where and by qubit. */
export function renderBudget(r: BudgetResult): string {
  const table = (rows: readonly BudgetSource[], withShare: boolean) =>
    renderTable(
      ['source', 'loss, only this on', 'removed when off', ...(withShare ? ['share'] : [])],
      rows.map((s) => [s.label, num(s.only_on), num(s.removed_when_off), ...(withShare ? [pct(s.share)] : [])]),
      [false, true, true, true],
    );
  const lossName = r.by === 'state' || r.by === 'classical' || r.by === 'purity' ? `1 − ${r.by === 'purity' ? 'purity' : `${r.by} fidelity`}` : r.by;
  const lines = [
    `Noise budget of ${r.name ?? r.file} on ${r.device ?? 'the noise written in the circuit'}: loss = ${lossName}`,
    '',
    table(r.sources, true).trimEnd(),
    '',
    `  total loss ${num(r.total)}; the sources alone sum to ${num(r.sum_only_on)}; remainder (interaction between sources) ${num(r.remainder)}`,
  ];
  if (r.where.length > 0) lines.push('', 'Relaxation and dephasing by where they act', '', table(r.where, true).trimEnd());
  if (r.qubits.length > 0) lines.push('', 'Relaxation and dephasing by qubit (largest first)', '', table(r.qubits, true).trimEnd());
  lines.push('', `(${r.runs} runs)`);
  return lines.join('\n') + '\n';
}
