import { noiseBudget, type BudgetResult, type BudgetSource } from '../studies/index.js';
import { toJson } from '../results/json.js';
import { UsageError, VERSION, type CliIO } from './main.js';
import { parseMetricOption, targetOf } from './options.js';
import { writeOutput } from './outputFiles.js';
import { renderTable } from './table.js';
import { writeHtmlReport } from './htmlReport.js';
import { budgetPage, budgetTable, lossName, lossText } from '../html/index.js';

/** `fray budget FILE`: where the loss of a metric comes from. */
export async function budgetCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const by = opts['by'] !== undefined ? parseMetricOption('--by', String(opts['by'])) : undefined;
  if (by?.kind === 'duration') throw new UsageError('--by duration: the budget splits a loss caused by noise; use state, classical, tvd, purity or observable:P');
  const r = noiseBudget(file, {
    ...targetOf(file, opts),
    ...(by !== undefined ? { by } : {}),
  });
  if (opts['plot'] !== undefined) writeOutput('--plot', String(opts['plot']), await (await import('../plots/index.js')).plotBudget(r));
  await writeHtmlReport(opts, io, () => budgetPage(r, VERSION));
  io.stdout.write(opts['json'] ? toJson(r) + '\n' : renderBudget(r));
}

/** The source table, the remainder line, then the split by where and by qubit. */
export function renderBudget(r: BudgetResult): string {
  const table = (rows: readonly BudgetSource[], withShare: boolean) => {
    const t = budgetTable(rows, withShare);
    return renderTable(t.head, t.rows, t.head.map((_, c) => t.numeric.includes(c)));
  };
  const num = lossText;
  const lines = [
    `Noise budget of ${r.name ?? r.file} on ${r.device ?? 'the noise written in the circuit'}: loss = ${lossName(r)}`,
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
