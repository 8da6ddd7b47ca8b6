import { MAX_DATA_FILE_BYTES, readBounded } from '../api/readInput.js';
import { formatProblem, type Problem } from '../format/problem.js';
import type { Style } from './style.js';

/**
 * Problems as text: one `FILE:LINE:COL: message` line per problem (the contract's form,
 * for scripts and CI). With `showSource` (a terminal), each is followed by its source line
 * and a caret under the column.
 */
export function renderProblems(problems: readonly Problem[], style: Style, showSource: boolean): string {
  const cache = new Map<string, string[] | null>();
  const lineOf = (file: string, line: number): string | undefined => {
    if (!cache.has(file)) {
      // bounded: the file a problem names may be the device or huge file it complains about
      const r = readBounded(file, MAX_DATA_FILE_BYTES);
      cache.set(file, 'text' in r ? r.text.split(/\r?\n/) : null);
    }
    return cache.get(file)?.[line - 1];
  };
  const out: string[] = [];
  for (const p of problems) {
    const head = formatProblem(p);
    out.push(p.severity === 'error' ? style.red(head) : style.yellow(head));
    if (!showSource) continue;
    const src = lineOf(p.file, p.line);
    if (src === undefined) continue;
    out.push(`  ${src}`);
    out.push(`  ${' '.repeat(Math.max(0, p.col - 1))}${style.bold('^')}`);
  }
  return out.join('\n') + '\n';
}
