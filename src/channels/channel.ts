/**
 * One value for a linear map on k ≤ MAX_CHANNEL_QUBITS qubits, created from any of its
 * representations and converted lazily to the others, each conversion done at most once
 * (cached). Conventions of every form: ./conventions.ts.
 *
 * Conversion routes: Kraus → Choi, superoperator, Stinespring directly; Choi ↔ superoperator
 * by reshuffling; superoperator ↔ Pauli transfer matrix by the Pauli basis change;
 * Stinespring → Kraus by slicing; any form → minimal Kraus through the Choi eigen-decomposition
 * (only for completely positive maps). Returned matrices are shared with the cache: do not
 * modify them.
 */
import { type CMatrix, adjoint, mul, identity } from '../linalg/cmatrix.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import { choiToSuperoperator, krausToChoi, superoperatorToChoi } from './choi.js';
import { type ChannelForm, MAX_CHANNEL_QUBITS, qubitsOfDim } from './conventions.js';
import { type HermitianEigen, hermitianEigen } from '../linalg/hermitianEigen.js';
import { choiToMinimalKraus, orthogonalKraus } from './minimalKraus.js';
import { ptmToSuperoperator, superoperatorToPtm } from './ptm.js';
import { krausToStinespring, stinespringToKraus } from './stinespring.js';
import { KRAUS_EIGENVALUE_TOLERANCE, UNITARY_CHANNEL_TOLERANCE } from './tolerances.js';

/** How a channel was first given: one of the representations, or a unitary. */
export type GivenForm = ChannelForm | 'unitary';

function checkSquare(m: CMatrix, what: string): void {
  if (m.rows !== m.cols) throw new RangeError(`${what}: matrix is ${m.rows}×${m.cols}, expected square`);
}

function qubitsOrThrow(d: number, what: string): number {
  const k = qubitsOfDim(d);
  if (k === undefined) throw new RangeError(`${what}: dimension ${d} is not 2^k for k = 1 … ${MAX_CHANNEL_QUBITS}`);
  return k;
}

function sqrtSize(D: number, what: string): number {
  const d = Math.round(Math.sqrt(D));
  if (d * d !== D) throw new RangeError(`${what}: ${D}×${D} is not d² × d²`);
  return d;
}

/** A linear map on k qubits (d = 2^k) given in any representation, converted on demand. */
export class Channel {
  /** Number of qubits k the map acts on (input and output). */
  readonly qubits: number;
  /** Hilbert-space dimension d = 2^k. */
  readonly dim: number;
  /** The representation the channel was created from. */
  readonly given: GivenForm;

  private krausOps?: readonly CMatrix[];
  private minimal?: readonly CMatrix[];
  private choiM?: CMatrix;
  private superM?: CMatrix;
  private ptmM?: CMatrix;
  private stineM?: CMatrix;
  private eig?: HermitianEigen;
  private unitaryM?: CMatrix | null;

  private constructor(qubits: number, given: GivenForm) {
    this.qubits = qubits;
    this.dim = 1 << qubits;
    this.given = given;
  }

  /** ρ → Σ_k K_k ρ K_k† from d × d Kraus operators (not checked for trace preservation here). */
  static fromKraus(kraus: readonly CMatrix[]): Channel {
    if (kraus.length === 0) throw new RangeError('Channel.fromKraus: empty Kraus set');
    const d = kraus[0]!.rows;
    for (const k of kraus) {
      if (k.rows !== d || k.cols !== d) throw new RangeError(`Channel.fromKraus: Kraus operator is ${k.rows}×${k.cols}, expected ${d}×${d}`);
    }
    const c = new Channel(qubitsOrThrow(d, 'Channel.fromKraus'), 'kraus');
    c.krausOps = kraus.slice();
    return c;
  }

  /** The map with Choi matrix J = Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|) (d² × d², input first, unnormalised). */
  static fromChoi(j: CMatrix): Channel {
    checkSquare(j, 'Channel.fromChoi');
    const c = new Channel(qubitsOrThrow(sqrtSize(j.rows, 'Channel.fromChoi'), 'Channel.fromChoi'), 'choi');
    c.choiM = j;
    return c;
  }

  /** The map with superoperator S (d² × d², column-stacking vec). */
  static fromSuperoperator(s: CMatrix): Channel {
    checkSquare(s, 'Channel.fromSuperoperator');
    const c = new Channel(qubitsOrThrow(sqrtSize(s.rows, 'Channel.fromSuperoperator'), 'Channel.fromSuperoperator'), 'superoperator');
    c.superM = s;
    return c;
  }

  /** The map with Pauli transfer matrix R_ij = Tr(P_i E(P_j))/d (d² × d²). */
  static fromPtm(r: CMatrix): Channel {
    checkSquare(r, 'Channel.fromPtm');
    const c = new Channel(qubitsOrThrow(sqrtSize(r.rows, 'Channel.fromPtm'), 'Channel.fromPtm'), 'ptm');
    c.ptmM = r;
    return c;
  }

