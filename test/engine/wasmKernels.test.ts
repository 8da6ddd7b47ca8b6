import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { CompiledPlanBuilder, type CompiledPlan } from '../../src/engine/compiledPlan.js';
import { referenceKernels } from '../../src/engine/kernels.js';
import type { KernelName } from '../../src/engine/kernelCall.js';
import type { DensityMatrix } from '../../src/engine/layout.js';
import { isTracePreservingRealForm, realFormOf } from '../../src/engine/realForm.js';
import { applyCompiled, createSharedDensityMatrix, kernelFamilyOf } from '../../src/engine/runCompiled.js';
import { closeSharedThreadPool, sharedThreadPool } from '../../src/engine/threadPool.js';
import { kernelFamilyFor, WASM_MAX_QUBITS, WASM_MIN_QUBITS, wasmKernelModule } from '../../src/engine/wasmKernels.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { diag, type CMatrix } from '../../src/linalg/cmatrix.js';
import { diagonalTable, DIAGONAL_BIN_MAX_QUBITS } from '../../src/plan/diagonalBatch.js';
import { denseChannel, rhoDiff, rhoToMath } from './dense.js';
import { mulberry32, randomDensityMatrix, randomKraus, sameBits } from './helpers.js';

afterAll(() => closeSharedThreadPool());

/** Agreement required of the WebAssembly kernels with the reference kernels and the dense route (issue 12: 1e-14). */
const WASM_AGREEMENT = 1e-14;

const root = fileURLToPath(new URL('../../', import.meta.url));

/** Random Hermitian n-qubit matrix with entries of size ~1/D (cheap for 10 qubits; the kernels need Hermiticity, not positivity). */
function randomHermitian(rng: () => number, n: number): Float64Array {
  const D = 1 << n;
  const data = new Float64Array(2 * D * D);
  for (let r = 0; r < D; r++) {
    for (let c = r; c < D; c++) {
      const re = (rng() - 0.5) / D;
      const im = r === c ? 0 : (rng() - 0.5) / D;
      data[2 * (r * D + c)] = re;
      data[2 * (r * D + c) + 1] = im;
      data[2 * (c * D + r)] = re;
      data[2 * (c * D + r) + 1] = -im;
    }
  }
  return data;
}

/** A one-call plan applying the channel `kraus` on `targets` with `kernel`. */
function onePassPlan(n: number, kernel: KernelName, targets: readonly number[], kraus: readonly CMatrix[]): CompiledPlan {
  const b = new CompiledPlanBuilder(n);
  const off = b.addNumbers(realFormOf(krausToSuperoperator(kraus), targets.length)!);
  b.addCall({ kernel, qubits: targets, off });
  return b.build();
}

/** ρ0 after `plan` with the WebAssembly kernels and with the JS kernels. */
function bothFamilies(n: number, rho0: Float64Array, plan: CompiledPlan): { wasm: DensityMatrix; js: DensityMatrix } {
  const wasm = createSharedDensityMatrix(n, 'wasm');
  const js = createSharedDensityMatrix(n, 'js');
  wasm.data.set(rho0);
  js.data.set(rho0);
  applyCompiled(wasm, plan);
  applyCompiled(js, plan);
  expect(kernelFamilyOf(wasm)).toBe('wasm');
  expect(kernelFamilyOf(js)).toBe('js');
  return { wasm, js };
}

function maxDiff(a: Float64Array, b: Float64Array): number {
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i]! - b[i]!));
  return w;
}

/**
 * Target pairs for n qubits: every ordered pair up to 6 qubits; on 7–8 neighbours both ways,
 * the two ends both ways and a middle pair; on 9–10 (16 MiB registers) the two ends both ways
 * and the last neighbours.
 */
function pairs(n: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  if (n <= 6) {
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) if (a !== b) out.push([a, b]);
    return out;
  }
  if (n >= 9) return [[0, n - 1], [n - 1, 0], [n - 2, n - 1]];
  out.push([0, 1], [1, 0], [n - 2, n - 1], [n - 1, n - 2], [0, n - 1], [n - 1, 0], [2, n - 3]);
  return out;
}

