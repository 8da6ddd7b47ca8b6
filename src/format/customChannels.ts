import type { CustomChannel } from '../circuit/circuit.js';
import { krausResidual, type CMatrix } from '../linalg/cmatrix.js';
import { qubitsOfDimension, readMatrix } from './matrix.js';
import type { ProblemList } from './problem.js';
import { asMap, checkKeys, entryOf } from './read.js';
import { describe, type YNode } from './yamlTree.js';

/** Largest deviation from trace preservation accepted: max |(Σ K†K − I)_ij| (the contract's 1e-9). */
export const TRACE_PRESERVING_TOLERANCE = 1e-9;

/** Qubits a custom channel may act on. */
export const MAX_CUSTOM_CHANNEL_QUBITS = 3;

/** Reads the circuit's `channels:` map of Kraus channels. */
export function readCustomChannels(
  node: YNode,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): Map<string, CustomChannel> {
  const out = new Map<string, CustomChannel>();
  const map = asMap(node, "'channels'", problems);
  if (map === undefined) return out;
  for (const e of map.entries) {
    const where = `custom channel '${e.key}'`;
    const def = asMap(e.value, where, problems);
    if (def === undefined) continue;
    checkKeys(def, ['kraus'], where, problems);
    const ke = entryOf(def, 'kraus');
    if (ke === undefined) {
      problems.error(e.keyAt, 'bad-channel', `${where} needs 'kraus': a list of Kraus matrices`);
      continue;
    }
    if (ke.value.kind !== 'seq' || ke.value.items.length === 0) {
      problems.error(ke.value.at, 'bad-channel', `'kraus' of ${where} must be a non-empty list of matrices, not ${describe(ke.value)}`);
      continue;
    }
    const ops: CMatrix[] = [];
    let ok = true;
    ke.value.items.forEach((item, i) => {
      const m = readMatrix(item, `Kraus operator ${i + 1} of ${where}`, env, problems);
      if (m === undefined) return void (ok = false);
      const k = qubitsOfDimension(m.rows);
      if (m.rows !== m.cols || k === undefined || k > MAX_CUSTOM_CHANNEL_QUBITS) {
        problems.error(item.at, 'bad-matrix', `Kraus operator ${i + 1} of ${where} is ${m.rows}×${m.cols}; expected 2^k × 2^k for k from 1 to ${MAX_CUSTOM_CHANNEL_QUBITS}`);
        return void (ok = false);
      }
      if (ops.length > 0 && ops[0]!.rows !== m.rows) {
        problems.error(item.at, 'bad-matrix', `Kraus operator ${i + 1} of ${where} is ${m.rows}×${m.cols} but the first is ${ops[0]!.rows}×${ops[0]!.cols}`);
        return void (ok = false);
      }
      ops.push(m);
    });
    if (!ok) continue;
    const res = krausResidual(ops);
    if (!(res <= TRACE_PRESERVING_TOLERANCE)) {
      problems.error(ke.value.at, 'not-trace-preserving', `${where} is not trace preserving: the largest entry of Σ K†K − I is ${res.toExponential(2)} (allowed ${TRACE_PRESERVING_TOLERANCE})`);
      continue;
    }
    out.set(e.key, { name: e.key, qubits: qubitsOfDimension(ops[0]!.rows)!, kraus: ops, at: e.keyAt });
  }
  return out;
}
