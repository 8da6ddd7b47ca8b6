/**
 * Random instruction lists for the plan tests (fixed seeds): unitaries, random CPTP channels,
 * diagonal maps (phase damping, z rotations, controlled phases) and resets on 1–3 qubits.
 */
import type { Instruction } from '../../src/engine/instruction.js';
import { diag, fromRows, type CMatrix } from '../../src/linalg/cmatrix.js';
import { randInt, randomKraus, randomTargets, randomUnitary } from '../engine/helpers.js';

/** Agreement required between the plan path and the reference kernels (issue 4: 1e-12). */
export const PLAN_AGREEMENT = 1e-12;

/** Phase damping with parameter λ: Kraus diag(1, √(1−λ)), diag(0, √λ) (Nielsen & Chuang §8.3.6, eq. 8.127–8.128). */
export function phaseDampingKraus(lambda: number): CMatrix[] {
  return [diag([1, Math.sqrt(1 - lambda)]), diag([0, Math.sqrt(lambda)])];
}

/** rz(θ) = diag(e^{−iθ/2}, e^{iθ/2}) (common practice). */
export function rz(theta: number): CMatrix {
  return diag([
    [Math.cos(theta / 2), -Math.sin(theta / 2)],
    [Math.cos(theta / 2), Math.sin(theta / 2)],
  ]);
}

/** Controlled phase diag(1, 1, 1, e^{iφ}) (common practice). */
export function cphase(phi: number): CMatrix {
  return diag([1, 1, 1, [Math.cos(phi), Math.sin(phi)]]);
}

/** CNOT with the first target as control (N&C §1.3.2). */
export const CNOT = fromRows([
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
  [0, 0, 1, 0],
]);

/** One random instruction on an n-qubit register. */
export function randomInstruction(rng: () => number, n: number): Instruction {
  const kind = randInt(rng, 9);
  const kMax = Math.min(n, 3);
  switch (kind) {
    case 0:
    case 1: {
      const k = 1 + randInt(rng, Math.min(kMax, 2));
      return { op: 'unitary', qubits: randomTargets(rng, n, k), matrix: randomUnitary(rng, 1 << k) };
    }
    case 2:
    case 3: {
      const k = 1 + randInt(rng, Math.min(kMax, 2));
      return { op: 'channel', qubits: randomTargets(rng, n, k), kraus: randomKraus(rng, 1 << k, 1 + randInt(rng, 3)) };
    }
    case 4:
      return { op: 'unitary', qubits: randomTargets(rng, n, 1), matrix: rz(2 * Math.PI * rng()) };
    case 5:
      return { op: 'channel', qubits: randomTargets(rng, n, 1), kraus: phaseDampingKraus(rng()) };
    case 6:
      return n >= 2
        ? { op: 'unitary', qubits: randomTargets(rng, n, 2), matrix: cphase(2 * Math.PI * rng()) }
        : { op: 'unitary', qubits: [0], matrix: rz(rng()) };
    case 7:
      return { op: 'reset', qubit: randInt(rng, n) };
    default: {
      // a 3-qubit channel when the register allows (general kernel), else a 1-qubit one
      const k = kMax;
      return { op: 'channel', qubits: randomTargets(rng, n, k), kraus: randomKraus(rng, 1 << k, 2) };
    }
  }
}

/** A random instruction list of `length` instructions on n qubits. */
export function randomProgram(rng: () => number, n: number, length: number): Instruction[] {
  return Array.from({ length }, () => randomInstruction(rng, n));
}

/** max_i |a_i − b_i| over two equally long arrays. */
export function maxDiff(a: Float64Array, b: Float64Array): number {
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i]! - b[i]!));
  return w;
}
