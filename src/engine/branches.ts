/**
 * The branch ensemble of a record-mode run (./recordProgram.ts): Σ_r |r⟩⟨r| ⊗ ρ_r held as one
 * unnormalised density matrix per record r with non-zero weight, keyed by the bits' current
 * values. A measurement of bit b first sums the branches that differ only in b's old value
 * (nothing can read it any more, so this is exact), then splits every branch by outcome and
 * recorded value.
 */
import type { Instruction, Origin } from './instruction.js';
import type { DensityMatrix, StateVector } from './layout.js';
import { qubitMask } from './layout.js';
import { conditionHolds, withBit, type RecordCondition, type RecordInstruction } from './recordProgram.js';
import { addOuter, applyIdeal, applyInstruction, finishIdeal, MAX_IDEAL_BRANCHES, NEGLIGIBLE_BRANCH_WEIGHT, setIdealBranches, squaredNorm, type IdealRun, type IdealState } from './run.js';
import { referenceKernels, type Kernels } from './kernels.js';
import { createStateVector } from './stateVector.js';
import { createDensityMatrix, traceOf } from './densityMatrix.js';
import { applyCompiled, createSharedDensityMatrix } from './runCompiled.js';
import type { ThreadPool } from './threadPool.js';
import { buildPlan, type BuildPlanOptions } from '../plan/buildPlan.js';
import { compilePlan } from '../plan/compilePlan.js';

/** The branches of a run: record key → unnormalised ρ_r (Tr ρ_r = probability of record r). */
export type BranchEnsemble = Map<string, DensityMatrix>;

/** How the ensemble runner allocates branches and applies runs of plain instructions. */
export interface BranchEngine {
  /** A new n-qubit matrix of zeros (shared memory when threads will work on it). */
  allocate(n: number): DensityMatrix;
  /** The initial branch |0…0⟩⟨0…0|. */
  initial(n: number): DensityMatrix;
  /** Prepares a run of instructions once (e.g. as a fused, compiled plan) and returns how to apply it to one branch in place. */
  prepare(n: number, instructions: readonly Instruction[]): (rho: DensityMatrix) => void;
}

/** The reference engine's branches: plain arrays, instructions applied one by one with `kernels`. */
export function referenceBranchEngine(kernels: Kernels = referenceKernels): BranchEngine {
  return {
    allocate: (n) => zeroMatrix(createDensityMatrix(n)),
    initial: createDensityMatrix,
    prepare: (_n, instructions) => (rho) => {
      for (const ins of instructions) applyInstruction(rho, ins, kernels);
    },
  };
}

/**
 * The fast engine's branches: shared memory, each run of instructions prepared once as a compiled
 * plan (fused unless `plan.fuse` is false) and applied with `pool`'s threads on large registers.
 * Branches run the JS kernels: an ensemble holds many registers at once, and every WebAssembly
 * memory reserves its own large range of address space.
 */
export function fastBranchEngine(plan: BuildPlanOptions = {}, pool?: ThreadPool): BranchEngine {
  return {
    allocate: (n) => zeroMatrix(createSharedDensityMatrix(n, 'js')),
    initial: (n) => createSharedDensityMatrix(n, 'js'),
    prepare: (n, instructions) => {
      const compiled = compilePlan(buildPlan(n, instructions, plan));
      return (rho) => applyCompiled(rho, compiled, pool);
    },
  };
}

/** |0…0⟩⟨0…0| turned into the zero matrix (its one nonzero entry cleared). */
function zeroMatrix(rho: DensityMatrix): DensityMatrix {
  rho.data[0] = 0;
  return rho;
}

/** A run of consecutive record instructions that act the same way on every branch they select (origins[i] explains instructions[i]). */
export type Segment =
  | { kind: 'apply'; when: { condition: RecordCondition; holds: boolean } | undefined; instructions: Instruction[]; origins: Origin[] }
  | Extract<RecordInstruction, { kind: 'measure' }>;

