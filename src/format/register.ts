import { suggest } from '../circuit/suggest.js';
import type { Register } from '../circuit/circuit.js';
import type { ProblemList } from './problem.js';
import { describe, type YNode } from './yamlTree.js';

/** Most qubits a circuit file may declare (far beyond what memory allows; guards 2^n arithmetic). */
export const MAX_DECLARED_QUBITS = 24;

/** Reads `qubits:` — a count n (qubits 0..n−1) or a list of unique labels (words, or `name[index]` as OpenQASM names register elements). */
export function readRegister(node: YNode, problems: ProblemList): Register | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'number') {
    const n = node.value;
    if (!Number.isInteger(n) || n < 1 || n > MAX_DECLARED_QUBITS) {
      problems.error(node.at, 'bad-qubits', `'qubits' must be a whole number from 1 to ${MAX_DECLARED_QUBITS} or a list of labels, not ${n}`);
      return undefined;
    }
    return { n, labels: null };
  }
  if (node.kind === 'seq') {
    const labels: string[] = [];
    let ok = true;
    for (const item of node.items) {
      if (item.kind !== 'scalar' || (typeof item.value !== 'string' && typeof item.value !== 'number')) {
        problems.error(item.at, 'bad-label', `a qubit label must be a word or a number, not ${describe(item)}`);
        ok = false;
        continue;
      }
      const label = String(item.value);
      if (label === 'all' || label.trim() === '' || /\s/.test(label)) {
        problems.error(item.at, 'bad-label', `'${label}' cannot label a qubit (labels are single words such as 'alice' or register elements such as 'q[0]', other than 'all')`);
        ok = false;
      } else if (labels.includes(label)) {
        problems.error(item.at, 'duplicate-label', `qubit label '${label}' is used twice; labels must be unique`);
        ok = false;
      }
      labels.push(label);
    }
    if (labels.length === 0 || labels.length > MAX_DECLARED_QUBITS) {
      problems.error(node.at, 'bad-qubits', `'qubits' must list from 1 to ${MAX_DECLARED_QUBITS} labels`);
      return undefined;
    }
    return ok ? { n: labels.length, labels } : undefined;
  }
  problems.error(node.at, 'bad-qubits', `'qubits' must be a count or a list of labels, not ${describe(node)}`);
  return undefined;
}

/**
 * Resolves one qubit reference: a label (matched first) or a 0-based index.
 * Returns the index, or an error message with a did-you-mean suggestion.
 */
export function resolveQubit(ref: string | number, reg: Register): number | { error: string } {
  const text = String(ref);
  if (reg.labels !== null) {
    const i = reg.labels.indexOf(text);
    if (i >= 0) return i;
  }
  if (/^\d+$/.test(text)) {
    const i = Number(text);
    if (i < reg.n) return i;
    const names = reg.labels !== null ? ` (labels: ${reg.labels.join(', ')})` : '';
    return { error: `qubit ${text} is out of range; this circuit has qubits 0 to ${reg.n - 1}${names}` };
  }
  if (reg.labels === null) {
    return { error: `unknown qubit '${text}'; this circuit has unlabelled qubits 0 to ${reg.n - 1}` };
  }
  const near = suggest(text, reg.labels);
  const hint = near !== undefined ? `did you mean '${near}'?` : `expected one of: ${reg.labels.join(', ')}`;
  return { error: `unknown qubit '${text}'; ${hint}` };
}

/** Reads a qubit reference node (a scalar index or label). */
export function readQubit(node: YNode, reg: Register, problems: ProblemList): number | undefined {
  if (node.kind !== 'scalar' || (typeof node.value !== 'number' && typeof node.value !== 'string')) {
    problems.error(node.at, 'bad-qubit', `expected a qubit index or label, not ${describe(node)}`);
    return undefined;
  }
  const r = resolveQubit(node.value, reg);
  if (typeof r === 'number') return r;
  problems.error(node.at, 'bad-qubit', r.error);
  return undefined;
}

/** The display name of qubit q (its label, or its index). */
export function qubitName(q: number, reg: Register): string {
  return reg.labels !== null ? reg.labels[q]! : String(q);
}
