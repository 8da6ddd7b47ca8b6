import { closeSync, existsSync, truncateSync, writeSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { MAX_DATA_FILE_BYTES, readInputFile } from '../api/readInput.js';
import { fileStart, InputError, ProblemList, warningText } from '../format/problem.js';
import {
  checkSweep,
  csvColumns,
  formatOf,
  headerOf,
  headerText,
  parseVary,
  planSweep,
  readSweepFile,
  completeBytes,
  rowText,
  runSweep,
  type Metric,
  type SweepPlan,
  type SweepRow,
  type Varied,
} from '../studies/index.js';
import { UsageError, VERSION, type CliIO } from './main.js';
import { parseConditionOption, parseMetricOption, targetOf } from './options.js';
import { makeProgress } from './progress.js';
import { openOutput, writeOutput } from './outputFiles.js';
import { renderTable } from './table.js';
import { writeHtmlReport } from './htmlReport.js';
import { sweepPage, sweepTable } from '../html/index.js';

/** `--shard I/N`. */
export function parseShard(v: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(v.trim());
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || count < 1 || index >= count) throw new UsageError(`--shard ${v}: expected I/N with 0 ≤ I < N, e.g. --shard 0/4 (the array index of a batch job as I)`);
  return { index, count };
}

/** `fray sweep FILE --vary KEY=RANGE …`. */
export async function sweepCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const vary: Varied[] = ((opts['vary'] as string[] | undefined) ?? []).map((t) => {
    const v = parseVary(t);
    if ('error' in v) throw new UsageError(`--vary ${v.error}`);
    return v;
  });
  if (vary.length === 0) throw new UsageError('sweep needs at least one --vary KEY=RANGE, e.g. --vary gates.cx.error=0.001..0.02:8');
  const metrics: Metric[] = ((opts['metric'] as string[] | undefined) ?? []).map((t) => parseMetricOption('--metric', t));
  const target = opts['target'] !== undefined ? parseConditionOption('--target', String(opts['target'])) : undefined;
  const shard = opts['shard'] !== undefined ? parseShard(String(opts['shard'])) : undefined;
  const out = opts['out'] !== undefined ? String(opts['out']) : undefined;
  const format = out !== undefined ? formatOf(out) : undefined;
  if (out !== undefined && format === undefined) throw new UsageError(`--out ${out}: expected a .csv or .jsonl file`);
  if (opts['resume'] === true && out === undefined) throw new UsageError('--resume needs --out FILE (the file to continue)');
  if (shard !== undefined && out === undefined) throw new UsageError('--shard needs --out FILE (each shard writes its own file for fray merge)');
  const plotted: Metric[] = metrics.length > 0 ? metrics : target !== undefined ? [target.metric] : [{ kind: 'state' }];
  const plan = planSweep({
    ...targetOf(file, opts),
    vary,
    metrics: [...plotted, ...(target !== undefined ? [target.metric] : [])],
  });
  if (opts['plot'] !== undefined && vary.length > 2) throw new UsageError(`--plot draws one varied key (metrics against it) or two (a heat map); this sweep varies ${vary.length}`);
  const selection = { ...(shard !== undefined ? { shard } : {}) };
  const check = checkSweep(plan, selection);
  const observables = check.observables;

  // The output file: fresh, or continued after the complete rows already in it.
  let skip = new Set<number>();
  let fd: number | undefined;
  if (out !== undefined && format !== undefined) {
    const header = headerOf(plan, format, shard);
    const columns = csvColumns(plan, observables);
    if (opts['resume'] === true && existsSync(out)) {
      const text = readSweepOutput(out);
      const c = readSweepFile(text, format);
      if ('error' in c) throw new InputError([{ ...fileStart(out), severity: 'error', code: 'bad-sweep-file', message: `--resume: ${out}: ${c.error}` }]);
      if (c.header.fingerprint !== header.fingerprint || c.header.shard !== header.shard) {
        throw new InputError([{ ...fileStart(out), severity: 'error', code: 'other-sweep', message: `--resume: ${out} holds another sweep (fingerprint ${c.header.fingerprint}${c.header.shard ? `, shard ${c.header.shard}` : ''}); this one is ${header.fingerprint}${header.shard ? `, shard ${header.shard}` : ''}` }]);
      }
      skip = new Set(c.rows.map((r) => r.index));
      if (c.completeLength < text.length) truncateSync(out, completeBytes(text, c));
      if (format === 'csv' && c.columns !== undefined && c.columns.length === 0) writeOutput('--out', out, headerText(header, columns));
      fd = openOutput('--out', out, 'a');
    } else {
      fd = openOutput('--out', out, 'w');
      writeSync(fd, headerText(header, columns));
    }
  }

  const progress = makeProgress(io, 'sweep', opts['quiet'] === true);
  const rows: SweepRow[] = [];
  try {
    const fresh = await runSweep(plan, {
      ...selection,
      skip,
      jobs: (opts['jobs'] as number | undefined) ?? defaultJobs(),
      onRow: (row) => {
        if (fd !== undefined && format !== undefined) writeSync(fd, rowText(plan, row, format));
      },
      onProgress: (done, total) => progress.update(done, total),
    });
    rows.push(...fresh);
  } finally {
    progress.stop();
    if (fd !== undefined) closeSync(fd);
  }
  const html = opts['html'] !== undefined;
  if (opts['plot'] !== undefined || html) {
    const all = out !== undefined && format !== undefined ? readAllRows(out, format, rows) : rows;
    if (opts['plot'] !== undefined) writeOutput('--plot', String(opts['plot']), await (await import('../plots/index.js')).plotSweep(plan, check, all, plotted, target));
    await writeHtmlReport(opts, io, () => sweepPage({ plan, check, rows: all, metrics: plotted, ...(target !== undefined ? { target } : {}) }, VERSION));
  }
  // A warning repeats at many points (the same file position): say each once.
  const warnings = [...new Set(rows.flatMap((r) => r.result.warnings.map(warningText)))];
  if (warnings.length > 0 && opts['quiet'] !== true) io.stderr.write(`sweep: warnings at some points:\n${warnings.map((w) => `  ${w}\n`).join('')}`);
  if (out === undefined) io.stdout.write(renderSweep(plan, rows, plotted));
  else if (opts['quiet'] !== true) io.stderr.write(`sweep: ${rows.length} point${rows.length === 1 ? '' : 's'} written to ${out}${skip.size > 0 ? ` (${skip.size} already there)` : ''}\n`);
}

