/**
 * The plan for people (`fray run --plan`): one line per kernel call with the kernel, its
 * qubits and the instructions it fuses (named by their step, 1-based as in messages, and
 * what they are), plus a JSON form with the same content.
 */
import type { Origin } from '../program/program.js';
import type { KernelFamily } from '../engine/wasmKernels.js';
import type { Plan, PlannedSegment } from './plan.js';

/** Short name of an instruction origin: 'step 3 cx', 'step 3 depolarizing', 'idle 120 ns'. */
function originName(o: Origin | undefined, index: number): string {
  if (o === undefined) return `#${index}`;
  const what = o.what.startsWith('thermal during') ? 'thermal' : o.what;
  return o.step < 0 ? what : `step ${o.step + 1} ${what}`;
}

/** What a call fuses, with repeats counted: 'step 1 ry ×2, step 1 amplitude_damping ×2, step 2 cx'. */
export function describeSources(sources: readonly number[], origins: readonly Origin[]): string {
  const counts = new Map<string, number>();
  for (const i of sources) {
    const name = originName(origins[i], i);
    counts.set(name, (counts.get(name) ?? 0) + 1);
  }
  return [...counts].map(([name, c]) => (c > 1 ? `${name} ×${c}` : name)).join(', ');
}

/** Which kernels run the passes of a plan, for people: the real-form and diagonal passes on `family`, the general ones in JS. */
export function describeKernelFamily(family: KernelFamily): string {
  return family === 'wasm' ? 'WebAssembly SIMD for real1, real1tp, real2 and diagonal; JS for general' : 'JS for every pass';
}

/**
 * The plan as a text table (kernel, qubits, fused instructions), with a one-line summary first
 * and, when `family` is given, a line saying which kernels run the passes.
 */
export function formatPlan(plan: Plan, origins: readonly Origin[], family?: KernelFamily): string {
  const perKernel = new Map<string, number>();
  for (const s of plan.steps) perKernel.set(s.kernel, (perKernel.get(s.kernel) ?? 0) + 1);
  const summary = [...perKernel].map(([k, c]) => `${k} ${c}`).join(', ');
  const lines: string[] = [];
  lines.push(
    `plan: ${plan.steps.length} kernel call${plan.steps.length === 1 ? '' : 's'} for ${plan.instructionCount} instruction${plan.instructionCount === 1 ? '' : 's'} on ${plan.n} qubit${plan.n === 1 ? '' : 's'}` +
      ` (${plan.fused ? 'fused' : 'unfused'}${summary !== '' ? `; ${summary}` : ''})`,
  );
  if (family !== undefined) lines.push(`kernels: ${describeKernelFamily(family)}`);
  const width = String(plan.steps.length).length;
  plan.steps.forEach((s, i) => {
    const qubits = s.kernel === 'diagonal' && s.binB !== undefined && s.binB.length > 0 ? `${s.binA!.join(',')} | ${s.binB.join(',')}` : s.qubits.join(',');
    lines.push(`  ${String(i + 1).padStart(width)}  ${s.kernel.padEnd(8)} ${qubits.padEnd(9)} ${describeSources(s.sources, origins)}`);
  });
  return lines.join('\n') + '\n';
}

/** The plan as plain data: per call its kernel, qubits, instruction indices and their origins; the kernel family when given. */
export function planToJson(plan: Plan, origins: readonly Origin[], family?: KernelFamily): object {
  return {
    qubits: plan.n,
    fused: plan.fused,
    ...(family !== undefined ? { kernels: family } : {}),
    instructions: plan.instructionCount,
    calls: plan.steps.map((s) => ({
      kernel: s.kernel,
      qubits: s.qubits,
      instructions: s.sources,
      fuses: s.sources.map((i) => origins[i] ?? null),
    })),
  };
}

/** Which branches a record-mode segment acts on, in words: 'every branch', 'where a=1, b=0', 'where not (a=1)'. */
export function segmentSelection(seg: PlannedSegment, bits: readonly string[]): string {
  if (seg.kind === 'measure') return 'every branch';
  if (seg.when === undefined) return 'every branch';
  const terms = seg.when.condition.map((t) => `${bits[t.bit] ?? t.bit}=${t.value}`).join(', ');
  return seg.when.holds ? `where ${terms}` : `where not (${terms})`;
}

/** A record-mode plan as text: per segment, a measurement that splits the branches, or the plan of a run of instructions and the branches it acts on. */
export function formatRecordPlan(segments: readonly PlannedSegment[], bits: readonly string[]): string {
  const out: string[] = [`record mode: ${segments.length} segment${segments.length === 1 ? '' : 's'}, each plan applied to every branch it selects`];
  segments.forEach((seg, i) => {
    if (seg.kind === 'measure') out.push(`segment ${i + 1}: measure qubit ${seg.qubit} into bit ${bits[seg.bit] ?? seg.bit} (every branch splits by outcome and recorded value)`);
    else out.push(`segment ${i + 1}: ${segmentSelection(seg, bits)}`, formatPlan(seg.plan, seg.origins).trimEnd());
  });
  return out.join('\n') + '\n';
}

/** A record-mode plan as plain data: per segment its kind, selection and plan. */
export function recordPlanToJson(segments: readonly PlannedSegment[], bits: readonly string[]): object {
  return {
    bits,
    segments: segments.map((seg) =>
      seg.kind === 'measure'
        ? { kind: 'measure', qubit: seg.qubit, bit: bits[seg.bit] ?? seg.bit }
        : {
            kind: 'apply',
            when: seg.when === undefined ? null : { condition: Object.fromEntries(seg.when.condition.map((t) => [bits[t.bit] ?? String(t.bit), t.value])), holds: seg.when.holds },
            plan: planToJson(seg.plan, seg.origins),
          },
    ),
  };
}
