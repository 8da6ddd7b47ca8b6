import { MAX_DATA_FILE_BYTES, readInputFile } from '../api/readInput.js';
import { fileStart, InputError, ProblemList } from '../format/problem.js';
import { formatOf, mergeSweepFiles } from '../studies/index.js';
import { writeOutput } from './outputFiles.js';
import { UsageError, type CliIO } from './main.js';

/** `fray merge PART… --out FILE`: joins a sweep's shard files in grid order. */
export async function mergeCommand(parts: string[], opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const out = String(opts['out']);
  const format = formatOf(out);
  if (format === undefined) throw new UsageError(`--out ${out}: expected a .csv or .jsonl file`);
  for (const p of parts) if (formatOf(p) !== format) throw new UsageError(`${p}: every part must be a .${format} file like --out`);
  const problems = new ProblemList();
  const texts = parts.map((path) => ({ path, text: readInputFile(path, fileStart(path), 'sweep part', problems, MAX_DATA_FILE_BYTES) ?? '' }));
  problems.throwIfErrors();
  const merged = mergeSweepFiles(texts, format);
  if ('error' in merged) throw new InputError([{ ...fileStart(parts[0]!), severity: 'error', code: 'bad-merge', message: `merge: ${merged.error}` }]);
  writeOutput('--out', out, merged.text);
  if (opts['quiet'] !== true) io.stderr.write(`merge: ${parts.length} part${parts.length === 1 ? '' : 's'} written to ${out}\n`);
}