/** A diagonal channel on `qubits`: a random diagonal unitary (phases e^{iφ}) or, on one qubit, phase damping. */
interface DiagonalOp {
  readonly qubits: number[];
  readonly kraus: CMatrix[];
}

/**
 * Random diagonal channels filling bins A and B (disjoint; B may be empty): on each bin a
 * phase-damping channel per qubit (Kraus diag(1, √(1−λ)), diag(0, √λ), N&C eq. 8.127–8.128) and
 * diagonal unitaries on random pairs and single qubits of the bin.
 */
function diagonalOps(rng: () => number, a: readonly number[], b: readonly number[]): DiagonalOp[] {
  const ops: DiagonalOp[] = [];
  const phases = (k: number): CMatrix => diag(Array.from({ length: 1 << k }, () => [Math.cos(6 * rng()), Math.sin(6 * rng())] as [number, number]));
  for (const bin of [a, b]) {
    for (const q of bin) {
      const lambda = 0.05 + 0.5 * rng();
      ops.push({ qubits: [q], kraus: [diag([1, Math.sqrt(1 - lambda)]), diag([0, Math.sqrt(lambda)])] });
    }
    for (let i = 0; i + 1 < bin.length; i += 2) ops.push({ qubits: [bin[i + 1]!, bin[i]!], kraus: [phases(2)] });
    if (bin.length > 0) ops.push({ qubits: [bin[bin.length - 1]!], kraus: [phases(1)] });
  }
  return ops;
}

/** A one-call plan applying the diagonal channels `ops` as the product tables over bins a and b. */
function diagonalPlan(n: number, a: readonly number[], b: readonly number[], ops: readonly DiagonalOp[]): CompiledPlan {
  const members = ops.map((o) => ({ qubits: o.qubits, superop: krausToSuperoperator(o.kraus) }));
  const plan = new CompiledPlanBuilder(n);
  const off = plan.addNumbers(diagonalTable(members, a));
  const offB = plan.addNumbers(diagonalTable(members, b));
  plan.addCall({ kernel: 'diagonal', qubits: a, qubitsB: b, off, offB });
  return plan.build();
}

/**
 * Bin pairs on n qubits: one bin of every qubit (up to DIAGONAL_BIN_MAX_QUBITS), one bin of a
 * single middle qubit, and two bins: interleaved qubits, and the low and high halves (listed
 * high first, so the packed order is not the register order).
 */
function diagonalBinPairs(rng: () => number, n: number): Array<[number[], number[]]> {
  const all = Array.from({ length: n }, (_, q) => q);
  const out: Array<[number[], number[]]> = [[all.slice(0, DIAGONAL_BIN_MAX_QUBITS), []], [[n >> 1], []]];
  if (n >= 2) {
    const shuffled = [...all].sort(() => rng() - 0.5);
    const kA = Math.min(DIAGONAL_BIN_MAX_QUBITS, Math.ceil(n / 2));
    out.push([shuffled.slice(0, kA).sort((x, y) => x - y), shuffled.slice(kA, kA + DIAGONAL_BIN_MAX_QUBITS).sort((x, y) => x - y)]);
    const half = n >> 1;
    out.push([all.slice(half).slice(0, DIAGONAL_BIN_MAX_QUBITS).reverse(), all.slice(0, half).reverse()]);
  }
  return out;
}

