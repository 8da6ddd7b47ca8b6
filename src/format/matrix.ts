import { evaluateComplex } from '../circuit/expression.js';
import { zeros, type CMatrix } from '../linalg/cmatrix.js';
import type { ProblemList } from './problem.js';
import { offsetInto } from './read.js';
import { describe, type YNode } from './yamlTree.js';

/**
 * Largest magnitude |re + i·im| a matrix entry may have. Unitaries, Kraus operators, Choi
 * matrices, superoperators and PTMs of channels on at most 6 qubits have entries of magnitude
 * at most 64 (bounded by d); the margin leaves room for the unphysical maps `fray channel`
 * inspects, while keeping products of entries (Choi matrices, eigen-solves) far from overflow.
 */
export const MAX_MATRIX_ENTRY = 1e6;

/**
 * Reads a complex matrix written as a list of rows; each entry is a number or a complex
 * expression string ("0.5-0.5i", "i", "1/sqrt(2)", "exp(i*pi/4)"), finite and of magnitude at
 * most MAX_MATRIX_ENTRY.
 */
export function readMatrix(
  node: YNode,
  what: string,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): CMatrix | undefined {
  if (node.kind !== 'seq' || node.items.length === 0) {
    problems.error(node.at, 'bad-matrix', `${what} must be a list of rows, not ${describe(node)}`);
    return undefined;
  }
  const rows = node.items.length;
  const first = node.items[0]!;
  const cols = first.kind === 'seq' ? first.items.length : 0;
  const m = zeros(rows, cols);
  let ok = true;
  node.items.forEach((row, r) => {
    if (row.kind !== 'seq' || row.items.length !== cols || cols === 0) {
      problems.error(row.at, 'bad-matrix', `row ${r + 1} of ${what} must be a list of ${cols || 'the same number of'} entries`);
      ok = false;
      return;
    }
    row.items.forEach((cell, c) => {
      const entryAt = (re: number, im: number): boolean => {
        if (Number.isFinite(re) && Number.isFinite(im) && Math.hypot(re, im) <= MAX_MATRIX_ENTRY) return true;
        const shown = Number.isNaN(re) || Number.isNaN(im) ? 'not a number' : !Number.isFinite(re) || !Number.isFinite(im) ? 'infinite' : `of magnitude ${Math.hypot(re, im).toExponential(2)}`;
        problems.error(cell.at, 'bad-entry', `entry (${r + 1}, ${c + 1}) of ${what} is ${shown}; expected a finite number of magnitude at most ${MAX_MATRIX_ENTRY}`);
        ok = false;
        return false;
      };
      if (cell.kind === 'scalar' && typeof cell.value === 'number') {
        if (entryAt(cell.value, 0)) m.data[2 * (r * cols + c)] = cell.value;
        return;
      }
      if (cell.kind !== 'scalar' || typeof cell.value !== 'string') {
        problems.error(cell.at, 'bad-entry', `entry (${r + 1}, ${c + 1}) of ${what} must be a number or a complex string like "0.5-0.5i", not ${describe(cell)}`);
        ok = false;
        return;
      }
      const v = evaluateComplex(cell.value, env);
      if ('error' in v) {
        problems.error(offsetInto(cell, v.error.offset), 'bad-entry', `entry (${r + 1}, ${c + 1}) of ${what}: ${v.error.message}`);
        ok = false;
        return;
      }
      if (!entryAt(v.value[0], v.value[1])) return;
      m.data[2 * (r * cols + c)] = v.value[0];
      m.data[2 * (r * cols + c) + 1] = v.value[1];
    });
  });
  return ok ? m : undefined;
}

/** log2 of d when d is a power of two ≥ 2, else undefined. */
export function qubitsOfDimension(d: number): number | undefined {
  if (d < 2) return undefined;
  const k = Math.round(Math.log2(d));
  return 1 << k === d ? k : undefined;
}
