import { afterAll, describe, expect, it } from 'vitest';
import { complex, matrix, type Matrix } from 'mathjs';
import type { Instruction } from '../../src/engine/instruction.js';
import { referenceKernels } from '../../src/engine/kernels.js';
import { runNoisy } from '../../src/engine/run.js';
import { runCompiled } from '../../src/engine/runCompiled.js';
import { ThreadPool } from '../../src/engine/threadPool.js';
import { identity, type CMatrix } from '../../src/linalg/cmatrix.js';
import { buildPlan } from '../../src/plan/buildPlan.js';
import { compilePlan } from '../../src/plan/compilePlan.js';
import { denseChannel, denseReset, DENSE_AGREEMENT, rhoDiff } from '../engine/dense.js';
import { mulberry32, randomKraus, randomUnitary } from '../engine/helpers.js';
import { CNOT, cphase, maxDiff, phaseDampingKraus, PLAN_AGREEMENT, randomProgram, rz } from './helpers.js';

// One pool for the whole file; threads are forced onto small registers (minThreadQubits = 1).
const pool = new ThreadPool(2);
// wait for the worker, so the 2-thread runs below split their passes (applyCompiled would not wait)
pool.ready();
afterAll(() => pool.close());

/** The dense mathjs result of an instruction list applied to |0…0⟩⟨0…0| (independent reference). */
function denseRun(n: number, program: readonly Instruction[]): Matrix {
  const dim = 1 << n;
  let rho = matrix(Array.from({ length: dim }, (_, r) => Array.from({ length: dim }, (_, c) => complex(r === 0 && c === 0 ? 1 : 0, 0))));
  for (const ins of program) {
    if (ins.op === 'reset') rho = denseReset(n, ins.qubit, rho);
    else rho = denseChannel(n, ins.qubits, ins.op === 'unitary' ? [ins.matrix] : ins.kraus, rho);
  }
  return rho;
}

describe('fused plan against the reference kernels (random circuits, fixed seeds)', () => {
  for (let n = 1; n <= 6; n++) {
    it(`${n} qubit${n === 1 ? '' : 's'}: fused, unfused, 1 and 2 threads agree with runNoisy to ${PLAN_AGREEMENT}`, () => {
      const rng = mulberry32(4000 + n);
      for (let trial = 0; trial < 3; trial++) {
        const program = randomProgram(rng, n, 12 + 4 * n);
        const expected = runNoisy(n, program, referenceKernels);
        const fused = buildPlan(n, program);
        const one = runCompiled(compilePlan(fused));
        const two = runCompiled(compilePlan(fused), pool, 1);
        const unfused = runCompiled(compilePlan(buildPlan(n, program, { fuse: false })), pool, 1);
        const keep = buildPlan(n, program, { keepDiagonal: true });
        expect(maxDiff(runCompiled(compilePlan(keep)).data, expected.data)).toBeLessThan(PLAN_AGREEMENT);
        expect(keep.steps.flatMap((s) => s.sources).sort((a, b) => a - b)).toEqual(program.map((_, i) => i));
        expect(maxDiff(one.data, expected.data)).toBeLessThan(PLAN_AGREEMENT);
        expect(maxDiff(two.data, expected.data)).toBeLessThan(PLAN_AGREEMENT);
        expect(maxDiff(unfused.data, expected.data)).toBeLessThan(PLAN_AGREEMENT);
        // every pass computes each element with the same operations whichever thread owns it: bit for bit
        expect(maxDiff(one.data, two.data)).toBe(0);
        // the plan accounts for every instruction exactly once
        expect(fused.steps.flatMap((s) => s.sources).sort((a, b) => a - b)).toEqual(program.map((_, i) => i));
      }
    });
  }

  it('2 pool threads are really in use (the compiled worker script is found)', () => {
    pool.ready();
    expect(pool.parts).toBe(2);
  });
});

