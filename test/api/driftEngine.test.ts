/**
 * The event-driven noisy run with drift, ZZ and coherent errors, on seeded random circuits under
 * both schedules: the fast engine (fused plan, diagonal batches) against an independent dense
 * mathjs computation of the same instruction list (full 2^n × 2^n matrices) to 1e-12, and against
 * the plain reference kernels; plus the drift instructions of each segment against exp(−iHΔ) of
 * the Hamiltonian written out densely.
 */
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { denseProgramRun, embed, rhoDiff, DENSE_AGREEMENT } from '../engine/dense.js';
import { loadText } from '../helpers/load.js';
import { mulberry32 } from '../helpers/random.js';

/** Seeds per schedule: the dense mathjs route costs ~0.1–0.5 s per case on 2–4 qubits. */
const SEEDS = Array.from({ length: 6 }, (_, i) => i + 1);

function pick<T>(rng: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rng() * xs.length)]!;
}

/** A random circuit with drift on every qubit, zz on a random coupling map, coherent errors, relaxation. */
function randomCircuit(seed: number, schedule: 'asap' | 'alap'): string {
  const rng = mulberry32(seed * 131 + (schedule === 'alap' ? 7 : 0));
  const n = 2 + Math.floor(rng() * 3);
  const lines: string[] = [`qubits: ${n}`, 'noise:', `  schedule: ${schedule}`, '  qubits:', `    all: { t1: 40us, t2: 30us, detuning: ${Math.round(rng() * 400 - 200)}kHz }`];
  for (let q = 0; q < n; q++) if (rng() < 0.5) lines.push(`    ${q}: { detuning: ${(rng() * 2 - 1).toFixed(3)}MHz, t1: ${20 + Math.round(rng() * 60)}us }`);
  lines.push('  couplings:');
  const pairs: [number, number][] = [];
  for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) if (b === a + 1 || rng() < 0.3) pairs.push([a, b]);
  for (const [a, b] of pairs) lines.push(`    "${rng() < 0.5 ? `${a} ${b}` : `${b} ${a}`}": ${rng() < 0.8 ? `{ zz: ${Math.round(rng() * 600 - 300)}kHz }` : '{}'}`);
  lines.push(
    '  gates:',
    `    all: { duration: ${20 + Math.round(rng() * 40)}ns, coherent: { x: ${(rng() * 0.1).toFixed(4)}, z: ${(rng() * 0.1 - 0.05).toFixed(4)} }, amplitude_damping: 0.001 }`,
    `    cx: { duration: ${100 + Math.round(rng() * 300)}ns, coherent: { zz: ${(rng() * 0.2 - 0.1).toFixed(4)}, y: 0.01 }, error: 0.02 }`,
    `    cz: { duration: ${80 + Math.round(rng() * 100)}ns, coherent: { zz: ${(rng() * 0.1).toFixed(4)} } }`,
    `    reset: { duration: 300ns }`,
    `    measure: { duration: 700ns${rng() < 0.5 ? ', simultaneous: true' : ''} }`,
    'steps:',
  );
  const steps = 5 + Math.floor(rng() * 7);
  for (let s = 0; s < steps; s++) {
    const u = rng();
    const q = Math.floor(rng() * n);
    const [a, b] = pick(rng, pairs);
    if (u < 0.35) lines.push(`  - ${pick(rng, ['h', 'x', 'sx', 't'])}: ${q}`);
    else if (u < 0.45) lines.push(`  - ry: ${q}`, `    angle: ${(rng() * 3).toFixed(3)}`);
    else if (u < 0.7) lines.push(`  - ${pick(rng, ['cx', 'cz'])}: [${rng() < 0.5 ? `${a}, ${b}` : `${b}, ${a}`}]`);
    else if (u < 0.8) lines.push(`  - idle: ${q}`, `    for: ${Math.round(rng() * 2000)}ns`);
    else if (u < 0.85) lines.push(`  - reset: ${q}`);
    else if (u < 0.9) lines.push(`  - noise: { coherent: { y: 0.05 }, phase_flip: 0.01 }`, `    on: [${q}]`);
    else if (u < 0.95) lines.push(`  - barrier: all`);
    else lines.push(`  - rzz: [${a}, ${b}]`, `    angle: 0.4`, `    noise: { coherent: { zz: 0.03 } }`);
  }
  const measured = Array.from({ length: n }, (_, i) => i).filter(() => rng() < 0.6);
  if (measured.length > 0) lines.push(`  - measure: [${measured.join(', ')}]`);
  return lines.join('\n') + '\n';
}


