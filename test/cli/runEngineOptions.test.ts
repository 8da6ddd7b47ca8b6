import { describe, expect, it } from 'vitest';
import { fray } from '../helpers/cli.js';

/** Every number of two equally shaped JSON values within `tol`, every other value equal. */
function sameShape(a: unknown, b: unknown, tol: number): boolean {
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= tol;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameShape(x, b[i], tol));
  if (a !== null && b !== null && typeof a === 'object' && typeof b === 'object') {
    const ka = Object.keys(a).sort();
    const kb = Object.keys(b).sort();
    return ka.join() === kb.join() && ka.every((k) => sameShape((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], tol));
  }
  return a === b;
}

describe('fray run engine options', () => {
  it('--plan prints the plan instead of running', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--plan');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^plan: 4 kernel calls for \d+ instructions on 5 qubits \(fused; real2 4\)/);
    expect(r.out).toContain('step 2 cx');
    expect(r.out).not.toContain('fidelity');
  });

  it('--plan --json prints the plan as JSON; --no-fuse shows one call per instruction', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--plan', '--json', '--no-fuse');
    const j = JSON.parse(r.out) as { fused: boolean; instructions: number; calls: unknown[] };
    expect(j.fused).toBe(false);
    expect(j.calls).toHaveLength(j.instructions);
  });

  it('--json has the same shape and numbers (to 1e-12) with --threads 1, --threads 2 and --no-fuse', async () => {
    const base = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json')).out);
    for (const extra of [['--threads', '1'], ['--threads', '2'], ['--no-fuse']]) {
      const other = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', ...extra)).out);
      expect(sameShape(base, other, 1e-12)).toBe(true);
    }
  });

  it('--max-memory still refuses the 13-qubit bench circuit cleanly, before allocating (exit 2)', async () => {
    const r = await fray('run', 'circuits/bench/layers13x20.yaml', '--max-memory', '1GiB');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/13 qubits need about 1\.03 GiB .* but the limit is 1 GiB/);
  });

  it('--threads 0 is a usage error (exit 2)', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--threads', '0');
    expect(r.code).toBe(2);
    expect(r.err).toContain('--threads 0');
  });
});
