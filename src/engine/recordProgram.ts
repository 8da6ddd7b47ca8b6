import type { Instruction, Origin } from './instruction.js';

/**
 * A record-mode program (format version 2, part B): the engine's instructions plus two kinds
 * that act on the classical record. The state is an ensemble of branches keyed by the record,
 * Σ_r |r⟩⟨r| ⊗ ρ_r; a record key is a string of m characters '0'/'1', character i = bit i
 * (bits not yet written read '0' in every branch until their first write).
 */

/** A condition on the record: every term's bit must read its value. */
export type RecordCondition = readonly { readonly bit: number; readonly value: 0 | 1 }[];

export type RecordInstruction =
  /**
   * An engine instruction on every branch (`when` absent), or only on the branches whose record
   * satisfies `when.condition` (holds: true) or violates it (holds: false).
   */
  | {
      readonly kind: 'apply';
      readonly instruction: Instruction;
      readonly when?: { readonly condition: RecordCondition; readonly holds: boolean };
      readonly origin: Origin;
    }
  /**
   * Measurement of `qubit` into record bit `bit`: each branch splits by the true outcome m
   * (Π_m ρ Π_m); the bit records m with probability 1 − e_m and 1 − m with e_m
   * (e_0 = zeroAsOne, e_1 = oneAsZero); branches whose records then agree are summed.
   */
  | {
      readonly kind: 'measure';
      readonly qubit: number;
      readonly bit: number;
      readonly zeroAsOne: number;
      readonly oneAsZero: number;
      readonly origin: Origin;
    };

/** The program of a record-mode run: m record bits and the noisy and ideal instruction lists. */
export interface RecordProgram {
  readonly bits: number;
  /** Every noise source, readout error included (the engine can run it with readout error off). */
  readonly noisy: readonly RecordInstruction[];
  /** Unitaries, resets and measurements without any noise or readout error. */
  readonly ideal: readonly RecordInstruction[];
}

/** True when record `key` satisfies `condition`. */
export function conditionHolds(key: string, condition: RecordCondition): boolean {
  for (const t of condition) if (key.charCodeAt(t.bit) - 48 !== t.value) return false;
  return true;
}

/** `key` with character `bit` set to `value`. */
export function withBit(key: string, bit: number, value: 0 | 1): string {
  return key.slice(0, bit) + (value === 1 ? '1' : '0') + key.slice(bit + 1);
}

/**
 * Most branch matrices a record program has alive at once: 2^w for the w distinct bits it
 * writes. Bits not yet written read '0' in every branch, and a measurement of bit b first sums
 * the branches that differ only in b and then splits each of those (at most 2^(w−1)) in two.
 */
export function maxBranches(program: readonly RecordInstruction[]): number {
  const written = new Set<number>();
  for (const ins of program) if (ins.kind === 'measure') written.add(ins.bit);
  return Math.pow(2, written.size);
}