/** The text of the sweep output `out` read back (bounded by MAX_DATA_FILE_BYTES); a located InputError when it cannot be. */
function readSweepOutput(out: string): string {
  const problems = new ProblemList();
  const text = readInputFile(out, fileStart(out), 'sweep output', problems, MAX_DATA_FILE_BYTES);
  problems.throwIfErrors();
  return text!;
}

/** The machine's cores (piscina's own default is the same). */
function defaultJobs(): number {
  return Math.max(1, (globalThis as { navigator?: { hardwareConcurrency?: number } }).navigator?.hardwareConcurrency ?? 1);
}

/** Every row of the output (after a resume, the earlier ones too) for the plot, read back from the file. */
function readAllRows(out: string, format: 'csv' | 'jsonl', fresh: readonly SweepRow[]): SweepRow[] {
  const text = readSweepOutput(out);
  if (format === 'jsonl') {
    const c = readSweepFile(text, format);
    if ('error' in c) return [...fresh];
    return c.rows.map((r) => {
      const o = JSON.parse(r.text) as { index: number; point: Record<string, number>; result: SweepRow['result'] };
      return { index: o.index, values: o.point, result: o.result };
    });
  }
  // CSV rows hold the figures the metrics read; the rest of a run's result is not in them.
  const records = parse(text, { comment: '#', columns: true, cast: (v, ctx) => (ctx.header ? v : Number(v)) }) as Record<string, number>[];
  return records.map((rec) => {
    const observables: Record<string, { noisy: number; ideal: number }> = Object.create(null) as Record<string, { noisy: number; ideal: number }>;
    for (const k of Object.keys(rec)) {
      const m = /^observable_(.+)_noisy$/.exec(k);
      if (m !== null) observables[m[1]!] = { noisy: rec[k]!, ideal: rec[`observable_${m[1]}_ideal`]! };
    }
    const values: Record<string, number> = Object.create(null) as Record<string, number>;
    for (const k of Object.keys(rec)) if (!FIGURE_COLUMN.test(k)) values[k] = rec[k]!;
    delete values['point'];
    const result = { duration_ns: rec['duration_ns'], fidelity: { state: rec['fidelity_state'], classical: rec['fidelity_classical'] }, tvd: rec['tvd'], purity: rec['purity'], observables } as unknown as SweepRow['result'];
    return { index: rec['point']!, values, result };
  });
}

/** Columns of a sweep CSV that hold figures rather than varied keys. */
const FIGURE_COLUMN = /^(duration_ns|fidelity_state|fidelity_classical|tvd|purity|observable_.+_(noisy|ideal))$/;

/** The points as a table on stdout (when there is no --out). */
function renderSweep(plan: SweepPlan, rows: readonly SweepRow[], metrics: readonly Metric[]): string {
  const t = sweepTable(plan, rows, metrics);
  return renderTable(t.head, t.rows, t.head.map(() => true));
}
