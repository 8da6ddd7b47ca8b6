// Kernel timings of `npm run bench`: each fast kernel's median time for one pass over an
// n-qubit density matrix, and its ratio to a bare streaming read+write pass over the same array
// written in WebAssembly (the JS streaming pass is about twice slower, so it would flatter the
// kernels).
import { CompiledPlanBuilder } from '../../dist/engine/compiledPlan.js';
import { executeCall } from '../../dist/engine/kernelCall.js';
import { realFormOf } from '../../dist/engine/realForm.js';
import { createSharedDensityMatrix } from '../../dist/engine/runCompiled.js';
import { krausToSuperoperator, superoperatorOf } from '../../dist/linalg/superoperator.js';
import { awaitOptimisedKernels } from '../../dist/engine/warmKernels.js';
import { warmWasmKernels, wasmRegisterOf } from '../../dist/engine/wasmKernels.js';
import { amplitudeDamping, depolarizing, phaseDamping } from '../../dist/noise/channels.js';
import { fromRows, mul } from '../../dist/linalg/cmatrix.js';
import { composeEmbedded } from '../../dist/plan/embedSuperoperator.js';
import { diagonalTable } from '../../dist/plan/diagonalBatch.js';

/** A bare streaming pass: every double read and written once, loop unrolled 4× (the memory floor of a pass). */
export function streamPass(d) {
  const L = d.length;
  for (let i = 0; i < L; i += 4) {
    d[i] = d[i] * 0.999999;
    d[i + 1] = d[i + 1] * 0.999999;
    d[i + 2] = d[i + 2] * 0.999999;
    d[i + 3] = d[i + 3] * 0.999999;
  }
}

/** Median of `reps` timings (ms) of f(rep). */
export function median(reps, f) {
  const t = [];
  for (let i = 0; i < reps; i++) {
    const s = performance.now();
    f(i);
    t.push(performance.now() - s);
  }
  t.sort((a, b) => a - b);
  return t[reps >> 1];
}

/**
 * Timings (ms) of f(rep) for `reps` repetitions cycling over `positions` target positions: the
 * fastest time per position (on a machine shared with other work interruptions only add time,
 * so the minimum is the steadiest estimate of a pass), then the median over the positions.
 * With `cpu`, process CPU time (user + system, all threads) instead of wall time: on a loaded
 * machine it leaves out the time other processes held the core; for 1-thread passes (the
 * workers sleep) it is the pass's own CPU time.
 */
export function fastest(reps, f, positions = 1, cpu = false) {
  const best = new Array(Math.min(reps, positions)).fill(Infinity);
  const clock = cpu
    ? () => {
        const u = process.cpuUsage();
        return (u.user + u.system) / 1000;
      }
    : () => performance.now();
  for (let i = 0; i < reps; i++) {
    const s = clock();
    f(i);
    const p = i % positions;
    best[p] = Math.min(best[p], clock() - s);
  }
  best.sort((a, b) => a - b);
  return best[best.length >> 1];
}

const ry = (a) => fromRows([[Math.cos(a / 2), -Math.sin(a / 2)], [Math.sin(a / 2), Math.cos(a / 2)]]);
const CX = fromRows([[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 0, 1], [0, 0, 1, 0]]);

/** The maps the kernels are timed with: what the plan fuses in the bench circuit. */
function fusedMaps() {
  const one = mul(krausToSuperoperator(amplitudeDamping(0.002).kraus), superoperatorOf(ry(0.3)));
  let two = mul(krausToSuperoperator(depolarizing(2, 0.01).kraus), superoperatorOf(CX));
  two = composeEmbedded(one, [0], 2, mul(two, composeEmbedded(one, [1], 2, composeEmbedded(one, [0], 2, identity16()))));
  const phase = krausToSuperoperator(phaseDamping(0.01).kraus);
  return { one, two, phase };
}

function identity16() {
  const data = new Float64Array(2 * 256);
  for (let i = 0; i < 16; i++) data[2 * (i * 16 + i)] = 1;
  return { rows: 16, cols: 16, data };
}

/**
 * Kernel rows for n qubits: [{kernel, ms, ratio, ms2?}], ratio to the WebAssembly streaming pass
 * (the memory floor), with `pool` for the 2-thread column. The real-form kernels are timed in
 * both families (WebAssembly SIMD and JS) on registers of their own.
 */
