/**
 * Seeded random circuits with every format-version-2 noise term: a detuning on every qubit, zz on a
 * random coupling map (a line plus random extra pairs), coherent errors in gate entries and steps,
 * relaxation, resets, standalone noise, barriers, simultaneous or free readout.
 */
import { mulberry32 } from './random.js';

function pick<T>(rng: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rng() * xs.length)]!;
}

/** A random circuit with drift on every qubit, zz on a random coupling map, coherent errors, relaxation. */
export function randomDriftCircuit(seed: number, schedule: 'asap' | 'alap'): string {
  const rng = mulberry32(seed * 131 + (schedule === 'alap' ? 7 : 0));
  const n = 2 + Math.floor(rng() * 3);
  const lines: string[] = [`qubits: ${n}`, 'noise:', `  schedule: ${schedule}`, '  qubits:', `    all: { t1: 40us, t2: 30us, detuning: ${Math.round(rng() * 400 - 200)}kHz }`];
  for (let q = 0; q < n; q++) if (rng() < 0.5) lines.push(`    ${q}: { detuning: ${(rng() * 2 - 1).toFixed(3)}MHz, t1: ${20 + Math.round(rng() * 60)}us }`);
  lines.push('  couplings:');
  const pairs: [number, number][] = [];
  for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) if (b === a + 1 || rng() < 0.3) pairs.push([a, b]);
  for (const [a, b] of pairs) lines.push(`    "${rng() < 0.5 ? `${a} ${b}` : `${b} ${a}`}": ${rng() < 0.8 ? `{ zz: ${Math.round(rng() * 600 - 300)}kHz }` : '{}'}`);
  lines.push(
    '  gates:',
    `    all: { duration: ${20 + Math.round(rng() * 40)}ns, coherent: { x: ${(rng() * 0.1).toFixed(4)}, z: ${(rng() * 0.1 - 0.05).toFixed(4)} }, amplitude_damping: 0.001 }`,
    `    cx: { duration: ${100 + Math.round(rng() * 300)}ns, coherent: { zz: ${(rng() * 0.2 - 0.1).toFixed(4)}, y: 0.01 }, error: 0.02 }`,
    `    cz: { duration: ${80 + Math.round(rng() * 100)}ns, coherent: { zz: ${(rng() * 0.1).toFixed(4)} } }`,
    `    reset: { duration: 300ns }`,
    `    measure: { duration: 700ns${rng() < 0.5 ? ', simultaneous: true' : ''} }`,
    'steps:',
  );
  const steps = 5 + Math.floor(rng() * 7);
  for (let s = 0; s < steps; s++) {
    const u = rng();
    const q = Math.floor(rng() * n);
    const [a, b] = pick(rng, pairs);
    if (u < 0.35) lines.push(`  - ${pick(rng, ['h', 'x', 'sx', 't'])}: ${q}`);
    else if (u < 0.45) lines.push(`  - ry: ${q}`, `    angle: ${(rng() * 3).toFixed(3)}`);
    else if (u < 0.7) lines.push(`  - ${pick(rng, ['cx', 'cz'])}: [${rng() < 0.5 ? `${a}, ${b}` : `${b}, ${a}`}]`);
    else if (u < 0.8) lines.push(`  - idle: ${q}`, `    for: ${Math.round(rng() * 2000)}ns`);
    else if (u < 0.85) lines.push(`  - reset: ${q}`);
    else if (u < 0.9) lines.push(`  - noise: { coherent: { y: 0.05 }, phase_flip: 0.01 }`, `    on: [${q}]`);
    else if (u < 0.95) lines.push(`  - barrier: all`);
    else lines.push(`  - rzz: [${a}, ${b}]`, `    angle: 0.4`, `    noise: { coherent: { zz: 0.03 } }`);
  }
  const measured = Array.from({ length: n }, (_, i) => i).filter(() => rng() < 0.6);
  if (measured.length > 0) lines.push(`  - measure: [${measured.join(', ')}]`);
  return lines.join('\n') + '\n';
}