describe('drift, zz and coherent errors: fast engine against the dense mathjs route', () => {
  for (const policy of ['asap', 'alap'] as const) {
    it.each(SEEDS)(`${policy}, seed %i: fused fast run = dense run = reference run to 1e-12`, (seed) => {
      const text = randomCircuit(seed, policy);
      const loaded = loadText(text);
      const fast = simulateLoaded(loaded, { threads: 1 });
      expect(fast.program.origins.some((o) => o.what.startsWith('drift'))).toBe(true);
      const diff = rhoDiff(fast.rho, denseProgramRun(fast.program.n, fast.program.noisy));
      if (!(diff < DENSE_AGREEMENT)) console.log(`seed ${seed} ${policy}\n${text}`);
      expect(diff).toBeLessThan(DENSE_AGREEMENT);
      const ref = simulateLoaded(loaded, { engine: 'reference' });
      let worst = 0;
      for (let i = 0; i < ref.rho.data.length; i++) worst = Math.max(worst, Math.abs(ref.rho.data[i]! - fast.rho.data[i]!));
      expect(worst).toBeLessThan(DENSE_AGREEMENT);
    });
  }

  it.each(SEEDS.slice(0, 4))('seed %i: the drift of every segment is exp(−iHΔ), H = Σ πδ_q Z_q + Σ (πζ/2) Z_a Z_b written densely', (seed) => {
    const s = simulateLoaded(loadText(randomCircuit(seed, 'asap')), { threads: 1 });
    const n = s.program.n;
    const d = 1 << n;
    // Group the drift instructions by segment (consecutive runs of 'drift' origins).
    const runs: { ins: typeof s.program.noisy[number][]; what: string }[] = [];
    s.program.noisy.forEach((ins, i) => {
      const o = s.program.origins[i]!;
      if (!o.what.startsWith('drift')) return;
      const prev = i > 0 ? s.program.origins[i - 1]! : undefined;
      if (prev === undefined || prev.what !== o.what || runs.length === 0) runs.push({ ins: [], what: o.what });
      runs.at(-1)!.ins.push(ins);
    });
    expect(runs.length).toBeGreaterThan(0);
    const first = runs[0]!; // the first segment starts at t = 0, before any measurement: every term acts
    const delta = Number(/drift (\S+) ns/.exec(first.what)![1]) * 1e-9;
    let u = math.identity(d) as math.Matrix;
    for (const ins of first.ins) if (ins.op === 'unitary') u = math.multiply(embed(n, ins.qubits, ins.matrix), u) as math.Matrix;
    // H's diagonal: E(x) = Σ_q πδ_q z_q + Σ_pairs (πζ/2) z_a z_b with z = ±1 from the bits of x (qubit 0 most significant)
    for (let x = 0; x < d; x++) {
      const z = (q: number) => ((x >> (n - 1 - q)) & 1 ? -1 : 1);
      let e = 0;
      for (let q = 0; q < n; q++) e += Math.PI * s.profile.qubits[q]!.detuning * z(q);
      for (const c of s.profile.couplings ?? []) e += (Math.PI * c.zz * z(c.a) * z(c.b)) / 2;
      const got = u.get([x, x]) as unknown as math.Complex;
      expect(Math.abs(got.re - Math.cos(e * delta))).toBeLessThan(1e-9);
      expect(Math.abs(got.im + Math.sin(e * delta))).toBeLessThan(1e-9);
    }
  });
});
