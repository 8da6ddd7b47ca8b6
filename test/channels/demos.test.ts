/**
 * The circuit demo of circuits/channels runs, and its headline figure is recomputed
 * independently with dense mathjs matrices from the Kraus operators of src/noise/channels.ts.
 */
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/api/simulate.js';
import { thermalRelaxation } from '../../src/noise/channels.js';
import { toMath } from '../helpers/mathjs.js';

describe('circuits/channels/parity-check.yaml', () => {
  it('its state fidelity equals a dense mathjs computation of H_q1 · (E0 ⊗ E1)(CZ·H⊗H|00⟩) against the Bell state', () => {
    const sim = simulate('circuits/channels/parity-check.yaml');
    const r = Math.SQRT1_2;
    const h = math.matrix([
      [r, r],
      [r, -r],
    ]);
    const id = math.identity(2) as math.Matrix;
    const cz = math.diag([1, 1, 1, -1]) as math.Matrix;
    const psi0 = math.matrix([[1], [0], [0], [0]]);
    const psi = math.multiply(cz, math.multiply(math.kron(h, h), psi0)) as math.Matrix;
    let rho = math.multiply(psi, math.ctranspose(psi)) as math.Matrix;
    const k0 = thermalRelaxation({ t1: 45_000, t2: 30_000, time: 1200, excited: 0.02 }).kraus.map(toMath);
    const k1 = thermalRelaxation({ t1: 80_000, t2: 100_000, time: 1200, excited: 0 }).kraus.map(toMath);
    let out = math.zeros(4, 4) as math.Matrix;
    for (const a of k0) for (const b of k1) {
      const k = math.kron(a, b) as math.Matrix;
      out = math.add(out, math.multiply(math.multiply(k, rho), math.ctranspose(k))) as math.Matrix;
    }
    const u = math.kron(id, h) as math.Matrix;
    rho = math.multiply(math.multiply(u, out), math.ctranspose(u)) as math.Matrix;
    const bell = math.matrix([[r], [0], [0], [r]]);
    const f = math.multiply(math.ctranspose(bell), math.multiply(rho, bell)) as math.Matrix;
    const v = f.get([0, 0]) as math.Complex | number;
    const fid = typeof v === 'number' ? v : v.re;
    expect(sim.result.fidelity.state).toBeCloseTo(fid, 10);
    expect(sim.circuit.channels.get('relax_pair')!.kraus.length).toBe(12);
  });
});
