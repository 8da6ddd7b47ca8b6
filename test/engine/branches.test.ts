import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { fastBranchEngine, measureSplit, referenceBranchEngine, runBranches, runIdealBranches, type BranchEnsemble, type IdealEnsemble } from '../../src/engine/branches.js';
import { createDensityMatrix } from '../../src/engine/densityMatrix.js';
import type { Instruction } from '../../src/engine/instruction.js';
import { ensembleToDensityMatrix } from '../../src/engine/run.js';
import { RESET_KRAUS } from '../../src/engine/instruction.js';
import type { RecordCondition, RecordInstruction } from '../../src/engine/recordProgram.js';
import { maxBranches } from '../../src/engine/recordProgram.js';
import { fromRows, type CMatrix } from '../../src/linalg/cmatrix.js';
import { fastKernels } from '../../src/engine/fastKernels.js';
import { DENSE_AGREEMENT, denseChannel, denseReset, embed, maxDiffToMath } from './dense.js';
import { mulberry32, randInt, randomKraus, randomTargets, randomUnitary } from './helpers.js';

/**
 * The branch ensemble against an independent dense computation (mathjs) of the whole state
 * Σ_r |r⟩⟨r| ⊗ ρ_r on m record qubits (placed first, bit i = qubit i) and n system qubits.
 * In the dense picture a measurement of system qubit q into bit b with readout confusion
 * (e0, e1) is: reset the record qubit b (its old value is traced out), CNOT from q onto it,
 * dephase it (Kraus |0⟩⟨0|, |1⟩⟨1|), then the classical confusion channel on it (Kraus
 * √(1−e0)|0⟩⟨0|, √e0|1⟩⟨0|, √e1|0⟩⟨1|, √(1−e1)|1⟩⟨1|). An instruction with a condition C is
 * the channel {P_C ⊗ K_k} ∪ {(I − P_C) ⊗ I} (or with P_C and I − P_C swapped when it acts
 * where C fails), P_C the projector on the records satisfying C. Derived from the definition
 * of the ensemble in the issue; no fray code is used for the dense side.
 */

const referenceEngine = referenceBranchEngine();
/** The fast engine's route: each run of instructions as a fused, compiled plan on shared-memory branches. */
const fastEngine = fastBranchEngine({ fuse: true });

function id2(): CMatrix {
  return fromRows([
    [1, 0],
    [0, 1],
  ]);
}

/** Projector on the record states satisfying `condition` (2^m × 2^m, diagonal). */
function conditionProjector(m: number, condition: RecordCondition, holds: boolean): math.Matrix {
  const d = 1 << m;
  const diag = Array.from({ length: d }, (_, r) => {
    const ok = condition.every((t) => ((r >> (m - 1 - t.bit)) & 1) === t.value);
    return ok === holds ? 1 : 0;
  });
  return math.matrix(diag.map((v, i) => diag.map((_, j) => math.complex(i === j ? v : 0, 0))));
}

function identity(d: number): math.Matrix {
  return math.matrix(Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => math.complex(i === j ? 1 : 0, 0))));
}

/** Kraus operators of an engine instruction. */
function krausOf(ins: Instruction): { qubits: readonly number[]; kraus: readonly CMatrix[] } {
  if (ins.op === 'unitary') return { qubits: ins.qubits, kraus: [ins.matrix] };
  if (ins.op === 'channel') return { qubits: ins.qubits, kraus: ins.kraus };
  return { qubits: [ins.qubit], kraus: RESET_KRAUS };
}

