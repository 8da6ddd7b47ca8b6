/**
 * The superoperator (column-stacking vec, src/linalg/superoperator.ts) of one engine
 * instruction, with the qubits it acts on. A reset is the CPTP map with Kraus operators
 * |0⟩⟨0| and |0⟩⟨1|: K₀ρK₀† + K₁ρK₁† = |0⟩⟨0| ⊗ (ρ₀₀ + ρ₁₁) = |0⟩⟨0|_q ⊗ Tr_q ρ, the same map
 * the reference reset kernel applies, so the plan may fuse it like any channel.
 */
import { RESET_KRAUS, type Instruction } from '../engine/instruction.js';
import type { CMatrix } from '../linalg/cmatrix.js';
import { memoised, numbersKey } from '../linalg/exactKeys.js';


/** The qubits an instruction acts on, first listed = most significant factor. */
export function instructionQubits(ins: Instruction): readonly number[] {
  return ins.op === 'reset' ? [ins.qubit] : ins.qubits;
}

/**
 * Σ_k conj(K_k) ⊗ K_k in one accumulation (the same matrix as krausToSuperoperator of
 * src/linalg/superoperator.ts, without intermediate matrices): entry
 * S[(a + b·d), (a' + b'·d)] = Σ_k K_k[a][a'] · conj(K_k[b][b']).
 */
export function superoperatorOfKraus(kraus: readonly CMatrix[]): CMatrix {
  const d = kraus[0]!.rows;
  const d2 = d * d;
  const out = new Float64Array(2 * d2 * d2);
  for (const k of kraus) {
    if (k.rows !== d || k.cols !== d) throw new RangeError(`superoperatorOfKraus: Kraus operator is ${k.rows}×${k.cols}, expected ${d}×${d}`);
    const K = k.data;
    for (let a = 0; a < d; a++) {
      for (let a2 = 0; a2 < d; a2++) {
        const xr = K[2 * (a * d + a2)]!;
        const xi = K[2 * (a * d + a2) + 1]!;
        if (xr === 0 && xi === 0) continue;
        for (let b = 0; b < d; b++) {
          const row = 2 * (a + b * d) * d2;
          for (let b2 = 0; b2 < d; b2++) {
            const yr = K[2 * (b * d + b2)]!;
            const yi = -K[2 * (b * d + b2) + 1]!;
            const e = row + 2 * (a2 + b2 * d);
            out[e] = out[e]! + xr * yr - xi * yi;
            out[e + 1] = out[e + 1]! + xr * yi + xi * yr;
          }
        }
      }
    }
  }
  return { rows: d2, cols: d2, data: out };
}

/** Superoperator of an instruction on instructionQubits(ins): conj(U) ⊗ U, Σ conj(K) ⊗ K, or the reset's. */
export function instructionSuperoperator(ins: Instruction): CMatrix {
  switch (ins.op) {
    case 'unitary':
      return superoperatorOfKraus([ins.matrix]);
    case 'channel':
      return superoperatorOfKraus(ins.kraus);
    case 'reset':
      return superoperatorOfKraus(RESET_KRAUS);
  }
}

/** Exact key of the numbers instructionSuperoperator reads from `ins` (its Kraus operators or unitary). */
function superoperatorKey(ins: Instruction): string {
  switch (ins.op) {
    case 'unitary':
      return `u${ins.matrix.rows}:${numbersKey(ins.matrix.data)}`;
    case 'channel':
      return `c${ins.kraus.map((k) => `${k.rows}:${numbersKey(k.data)}`).join(';')}`;
    case 'reset':
      return 'r';
  }
}

/**
 * instructionSuperoperator memoised by the instruction's numbers, bit for bit: an instruction
 * repeated in every layer (a gate, its noise, a drift term of the same length) is converted once,
 * and every application gets the same superoperator (the bits it would compute; callers never
 * modify it).
 */
export function memoisedInstructionSuperoperator(): (ins: Instruction) => CMatrix {
  const memo = new Map<string, CMatrix>();
  return (ins) => memoised(memo, superoperatorKey(ins), () => instructionSuperoperator(ins));
}
