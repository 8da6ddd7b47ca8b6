/**
 * A plan (./plan.ts) packed for the kernels: calls encoded as integers and all numbers in one
 * shared arena (src/engine/compiledPlan.ts).
 */
import { CompiledPlanBuilder, type CompiledPlan } from '../engine/compiledPlan.js';
import type { Plan } from './plan.js';

/** Packs every step of `plan` into a CompiledPlan (SharedArrayBuffer-backed words and arena). */
export function compilePlan(plan: Plan): CompiledPlan {
  const b = new CompiledPlanBuilder(plan.n);
  for (const s of plan.steps) {
    const off = b.addNumbers(s.numbers);
    if (s.kernel === 'diagonal') {
      const offB = b.addNumbers(s.tableB!);
      b.addCall({ kernel: 'diagonal', qubits: s.binA!, qubitsB: s.binB!, off, offB });
    } else {
      b.addCall({ kernel: s.kernel, qubits: s.qubits, off });
    }
  }
  return b.build();
}