  /** ρ → Tr_env(V ρ V†) for V of shape (d·r) × d, environment factor last. */
  static fromStinespring(v: CMatrix): Channel {
    const d = v.cols;
    if (d === 0 || v.rows % d !== 0) throw new RangeError(`Channel.fromStinespring: ${v.rows}×${v.cols} is not (d·r) × d`);
    const c = new Channel(qubitsOrThrow(d, 'Channel.fromStinespring'), 'stinespring');
    c.stineM = v;
    c.krausOps = stinespringToKraus(v);
    return c;
  }

  /** ρ → U ρ U† (U is not checked for unitarity here). */
  static fromUnitary(u: CMatrix): Channel {
    checkSquare(u, 'Channel.fromUnitary');
    const c = new Channel(qubitsOrThrow(u.rows, 'Channel.fromUnitary'), 'unitary');
    c.krausOps = [u];
    c.unitaryM = u;
    return c;
  }

  /** The identity channel on k qubits. */
  static identity(qubits: number): Channel {
    return Channel.fromUnitary(identity(1 << qubits));
  }

  /** Choi matrix J (d² × d², input first, unnormalised). */
  choi(): CMatrix {
    if (this.choiM === undefined) {
      this.choiM = this.krausOps !== undefined ? krausToChoi(this.krausOps) : superoperatorToChoi(this.superoperator());
    }
    return this.choiM;
  }

  /** Superoperator S (d² × d²) on column-stacked vec(ρ). */
  superoperator(): CMatrix {
    if (this.superM === undefined) {
      if (this.krausOps !== undefined) this.superM = krausToSuperoperator(this.krausOps);
      else if (this.choiM !== undefined) this.superM = choiToSuperoperator(this.choiM);
      else this.superM = ptmToSuperoperator(this.ptmM!);
    }
    return this.superM;
  }

  /** Pauli transfer matrix R (d² × d²; real up to rounding for Hermiticity-preserving maps). */
  ptm(): CMatrix {
    if (this.ptmM === undefined) this.ptmM = superoperatorToPtm(this.superoperator());
    return this.ptmM;
  }

  /** Eigen-decomposition of the Hermitian part of the Choi matrix (eigenvalues descending). */
  choiEigen(): HermitianEigen {
    if (this.eig === undefined) this.eig = hermitianEigen(this.choi());
    return this.eig;
  }

  /**
   * A Kraus set: the one given (as Kraus operators, a unitary or the blocks of a Stinespring
   * isometry), else the minimal one. Throws NotCompletelyPositiveError for maps that are not CP.
   */
  kraus(): readonly CMatrix[] {
    return this.krausOps ?? this.minimalKraus();
  }

  /**
   * The minimal Kraus set (as many operators as the Choi rank): the given operators when they
   * are already mutually orthogonal, else from the Choi eigen-decomposition. Throws
   * NotCompletelyPositiveError for maps that are not CP.
   */
  minimalKraus(): readonly CMatrix[] {
    if (this.minimal === undefined) {
      const given = this.krausOps !== undefined ? orthogonalKraus(this.krausOps) : undefined;
      this.minimal = given ?? choiToMinimalKraus(this.choi(), this.choiEigen());
    }
    return this.minimal;
  }

  /** Kraus rank: the number of Choi eigenvalues above KRAUS_EIGENVALUE_TOLERANCE (for CP maps, the minimal Kraus count). */
  krausRank(): number {
    let r = 0;
    for (const v of this.choiEigen().values) if (v > KRAUS_EIGENVALUE_TOLERANCE) r++;
    return r;
  }

  /** Stinespring isometry V = Σ_k K_k ⊗ |k⟩ ((d·r) × d, environment last) of kraus(). */
  stinespring(): CMatrix {
    if (this.stineM === undefined) this.stineM = krausToStinespring(this.kraus());
    return this.stineM;
  }

  /** The representation named `form` (for 'kraus': kraus()). */
  form(form: ChannelForm): CMatrix | readonly CMatrix[] {
    switch (form) {
      case 'kraus':
        return this.kraus();
      case 'choi':
        return this.choi();
      case 'superoperator':
        return this.superoperator();
      case 'ptm':
        return this.ptm();
      case 'stinespring':
        return this.stinespring();
    }
  }

  /**
   * The unitary U when the map is ρ → UρU† (Choi rank 1 with U†U = I to
   * UNITARY_CHANNEL_TOLERANCE; U fixed up to a global phase), else undefined.
   */
  unitary(): CMatrix | undefined {
    if (this.unitaryM === undefined) {
      this.unitaryM = null;
      const ops = this.krausOps?.length === 1 ? this.krausOps : this.isCpRankOne() ? this.minimalKraus() : undefined;
      if (ops !== undefined && ops.length === 1) {
        const u = ops[0]!;
        const g = mul(adjoint(u), u);
        const id = identity(this.dim);
        let worst = 0;
        for (let i = 0; i < g.data.length; i++) worst = Math.max(worst, Math.abs(g.data[i]! - id.data[i]!));
        if (worst <= UNITARY_CHANNEL_TOLERANCE) this.unitaryM = u;
      }
    }
    return this.unitaryM ?? undefined;
  }

  private isCpRankOne(): boolean {
    const v = this.choiEigen().values;
    if (this.krausRank() !== 1) return false;
    return v[v.length - 1]! >= -UNITARY_CHANNEL_TOLERANCE;
  }
}
