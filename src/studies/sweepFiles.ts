import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { toJsonLine } from '../results/json.js';
import type { SweepPlan, SweepRow } from './sweep.js';

/**
 * Sweep output files. Both formats start with one header line naming the sweep — its
 * fingerprint, circuit, point count, ranges and (for a shard) which shard — then one line
 * per point in grid order:
 *
 *   CSV:  `# fray sweep {…}`, the column names, then `point, KEY…, duration_ns,
 *         fidelity_state, fidelity_classical, tvd, purity, observable_<P>_noisy,
 *         observable_<P>_ideal…` (keys in base units: ns, Hz, probabilities, plain numbers)
 *   JSONL: `{"fray_sweep": {…}}`, then `{"index", "point": {KEY: value…}, "result": <fray run --json>}`
 *
 * Numbers are written in their shortest round-trip form, so a row read back is the same
 * double. The header and rows are what resume and merge check.
 */

/** The two formats, chosen by the output file's extension. */
export type SweepFormat = 'csv' | 'jsonl';

/** The header of a sweep file. */
export interface SweepHeader {
  readonly fingerprint: string;
  readonly file: string;
  readonly points: number;
  readonly vary: readonly string[];
  readonly format: SweepFormat;
  /** "I/N" for a shard's file. */
  readonly shard?: string;
}

/** The format of an output path (.csv or .jsonl), or undefined. */
export function formatOf(path: string): SweepFormat | undefined {
  return path.endsWith('.csv') ? 'csv' : path.endsWith('.jsonl') ? 'jsonl' : undefined;
}

/** The header of a plan's output (with the shard when given). */
export function headerOf(plan: SweepPlan, format: SweepFormat, shard?: { index: number; count: number }): SweepHeader {
  return {
    fingerprint: plan.fingerprint,
    file: plan.spec.file,
    points: plan.total,
    vary: plan.spec.vary.map((v) => `${v.key}=${v.text.slice(v.text.indexOf('=') + 1)}`),
    format,
    ...(shard !== undefined ? { shard: `${shard.index}/${shard.count}` } : {}),
  };
}

/** The header line(s) of a file: the sweep line, and for CSV the column names. */
export function headerText(h: SweepHeader, columns: readonly string[]): string {
  const meta = JSON.stringify({ fingerprint: h.fingerprint, file: h.file, points: h.points, vary: h.vary, ...(h.shard !== undefined ? { shard: h.shard } : {}) });
  return h.format === 'csv' ? `# fray sweep ${meta}\n${stringify([[...columns]])}` : `{"fray_sweep":${meta}}\n`;
}

/** The CSV columns of a plan: point, the keys, the figures, each observable's noisy and ideal value. */
export function csvColumns(plan: SweepPlan, observables: readonly string[]): string[] {
  return [
    'point',
    ...plan.spec.vary.map((v) => v.key),
    'duration_ns',
    'fidelity_state',
    'fidelity_classical',
    'tvd',
    'purity',
    ...observables.flatMap((p) => [`observable_${p}_noisy`, `observable_${p}_ideal`]),
  ];
}

/** One row's line (with its newline). */
export function rowText(plan: SweepPlan, row: SweepRow, format: SweepFormat): string {
  if (format === 'jsonl') return toJsonLine({ index: row.index, point: row.values, result: row.result }) + '\n';
  const r = row.result;
  const obs = Object.values(r.observables ?? {}).flatMap((o) => [o.noisy, o.ideal]);
  return stringify([[row.index, ...plan.spec.vary.map((v) => row.values[v.key]!), r.duration_ns, r.fidelity.state, r.fidelity.classical, r.tvd, r.purity, ...obs].map(String)]);
}

/** A sweep file read back: its header, column names (CSV), and each complete row's index and text. */
export interface SweepFileContent {
  readonly header: SweepHeader;
  readonly columns?: readonly string[];
  readonly rows: readonly { readonly index: number; readonly text: string }[];
  /** Length of the complete lines, in UTF-16 code units of the text (a trailing partial line, from a killed run, is not counted); `completeBytes` gives it in bytes of the file. */
  readonly completeLength: number;
}

/** Bytes (UTF-8, as written to the file) of the complete lines of a sweep file's text: where a resumed run cuts the file. */
export function completeBytes(text: string, content: SweepFileContent): number {
  return Buffer.byteLength(text.slice(0, content.completeLength), 'utf8');
}

