import { describe, expect, it } from 'vitest';
import { fray, tempFile } from '../helpers/cli.js';

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

  it('--kernels js (the JS fallback) and --threads 1 give exactly the JSON of the default WebAssembly kernels on 2 threads', async () => {
    // 9 qubits: the register is split over threads (THREADS_MIN_QUBITS)
    const steps = ['  - ry: [0, 1, 2, 3, 4, 5, 6, 7, 8]\n    angle: 0.3\n    noise: { amplitude_damping: 0.01 }'];
    for (let q = 0; q + 1 < 9; q += 2) steps.push(`  - cx: [${q}, ${q + 1}]\n    noise: { depolarizing: 0.02 }`);
    steps.push('  - rz: [0, 4, 8]\n    angle: 0.7\n    noise: { phase_damping: 0.05 }', '  - cx: [8, 0]');
    const file = tempFile('nine.yaml', `name: nine\nqubits: 9\nnoise:\n  gates:\n    all: { duration: 20ns }\n  idle: none\nsteps:\n${steps.join('\n')}\n`);
    const runs = await Promise.all([['--threads', '2'], ['--threads', '2', '--kernels', 'js'], ['--threads', '1']].map((extra) => fray('run', file, '--json', ...extra)));
    const [wasm2, js2, wasm1] = runs.map((r) => JSON.parse(r.out));
    expect(wasm2.engine).toEqual({ kernels: 'wasm', threads: 2 });
    expect(js2.engine).toEqual({ kernels: 'js', threads: 2 });
    expect(wasm1.engine).toEqual({ kernels: 'wasm', threads: 1 });
    for (const j of [wasm2, js2, wasm1]) delete j.engine;
    expect(js2).toEqual(wasm2);
    expect(wasm1).toEqual(wasm2);
    const plan = await fray('run', file, '--plan', '--kernels', 'js');
    expect(plan.out).toContain('kernels: JS for every pass');
    expect((await fray('run', file, '--plan')).out).toContain('kernels: WebAssembly SIMD for real1, real1tp, real2 and diagonal; JS for general');
  });

  it('--threads 0 is a usage error (exit 2)', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--threads', '0');
    expect(r.code).toBe(2);
    expect(r.err).toContain('--threads 0');
  });
});
