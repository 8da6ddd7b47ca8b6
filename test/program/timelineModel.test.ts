/**
 * The timing model of issue 7, re-derived from its text alone and computed densely with mathjs,
 * against fray's whole run (fused fast engine) on seeded random circuits under both schedules.
 *
 * From the contract: event times are 0, the end, and every start and end of gates, resets,
 * standalone noise steps and measurements; at each event t (previous t′): (1) drift
 * exp(−iH(t − t′)) of every term acting in [t′, t) — a qubit until its measurement starts, a pair
 * while neither is measured; (2) relaxation of every qubit idle throughout [t′, t); (3) the
 * operations starting at t in step order, each whole (U → coherent → thermal → kinds). Here the
 * drift is the diagonal of H written out (not fray's rz/rzz), idle qubits are found from the
 * operations' intervals (not fray's idle windows or timeline), and each operation's own channel
 * sequence comes from gateNoise (checked on its own against 2-design averages in test/noise/).
 */
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { plainKinds } from '../../src/format/noiseKindsSpec.js';
import { thermalRelaxation } from '../../src/noise/channels.js';
import { gateNoise } from '../../src/noise/gateNoise.js';
import { DENSE_AGREEMENT, denseChannel, denseReset, embed, rhoDiff } from '../engine/dense.js';
import { randomDriftCircuit } from '../helpers/driftCircuits.js';
import { loadText } from '../helpers/load.js';

const SEEDS = [11, 12, 13];

function modelRun(text: string) {
  const s = simulateLoaded(loadText(text), { threads: 1 });
  const { circuit, profile, schedule } = s;
  const n = circuit.register.n;
  const d = 1 << n;
  const isOperation = (k: string) => k === 'gate' || k === 'reset' || k === 'channel' || k === 'measure';
  const ops = schedule.items.filter((it) => isOperation(it.op.kind));
  const times = [...new Set([0, schedule.duration, ...ops.flatMap((it) => [it.start, it.end])])].sort((a, b) => a - b);
  const measureStart = Array.from({ length: n }, (_, q) => ops.find((it) => it.op.kind === 'measure' && it.op.qubits[0] === q)?.start ?? Infinity);
  let rho = math.zeros(d, d) as math.Matrix;
  rho.set([0, 0], math.complex(1, 0));
  const apply = (qubits: readonly number[], kraus: readonly import('../../src/linalg/cmatrix.js').CMatrix[]) => {
    rho = denseChannel(n, qubits, kraus, rho);
  };
  const noiseAfter = (qubits: readonly number[], duration: number, thermal: boolean, kinds: ReturnType<typeof plainKinds>) => {
    const gn = gateNoise({ k: qubits.length, duration, thermal, decay: qubits.map((q) => profile.qubits[q]!), kinds, channels: circuit.channels });
    for (const c of gn.channels) apply(c.targets.map((t) => qubits[t]!), c.kraus);
  };
  times.forEach((t, i) => {
    if (i > 0) {
      const tp = times[i - 1]!;
      const dt = (t - tp) * 1e-9;
      const on = (q: number) => t <= measureStart[q]!;
      // (1) drift: diagonal of exp(−iH·dt), H = Σ π δ_q Z_q + Σ (π ζ/2) Z_a Z_b over the active terms
      const diag: math.Complex[] = [];
      for (let x = 0; x < d; x++) {
        const z = (q: number) => ((x >> (n - 1 - q)) & 1 ? -1 : 1);
        let e = 0;
        for (let q = 0; q < n; q++) if (on(q)) e += Math.PI * profile.qubits[q]!.detuning * z(q);
        for (const c of profile.couplings ?? []) if (on(c.a) && on(c.b)) e += (Math.PI * c.zz * z(c.a) * z(c.b)) / 2;
        diag.push(math.complex(Math.cos(e * dt), -Math.sin(e * dt)));
      }
      const u = math.diag(diag) as math.Matrix;
      rho = math.multiply(math.multiply(u, rho), math.ctranspose(u)) as math.Matrix;
      // (2) relaxation of qubits idle throughout [t′, t): no operation on them overlaps it, not yet measured
      if (profile.idle === 'thermal') {
        for (let q = 0; q < n; q++) {
          if (!on(q)) continue;
          if (ops.some((it) => it.op.qubits.includes(q) && it.start < t && it.end > tp)) continue;
          const p = profile.qubits[q]!;
          if (!Number.isFinite(p.t1) && !Number.isFinite(p.t2)) continue;
          apply([q], thermalRelaxation({ t1: p.t1, t2: p.t2, excited: p.excited, time: t - tp }).kraus);
        }
      }
    }
    // (3) operations starting at t, in step order (schedule.items is in program order)
    for (const it of ops) {
      if (it.start !== t) continue;
      const op = it.op;
      if (op.kind === 'gate') {
        const u = embed(n, op.qubits, op.unitary);
        rho = math.multiply(math.multiply(u, rho), math.ctranspose(u)) as math.Matrix;
        const entry = profile.gateEntry(op.name, op.qubits);
        noiseAfter(op.qubits, it.end - it.start, entry.thermal, plainKinds(op.noise?.kinds ?? entry.kinds));
      } else if (op.kind === 'reset') {
        rho = denseReset(n, op.qubits[0]!, rho);
        noiseAfter(op.qubits, 0, false, plainKinds(op.noise?.kinds ?? profile.reset.kinds));
      } else if (op.kind === 'channel') {
        noiseAfter(op.qubits, 0, false, plainKinds(op.noise.kinds));
      }
    }
  });
  return { s, rho };
}

describe('the timing model, re-derived from the contract, against the whole run', () => {
  for (const policy of ['asap', 'alap'] as const) {
    it.each(SEEDS)(`${policy}, seed %i: fray's run equals the event-by-event dense model to 1e-12`, (seed) => {
      const text = randomDriftCircuit(seed, policy);
      const { s, rho } = modelRun(text);
      const diff = rhoDiff(s.rho, rho);
      if (!(diff < DENSE_AGREEMENT)) console.log(`seed ${seed} ${policy}\n${text}`);
      expect(diff).toBeLessThan(DENSE_AGREEMENT);
    });
  }
});
