import { describe, expect, it } from 'vitest';
import { fromRows } from '../../src/linalg/cmatrix.js';
import { amplitudeDampingChannel, depolarizingChannel, pauliChannel } from '../../src/channels/builtins.js';
import { pauliBasis } from '../../src/channels/ptm.js';
import { adjoint, identity, mul } from '../../src/linalg/cmatrix.js';
import { maxDiff, ROUND_TRIP } from './helpers.js';

describe('Pauli transfer matrices R_ij = Tr(P_i E(P_j))/d', () => {
  it('the Pauli basis change B (columns vec(P_j)/√d) is unitary for 1–3 qubits', () => {
    for (const k of [1, 2, 3]) {
      const b = pauliBasis(k);
      expect(maxDiff(mul(adjoint(b), b), identity(b.rows))).toBeLessThan(ROUND_TRIP);
    }
  });

  it('depolarizing: diag(1, 1−p, 1−p, 1−p) (N&C §8.3.4: Bloch vector shrinks by 1−p, from memory; derived)', () => {
    for (const p of [0.1, 0.37]) {
      expect(maxDiff(depolarizingChannel(1, p).ptm(), fromRows([[1, 0, 0, 0], [0, 1 - p, 0, 0], [0, 0, 1 - p, 0], [0, 0, 0, 1 - p]]))).toBeLessThan(ROUND_TRIP);
    }
    // two qubits: every non-identity Pauli string is scaled by 1 − p (same derivation)
    const r = depolarizingChannel(2, 0.2).ptm();
    for (let i = 0; i < 16; i++) expect(r.data[2 * (i * 16 + i)]!).toBeCloseTo(i === 0 ? 1 : 0.8, 12);
  });

  it('amplitude damping: rows (1,0,0,0), (0,√(1−γ),0,0), (0,0,√(1−γ),0), (γ,0,0,1−γ) (N&C §8.3.5 Bloch-vector map, derived)', () => {
    for (const g of [0.2, 0.75]) {
      const s = Math.sqrt(1 - g);
      const want = fromRows([
        [1, 0, 0, 0],
        [0, s, 0, 0],
        [0, 0, s, 0],
        [g, 0, 0, 1 - g],
      ]);
      expect(maxDiff(amplitudeDampingChannel(g).ptm(), want)).toBeLessThan(ROUND_TRIP);
    }
  });

  it('a Pauli channel has a diagonal PTM with λ_X = 1 − 2(y + z) etc. (common practice: P anticommuting with X flips its sign)', () => {
    const [x, y, z] = [0.05, 0.02, 0.1];
    const want = fromRows([
      [1, 0, 0, 0],
      [0, 1 - 2 * (y + z), 0, 0],
      [0, 0, 1 - 2 * (x + z), 0],
      [0, 0, 0, 1 - 2 * (x + y)],
    ]);
    expect(maxDiff(pauliChannel(x, y, z).ptm(), want)).toBeLessThan(ROUND_TRIP);
  });
});
