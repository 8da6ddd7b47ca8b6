import { describe, expect, it } from 'vitest';
import { buildPlan } from '../../src/plan/buildPlan.js';
import { describeSources, formatPlan, planToJson } from '../../src/plan/formatPlan.js';
import type { Instruction } from '../../src/engine/instruction.js';
import type { Origin } from '../../src/program/program.js';
import { CNOT, phaseDampingKraus, rz } from './helpers.js';

const program: Instruction[] = [
  { op: 'unitary', qubits: [0], matrix: rz(0.3) },
  { op: 'channel', qubits: [0], kraus: phaseDampingKraus(0.1) },
  { op: 'unitary', qubits: [1], matrix: rz(0.2) },
  { op: 'unitary', qubits: [0, 1], matrix: CNOT },
  { op: 'channel', qubits: [1], kraus: phaseDampingKraus(0.2) },
];
const origins: Origin[] = [
  { step: 0, what: 'rz' },
  { step: 0, what: 'phase_damping' },
  { step: 0, what: 'rz' },
  { step: 1, what: 'cx' },
  { step: -1, what: 'idle 120 ns' },
];

describe('formatPlan', () => {
  it('prints a summary and one line per call with kernel, qubits and the fused steps (1-based)', () => {
    const text = formatPlan(buildPlan(2, program), origins);
    const lines = text.trimEnd().split('\n');
    expect(lines[0]).toBe('plan: 1 kernel call for 5 instructions on 2 qubits (fused; real2 1)');
    expect(lines[1]).toMatch(/^ {2}1 {2}real2 +0,1 +step 1 rz ×2, step 1 phase_damping, step 2 cx, idle 120 ns$/);
  });

  it('the unfused plan has one general call per instruction', () => {
    const text = formatPlan(buildPlan(2, program, { fuse: false }), origins);
    expect(text.split('\n')[0]).toBe('plan: 5 kernel calls for 5 instructions on 2 qubits (unfused; general 5)');
  });

  it('describeSources counts repeats; planToJson carries the same content', () => {
    expect(describeSources([0, 2, 3], origins)).toBe('step 1 rz ×2, step 2 cx');
    const j = planToJson(buildPlan(2, program), origins) as { calls: { kernel: string; instructions: number[] }[] };
    expect(j.calls).toHaveLength(1);
    expect(j.calls[0]!.kernel).toBe('real2');
    expect(j.calls[0]!.instructions).toEqual([0, 1, 2, 3, 4]);
  });
});