function denseRecordRun(n: number, m: number, program: readonly RecordInstruction[], readout: boolean): math.Matrix {
  const N = n + m;
  const d = 1 << N;
  let rho = math.zeros(d, d) as math.Matrix;
  rho.set([0, 0], math.complex(1, 0));
  const sys = (qs: readonly number[]) => qs.map((q) => q + m);
  for (const ins of program) {
    if (ins.kind === 'measure') {
      const b = ins.bit;
      const e0 = readout ? ins.zeroAsOne : 0;
      const e1 = readout ? ins.oneAsZero : 0;
      rho = denseReset(N, b, rho);
      const cnot = fromRows([
        [1, 0, 0, 0],
        [0, 1, 0, 0],
        [0, 0, 0, 1],
        [0, 0, 1, 0],
      ]);
      rho = denseChannel(N, [ins.qubit + m, b], [cnot], rho);
      rho = denseChannel(N, [b], [fromRows([[1, 0], [0, 0]]), fromRows([[0, 0], [0, 1]])], rho);
      rho = denseChannel(
        N,
        [b],
        [fromRows([[Math.sqrt(1 - e0), 0], [0, 0]]), fromRows([[0, 0], [Math.sqrt(e0), 0]]), fromRows([[0, Math.sqrt(e1)], [0, 0]]), fromRows([[0, 0], [0, Math.sqrt(1 - e1)]])],
        rho,
      );
      continue;
    }
    const { qubits, kraus } = krausOf(ins.instruction);
    if (ins.when === undefined) {
      rho = denseChannel(N, sys(qubits), kraus, rho);
      continue;
    }
    // {P ⊗ K_k} ∪ {(I − P) ⊗ I}, with the system operators embedded on the system qubits
    const p = conditionProjector(m, ins.when.condition, ins.when.holds);
    const q = math.subtract(identity(1 << m), p) as math.Matrix;
    const terms: math.Matrix[] = [];
    for (const k of kraus) terms.push(math.kron(p, embed(n, qubits, k)) as math.Matrix);
    terms.push(math.kron(q, identity(1 << n)) as math.Matrix);
    let out = math.zeros(d, d) as math.Matrix;
    for (const t of terms) out = math.add(out, math.multiply(math.multiply(t, rho), math.ctranspose(t))) as math.Matrix;
    rho = out;
  }
  return rho;
}

/** The ensemble as the dense block-diagonal Σ_r |r⟩⟨r| ⊗ ρ_r (interleaved data of size 2^(m+n)). */
function ensembleAsDense(n: number, m: number, branches: BranchEnsemble | Map<string, Float64Array>): Float64Array {
  const D = 1 << n;
  const big = 1 << (n + m);
  const out = new Float64Array(2 * big * big);
  for (const [key, v] of branches) {
    const data = v instanceof Float64Array ? v : v.data;
    const r = m === 0 ? 0 : parseInt(key, 2);
    for (let i = 0; i < D; i++)
      for (let j = 0; j < D; j++) {
        const at = 2 * ((r * D + i) * big + (r * D + j));
        out[at] = data[2 * (i * D + j)]!;
        out[at + 1] = data[2 * (i * D + j) + 1]!;
      }
  }
  return out;
}

/** Largest entry difference between an ensemble (as Σ_r |r⟩⟨r| ⊗ ρ_r) and the dense state. */
function denseDiff(n: number, m: number, branches: BranchEnsemble | Map<string, Float64Array>, dense: math.Matrix): number {
  return maxDiffToMath(ensembleAsDense(n, m, branches), 1 << (n + m), 1 << (n + m), dense);
}

function idealAsMatrices(ideal: IdealEnsemble): Map<string, Float64Array> {
  const out = new Map<string, Float64Array>();
  for (const [key, s] of ideal) {
    const rho = s.kind === 'mixed' ? s.rho : ensembleToDensityMatrix(s.kind === 'pure' ? [s.state] : s.states);
    out.set(key, rho.data);
  }
  return out;
}

/** A random record program: unitaries, channels, resets, 1–3 measurements into 1–2 bits (so some overwrite), conditions on written bits. */
function randomProgram(rng: () => number, n: number, ideal: boolean): { m: number; program: RecordInstruction[] } {
  const m = 1 + randInt(rng, 2);
  const measurements = 1 + randInt(rng, 3);
  const program: RecordInstruction[] = [];
  const written = new Set<number>();
  const origin = { step: 0, what: 'random' };
  const randomInstruction = (): Instruction => {
    const kind = ideal ? randInt(rng, 4) % 2 === 0 ? 0 : 2 : randInt(rng, 3);
    const k = n >= 2 && rng() < 0.4 ? 2 : 1;
    const qubits = randomTargets(rng, n, k);
    if (kind === 0) return { op: 'unitary', qubits, matrix: randomUnitary(rng, 1 << k) };
    if (kind === 1) return { op: 'channel', qubits, kraus: randomKraus(rng, 1 << k, 1 + randInt(rng, 3)) };
    return { op: 'reset', qubit: qubits[0]! };
  };
  for (let i = 0; i < measurements; i++) {
    for (let g = 0; g < 2; g++) program.push({ kind: 'apply', instruction: randomInstruction(), origin });
    const bit = randInt(rng, m);
    const e0 = ideal ? 0 : 0.2 * rng();
    const e1 = ideal ? 0 : 0.2 * rng();
    program.push({ kind: 'measure', qubit: randInt(rng, n), bit, zeroAsOne: e0, oneAsZero: e1, origin });
    written.add(bit);
    const bits = [...written];
    for (let c = 0; c < 2; c++) {
      const condition: RecordCondition = bits.filter(() => rng() < 0.7).map((b) => ({ bit: b, value: rng() < 0.5 ? 0 : 1 }));
      const when = { condition: condition.length > 0 ? condition : [{ bit: bits[0]!, value: 1 as const }], holds: ideal || rng() < 0.6 };
      program.push({ kind: 'apply', instruction: randomInstruction(), when, origin });
    }
  }
  program.push({ kind: 'apply', instruction: randomInstruction(), origin });
  return { m, program };
}