describe('WebAssembly kernels', () => {
  it('run on this Node (the fresh-clone default) from WASM_MIN_QUBITS to WASM_MAX_QUBITS (any size when asked), the JS kernels elsewhere', () => {
    expect(wasmKernelModule()).toBeDefined();
    expect(kernelFamilyFor(WASM_MIN_QUBITS)).toBe('wasm');
    expect(kernelFamilyFor(WASM_MAX_QUBITS)).toBe('wasm');
    expect(kernelFamilyFor(WASM_MIN_QUBITS - 1)).toBe('js');
    expect(kernelFamilyFor(1, 'wasm')).toBe('wasm');
    expect(kernelFamilyFor(WASM_MAX_QUBITS + 1)).toBe('js');
    expect(kernelFamilyFor(WASM_MAX_QUBITS + 1, 'wasm')).toBe('js');
    expect(kernelFamilyFor(10, 'js')).toBe('js');
  });

  it('the committed wasm/kernels.wasm is exactly what its generator writes', () => {
    const dir = mkdtempSync(join(tmpdir(), 'fray-wasm-'));
    try {
      const out = join(dir, 'kernels.wasm');
      const r = spawnSync(process.execPath, [join(root, 'test/bench/generateWasmKernels.mjs')], { env: { ...process.env, WASM_OUT: out }, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      expect(Buffer.compare(readFileSync(out), readFileSync(join(root, 'wasm/kernels.wasm')))).toBe(0);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  // Source for the physics: the reference kernels (src/engine/kernels.ts, checked against mathjs
  // in kernels.test.ts) and, below, the dense mathjs route. Bit-for-bit equality with the JS
  // real-form kernels holds because both do the same IEEE operations in the same order.
  /** Whether to also run the (slow, plain) reference kernel: always up to 8 qubits, on the first target set above (bit-for-bit equality with the JS kernels carries the rest). */
  const checkReference = (n: number, index: number) => n <= 8 || index === 0;

  it.each([1, 2, 3, 4, 5, 6, 7, 8, 9, 10])('1-qubit channels on %i qubits (every qubit up to 6; first, middle, last on 7–8; first and last on 9–10): bit-for-bit the JS kernels, 1e-14 the reference', (n) => {
    const rng = mulberry32(12_100 + n);
    const qubits = n <= 6 ? Array.from({ length: n }, (_, q) => q) : n <= 8 ? [0, n >> 1, n - 1] : [0, n - 1];
    for (const [index, q] of qubits.entries()) {
      const rho0 = randomHermitian(rng, n);
      const kraus = randomKraus(rng, 2, 1 + (q % 3));
      const tp = realFormOf(krausToSuperoperator(kraus), 1)!;
      expect(isTracePreservingRealForm(tp)).toBe(true);
      for (const kernel of ['real1', 'real1tp'] as const) {
        const { wasm, js } = bothFamilies(n, rho0, onePassPlan(n, kernel, [q], kraus));
        expect(sameBits(wasm.data, js.data)).toBe(true);
        if (!checkReference(n, index)) continue;
        const ref: DensityMatrix = { n, dim: 1 << n, data: Float64Array.from(rho0) };
        referenceKernels.applyKraus(ref, [q], kraus);
        expect(maxDiff(wasm.data, ref.data)).toBeLessThan(WASM_AGREEMENT);
      }
    }
  });

  it.each([2, 3, 4, 5, 6, 7, 8, 9, 10])('2-qubit channels on %i qubits, adjacent, reversed and distant pairs: bit-for-bit the JS kernel, 1e-14 the reference', (n) => {
    const rng = mulberry32(12_200 + n);
    for (const [index, [a, b]] of pairs(n).entries()) {
      const rho0 = randomHermitian(rng, n);
      const kraus = randomKraus(rng, 4, 2);
      const { wasm, js } = bothFamilies(n, rho0, onePassPlan(n, 'real2', [a, b], kraus));
      expect(sameBits(wasm.data, js.data)).toBe(true);
      if (!checkReference(n, index)) continue;
      const ref: DensityMatrix = { n, dim: 1 << n, data: Float64Array.from(rho0) };
      referenceKernels.applyKraus(ref, [a, b], kraus);
      expect(maxDiff(wasm.data, ref.data)).toBeLessThan(WASM_AGREEMENT);
    }
  });

  // Source: independent dense computation with mathjs (full 2^n × 2^n operators, ./dense.ts).
  it.each([1, 2, 3, 4])('agree with the dense mathjs route to 1e-14 on %i qubits (every target and pair)', (n) => {
    const rng = mulberry32(12_300 + n);
    const targetSets: number[][] = [];
    for (let a = 0; a < n; a++) targetSets.push([a]);
    for (const p of pairs(n)) targetSets.push(p);
    for (const targets of targetSets) {
      const rho = randomDensityMatrix(rng, n);
      const kraus = randomKraus(rng, 1 << targets.length, 2);
      const expected = denseChannel(n, targets, kraus, rhoToMath(rho));
      const { wasm } = bothFamilies(n, rho.data, onePassPlan(n, targets.length === 1 ? 'real1tp' : 'real2', targets, kraus));
      expect(rhoDiff(wasm, expected)).toBeLessThan(WASM_AGREEMENT);
    }
  });

  // Source for the physics: the reference kernels applying each diagonal channel by its Kraus
  // operators (src/engine/kernels.ts, checked against mathjs in kernels.test.ts). Bit-for-bit
  // equality with the JS diagonal kernel holds because both do the same two complex products per
  // element in the same order.
  it.each([1, 2, 3, 4, 5, 6, 7, 8, 9, 10])('diagonal batches on %i qubits, one and two bins: bit-for-bit the JS kernel, 1e-14 the reference', (n) => {
    const rng = mulberry32(12_500 + n);
    for (const [index, [a, b]] of diagonalBinPairs(rng, n).entries()) {
      const rho0 = randomHermitian(rng, n);
      const ops = diagonalOps(rng, a, b);
      const { wasm, js } = bothFamilies(n, rho0, diagonalPlan(n, a, b, ops));
      expect(sameBits(wasm.data, js.data)).toBe(true);
      if (!checkReference(n, index)) continue;
      const ref: DensityMatrix = { n, dim: 1 << n, data: Float64Array.from(rho0) };
      for (const o of ops) referenceKernels.applyKraus(ref, o.qubits, o.kraus);
      expect(maxDiff(wasm.data, ref.data)).toBeLessThan(WASM_AGREEMENT);
    }
  });

  // Source: independent dense computation with mathjs (full 2^n × 2^n operators, ./dense.ts).
  it.each([1, 2, 3, 4])('diagonal batches agree with the dense mathjs route to 1e-14 on %i qubits', (n) => {
    const rng = mulberry32(12_600 + n);
    for (const [a, b] of diagonalBinPairs(rng, n)) {
      const rho = randomDensityMatrix(rng, n);
      const ops = diagonalOps(rng, a, b);
      let expected = rhoToMath(rho);
      for (const o of ops) expected = denseChannel(n, o.qubits, o.kraus, expected);
      const { wasm } = bothFamilies(n, rho.data, diagonalPlan(n, a, b, ops));
      expect(rhoDiff(wasm, expected)).toBeLessThan(WASM_AGREEMENT);
    }
  });

  it('give bit-for-bit the same ρ on 1 and 2 threads, equal to the JS kernels on 2 threads', () => {
    const pool = sharedThreadPool(2, false);
    pool.ready();
    const n = 7;
    const rng = mulberry32(12_400);
    const b = new CompiledPlanBuilder(n);
    for (let i = 0; i < 16; i++) {
      const k = 1 + (i % 2);
      const qubits = k === 1 ? [(3 * i) % n] : [i % n, (i + 2 + (i % 3)) % n];
      const real = realFormOf(krausToSuperoperator(randomKraus(rng, 1 << k, 2)), k)!;
      b.addCall({ kernel: k === 2 ? 'real2' : i % 4 === 0 ? 'real1' : 'real1tp', qubits, off: b.addNumbers(real) });
      if (i % 5 === 4) {
        // a diagonal batch: two bins every other time
        const [binA, binB] = i % 10 === 4 ? [[1, 3, 4], [0, 6]] : [[2, 5], []];
        const members = diagonalOps(rng, binA, binB).map((o) => ({ qubits: o.qubits, superop: krausToSuperoperator(o.kraus) }));
        const off = b.addNumbers(diagonalTable(members, binA));
        b.addCall({ kernel: 'diagonal', qubits: binA, qubitsB: binB, off, offB: b.addNumbers(diagonalTable(members, binB)) });
      }
    }
    const plan = b.build();
    const one = createSharedDensityMatrix(n, 'wasm');
    const two = createSharedDensityMatrix(n, 'wasm');
    const jsTwo = createSharedDensityMatrix(n, 'js');
    applyCompiled(one, plan);
    applyCompiled(two, plan, pool, 1);
    applyCompiled(jsTwo, plan, pool, 1);
    expect(pool.parts).toBe(2);
    expect(sameBits(one.data, two.data)).toBe(true);
    expect(sameBits(one.data, jsTwo.data)).toBe(true);
  });
});
