/**
 * Figures of merit of a map E against a target (the identity by default, a unitary U, or
 * another channel F), on d = 2^k dimensions, all from the representations of ./conventions.ts:
 * - process (entanglement) fidelity: against a unitary U, F_pro = ⟨Φ_U|J_E/d|Φ_U⟩ with
 *   |Φ_U⟩ = vec(U)/√d, i.e. vec(U)†·J_E·vec(U)/d² = Σ_k |Tr(U†K_k)|²/d² (Nielsen & Chuang §9.3,
 *   from memory; src/noise/fidelity.ts); against a channel F that is not unitary, the Uhlmann
 *   fidelity (Tr √(√ρ σ √ρ))² of the normalised Choi states ρ = J_E/d, σ = J_F/d
 *   (A. Gilchrist, N. K. Langford, M. A. Nielsen, Phys. Rev. A 71, 062310 (2005), from memory),
 *   which reduces to the former when F is unitary;
 * - average gate fidelity F_avg = (d·F_pro + 1)/(d + 1) against a unitary target, for
 *   trace-preserving E (M. A. Nielsen, Phys. Lett. A 303, 249 (2002));
 * - unitarity u(E) = Σ_{i,j ≥ 1} |R_ij|²/(d² − 1), the squared Frobenius norm of the unital
 *   block of the Pauli transfer matrix (the PTM uses normalised Paulis P/√d, so it is the
 *   Liouville matrix of J. Wallman, C. Granade, R. Harper, S. T. Flammia, New J. Phys. 17,
 *   113020 (2015), whose unitarity is Tr(E_u†E_u)/(d² − 1) for trace-preserving maps; from
 *   memory). Depolarizing gives (1 − p)², every unitary 1. It does not depend on the target;
 * - Pauli-twirled error probabilities: the Pauli channel obtained by twirling the error map
 *   Λ = U†∘E over the Pauli group has p_i = vec(P_i)†·J_Λ·vec(P_i)/d² = Σ_k |Tr(P_i M_k)|²/d²
 *   for Kraus operators M_k of Λ (the diagonal of the process matrix in the Pauli basis;
 *   common practice), labels as in ./conventions.ts;
 * - the diamond distance of ./diamond.ts.
 */
import { type CMatrix, adjoint, mul, scale } from '../linalg/cmatrix.js';
import { pauliLabels } from '../noise/channels.js';
import { Channel } from './channel.js';
import { superoperatorToChoi, traceOutput, vec } from './choi.js';
import { type DiamondDistance, diamondDistance } from './diamond.js';
import { hermitianFunction, traceNorm } from './norms.js';
import { pauliBasis } from './ptm.js';
import { PHYSICALITY_TOLERANCE } from './tolerances.js';

/** Process fidelity ⟨Φ_U|J_E/d|Φ_U⟩ = vec(U)†·J_E·vec(U)/d² of E against the unitary U (identity when omitted). */
export function processFidelityToUnitary(e: Channel, u?: CMatrix): number {
  const d = e.dim;
  const D = d * d;
  const j = e.choi().data;
  const v = u === undefined ? vec(identityOf(d)) : vec(u);
  let re = 0;
  for (let r = 0; r < D; r++) {
    const xr = v[2 * r]!;
    const xi = -v[2 * r + 1]!;
    for (let c = 0; c < D; c++) {
      const jr = j[2 * (r * D + c)]!;
      const ji = j[2 * (r * D + c) + 1]!;
      const yr = v[2 * c]!;
      const yi = v[2 * c + 1]!;
      re += xr * (jr * yr - ji * yi) - xi * (jr * yi + ji * yr);
    }
  }
  return re / (d * d);
}

function identityOf(d: number): CMatrix {
  const data = new Float64Array(2 * d * d);
  for (let i = 0; i < d; i++) data[2 * (i * d + i)] = 1;
  return { rows: d, cols: d, data };
}

/**
 * Eigenvalues of a normalised Choi state below this are taken as zero before square roots are
 * taken: a rounding error ε in a zero eigenvalue would otherwise enter the fidelity as √ε.
 */
export const FIDELITY_EIGENVALUE_FLOOR = 1e-14;

/**
 * Uhlmann fidelity (Tr √(√ρ σ √ρ))² = ‖√ρ·√σ‖₁² of the normalised Choi states ρ = J_E/d,
 * σ = J_F/d (eigenvalues below FIDELITY_EIGENVALUE_FLOOR set to zero).
 */
export function choiStateFidelity(e: Channel, f: Channel): number {
  const d = e.dim;
  const root = (x: number): number => (x > FIDELITY_EIGENVALUE_FLOOR ? Math.sqrt(x) : 0);
  const sr = hermitianFunction(scale(e.choi(), 1 / d), root);
  const ss = hermitianFunction(scale(f.choi(), 1 / d), root);
  const t = traceNorm(mul(sr, ss));
  return t * t;
}

/** Average gate fidelity (d·F_pro + 1)/(d + 1) of a trace-preserving map against a unitary (Nielsen 2002). */
export function averageGateFidelity(e: Channel, u?: CMatrix): number {
  const d = e.dim;
  return (d * processFidelityToUnitary(e, u) + 1) / (d + 1);
}