describe('branch ensemble (src/engine/branches.ts) against a dense Σ_r |r⟩⟨r| ⊗ ρ_r (mathjs)', () => {
  // 2 system qubits and 1–2 record bits keep the dense matrices at most 16 × 16 (mathjs is slow)
  for (let seed = 1; seed <= 5; seed++) {
    it(`random noisy record program, seed ${seed}: reference and fused engines agree with the dense state to 1e-12`, () => {
      const rng = mulberry32(seed);
      const n = 2;
      const { m, program } = randomProgram(rng, n, false);
      const dense = denseRecordRun(n, m, program, true);
      for (const engine of [referenceEngine, fastEngine]) {
        const branches = runBranches(n, m, program, engine);
        expect(branches.size).toBeLessThanOrEqual(maxBranches(program));
        expect(denseDiff(n, m, branches, dense)).toBeLessThan(DENSE_AGREEMENT);
      }
      // without readout error: the dense run with e0 = e1 = 0
      const plain = runBranches(n, m, program, referenceEngine, { readout: false });
      expect(denseDiff(n, m, plain, denseRecordRun(n, m, program, false))).toBeLessThan(DENSE_AGREEMENT);
    });
  }

  for (let seed = 11; seed <= 13; seed++) {
    it(`random ideal record program, seed ${seed}: pure branches per record agree with the dense state to 1e-12`, () => {
      const rng = mulberry32(seed);
      const n = 2;
      const { m, program } = randomProgram(rng, n, true);
      const dense = denseRecordRun(n, m, program, false);
      for (const maxIdeal of [64, 1]) {
        const ideal = runIdealBranches(n, m, program, fastKernels, maxIdeal);
        expect(denseDiff(n, m, idealAsMatrices(ideal), dense)).toBeLessThan(DENSE_AGREEMENT);
      }
    });
  }

  it('measureSplit keeps Π_0ρΠ_0 and Π_1ρΠ_1 and mixes them by the readout confusion (definition)', () => {
    const rho = createDensityMatrix(1);
    // |+⟩⟨+|
    rho.data.set([0.5, 0, 0.5, 0, 0.5, 0, 0.5, 0]);
    const one = createDensityMatrix(1);
    one.data[0] = 0;
    measureSplit(rho, one, 0, 0.1, 0.3);
    // recorded 0: 0.9·½|0⟩⟨0| + 0.3·½|1⟩⟨1|; recorded 1: 0.1·½|0⟩⟨0| + 0.7·½|1⟩⟨1|
    expect([...rho.data]).toEqual([0.45, 0, 0, 0, 0, 0, 0.15, 0]);
    expect([...one.data].map((x) => Number(x.toFixed(15)))).toEqual([0.05, 0, 0, 0, 0, 0, 0.35, 0]);
  });

  it('a rewritten bit merges the branches that differed only in its old value (count stays 2^bits)', () => {
    const origin = { step: 0, what: 't' };
    const h = fromRows([
      [Math.SQRT1_2, Math.SQRT1_2],
      [Math.SQRT1_2, -Math.SQRT1_2],
    ]);
    const program: RecordInstruction[] = [];
    for (let i = 0; i < 4; i++) {
      program.push({ kind: 'apply', instruction: { op: 'unitary', qubits: [0], matrix: h }, origin });
      program.push({ kind: 'measure', qubit: 0, bit: 0, zeroAsOne: 0.1, oneAsZero: 0.1, origin });
    }
    program.push({ kind: 'apply', instruction: { op: 'unitary', qubits: [0], matrix: id2() }, origin });
    const branches = runBranches(1, 1, program, referenceEngine);
    expect([...branches.keys()].sort()).toEqual(['0', '1']);
    expect(maxBranches(program)).toBe(2);
  });
});