/** Reads a sweep file's text; an error message says what is wrong with it. */
export function readSweepFile(text: string, format: SweepFormat): SweepFileContent | { error: string } {
  const end = text.lastIndexOf('\n') + 1;
  const lines = text.slice(0, end).split('\n').slice(0, -1);
  const first = lines[0];
  let meta: Record<string, unknown> | undefined;
  try {
    if (format === 'csv' && first?.startsWith('# fray sweep ')) meta = JSON.parse(first.slice('# fray sweep '.length)) as Record<string, unknown>;
    if (format === 'jsonl' && first !== undefined) meta = (JSON.parse(first) as { fray_sweep?: Record<string, unknown> }).fray_sweep;
  } catch {
    meta = undefined;
  }
  if (meta === undefined || typeof meta['fingerprint'] !== 'string' || typeof meta['points'] !== 'number') {
    return { error: `it does not start with a fray sweep header line (${format === 'csv' ? "'# fray sweep {…}'" : '{"fray_sweep": …}'})` };
  }
  const header: SweepHeader = {
    fingerprint: meta['fingerprint'] as string,
    file: String(meta['file']),
    points: meta['points'] as number,
    vary: (meta['vary'] as string[]) ?? [],
    format,
    ...(typeof meta['shard'] === 'string' ? { shard: meta['shard'] } : {}),
  };
  const rows: { index: number; text: string }[] = [];
  let columns: string[] | undefined;
  const body = format === 'csv' ? lines.slice(2) : lines.slice(1);
  if (format === 'csv') {
    if (lines[1] === undefined) return { header, columns: [], rows, completeLength: end };
    columns = (parse(lines[1], { relax_column_count: true }) as string[][])[0] ?? [];
  }
  for (const [k, line] of body.entries()) {
    const at = (format === 'csv' ? 3 : 2) + k;
    let index: number;
    try {
      index = format === 'csv' ? Number((parse(line) as string[][])[0]![0]) : (JSON.parse(line) as { index: number }).index;
    } catch {
      return { error: `line ${at} is not a ${format === 'csv' ? 'CSV row' : 'JSON object'}` };
    }
    if (!Number.isSafeInteger(index) || index < 0 || index >= header.points) return { error: `line ${at} names point ${index}, outside the sweep's 0..${header.points - 1}` };
    rows.push({ index, text: line + '\n' });
  }
  return { header, ...(columns !== undefined ? { columns } : {}), rows, completeLength: end };
}

/**
 * Joins shard files of one sweep into the whole sweep's file, in grid order. Refuses parts
 * of different sweeps or formats, a point given twice, and a missing point.
 */
export function mergeSweepFiles(parts: readonly { path: string; text: string }[], format: SweepFormat): { text: string } | { error: string } {
  let first: SweepFileContent | undefined;
  let firstPath = '';
  const byIndex = new Map<number, { text: string; path: string }>();
  for (const part of parts) {
    const c = readSweepFile(part.text, format);
    if ('error' in c) return { error: `${part.path}: ${c.error}` };
    if (c.completeLength !== part.text.length) return { error: `${part.path}: its last line is cut off (an unfinished shard? run it again with --resume)` };
    if (first === undefined) {
      first = c;
      firstPath = part.path;
    } else if (c.header.fingerprint !== first.header.fingerprint) {
      return { error: `${part.path} is from a different sweep than ${firstPath} (fingerprint ${c.header.fingerprint}, not ${first.header.fingerprint}): circuit, device, keys or ranges differ` };
    }
    for (const r of c.rows) {
      const seen = byIndex.get(r.index);
      if (seen !== undefined) return { error: `point ${r.index} is in both ${seen.path} and ${part.path}` };
      byIndex.set(r.index, { text: r.text, path: part.path });
    }
  }
  if (first === undefined) return { error: 'no parts given' };
  const missing: number[] = [];
  for (let i = 0; i < first.header.points && missing.length < 10; i++) if (!byIndex.has(i)) missing.push(i);
  if (missing.length > 0) return { error: `the parts lack point${missing.length === 1 ? '' : 's'} ${missing.join(', ')}${missing.length === 10 ? ', …' : ''} of ${first.header.points}` };
  const { shard: _shard, ...whole } = first.header;
  void _shard;
  const rows = [...byIndex.keys()].sort((a, b) => a - b).map((i) => byIndex.get(i)!.text);
  return { text: headerText(whole, first.columns ?? []) + rows.join('') };
}