export function kernelTimes(n, reps, pool) {
  awaitOptimisedKernels();
  warmWasmKernels();
  const { one, two, phase } = fusedMaps();
  const b = new CompiledPlanBuilder(n);
  const r1 = b.addNumbers(realFormOf(one, 1));
  const r2 = b.addNumbers(realFormOf(two, 2));
  const gen = b.addNumbers(two.data);
  const members = Array.from({ length: n }, (_, q) => ({ qubits: [q], superop: phase }));
  const binA = Array.from({ length: Math.min(n, 7) }, (_, q) => q);
  const binB = Array.from({ length: n - binA.length }, (_, q) => q + binA.length);
  const tA = b.addNumbers(diagonalTable(members, binA));
  const tB = b.addNumbers(diagonalTable(members, binB));
  const t1 = b.addNumbers(diagonalTable([members[0]], [0]));
  // one call per target position, so the median runs over positions
  for (let q = 0; q < n; q++) {
    b.addCall({ kernel: 'real1tp', qubits: [q], off: r1 });
    b.addCall({ kernel: 'real2', qubits: [q, (q + 1) % n], off: r2 });
    b.addCall({ kernel: 'general', qubits: [q, (q + 1) % n], off: gen });
    b.addCall({ kernel: 'diagonal', qubits: [q], qubitsB: [], off: t1 });
    b.addCall({ kernel: 'real1', qubits: [q], off: r1 });
  }
  b.addCall({ kernel: 'diagonal', qubits: binA, qubitsB: binB, off: tA, offB: tB });
  const plan = b.build();
  const registers = { wasm: createSharedDensityMatrix(n, 'wasm'), js: createSharedDensityMatrix(n, 'js') };
  const D = 1 << n;
  for (const rho of Object.values(registers)) for (let i = 0; i < D; i++) rho.data[2 * (i * D + i)] = 1 / D;
  const reg = wasmRegisterOf(registers.wasm.data);
  reg.loadArena(plan.arena);
  const binding = reg.bind();
  const at = (kind, q) => plan.starts[5 * q + kind];
  const allDiag = plan.starts[5 * n];
  const rows = [];
  // the whole array is one position for the streaming passes
  const wasmStream = () => binding.kernels.stream(binding.rhoAt, registers.wasm.data.byteLength);
  const floor = fastest(reps, wasmStream);
  const floorCpu = fastest(reps, wasmStream, 1, true);
  rows.push({ kernel: 'streaming pass, WebAssembly (the memory floor)', ms: floor, cpu: floorCpu });
  rows.push({ kernel: 'streaming pass, JS', ms: fastest(reps, () => streamPass(registers.js.data)), cpu: fastest(reps, () => streamPass(registers.js.data), 1, true) });
  for (const family of ['wasm', 'js']) {
    const rho = registers[family];
    const wasm = family === 'wasm' ? binding : undefined;
    const tag = family === 'wasm' ? 'WebAssembly' : 'JS';
    if (pool) pool.attach(rho.data, plan.arena, plan.words, family === 'wasm' ? reg.handle() : undefined);
    const timed = (label, kind, generalReps = reps) => {
      const call = (i) => (kind < 0 ? allDiag : at(kind, i % n));
      const positions = kind < 0 ? 1 : n;
      const one = (i) => executeCall(rho.data, n, plan.words, call(i), plan.arena, 0, 1, wasm);
      const ms = fastest(generalReps, one, positions);
      const cpu = fastest(generalReps, one, positions, true);
      const ms2 = pool && pool.parts > 1 ? fastest(generalReps, (i) => pool.run(n, call(i)), positions) : undefined;
      rows.push({ kernel: label, ms, cpu, ms2 });
    };
    timed(`1-qubit fused channel, ${tag} (real1tp: trace-preserving, as planned)`, 0);
    timed(`1-qubit fused channel, ${tag} (real1: general Hermiticity-preserving form)`, 4);
    timed(`2-qubit fused channel, ${tag} (real2, mirrored)`, 1);
    timed(`diagonal, 1 qubit (${tag})`, 3);
    timed(`diagonal, all ${n} qubits in one pass (${tag})`, -1);
    if (family === 'js') timed('2-qubit general complex (JS; the --no-fuse kernel)', 2, Math.max(3, reps >> 2));
    if (pool) pool.detach();
  }
  for (const r of rows) {
    r.ratio = r.ms / floor;
    r.cpuRatio = r.cpu / floorCpu;
  }
  return rows;
}
