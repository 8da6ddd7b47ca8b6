/**
 * The device's coupling map: which qubits are physically coupled. A gate application is on
 * the map when its qubits are connected through listed pairs among themselves (two qubits:
 * the pair is listed; k qubits: the listed pairs inside the application join all k). Paths
 * through qubits outside the application do not count: the gate acts on its own qubits only.
 */
import type { ProblemList } from '../format/problem.js';
import { qubitName } from '../format/register.js';
import type { Register } from '../circuit/circuit.js';
import type { Schedule } from '../schedule/schedule.js';
import type { Coupling } from './profile.js';

/** True when the listed pairs among `qubits` connect all of them (one qubit is always connected). */
export function onCouplingMap(qubits: readonly number[], couplings: readonly Coupling[]): boolean {
  if (qubits.length <= 1) return true;
  const inside = new Set(qubits);
  const reached = new Set([qubits[0]!]);
  let grew = true;
  while (grew) {
    grew = false;
    for (const c of couplings) {
      if (!inside.has(c.a) || !inside.has(c.b)) continue;
      if (reached.has(c.a) !== reached.has(c.b)) {
        reached.add(c.a);
        reached.add(c.b);
        grew = true;
      }
    }
  }
  return reached.size === inside.size;
}

/** One warning per scheduled gate application off the coupling map (nothing without a map). */
export function warnOffMap(schedule: Schedule, couplings: readonly Coupling[] | null, register: Register, problems: ProblemList): number {
  if (couplings === null) return 0;
  let count = 0;
  for (const { op } of schedule.items) {
    if (op.kind !== 'gate' || onCouplingMap(op.qubits, couplings)) continue;
    const names = op.qubits.map((q) => qubitName(q, register)).join(', ');
    const why = op.qubits.length === 2 ? `the pair ${names} is not in the device's couplings` : `qubits ${names} are not joined by the device's couplings`;
    problems.warn(op.at, 'off-coupling-map', `step ${op.step + 1}: ${op.name} on ${names}: ${why}`);
    count++;
  }
  return count;
}
