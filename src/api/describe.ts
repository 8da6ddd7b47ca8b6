import type { Simulation } from './simulate.js';

/** How a report names the noise source of a run: the device's name, "inline noise", or none. */
export function deviceDescription(sim: Simulation): string {
  if (sim.result.device !== null) return sim.result.device;
  const relaxes = sim.profile.qubits.some((q) => Number.isFinite(q.t1) || Number.isFinite(q.t2));
  return relaxes ? 'inline noise' : 'none (noise only as written in the circuit)';
}
