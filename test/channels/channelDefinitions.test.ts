import { describe, expect, it } from 'vitest';
import { readChannelDefinitions } from '../../src/format/channelDefinitions.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';
import { parseYamlTree } from '../../src/format/yamlTree.js';
import { amplitudeDampingChannel, depolarizingChannel, thermalRelaxationChannel } from '../../src/channels/builtins.js';
import { parallel } from '../../src/channels/parallel.js';
import { builtinGate } from '../../src/circuit/gates.js';
import { maxDiff, ROUND_TRIP } from './helpers.js';

/** Reads `channels:` YAML (the map's body) and returns the definitions and the located problems. */
function read(body: string, env: Record<string, number> = {}) {
  const problems = new ProblemList();
  const root = parseYamlTree(`channels:\n${body}`, 'c.yaml', problems)!;
  const node = root.kind === 'map' ? root.entries[0]!.value : root;
  const defs = readChannelDefinitions(node, env, problems);
  return { defs, errors: problems.errors.map(formatProblem) };
}

describe('channel definitions: every form', () => {
  it('kraus, choi, superoperator, ptm and stinespring of amplitude damping all give the same channel', () => {
    const g = 0.3;
    const s = Math.sqrt(1 - g);
    const r = Math.sqrt(g);
    const { defs, errors } = read(
      [
        `  k: { kraus: [ [[1, 0], [0, ${s}]], [[0, ${r}], [0, 0]] ] }`,
        `  c: { choi: [[1, 0, 0, ${s}], [0, 0, 0, 0], [0, 0, ${g}, 0], [${s}, 0, 0, ${1 - g}]] }`,
        `  s: { superoperator: [[1, 0, 0, ${g}], [0, ${s}, 0, 0], [0, 0, ${s}, 0], [0, 0, 0, ${1 - g}]] }`,
        `  p: { ptm: [[1, 0, 0, 0], [0, ${s}, 0, 0], [0, 0, ${s}, 0], [${g}, 0, 0, ${1 - g}]] }`,
        `  v: { stinespring: [[1, 0], [0, ${r}], [0, ${s}], [0, 0]] }`,
        `  b: { amplitude_damping: ${g} }`,
      ].join('\n') + '\n',
    );
    expect(errors).toEqual([]);
    const ref = amplitudeDampingChannel(g).choi();
    for (const name of ['k', 'c', 's', 'p', 'v', 'b']) expect(maxDiff(defs.get(name)!.channel.choi(), ref)).toBeLessThan(ROUND_TRIP);
    expect(defs.get('p')!.kind).toBe('ptm');
  });

  it('unitary as a matrix with expressions or as a gate call; params feed expressions', () => {
    const { defs, errors } = read('  u: { unitary: [[1, 0], [0, "exp(i*phi)"]] }\n  g: { unitary: "rz(2*phi)" }\n  x: { unitary: cx }\n', { phi: 0.4 });
    expect(errors).toEqual([]);
    expect(maxDiff(defs.get('g')!.channel.unitary()!, builtinGate('rz')!.matrix([0.8]))).toBe(0);
    expect(defs.get('u')!.channel.qubits).toBe(1);
    expect(defs.get('x')!.channel.qubits).toBe(2);
  });

  it('built-in kinds with qubits: depolarizing on k qubits; one-qubit kinds on each of k qubits', () => {
    const { defs, errors } = read('  d: { depolarizing: 0.1, qubits: 2 }\n  a: { amplitude_damping: 0.2, qubits: 3 }\n  t: { thermal: { t1: 50us, t2: 30us, time: 200ns, excited: 0.01 } }\n  f: { pauli: { x: 0.01, z: 0.02 } }\n');
    expect(errors).toEqual([]);
    expect(maxDiff(defs.get('d')!.channel.choi(), depolarizingChannel(2, 0.1).choi())).toBeLessThan(ROUND_TRIP);
    const a = amplitudeDampingChannel(0.2);
    expect(maxDiff(defs.get('a')!.channel.choi(), parallel([a, a, a]).choi())).toBeLessThan(ROUND_TRIP);
    expect(maxDiff(defs.get('t')!.channel.choi(), thermalRelaxationChannel({ t1: 50_000, t2: 30_000, time: 200, excited: 0.01 }).choi())).toBeLessThan(ROUND_TRIP);
    expect(defs.get('f')!.channel.minimalKraus().length).toBe(3);
  });

  it('sequence and parallel by name (in any order of definition) and inline', () => {
    const { defs, errors } = read('  both: { sequence: [amp, { amplitude_damping: 0.5 }] }\n  amp: { amplitude_damping: 0.2 }\n  side: { parallel: [amp, { unitary: h }] }\n');
    expect(errors).toEqual([]);
    expect(maxDiff(defs.get('both')!.channel.choi(), amplitudeDampingChannel(1 - 0.8 * 0.5).choi())).toBeLessThan(ROUND_TRIP);
    expect(defs.get('side')!.channel.qubits).toBe(2);
  });
});