/** Groups the program into segments: consecutive 'apply' items with the same selection share one segment (one fused plan). */
export function segments(program: readonly RecordInstruction[]): Segment[] {
  const out: Segment[] = [];
  let last: Extract<Segment, { kind: 'apply' }> | undefined;
  let lastKey = '';
  for (const ins of program) {
    if (ins.kind === 'measure') {
      out.push(ins);
      last = undefined;
      continue;
    }
    const key = ins.when === undefined ? '*' : `${ins.when.holds ? '' : '!'}${ins.when.condition.map((t) => `${t.bit}=${t.value}`).join(',')}`;
    if (last !== undefined && key === lastKey) {
      last.instructions.push(ins.instruction);
      last.origins.push(ins.origin);
    } else {
      last = { kind: 'apply', when: ins.when, instructions: [ins.instruction], origins: [ins.origin] };
      lastKey = key;
      out.push(last);
    }
  }
  return out;
}

/** True when a branch with record `key` is selected by `when` (every branch when undefined). */
function selects(key: string, when: { condition: RecordCondition; holds: boolean } | undefined): boolean {
  return when === undefined || conditionHolds(key, when.condition) === when.holds;
}

/** Options of runBranches. */
export interface RunBranchesOptions {
  /** False: every measurement records the true outcome (the run behind probabilities.noisy). */
  readonly readout?: boolean;
}

/**
 * Runs a record program on n qubits with m record bits from |0…0⟩ and the all-zero record;
 * returns the branches with non-zero weight.
 */
export function runBranches(n: number, m: number, program: readonly RecordInstruction[], engine: BranchEngine, options: RunBranchesOptions = {}): BranchEnsemble {
  const readout = options.readout !== false;
  let branches: BranchEnsemble = new Map([['0'.repeat(m), engine.initial(n)]]);
  for (const seg of segments(program)) {
    if (seg.kind === 'apply') {
      const apply = engine.prepare(n, seg.instructions);
      for (const [key, rho] of branches) if (selects(key, seg.when)) apply(rho);
      continue;
    }
    const e0 = readout ? seg.zeroAsOne : 0;
    const e1 = readout ? seg.oneAsZero : 0;
    // Forget b's old value first: branches that differed only in it are summed (nothing can read
    // it any more; the split below is linear, so this equals summing after the split). The
    // merged branches then split without meeting each other: at most 2^w matrices are alive.
    const merged: BranchEnsemble = new Map();
    for (const [key, rho] of branches) {
      const k = withBit(key, seg.bit, 0);
      const there = merged.get(k);
      if (there === undefined) merged.set(k, rho);
      else addInto(there, rho);
    }
    branches = merged;
    const next: BranchEnsemble = new Map();
    for (const [key, rho] of branches) {
      const one = engine.allocate(n);
      measureSplit(rho, one, seg.qubit, e0, e1);
      if (traceOf(rho) > NEGLIGIBLE_BRANCH_WEIGHT) next.set(key, rho);
      if (traceOf(one) > NEGLIGIBLE_BRANCH_WEIGHT) next.set(withBit(key, seg.bit, 1), one);
    }
    branches = next;
  }
  return branches;
}

/**
 * Splits ρ by the outcome of measuring qubit q with readout confusion (e0, e1), in place:
 * with ρ_m = Π_m ρ Π_m, `rho` becomes the record-0 part (1 − e0)ρ_0 + e1 ρ_1 and `one` (all
 * zeros on entry) the record-1 part e0 ρ_0 + (1 − e1) ρ_1. Coherences between the outcomes vanish.
 */
export function measureSplit(rho: DensityMatrix, one: DensityMatrix, q: number, e0: number, e1: number): void {
  const n = rho.n;
  const D = rho.dim;
  const mask = qubitMask(n, q);
  const a = rho.data;
  const b = one.data;
  for (let r = 0; r < D; r++) {
    const rowBit = r & mask;
    const row = 2 * r * D;
    for (let c = 0; c < D; c++) {
      const k = row + 2 * c;
      if ((c & mask) !== rowBit) {
        a[k] = 0;
        a[k + 1] = 0;
        continue;
      }
      const re = a[k]!;
      const im = a[k + 1]!;
      const stay = rowBit === 0 ? 1 - e0 : e1; // weight recorded as 0
      const flip = rowBit === 0 ? e0 : 1 - e1; // weight recorded as 1
      a[k] = stay * re;
      a[k + 1] = stay * im;
      b[k] = flip * re;
      b[k + 1] = flip * im;
    }
  }
}

/** a += b entrywise. */
function addInto(a: DensityMatrix, b: DensityMatrix): void {
  const x = a.data;
  const y = b.data;
  for (let i = 0; i < x.length; i++) x[i] += y[i]!;
}

