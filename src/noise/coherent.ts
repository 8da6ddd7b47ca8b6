/**
 * Coherent (unitary) noise: the rotation of a coherent gate error, and the always-on drift of
 * detuned qubits and ZZ-coupled pairs. All angles in radians; matrices in the gate table's
 * convention (src/circuit/gates.ts: first qubit = leftmost factor, rotations exp(−iθP/2)).
 */
import { builtinGate } from '../circuit/gates.js';
import type { CMatrix } from '../linalg/cmatrix.js';

/**
 * exp(−i(x·X + y·Y + z·Z)/2) = cos(θ/2)·I − i·sin(θ/2)·(n·σ), θ = |(x, y, z)|, n = (x, y, z)/θ
 * (Nielsen & Chuang, Exercise 4.6: the rotation by θ about the axis n).
 */
export function coherentRotation(x: number, y: number, z: number): CMatrix {
  const theta = Math.hypot(x, y, z);
  const c = Math.cos(theta / 2);
  // sin(θ/2)/θ, continuous at θ = 0 (where n is irrelevant)
  const s = theta === 0 ? 0.5 : Math.sin(theta / 2) / theta;
  const nx = s * x;
  const ny = s * y;
  const nz = s * z;
  // [[c − i·nz, −i·nx − ny], [−i·nx + ny, c + i·nz]], interleaved re/im, row-major
  return { rows: 2, cols: 2, data: Float64Array.from([c, -nz, -ny, -nx, ny, -nx, c, nz]) };
}

/** rzz(θ) = exp(−iθ Z⊗Z/2) from the gate table. */
export function zzRotation(theta: number): CMatrix {
  return builtinGate('rzz')!.matrix([theta]);
}

/** rz(θ) = exp(−iθZ/2) from the gate table. */
export function zRotation(theta: number): CMatrix {
  return builtinGate('rz')!.matrix([theta]);
}

/** Nanoseconds per second: frequencies are in Hz, times in ns. */
const NS_PER_S = 1e9;

/** The rz angle 2π·δ·τ of a detuning δ (Hz) over τ (ns): H = π·δ·Z, so exp(−iHτ) = rz(2π·δ·τ). */
export function detuningAngle(detuningHz: number, ns: number): number {
  return (2 * Math.PI * detuningHz * ns) / NS_PER_S;
}

/** The rzz angle π·ζ·τ of a ZZ strength ζ (Hz) over τ (ns): H = (π·ζ/2)·Z⊗Z, so exp(−iHτ) = rzz(π·ζ·τ). */
export function zzAngle(zzHz: number, ns: number): number {
  return (Math.PI * zzHz * ns) / NS_PER_S;
}
