import { readFileSync } from 'node:fs';
import { fileStart, InputError } from '../format/problem.js';
import { formatOf, mergeSweepFiles } from '../studies/index.js';
import { writeOutput } from './outputFiles.js';
import { UsageError, type CliIO } from './main.js';

/** `fray merge PART… --out FILE`: joins a sweep's shard files in grid order. */
export async function mergeCommand(parts: string[], opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const out = String(opts['out']);
  const format = formatOf(out);
  if (format === undefined) throw new UsageError(`--out ${out}: expected a .csv or .jsonl file`);
  for (const p of parts) if (formatOf(p) !== format) throw new UsageError(`${p}: every part must be a .${format} file like --out`);
  const texts = parts.map((path) => {
    try {
      return { path, text: readFileSync(path, 'utf8') };
    } catch (e) {
      throw new InputError([{ ...fileStart(path), severity: 'error', code: 'cannot-read', message: `cannot read sweep part '${path}': ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}` }]);
    }
  });
  const merged = mergeSweepFiles(texts, format);
  if ('error' in merged) throw new InputError([{ ...fileStart(parts[0]!), severity: 'error', code: 'bad-merge', message: `merge: ${merged.error}` }]);
  writeOutput('--out', out, merged.text);
  if (opts['quiet'] !== true) io.stderr.write(`merge: ${parts.length} part${parts.length === 1 ? '' : 's'} written to ${out}\n`);
}
