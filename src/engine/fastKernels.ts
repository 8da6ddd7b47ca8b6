/**
 * The fast kernels behind the Kernels interface of ./kernels.ts, one call at a time (the plan
 * path of src/plan/ fuses calls first; this object serves callers that apply instructions one
 * by one, e.g. the mixed part of the ideal run). 1- and 2-qubit Hermiticity-preserving maps go
 * to the real-form kernels, anything else to the general complex kernel.
 *
 * Precondition (true for every density matrix): ρ is Hermitian. The 2-qubit kernel computes the
 * blocks on and above the block diagonal and mirrors the rest.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { applyGeneral } from './kernelGeneral.js';
import { applyReal1, applyReal1Tp } from './kernelReal1.js';
import { applyReal2 } from './kernelReal2.js';
import type { Kernels } from './kernels.js';
import type { DensityMatrix } from './layout.js';
import { isTracePreservingRealForm, realFormOf } from './realForm.js';
import { krausToSuperoperator, superoperatorOf } from '../linalg/superoperator.js';
import { checkTargets } from './targets.js';
import { RESET_KRAUS } from './instruction.js';

const RESET_SUPEROPERATOR = krausToSuperoperator(RESET_KRAUS);

/** vec(B) → S·vec(B) on `qubits` with the fastest applicable kernel (single-threaded). */
function applySuperoperator(rho: DensityMatrix, qubits: readonly number[], s: CMatrix): void {
  checkTargets(rho.n, qubits, 'applySuperoperator');
  const k = qubits.length;
  const d2 = 1 << (2 * k);
  if (s.rows !== d2 || s.cols !== d2) throw new RangeError(`applySuperoperator: matrix is ${s.rows}×${s.cols}, expected ${d2}×${d2}`);
  if (k <= 2) {
    const real = realFormOf(s, k);
    if (real !== undefined) {
      if (k === 1 && isTracePreservingRealForm(real)) applyReal1Tp(rho.data, rho.n, qubits[0]!, real, 0, 0, 1);
      else if (k === 1) applyReal1(rho.data, rho.n, qubits[0]!, real, 0, 0, 1);
      else applyReal2(rho.data, rho.n, qubits[0]!, qubits[1]!, real, 0, 0, 1);
      return;
    }
  }
  applyGeneral(rho.data, rho.n, qubits, s.data, 0, 0, 1);
}

/** The fast kernels (real form, mirrored half, unrolled) as a drop-in Kernels object. */
export const fastKernels: Kernels = {
  applyUnitary(rho, qubits, u) {
    applySuperoperator(rho, qubits, superoperatorOf(u));
  },
  applySuperoperator,
  applyKraus(rho, qubits, kraus) {
    applySuperoperator(rho, qubits, krausToSuperoperator(kraus));
  },
  reset(rho, qubit) {
    applySuperoperator(rho, [qubit], RESET_SUPEROPERATOR);
  },
};
