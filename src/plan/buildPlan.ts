/**
 * From an instruction list (Program.noisy) to a plan of kernel calls.
 *
 * Fused (default): fuseInstructions folds gates, their noise, idle channels and resets into
 * groups; each group whose superoperator is diagonal joins a diagonal batch (diagonal maps
 * commute with each other, and moving one back to the batch's place only crosses calls on
 * other qubits), every other group becomes a real-form call when its map is
 * Hermiticity-preserving (every CPTP map is; on one qubit the trace-preserving variant when the
 * map is trace-preserving to rounding) and a general call otherwise or for 3+ qubits.
 * Unfused (--no-fuse): one general call per instruction, the plain generic path.
 */
import type { Instruction } from '../engine/instruction.js';
import { isTracePreservingRealForm, realFormOf } from '../engine/realForm.js';
import { DIAGONAL_BIN_MAX_QUBITS, diagonalBins, isDiagonalSuperoperator, memoisedDiagonalTable, type DiagonalMember } from './diagonalBatch.js';
import { fuseInstructions, type FusedGroup } from './fuseInstructions.js';
import { instructionQubits, instructionSuperoperator } from './instructionSuperoperator.js';
import type { Plan, PlanStep } from './plan.js';
import type { CMatrix } from '../linalg/cmatrix.js';

/** Options of buildPlan. */
export interface BuildPlanOptions {
  /** Fuse instructions (default true); false gives one general call per instruction. */
  readonly fuse?: boolean;
  /** Keep diagonal groups diagonal for batching (programs with drift; see src/plan/fuseInstructions.ts). */
  readonly keepDiagonal?: boolean;
}

/** The call for one non-diagonal fused group: real1 / real2 when the map is Hermiticity-preserving, else general. `realForms` keeps realFormOf per superoperator object (groups of one history share theirs). */
function groupStep(g: FusedGroup, realForms: Map<CMatrix, Float64Array | undefined>): PlanStep {
  const k = g.qubits.length;
  if (k <= 2) {
    if (!realForms.has(g.superop)) realForms.set(g.superop, realFormOf(g.superop, k));
    const real = realForms.get(g.superop);
    if (real !== undefined) {
      const kernel = k === 2 ? 'real2' : isTracePreservingRealForm(real) ? 'real1tp' : 'real1';
      return { kernel, qubits: g.qubits, sources: g.sources, numbers: real };
    }
  }
  return { kernel: 'general', qubits: g.qubits, sources: g.sources, numbers: g.superop.data };
}

/** The diagonal call for a batch of diagonal members (tables from `tableOf`, diagonalTable or a memo of it). */
function diagonalStep(members: readonly DiagonalMember[], sources: readonly number[], tableOf: (members: readonly DiagonalMember[], bin: readonly number[]) => Float64Array): PlanStep {
  const bins = diagonalBins(members);
  if (bins === undefined) throw new Error('buildPlan: diagonal batch does not fit its bins');
  const [a, b] = bins;
  return {
    kernel: 'diagonal',
    qubits: [...a, ...b],
    sources: [...sources].sort((x, y) => x - y),
    numbers: tableOf(members, a),
    binA: a,
    binB: b,
    tableB: tableOf(members, b),
  };
}

/** The plan of kernel calls for `instructions` on n qubits (see above). */
export function buildPlan(n: number, instructions: readonly Instruction[], options: BuildPlanOptions = {}): Plan {
  if (options.fuse === false) {
    const steps: PlanStep[] = instructions.map((ins, i) => ({
      kernel: 'general',
      qubits: instructionQubits(ins),
      sources: [i],
      numbers: instructionSuperoperator(ins).data,
    }));
    return { n, fused: false, instructionCount: instructions.length, steps };
  }
  const steps: (PlanStep | undefined)[] = [];
  let batch: { members: DiagonalMember[]; sources: number[]; at: number } | undefined;
  const touched = new Set<number>();
  const tableOf = memoisedDiagonalTable();
  const realForms = new Map<CMatrix, Float64Array | undefined>();
  const closeBatch = (): void => {
    if (batch === undefined) return;
    steps[batch.at] = diagonalStep(batch.members, batch.sources, tableOf);
    batch = undefined;
  };
  for (const g of fuseInstructions(n, instructions, { keepDiagonal: options.keepDiagonal === true })) {
    if (g.qubits.length <= DIAGONAL_BIN_MAX_QUBITS && isDiagonalSuperoperator(g.superop)) {
      if (batch !== undefined && g.qubits.every((q) => !touched.has(q)) && diagonalBins([...batch.members, g]) !== undefined) {
        batch.members.push(g);
        batch.sources.push(...g.sources);
        continue;
      }
      closeBatch();
      batch = { members: [g], sources: [...g.sources], at: steps.length };
      steps.push(undefined);
      touched.clear();
      continue;
    }
    steps.push(groupStep(g, realForms));
    for (const q of g.qubits) touched.add(q);
  }
  closeBatch();
  return { n, fused: true, instructionCount: instructions.length, steps: steps as PlanStep[] };
}
