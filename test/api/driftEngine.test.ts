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
import { randomDriftCircuit as randomCircuit } from '../helpers/driftCircuits.js';

/** Seeds per schedule: the dense mathjs route costs ~0.1–0.5 s per case on 2–4 qubits. */
const SEEDS = Array.from({ length: 6 }, (_, i) => i + 1);

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
