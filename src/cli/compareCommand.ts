import { warningText } from '../format/problem.js';
import { compareVariants, type CompareResult } from '../studies/index.js';
import { stringify } from 'csv-stringify/sync';
import { toJson } from '../results/json.js';
import { EXIT, VERSION, type CliIO } from './main.js';
import { parseConditionOption, parseMetricOption, parseSetOptions } from './options.js';
import { writeOutput } from './outputFiles.js';
import { renderTable } from './table.js';
import { writeHtmlReport } from './htmlReport.js';
import { compareTable, comparePage } from '../html/index.js';

/** `fray compare A.yaml B.yaml …`: ranks the variants; exit status 3 when one fails a --require. */
export async function compareCommand(files: string[], opts: Record<string, unknown>, io: CliIO): Promise<number> {
  const by = opts['by'] !== undefined ? parseMetricOption('--by', String(opts['by'])) : undefined;
  const require = ((opts['require'] as string[] | undefined) ?? []).map((t) => parseConditionOption('--require', t));
  const set = parseSetOptions(opts['set']);
  const result = compareVariants(files, {
    ...(opts['device'] !== undefined ? { devices: opts['device'] as string[] } : {}),
    ...(opts['layout'] !== undefined ? { layouts: opts['layout'] as number[][] } : {}),
    ...(by !== undefined ? { by } : {}),
    require,
    common: { set, ...(opts['noiseScale'] !== undefined ? { noiseScale: opts['noiseScale'] as number } : {}) },
  });
  if (opts['csv'] !== undefined) writeOutput('--csv', String(opts['csv']), compareCsv(result));
  if (opts['plot'] !== undefined) writeOutput('--plot', String(opts['plot']), await (await import('../plots/index.js')).plotCompare(result));
  await writeHtmlReport(opts, io, () => comparePage(result, VERSION));
  io.stdout.write(opts['json'] ? toJson(result) + '\n' : renderCompare(result));
  return result.variants.some((v) => v.failed.length > 0) ? EXIT.requirement : EXIT.ok;
}

/** The ranked table, the verdict, and what failed. */
export function renderCompare(r: CompareResult): string {
  const t = compareTable(r);
  const right = t.head.map((_, c) => t.numeric.includes(c));
  const lines = [`Variants ranked by ${r.by} (best first)`, '', renderTable(t.head, t.rows, right).trimEnd(), '', r.verdict];
  if (!r.comparable) {
    lines.push('The variants differ in qubit count or measured qubits: each figure compares a variant with its own ideal run (state fidelity, and TVD of its own distributions).');
  }
  const warnings = [...new Set(r.variants.flatMap((v) => v.warnings.map(warningText)))];
  if (warnings.length > 0) lines.push('', 'Warnings:', ...warnings.map((w) => `  ${w}`));
  const failing = r.variants.filter((v) => v.failed.length > 0);
  if (failing.length > 0) lines.push(`${failing.length} of ${r.variants.length} variant${r.variants.length === 1 ? '' : 's'} fail${failing.length === 1 ? 's' : ''} a requirement (exit status 3).`);
  return lines.join('\n') + '\n';
}

/** One CSV row per variant, best first. */
export function compareCsv(r: CompareResult): string {
  const obsKeys = [...new Set(r.variants.flatMap((v) => Object.keys(v.observables ?? {})))];
  const header = ['rank', 'file', 'device', 'layout', 'name', 'duration_ns', 'one_qubit_gates', 'two_qubit_gates', 'measurements', 'resets', 'fidelity_state', 'fidelity_classical', 'tvd', 'purity', ...obsKeys.flatMap((p) => [`observable_${p}_noisy`, `observable_${p}_ideal`]), 'failed'];
  const rows = r.variants.map((v) => [
    v.rank,
    v.file,
    v.device ?? '',
    v.layout?.join(' ') ?? '',
    v.name ?? '',
    v.duration_ns,
    v.operations.one_qubit_gates,
    v.operations.two_qubit_gates,
    v.operations.measurements,
    v.operations.resets,
    v.fidelity.state,
    v.fidelity.classical,
    v.tvd,
    v.purity,
    ...obsKeys.flatMap((p) => [v.observables?.[p]?.noisy ?? '', v.observables?.[p]?.ideal ?? '']),
    v.failed.join(' '),
  ]);
  return stringify([header, ...rows]);
}

