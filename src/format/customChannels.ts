/**
 * The circuit's `channels:` map: every definition form of ./channelDefinitions.ts (Kraus,
 * Choi, superoperator, Pauli transfer matrix, Stinespring, unitary, built-in kinds, sequence,
 * parallel), each required to be a quantum channel — completely positive and trace
 * preserving — and handed to the engine in its MINIMAL Kraus form (src/channels/minimalKraus.ts).
 */
import type { CustomChannel } from '../circuit/circuit.js';
import { traceOutput } from '../channels/choi.js';
import { antiHermitianDeviation } from '../channels/norms.js';
import { PHYSICALITY_TOLERANCE } from '../channels/tolerances.js';
import { readChannelDefinitions } from './channelDefinitions.js';
import type { ProblemList } from './problem.js';
import type { YNode } from './yamlTree.js';

/**
 * Largest deviation from trace preservation accepted: max |(Σ K†K − I)_ij| (the contract's
 * 1e-9); for a map given in another form Σ K†K means (Tr_out J)ᵀ, which is the same matrix.
 */
export const TRACE_PRESERVING_TOLERANCE = 1e-9;

/** Most negative Choi eigenvalue accepted as rounding (PHYSICALITY_TOLERANCE of src/channels). */
export const COMPLETE_POSITIVITY_TOLERANCE = PHYSICALITY_TOLERANCE;

/** Qubits a custom channel may act on (MAX_CHANNEL_QUBITS of src/channels). */
export const MAX_CUSTOM_CHANNEL_QUBITS = 3;

/**
 * Reads the circuit's `channels:` map; a channel that is not CPTP is refused with a located
 * error naming the property and its size. A refused channel stays in the map with an EMPTY
 * Kraus list, so the steps that name it are still checked (arity) instead of being reported
 * as naming an unknown channel; the circuit itself is refused because an error was recorded.
 */
export function readCustomChannels(
  node: YNode,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): Map<string, CustomChannel> {
  const out = new Map<string, CustomChannel>();
  for (const [name, def] of readChannelDefinitions(node, env, problems)) {
    const where = `custom channel '${name}'`;
    const c = def.channel;
    const j = c.choi();
    const ah = antiHermitianDeviation(j);
    const refuse = (code: string, message: string): void => {
      problems.error(def.formAt, code, message);
      out.set(name, { name, qubits: c.qubits, kraus: [], at: def.at });
    };
    if (ah > COMPLETE_POSITIVITY_TOLERANCE) {
      refuse('not-completely-positive', `${where} is not completely positive: its Choi matrix is not Hermitian (the largest entry of J − J† is ${ah.toExponential(2)}, allowed ${COMPLETE_POSITIVITY_TOLERANCE})`);
      continue;
    }
    const ev = c.choiEigen().values;
    const min = ev[ev.length - 1]!;
    if (min < -COMPLETE_POSITIVITY_TOLERANCE) {
      refuse('not-completely-positive', `${where} is not completely positive: its Choi matrix has the eigenvalue ${min.toExponential(2)} (allowed down to −${COMPLETE_POSITIVITY_TOLERANCE}); 'fray channel' shows the nearest CPTP channel`);
      continue;
    }
    const t = traceOutput(j);
    const d = c.dim;
    let res = 0;
    for (let i = 0; i < d; i++) {
      for (let k = 0; k < d; k++) res = Math.max(res, Math.hypot(t.data[2 * (i * d + k)]! - (i === k ? 1 : 0), t.data[2 * (i * d + k) + 1]!));
    }
    if (!(res <= TRACE_PRESERVING_TOLERANCE)) {
      refuse('not-trace-preserving', `${where} is not trace preserving: the largest entry of Σ K†K − I is ${res.toExponential(2)} (allowed ${TRACE_PRESERVING_TOLERANCE})`);
      continue;
    }
    out.set(name, { name, qubits: c.qubits, kraus: c.minimalKraus(), at: def.at });
  }
  return out;
}