/** The sum Σ_r ρ_r of an ensemble (the state with the record discarded). */
export function sumBranches(n: number, branches: BranchEnsemble): DensityMatrix {
  const dim = 1 << n;
  const out: DensityMatrix = { n, dim, data: new Float64Array(2 * dim * dim) };
  for (const rho of branches.values()) addInto(out, rho);
  return out;
}

/** The ideal run's branches: record key → the ideal state of that record (unnormalised: its trace is the record's probability). */
export type IdealEnsemble = Map<string, IdealState>;

/**
 * Runs the ideal record program (unitaries, resets, measurements without readout error)
 * with each record's state kept as unnormalised pure branches as in runIdeal (a density
 * matrix past maxBranches), so exact zeros stay exact.
 */
export function runIdealBranches(
  n: number,
  m: number,
  program: readonly RecordInstruction[],
  kernels: Kernels = referenceKernels,
  maxBranches: number = MAX_IDEAL_BRANCHES,
): IdealEnsemble {
  let records = new Map<string, IdealRun>([['0'.repeat(m), { branches: [createStateVector(n)] }]]);
  for (const ins of program) {
    if (ins.kind === 'apply') {
      for (const [key, run] of records) if (selects(key, ins.when)) applyIdeal(run, ins.instruction, kernels, maxBranches);
      continue;
    }
    const next = new Map<string, { vectors: StateVector[]; rho?: DensityMatrix }>();
    const part = (key: string) => {
      let p = next.get(key);
      if (p === undefined) next.set(key, (p = { vectors: [] }));
      return p;
    };
    for (const [key, run] of records) {
      if (run.rho !== undefined) {
        const one: DensityMatrix = { n, dim: run.rho.dim, data: new Float64Array(run.rho.data.length) };
        const zero: DensityMatrix = { n, dim: run.rho.dim, data: Float64Array.from(run.rho.data) };
        measureSplit(zero, one, ins.qubit, 0, 0);
        addDensity(part(withBit(key, ins.bit, 0)), zero);
        addDensity(part(withBit(key, ins.bit, 1)), one);
        continue;
      }
      const mask = qubitMask(n, ins.qubit);
      for (const psi of run.branches) {
        const [p0, p1] = projectVector(psi, mask);
        if (squaredNorm(p0) > NEGLIGIBLE_BRANCH_WEIGHT) part(withBit(key, ins.bit, 0)).vectors.push(p0);
        if (squaredNorm(p1) > NEGLIGIBLE_BRANCH_WEIGHT) part(withBit(key, ins.bit, 1)).vectors.push(p1);
      }
    }
    records = new Map();
    for (const [key, p] of next) {
      const run: IdealRun = { branches: [] };
      if (p.rho !== undefined) {
        run.rho = p.rho;
        for (const psi of p.vectors) addOuter(p.rho, psi);
      } else if (p.vectors.length > 0) setIdealBranches(run, p.vectors, maxBranches);
      if (run.rho !== undefined || run.branches.length > 0) records.set(key, run);
    }
  }
  const out: IdealEnsemble = new Map();
  for (const [key, run] of records) out.set(key, finishIdeal(run));
  return out;
}

function addDensity(p: { vectors: StateVector[]; rho?: DensityMatrix }, rho: DensityMatrix): void {
  if (!(traceOf(rho) > NEGLIGIBLE_BRANCH_WEIGHT)) return;
  if (p.rho === undefined) p.rho = rho;
  else addInto(p.rho, rho);
}

/** (Π_0 ψ, Π_1 ψ) for the qubit of bit mask `mask`: ψ's amplitudes split by that qubit's value. */
function projectVector(psi: StateVector, mask: number): [StateVector, StateVector] {
  const zero = new Float64Array(psi.data.length);
  const one = new Float64Array(psi.data.length);
  for (let i = 0; i < psi.dim; i++) {
    const target = (i & mask) === 0 ? zero : one;
    target[2 * i] = psi.data[2 * i]!;
    target[2 * i + 1] = psi.data[2 * i + 1]!;
  }
  return [
    { n: psi.n, dim: psi.dim, data: zero },
    { n: psi.n, dim: psi.dim, data: one },
  ];
}
