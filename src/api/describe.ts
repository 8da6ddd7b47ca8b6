import { hasDrift } from '../program/program.js';
import type { Simulation } from './simulate.js';

/** How a report names the noise source of a run: the device's name, "inline noise", noise only in the steps, or an ideal run. */
export function deviceDescription(sim: Simulation): string {
  if (sim.result.device !== null) return sim.result.device;
  const noiseWritten = sim.circuit.inlineNoise !== null || sim.circuit.operations.some((op) => op.kind === 'channel' || ('noise' in op && op.noise !== undefined));
  if (!noiseWritten) return 'none: an ideal run (give a noise profile with --device)';
  return sim.profile.qubits.every((q) => !Number.isFinite(q.t1) && !Number.isFinite(q.t2)) ? 'none (noise only as written in the circuit)' : 'inline noise';
}

/** The device facts a report header shows besides the basics: readout timing, the coupling map, drift. */
export interface DeviceFacts {
  /** How measurements are timed (present when the circuit measures). */
  readonly readout?: string;
  /** The coupling map: its pairs, and whether every gate stays on it (present when the profile has one). */
  readonly couplings?: { readonly pairs: string; readonly map: string; readonly offMap: boolean };
  /** Always-on drift: detuned qubits and zz pairs (present when there is any). */
  readonly drift?: string;
}

/** The device facts of a run, in words. */
export function deviceFacts(sim: Simulation): DeviceFacts {
  const out: { -readonly [K in keyof DeviceFacts]: DeviceFacts[K] } = {};
  if (sim.circuit.operations.some((op) => op.kind === 'measure')) {
    out.readout = sim.profile.simultaneousMeasure ? 'simultaneous: each measure step starts all its measurements together' : 'each qubit measured as soon as it is free';
  }
  const couplings = sim.profile.couplings;
  if (couplings !== null) {
    const off = sim.warnings.filter((w) => w.code === 'off-coupling-map').length;
    const withZz = couplings.filter((c) => c.zz !== 0).length;
    out.couplings = {
      pairs: `${couplings.length} pair${couplings.length === 1 ? '' : 's'} (${withZz} with zz)`,
      map: off === 0 ? 'every gate on the map' : `${off} gate application${off === 1 ? '' : 's'} off the map (see Warnings)`,
      offMap: off > 0,
    };
  }
  if (hasDrift(sim.profile)) {
    const detuned = sim.profile.qubits.filter((q) => q.detuning !== 0).length;
    const pairs = (couplings ?? []).filter((c) => c.zz !== 0).length;
    out.drift = `detuning on ${detuned} qubit${detuned === 1 ? '' : 's'}, zz on ${pairs} pair${pairs === 1 ? '' : 's'}; the ideal run has none`;
  }
  return out;
}
