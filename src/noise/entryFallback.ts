/**
 * A multi-qubit or composite gate with neither a name entry nor a tuple entry in the profile
 * takes the `all` entry, which is usually calibrated for 1-qubit gates. That is almost never
 * what a user meant, so it is warned about once per gate name, with the values it fell back to.
 */
import type { Circuit, Operation } from '../circuit/circuit.js';
import { formatDuration } from '../format/duration.js';
import { plainKinds } from '../format/noiseKindsSpec.js';
import type { ProblemList } from '../format/problem.js';
import type { NoiseProfile } from './profile.js';

/** Warns once per gate name whose multi-qubit or composite applications take only the `all` entry's values. */
export function warnEntryFallback(ops: readonly Operation[], circuit: Circuit, profile: NoiseProfile, problems: ProblemList): void {
  const warned = new Set<string>();
  for (const op of ops) {
    if (op.kind !== 'gate' || warned.has(op.name)) continue;
    if (op.qubits.length === 1 && !circuit.compositeGates.has(op.name)) continue;
    const e = profile.gateEntry(op.name, op.qubits);
    if (!e.fromAll) continue;
    const kinds = plainKinds(e.kinds);
    const values = [
      ...(e.duration > 0 ? [`duration ${formatDuration(e.duration)}`] : []),
      ...Object.entries(kinds).map(([k, v]) => `${k} ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`),
    ];
    if (values.length === 0) continue;
    warned.add(op.name);
    const what = circuit.compositeGates.has(op.name) ? 'composite gate' : `${op.qubits.length}-qubit gate`;
    problems.warn(
      op.at,
      'entry-fallback',
      `${what} ${op.name} has no entry in the profile's 'gates', so it takes the 'all' entry (${values.join(', ')}); give it an entry of its own`,
    );
  }
}
