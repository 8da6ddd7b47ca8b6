/**
 * ZYZ (Euler) angles of a one-qubit unitary: U = e^{iα} · u(θ, φ, λ) with fray's
 * u(θ, φ, λ) = [[cos θ/2, −e^{iλ} sin θ/2], [e^{iφ} sin θ/2, e^{i(φ+λ)} cos θ/2]]
 * (src/circuit/gates.ts), which is e^{i(φ+λ)/2} Rz(φ) Ry(θ) Rz(λ) (Nielsen & Chuang
 * Theorem 4.1, the Z-Y decomposition, from memory). θ ∈ [0, π]; where φ and λ are not
 * both determined (θ = 0 or π) φ is taken as 0.
 */
import type { CMatrix } from '../linalg/cmatrix.js';

/** Below this a matrix entry's magnitude counts as zero when choosing which entries fix the phases. */
export const ZYZ_ZERO = 1e-12;

/** The angles (radians) and global phase α with U = e^{iα} · u(θ, φ, λ). */
export interface ZyzAngles {
  readonly theta: number;
  readonly phi: number;
  readonly lambda: number;
  readonly phase: number;
}

/** Decomposes a 2 × 2 unitary into ZYZ angles (see the module comment for the convention). */
export function zyzAngles(u: CMatrix): ZyzAngles {
  if (u.rows !== 2 || u.cols !== 2) throw new RangeError(`zyzAngles: expected a 2×2 matrix, got ${u.rows}×${u.cols}`);
  const d = u.data;
  const abs = (k: number): number => Math.hypot(d[2 * k]!, d[2 * k + 1]!);
  const arg = (k: number): number => Math.atan2(d[2 * k + 1]!, d[2 * k]!);
  // entries: 0 = U00, 1 = U01, 2 = U10, 3 = U11
  const theta = 2 * Math.atan2(abs(2), abs(0));
  const wrap = (x: number): number => Math.atan2(Math.sin(x), Math.cos(x));
  if (abs(0) > ZYZ_ZERO) {
    const phase = arg(0);
    const sum = arg(3) - phase; // φ + λ
    if (abs(2) > ZYZ_ZERO) {
      const phi = wrap(arg(2) - phase);
      return { theta, phi, lambda: wrap(sum - phi), phase };
    }
    return { theta, phi: 0, lambda: wrap(sum), phase };
  }
  // θ = π: U = e^{iα} [[0, −e^{iλ}], [e^{iφ}, 0]]; take φ = 0.
  const phase = arg(2);
  return { theta, phi: 0, lambda: wrap(arg(1) + Math.PI - phase), phase };
}