describe('fused plan against the dense mathjs reference', () => {
  // Source: independent dense computation with mathjs (full 2^n × 2^n Kraus sums, ../engine/dense.ts).
  it.each([1, 2, 3])('%i qubits, random circuits', (n) => {
    const rng = mulberry32(5000 + n);
    for (let trial = 0; trial < 2; trial++) {
      const program = randomProgram(rng, n, 10);
      const rho = runCompiled(compilePlan(buildPlan(n, program)), pool, 1);
      expect(rhoDiff(rho, denseRun(n, program))).toBeLessThan(DENSE_AGREEMENT);
    }
  });
});

describe('fusion structure', () => {
  it('a layer of 1-qubit gates with noise folds into the following 2-qubit gates: one real2 call per pair', () => {
    const rng = mulberry32(77);
    const program: Instruction[] = [];
    for (let q = 0; q < 4; q++) {
      program.push({ op: 'unitary', qubits: [q], matrix: randomUnitary(rng, 2) });
      program.push({ op: 'channel', qubits: [q], kraus: randomKraus(rng, 2, 2) });
    }
    program.push({ op: 'unitary', qubits: [0, 1], matrix: CNOT }, { op: 'channel', qubits: [0, 1], kraus: randomKraus(rng, 4, 3) });
    program.push({ op: 'unitary', qubits: [3, 2], matrix: CNOT }, { op: 'channel', qubits: [3, 2], kraus: randomKraus(rng, 4, 3) });
    const plan = buildPlan(4, program);
    expect(plan.steps.map((s) => s.kernel)).toEqual(['real2', 'real2']);
    expect(plan.steps[0]!.sources).toEqual([0, 1, 2, 3, 8, 9]);
    expect(plan.steps[1]!.sources).toEqual([4, 5, 6, 7, 10, 11]);
    expect(maxDiff(runCompiled(compilePlan(plan)).data, runNoisy(4, program).data)).toBeLessThan(PLAN_AGREEMENT);
  });

  it('a reset is fused as its exact CPTP map and never moves across other work on its qubit', () => {
    // h(0), cx(0,1), reset(0), h(0), cx(1,2), reset(1): each reset must act after the cx on its qubit
    const h = randomUnitary(mulberry32(3), 2);
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0], matrix: h },
      { op: 'unitary', qubits: [0, 1], matrix: CNOT },
      { op: 'reset', qubit: 0 },
      { op: 'unitary', qubits: [0], matrix: h },
      { op: 'unitary', qubits: [1, 2], matrix: CNOT },
      { op: 'reset', qubit: 1 },
    ];
    const plan = buildPlan(3, program);
    const rho = runCompiled(compilePlan(plan));
    expect(rhoDiff(rho, denseRun(3, program))).toBeLessThan(DENSE_AGREEMENT);
    // the reset of qubit 0 and the later h join the cx group (same qubits, nothing in between)
    expect(plan.steps[0]!.sources).toEqual([0, 1, 2, 3]);
    // the cx on (1, 2) cannot absorb that group (qubit 0 is outside it): a separate call after it
    expect(plan.steps[1]!.sources).toEqual([4, 5]);
  });

  it('diagonal maps (rz, phase damping, controlled phase) are batched into one diagonal pass', () => {
    const rng = mulberry32(11);
    const n = 5;
    const diagonal: Instruction[] = [];
    for (let q = 0; q < n; q++) diagonal.push({ op: 'unitary', qubits: [q], matrix: rz(6 * rng()) }, { op: 'channel', qubits: [q], kraus: phaseDampingKraus(rng()) });
    diagonal.push({ op: 'unitary', qubits: [0, 3], matrix: cphase(rng()) }, { op: 'unitary', qubits: [4, 1], matrix: cphase(rng()) });
    const batch = buildPlan(n, diagonal);
    expect(batch.steps.map((s) => s.kernel)).toEqual(['diagonal']);
    expect(batch.steps[0]!.sources).toHaveLength(diagonal.length);
    // on a superposition (so that the phases matter): random 1-qubit gates first, unfused, then the batch
    const prep: Instruction[] = Array.from({ length: n }, (_, q) => ({ op: 'unitary' as const, qubits: [q], matrix: randomUnitary(rng, 2) }));
    const steps = [...buildPlan(n, prep, { fuse: false }).steps, ...batch.steps.map((s) => ({ ...s, sources: s.sources.map((i) => i + n) }))];
    const rho = runCompiled(compilePlan({ n, fused: true, instructionCount: prep.length + diagonal.length, steps }), pool, 1);
    expect(maxDiff(rho.data, runNoisy(n, [...prep, ...diagonal]).data)).toBeLessThan(PLAN_AGREEMENT);
  });

  it('a diagonal map joins the open batch only when its qubits were untouched since the batch opened', () => {
    const rng = mulberry32(12);
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0], matrix: rz(1) }, // diagonal: opens a batch
      { op: 'unitary', qubits: [1, 2], matrix: CNOT }, // not diagonal, on 1 and 2
      { op: 'unitary', qubits: [3], matrix: rz(2) }, // qubit 3 untouched since: joins the batch
      { op: 'unitary', qubits: [1, 4], matrix: cphase(0.7) }, // qubit 1 touched by the cx: a new batch after it
      { op: 'channel', qubits: [2], kraus: randomKraus(rng, 2, 2) }, // folds into the cx group
    ];
    const plan = buildPlan(5, program);
    expect(plan.steps.map((s) => [s.kernel, s.sources])).toEqual([
      ['diagonal', [0, 2]],
      ['real2', [1, 4]],
      ['diagonal', [3]],
    ]);
    expect(maxDiff(runCompiled(compilePlan(plan)).data, runNoisy(5, program).data)).toBeLessThan(PLAN_AGREEMENT);
  });

  it('keepDiagonal: a 1-qubit gate does not turn a diagonal pair into a real2 call; the pairs batch into one pass', () => {
    // rzz-like phases on (0,1) and (2,3), then an x-type gate on qubit 1: by default it merges into the
    // (0,1) group (real2); with keepDiagonal the pair stays diagonal and the gate is its own 1-qubit call.
    const x = { rows: 2, cols: 2, data: Float64Array.from([0, 0, 1, 0, 1, 0, 0, 0]) };
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0, 1], matrix: cphase(0.3) },
      { op: 'unitary', qubits: [2, 3], matrix: cphase(0.7) },
      { op: 'unitary', qubits: [1], matrix: x },
    ];
    expect(buildPlan(4, program).steps.map((s) => s.kernel)).toEqual(['real2', 'diagonal']);
    const keep = buildPlan(4, program, { keepDiagonal: true });
    expect(keep.steps.map((s) => s.kernel)).toEqual(['diagonal', 'real1tp']);
    expect(maxDiff(runCompiled(compilePlan(keep)).data, runNoisy(4, program, referenceKernels).data)).toBeLessThan(PLAN_AGREEMENT);
  });

  it('a lone 1-qubit CPTP group uses the trace-preserving kernel, a trace-decreasing one the general real form', () => {
    const rng = mulberry32(13);
    const cptp = buildPlan(2, [{ op: 'channel', qubits: [1], kraus: randomKraus(rng, 2, 2) }]);
    expect(cptp.steps[0]!.kernel).toBe('real1tp');
    const lossy: Instruction[] = [{ op: 'channel', qubits: [1], kraus: randomKraus(rng, 2, 2).map((k) => ({ ...k, data: k.data.map((x) => 0.9 * x) })) }];
    const plan = buildPlan(2, lossy);
    expect(plan.steps[0]!.kernel).toBe('real1');
    expect(maxDiff(runCompiled(compilePlan(plan)).data, runNoisy(2, lossy).data)).toBeLessThan(PLAN_AGREEMENT);
  });

  it('identity-only work still yields a valid plan', () => {
    const program: Instruction[] = [{ op: 'unitary', qubits: [0], matrix: identity(2) }];
    const plan = buildPlan(2, program);
    expect(plan.steps).toHaveLength(1);
    expect(runCompiled(compilePlan(plan)).data[0]).toBe(1);
  });
});