describe('channel definitions: located errors', () => {
  const cases: Array<[string, string, string, string]> = [
    ['no form', '  a: { qubits: 1 }\n', 'c.yaml:2:6', "channel 'a' needs one of: kraus, choi"],
    ['two forms', '  a: { bit_flip: 0.1, phase_flip: 0.1 }\n', 'c.yaml:2:23', "has both 'bit_flip' and 'phase_flip'"],
    ['unknown key with suggestion', '  a: { krause: [[[1, 0], [0, 1]]] }\n', 'c.yaml:2:8', "did you mean 'kraus'?"],
    ['Choi of the wrong size', '  a: { choi: [[1, 0], [0, 1]] }\n', 'c.yaml:2:14', 'is 2×2; a Choi matrix must be 4×4, 16×16, 64×64'],
    ['PTM row too short', '  a:\n    ptm:\n      - [1, 0, 0, 0]\n      - [0, 1, 0]\n', 'c.yaml:5:9', 'row 2'],
    ['bad matrix entry', '  a: { ptm: [[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, "1+"]] }\n', 'c.yaml:2', 'entry (4, 4)'],
    ['Stinespring with a bad shape', '  a: { stinespring: [[1, 0, 0]] }\n', 'c.yaml:2:21', 'a Stinespring isometry is (d·r) × d'],
    ['non-unitary matrix', '  a: { unitary: [[1, 0], [0, 0.5]] }\n', 'c.yaml:2:17', 'is not unitary: the largest entry of U†U − I is 7.50e-1'],
    ['unknown gate', '  a: { unitary: "rzx(1)" }\n', 'c.yaml:2:18', "unknown gate 'rzx'"],
    ['not a gate call', '  a: { unitary: "rz(1" }\n', 'c.yaml:2:18', 'is not a gate'],
    ['wrong number of angles', '  a: { unitary: "rz(1, 2)" }\n', 'c.yaml:2:18', "gate 'rz' takes 1 angle(s) (theta), got 2"],
    ['probability out of range', '  a: { depolarizing: 1.5 }\n', 'c.yaml:2:22', 'must be between 0 and 1, not 1.5'],
    ['qubits out of range', '  a: { depolarizing: 0.1, qubits: 4 }\n', 'c.yaml:2:35', "'qubits' of channel 'a' must be a whole number from 1 to 3"],
    ['qubits disagree with the matrix', '  a: { unitary: cx, qubits: 1 }\n', 'c.yaml:2:29', "says 'qubits: 1' but its 'unitary' acts on 2 qubits"],
    ['thermal without time', '  a: { thermal: { t1: 50us } }\n', 'c.yaml:2:17', "needs 'time'"],
    ['thermal t2 > 2 t1', '  a: { thermal: { t1: 10us, t2: 30us, time: 1us } }\n', 'c.yaml:2:33', 'exceeds 2·t1'],
    ['thermal duration without unit', '  a: { thermal: { t1: 50, time: 1us } }\n', 'c.yaml:2:23', 'has no unit'],
    ['unknown channel in a sequence', '  amp: { amplitude_damping: 0.1 }\n  b: { sequence: [amp, ampp] }\n', 'c.yaml:3:24', "unknown channel 'ampp' in 'sequence' of channel 'b'; did you mean 'amp'?"],
    ['a cycle', '  a: { sequence: [b] }\n  b: { sequence: [a] }\n', 'c.yaml:3:19', "channel 'a' is defined in terms of itself (a → b → a)"],
    ['sequence of different sizes', '  a: { sequence: [{ bit_flip: 0.1 }, { unitary: cx }] }\n', 'c.yaml:2:38', 'acts on 2 qubit(s) but item 1 on 1'],
    ['parallel over 3 qubits', '  a: { parallel: [{ unitary: cx }, { unitary: cx }] }\n', 'c.yaml:2:18', 'acts on 4 qubits together'],
    ['pauli over 1', '  a: { pauli: { x: 0.5, y: 0.6 } }\n', 'c.yaml:2:15', 'x + y + z = 1.1 exceeds 1'],
  ];
  for (const [name, body, where, says] of cases) {
    it(name, () => {
      const { errors } = read(body);
      expect(errors.length).toBeGreaterThan(0);
      const hit = errors.find((e) => e.includes(says));
      expect(hit, errors.join('\n')).toBeDefined();
      expect(hit!.startsWith(where)).toBe(true);
    });
  }
});
