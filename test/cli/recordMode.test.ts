import { describe, expect, it } from 'vitest';
import { estimateRecordRunBytes, RUN_OVERHEAD_BYTES } from '../../src/engine/memory.js';
import { fray, LOCATED, tempFile } from '../helpers/cli.js';

/** The command line in record mode: JSON shape, report sections, --plan, and the memory refusal. */
describe('fray run in record mode', () => {
  it('--json has bits in record order, no measured qubits, and record keys (character i = bit i)', async () => {
    const r = await fray('run', 'circuits/teleport.yaml', '--json', '--shots', '200');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.bits).toEqual(['a', 'b']);
    expect(j.measured).toEqual([]);
    expect(j.measured_labels).toEqual([]);
    expect(Object.keys(j.probabilities.ideal).sort()).toEqual(['00', '01', '10', '11']);
    for (const k of Object.keys(j.counts)) expect(k).toMatch(/^[01]{2}$/);
    expect(Object.values(j.counts as Record<string, number>).reduce((a, b) => a + b, 0)).toBe(200);
  });

  it('the report heads the record table with the bit names; --state lists branch weights; --schedule the feeds', async () => {
    const r = await fray('run', 'circuits/teleport.yaml', '--state', '--schedule', '--no-color');
    expect(r.code).toBe(0);
    expect(r.out).toContain('record: a b');
    expect(r.out).toMatch(/Most likely records \(4 of 4/);
    expect(r.out).toMatch(/\n {2}a b\s+ideal\s+noisy\s+measured\n/);
    expect(r.out).toContain('Branches: one density matrix per record with non-zero weight (4 noisy, 4 ideal)');
    // b is written by the measurement of link (step 7) and feeds x on dst (step 8), after 250 ns of latency
    expect(r.out).toMatch(/step 7 measure link → bit b → step 8 x dst {2}\(measurement ends \d+, latency 250 ns, step starts \d+\)/);
  });

  it('--plan shows one plan per segment and the measurements between them', async () => {
    const r = await fray('run', 'circuits/teleport.yaml', '--plan');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^record mode: \d+ segments/);
    expect(r.out).toContain('measure qubit 0 into bit a');
    expect(r.out).toContain('where b=1');
    const j = JSON.parse((await fray('run', 'circuits/teleport.yaml', '--plan', '--json')).out);
    expect(j.bits).toEqual(['a', 'b']);
    expect(j.segments.some((s: { kind: string }) => s.kind === 'measure')).toBe(true);
  });

  it('refuses before allocating when the branches would not fit, counting them', async () => {
    // 12 distinct bits: up to 2^12 branches of a 4-qubit density matrix (4 KiB each) plus their sum
    const steps = Array.from({ length: 12 }, (_, i) => `  - h: ${i % 4}\n  - measure: ${i % 4}\n    into: b${i}\n`).join('');
    const file = tempFile('many.yaml', `qubits: 4\nsteps:\n${steps}`);
    const r = await fray('run', file, '--max-memory', '40MiB');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(LOCATED);
    expect(r.err).toContain('with up to 4096 record branches need about');
    expect(r.err).toContain('record into fewer distinct bits');
    expect(estimateRecordRunBytes(4, 4096, 0)).toBe(4097 * 16 * 256 + RUN_OVERHEAD_BYTES);
  });
});