/** Unitarity Σ_{i,j≥1} |R_ij|²/(d² − 1) from the unital block of the Pauli transfer matrix (Wallman et al. 2015). */
export function unitarity(e: Channel): number {
  const r = e.ptm();
  const D = r.rows;
  let s = 0;
  for (let i = 1; i < D; i++) {
    for (let j = 1; j < D; j++) s += r.data[2 * (i * D + j)]! ** 2 + r.data[2 * (i * D + j) + 1]! ** 2;
  }
  return s / (D - 1);
}

/** One Pauli error and its probability after twirling. */
export interface PauliError {
  /** Pauli string, qubit 0 leftmost ('I…I' is no error). */
  readonly label: string;
  readonly probability: number;
}

/** Pauli-twirled error probabilities p_i = vec(P_i)†·J_Λ·vec(P_i)/d² of the error map Λ = U†∘E (U = identity when omitted). */
export function pauliErrorProbabilities(e: Channel, u?: CMatrix): PauliError[] {
  const d = e.dim;
  const D = d * d;
  let j = e.choi();
  if (u !== undefined) {
    // S_Λ = S_{U†}·S_E with S_{U†} = conj(U†) ⊗ U† = Uᵀ ⊗ U† (src/linalg/superoperator.ts).
    const sUd = Channel.fromUnitary(adjoint(u)).superoperator();
    j = superoperatorToChoi(mul(sUd, e.superoperator()));
  }
  const b = pauliBasis(e.qubits);
  const labels = pauliLabels(e.qubits);
  const out: PauliError[] = [];
  for (let i = 0; i < D; i++) {
    // (B† J B)_ii / d, since column i of B is vec(P_i)/√d
    let re = 0;
    for (let r = 0; r < D; r++) {
      const xr = b.data[2 * (r * D + i)]!;
      const xi = -b.data[2 * (r * D + i) + 1]!;
      for (let c = 0; c < D; c++) {
        const jr = j.data[2 * (r * D + c)]!;
        const ji = j.data[2 * (r * D + c) + 1]!;
        const yr = b.data[2 * (c * D + i)]!;
        const yi = b.data[2 * (c * D + i) + 1]!;
        re += xr * (jr * yr - ji * yi) - xi * (jr * yi + ji * yr);
      }
    }
    out.push({ label: labels[i]!, probability: re / d });
  }
  return out;
}

/** What a map is compared with: a channel (its unitary, when it is one, is used by the unitary formulas). */
export interface MetricsTarget {
  /** How the target is named in reports ('identity', a gate, a channel name). */
  readonly label: string;
  readonly channel: Channel;
}

/** Every figure of merit of a map against a target. */
export interface ChannelMetrics {
  readonly target: string;
  /**
   * Process fidelity: against a unitary vec(U)†J vec(U)/d²; against another channel the
   * Choi-state fidelity, null when either map is not completely positive (its Choi "state" is
   * then not a state).
   */
  readonly processFidelity: number | null;
  /** 'unitary' (target is unitary) or 'choi-states' (Uhlmann fidelity of the normalised Choi states). */
  readonly processFidelityDefinition: 'unitary' | 'choi-states';
  /** (d·F_pro + 1)/(d + 1), only for a unitary target and a trace-preserving map; null otherwise. */
  readonly averageGateFidelity: number | null;
  readonly unitarity: number;
  /** Pauli-twirled error probabilities of U†∘E, only for a unitary target; null otherwise. */
  readonly pauliErrors: readonly PauliError[] | null;
  readonly diamond: DiamondDistance;
}

/** All metrics of `e` against `target` (the identity channel on e's qubits when omitted). */
export function channelMetrics(e: Channel, target?: MetricsTarget): ChannelMetrics {
  const t = target ?? { label: 'identity', channel: Channel.identity(e.qubits) };
  if (t.channel.qubits !== e.qubits) throw new RangeError(`channelMetrics: the target acts on ${t.channel.qubits} qubits, the map on ${e.qubits}`);
  const u = t.channel.unitary();
  const tp = isTracePreserving(e);
  return {
    target: t.label,
    processFidelity: u !== undefined ? processFidelityToUnitary(e, u) : isCp(e) && isCp(t.channel) ? choiStateFidelity(e, t.channel) : null,
    processFidelityDefinition: u !== undefined ? 'unitary' : 'choi-states',
    averageGateFidelity: u !== undefined && tp ? averageGateFidelity(e, u) : null,
    unitarity: unitarity(e),
    pauliErrors: u !== undefined ? pauliErrorProbabilities(e, u) : null,
    diamond: diamondDistance(e, t.channel),
  };
}

function isCp(e: Channel): boolean {
  const v = e.choiEigen().values;
  return v[v.length - 1]! >= -PHYSICALITY_TOLERANCE;
}

function isTracePreserving(e: Channel): boolean {
  const t = traceOutput(e.choi());
  const d = e.dim;
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      if (Math.hypot(t.data[2 * (i * d + k)]! - (i === k ? 1 : 0), t.data[2 * (i * d + k) + 1]!) > PHYSICALITY_TOLERANCE) return false;
    }
  }
  return true;
}