describe('one superoperator per distinct numbers and one composition per distinct operands (src/plan/instructionSuperoperator.ts, src/plan/compositionMemo.ts)', () => {
  it('a plan whose instructions share matrix and Kraus objects has the same numbers, bit for bit, as one where every instruction has its own copies', () => {
    const copy = (m: CMatrix): CMatrix => ({ rows: m.rows, cols: m.cols, data: Float64Array.from(m.data) });
    const rng = mulberry32(4711);
    for (const n of [3, 5]) {
      // a few payloads used again and again, as the applications of one noise entry are
      const payloads: Instruction[] = randomProgram(rng, n, 8).filter((ins) => ins.op !== 'reset');
      const shared: Instruction[] = Array.from({ length: 40 }, () => payloads[Math.floor(rng() * payloads.length)]!);
      const own: Instruction[] = shared.map((ins) => (ins.op === 'unitary' ? { ...ins, matrix: copy(ins.matrix) } : ins.op === 'channel' ? { ...ins, kraus: ins.kraus.map(copy) } : ins));
      const a = buildPlan(n, shared);
      const b = buildPlan(n, own);
      expect(a.steps.length).toBe(b.steps.length);
      a.steps.forEach((s, i) => {
        expect(s.kernel).toBe(b.steps[i]!.kernel);
        expect(Array.from(s.numbers)).toEqual(Array.from(b.steps[i]!.numbers));
      });
      expect(maxDiff(runCompiled(compilePlan(a)).data, runCompiled(compilePlan(b)).data)).toBe(0);
    }
  });

  it('groups of one history (brickwork layers of one rotation, one cx and shared noise) share superoperators, with the numbers of a plan without sharing', () => {
    const copy = (m: CMatrix): CMatrix => ({ rows: m.rows, cols: m.cols, data: Float64Array.from(m.data) });
    const n = 6;
    const noise = phaseDampingKraus(0.02);
    const shared: Instruction[] = [];
    for (let layer = 0; layer < 6; layer++) {
      const turn = rz(0.3 + 0.1 * (layer % 2));
      for (let q = 0; q < n; q++) shared.push({ op: 'unitary', qubits: [q], matrix: turn }, { op: 'channel', qubits: [q], kraus: noise });
      for (let q = layer % 2; q + 1 < n; q += 2) shared.push({ op: 'unitary', qubits: [q, q + 1], matrix: CNOT }, { op: 'channel', qubits: [q + 1], kraus: noise });
    }
    const own: Instruction[] = shared.map((ins) => (ins.op === 'unitary' ? { ...ins, matrix: copy(ins.matrix) } : ins.op === 'channel' ? { ...ins, kraus: ins.kraus.map(copy) } : ins));
    const a = buildPlan(n, shared);
    const b = buildPlan(n, own);
    // the three cx groups of a layer are one history: fewer distinct number arrays than steps;
    // superoperators are memoised by the bits of their numbers, so the copies share them too
    expect(new Set(a.steps.map((s) => s.numbers)).size).toBeLessThan(a.steps.length);
    expect(new Set(b.steps.map((s) => s.numbers)).size).toBe(new Set(a.steps.map((s) => s.numbers)).size);
    expect(a.steps.map((s) => [s.kernel, s.qubits, s.sources])).toEqual(b.steps.map((s) => [s.kernel, s.qubits, s.sources]));
    a.steps.forEach((s, i) => expect(Array.from(s.numbers)).toEqual(Array.from(b.steps[i]!.numbers)));
    expect(maxDiff(runCompiled(compilePlan(a)).data, runCompiled(compilePlan(b)).data)).toBe(0);
  });
});
