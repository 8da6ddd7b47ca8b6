import type { Register } from '../circuit/circuit.js';
import type { ProblemList } from './problem.js';
import { readQubit } from './register.js';
import { describe, type YNode } from './yamlTree.js';

/**
 * How a step's target node turns into applications (lists of qubit indices):
 * - 'each': one application per listed qubit (1-qubit gates, idle, reset, measure);
 * - 'tuple': k-qubit gates: a list of k references is one application (controls first),
 *   a list of lists is several;
 * - 'group': all listed qubits together (barrier);
 * - 'channel': standalone noise: a flat list acts on each qubit, a list of lists is one
 *   application per inner list.
 */
export type TargetMode = { kind: 'each' } | { kind: 'tuple'; arity: number } | { kind: 'group' } | { kind: 'channel' };

/** Reads a target node into applications; `what` names the step for messages. */
export function readTargets(
  node: YNode,
  mode: TargetMode,
  reg: Register,
  what: string,
  problems: ProblemList,
): number[][] | undefined {
  const all = Array.from({ length: reg.n }, (_, i) => i);
  const isAll = node.kind === 'scalar' && node.value === 'all' && !(reg.labels ?? []).includes('all');
  const one = (q: YNode): number | undefined => readQubit(q, reg, problems);
  const tuple = (list: readonly YNode[], at: YNode, arity?: number): number[] | undefined => {
    if (arity !== undefined && list.length !== arity) {
      problems.error(at.at, 'wrong-arity', `${what} acts on ${arity} qubits, but ${list.length} ${list.length === 1 ? 'is' : 'are'} given here`);
      return undefined;
    }
    const qs: number[] = [];
    let ok = true;
    for (const item of list) {
      if (item.kind === 'seq') {
        problems.error(item.at, 'bad-qubit', `${what}: expected a qubit index or label here, not a list`);
        ok = false;
        continue;
      }
      const q = one(item);
      if (q === undefined) {
        ok = false;
        continue;
      }
      if (qs.includes(q)) {
        problems.error(item.at, 'repeated-qubit', `${what} names qubit ${String((item as { value?: unknown }).value)} twice in one application; each qubit may appear once`);
        ok = false;
      }
      qs.push(q);
    }
    return ok ? qs : undefined;
  };
  const emptyCheck = (): undefined => {
    problems.error(node.at, 'no-targets', `${what} has an empty target list; expected at least one qubit`);
    return undefined;
  };

  switch (mode.kind) {
    case 'group': {
      if (isAll) return [all];
      if (node.kind === 'seq') {
        if (node.items.length === 0) return emptyCheck();
        const t = tuple(node.items, node);
        return t === undefined ? undefined : [t];
      }
      const q = one(node);
      return q === undefined ? undefined : [[q]];
    }
    case 'each':
    case 'channel': {
      if (isAll) return all.map((q) => [q]);
      if (node.kind === 'seq') {
        if (node.items.length === 0) return emptyCheck();
        const out: number[][] = [];
        let ok = true;
        const nested = node.items.some((i) => i.kind === 'seq');
        if (nested) {
          for (const item of node.items) {
            if (item.kind !== 'seq') {
              problems.error(item.at, 'mixed-targets', `${what}: mix of qubits and lists; write either a list of qubits or a list of lists`);
              ok = false;
              continue;
            }
            if (item.items.length === 0) {
              problems.error(item.at, 'no-targets', `${what}: empty application; expected at least one qubit`);
              ok = false;
              continue;
            }
            const t = tuple(item.items, item, mode.kind === 'each' ? 1 : undefined);
            if (t === undefined) ok = false;
            else out.push(t);
          }
        } else {
          for (const item of node.items) {
            const q = one(item);
            if (q === undefined) ok = false;
            else out.push([q]);
          }
        }
        return ok ? out : undefined;
      }
      const q = one(node);
      return q === undefined ? undefined : [[q]];
    }
    case 'tuple': {
      if (isAll) {
        if (reg.n === mode.arity) return [all];
        problems.error(node.at, 'wrong-arity', `${what} acts on ${mode.arity} qubits; 'all' names ${reg.n}`);
        return undefined;
      }
      if (node.kind !== 'seq') {
        problems.error(node.at, 'wrong-arity', `${what} acts on ${mode.arity} qubits; give a list of ${mode.arity} (controls first), not ${describe(node)}`);
        return undefined;
      }
      if (node.items.length === 0) return emptyCheck();
      if (node.items.every((i) => i.kind === 'seq')) {
        const out: number[][] = [];
        let ok = true;
        for (const item of node.items) {
          if (item.kind !== 'seq') continue;
          const t = tuple(item.items, item, mode.arity);
          if (t === undefined) ok = false;
          else out.push(t);
        }
        return ok ? out : undefined;
      }
      const t = tuple(node.items, node, mode.arity);
      return t === undefined ? undefined : [t];
    }
  }
}
