/**
 * Expectation values of Pauli strings and single-qubit Bloch vectors, computed in O(D)
 * from the action P|j⟩ = phase(j)·|j ⊕ xmask⟩ without building any Pauli matrix.
 *
 * A Pauli string has one letter per qubit, character q acting on qubit q (qubit 0 leftmost,
 * as in ../engine/layout.ts). Letters: I, X, Y, Z (uppercase only).
 * With X|b⟩ = |1−b⟩, Y|b⟩ = i(−1)^b|1−b⟩, Z|b⟩ = (−1)^b|b⟩ (the Pauli matrices of Nielsen &
 * Chuang §2.1.3, from memory) the whole string acts as
 *   P|j⟩ = i^{#Y} (−1)^{popcount(j & zmask)} |j ⊕ xmask⟩,
 * where xmask marks the X and Y letters and zmask the Y and Z letters.
 */
import type { DensityMatrix, StateVector } from '../engine/layout.js';
import { isDensityMatrix } from './stateKind.js';
import { pauliStringProblem } from '../circuit/pauliString.js';

/** Parity (0 or 1) of the number of set bits of a non-negative 32-bit integer. */
function parity(x: number): number {
  x ^= x >>> 16;
  x ^= x >>> 8;
  x ^= x >>> 4;
  x ^= x >>> 2;
  x ^= x >>> 1;
  return x & 1;
}

/**
 * Re Tr(P ρ) (density matrix) or Re ⟨ψ|P|ψ⟩ (state vector) for the Pauli operator given by
 * its masks: xmask (X or Y letters), zmask (Y or Z letters) and the count of Y letters.
 */
export function pauliExpectationFromMasks(
  state: DensityMatrix | StateVector,
  xmask: number,
  zmask: number,
  yCount: number,
): number {
  const d = state.dim;
  const a = state.data;
  let sr = 0;
  let si = 0;
  if (isDensityMatrix(state)) {
    // Tr(Pρ) = Σ_k ⟨k⊕x|P|k⟩ ρ_{k, k⊕x} = i^{#Y} Σ_k (−1)^{|k & z|} ρ_{k, k⊕x}.
    for (let k = 0; k < d; k++) {
      const idx = 2 * (k * d + (k ^ xmask));
      if (parity(k & zmask)) {
        sr -= a[idx]!;
        si -= a[idx + 1]!;
      } else {
        sr += a[idx]!;
        si += a[idx + 1]!;
      }
    }
  } else {
    // ⟨ψ|P|ψ⟩ = i^{#Y} Σ_k (−1)^{|k & z|} conj(ψ_{k⊕x}) ψ_k.
    for (let k = 0; k < d; k++) {
      const l = k ^ xmask;
      const ur = a[2 * l]!;
      const ui = a[2 * l + 1]!;
      const vr = a[2 * k]!;
      const vi = a[2 * k + 1]!;
      const pr = ur * vr + ui * vi;
      const pi = ur * vi - ui * vr;
      if (parity(k & zmask)) {
        sr -= pr;
        si -= pi;
      } else {
        sr += pr;
        si += pi;
      }
    }
  }
  switch (yCount & 3) {
    case 0:
      return sr;
    case 1:
      return -si;
    case 2:
      return -sr;
    default:
      return si;
  }
}

/** Expectation Re Tr(P ρ) (or ⟨ψ|P|ψ⟩) of the Pauli string P, character q acting on qubit q; throws RangeError on an invalid string. */
export function pauliExpectation(state: DensityMatrix | StateVector, pauli: string): number {
  const n = state.n;
  const err = pauliStringProblem(pauli, n);
  if (err !== undefined) throw new RangeError(err);
  let xmask = 0;
  let zmask = 0;
  let yCount = 0;
  for (let q = 0; q < n; q++) {
    const bit = 1 << (n - 1 - q);
    const c = pauli[q];
    if (c === 'X') xmask |= bit;
    else if (c === 'Z') zmask |= bit;
    else if (c === 'Y') {
      xmask |= bit;
      zmask |= bit;
      yCount++;
    }
  }
  return pauliExpectationFromMasks(state, xmask, zmask, yCount);
}

/** Bloch vector (⟨X⟩, ⟨Y⟩, ⟨Z⟩) of each qubit's reduced state, qubit 0 first. */
export function blochVectors(state: DensityMatrix | StateVector): [number, number, number][] {
  const n = state.n;
  const out: [number, number, number][] = [];
  for (let q = 0; q < n; q++) {
    const bit = 1 << (n - 1 - q);
    out.push([
      pauliExpectationFromMasks(state, bit, 0, 0),
      pauliExpectationFromMasks(state, bit, bit, 1),
      pauliExpectationFromMasks(state, 0, bit, 0),
    ]);
  }
  return out;
}
