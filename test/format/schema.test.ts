import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { parse as parseYaml } from 'yaml';
import { describe, expect, it } from 'vitest';
import { loadCircuit, parseCircuitText, parseProfileText } from '../../src/api/loadCircuit.js';
import { readChannelFile } from '../../src/cli/channelCommand.js';
import { InputError, ProblemList } from '../../src/format/problem.js';
import { buildSchemas, SCHEMA_KINDS, schemaText, type JsonSchema, type SchemaKind } from '../../src/format/schema/index.js';
import { ACTION_MODIFIERS } from '../../src/format/schema/circuitSchema.js';
import { STEP_ACTIONS, STEP_MODIFIERS } from '../../src/format/stepShape.js';
import { generateCase } from '../contract/generator.js';
import { fray } from '../helpers/cli.js';

/**
 * The JSON Schemas say what the validator says: built from its key tables with no gaps,
 * committed as docs/schemas/*.schema.json exactly as `fray schema` prints them, every demo
 * file (and every generated contract circuit) that fray accepts validates, and a sample of
 * files fray refuses for unknown keys or wrong types is refused by the schema too (ajv,
 * an independent implementation of JSON Schema draft 2020-12).
 */
const schemas = buildSchemas();
const ajv = new Ajv2020({ allErrors: true, allowUnionTypes: true });
const validators = Object.fromEntries(SCHEMA_KINDS.map((k) => [k, ajv.compile(schemas[k] as object)])) as Record<SchemaKind, ReturnType<typeof ajv.compile>>;

function valid(kind: SchemaKind, yamlText: string): boolean {
  return validators[kind](parseYaml(yamlText)) as boolean;
}

function yamlFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? yamlFiles(p) : name.endsWith('.yaml') ? [p] : [];
  });
}

/** The schema a file names in its first line: `# yaml-language-server: $schema=PATH` (PATH relative to the file). */
const MODELINE = /^# yaml-language-server: \$schema=(\S+)\n/;

describe('JSON Schemas of the file formats', () => {
  it('cover every key of the validator tables, and nothing else', () => {
    expect(schemas.gaps.map((g) => `${g.object}: '${g.key}' ${g.problem}`)).toEqual([]);
  });

  it('are committed in docs/schemas exactly as `fray schema KIND` prints them', async () => {
    for (const kind of SCHEMA_KINDS) {
      const committed = readFileSync(`docs/schemas/${kind}.schema.json`, 'utf8');
      expect(committed, `docs/schemas/${kind}.schema.json is stale: npm run schemas`).toBe(schemaText(kind));
      const r = await fray('schema', kind);
      expect(r.code).toBe(0);
      expect(r.out).toBe(committed);
    }
  });

  it('declare draft 2020-12 and compile under ajv strict schema checks', () => {
    for (const kind of SCHEMA_KINDS) {
      expect(schemas[kind]['$schema']).toBe('https://json-schema.org/draft/2020-12/schema');
      expect(ajv.validateSchema(schemas[kind] as object)).toBe(true);
    }
  });

  it('fray schema with an unknown kind is an input error naming the kinds', async () => {
    const r = await fray('schema', 'device');
    expect(r.code).toBe(2);
    expect(r.err).toBe('fray: schema device: expected one of circuit, profile, channels\n');
  });

  it('every demo file names its schema in a modeline, fray accepts it, and it validates', () => {
    const files = yamlFiles('circuits');
    expect(files.length).toBeGreaterThanOrEqual(14);
    for (const f of files) {
      const text = readFileSync(f, 'utf8');
      const m = MODELINE.exec(text);
      expect(m, `${f} has no yaml-language-server modeline on its first line`).not.toBeNull();
      const schemaPath = relative('.', resolve(dirname(f), m![1]!));
      const kind = /^docs\/schemas\/(circuit|profile|channels)\.schema\.json$/.exec(schemaPath)?.[1] as SchemaKind | undefined;
      expect(kind, `${f} names ${schemaPath}`).toBeDefined();
      // fray accepts the file as that kind
      if (kind === 'circuit') loadCircuit(f);
      else if (kind === 'channels') readChannelFile(text, f);
      else {
        const problems = new ProblemList();
        parseProfileText(text, f, problems);
        expect(problems.errors).toEqual([]);
      }
      expect(valid(kind!, text), `${f}: ${JSON.stringify(validators[kind!].errors)}`).toBe(true);
    }
  });

  it('every test fixture file fray accepts validates (device files against the profile schema)', () => {
    const files = yamlFiles('test').filter((f) => f.includes('fixtures'));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) {
      const text = readFileSync(f, 'utf8');
      const kind: SchemaKind = f.endsWith('-device.yaml') ? 'profile' : 'circuit';
      if (kind === 'circuit') loadCircuit(f);
      expect(valid(kind, text), `${f}: ${JSON.stringify(validators[kind].errors)}`).toBe(true);
    }
  });

  it('every generated contract circuit (and device file) that fray accepts validates (seeded)', () => {
    let accepted = 0;
    for (let seed = 1; seed <= 150; seed++) {
      const c = generateCase(seed);
      const problems = new ProblemList();
      parseCircuitText(c.circuitYaml, 'c.yaml', problems, {
        readDevice: () => (c.deviceYaml !== undefined ? { text: c.deviceYaml, file: 'dev.yaml' } : undefined),
      });
      if (!problems.ok) continue;
      accepted++;
      expect(valid('circuit', c.circuitYaml), `seed ${seed}: ${JSON.stringify(validators.circuit.errors)}\n${c.circuitYaml}`).toBe(true);
      if (c.deviceYaml !== undefined) expect(valid('profile', c.deviceYaml), `seed ${seed} device: ${JSON.stringify(validators.profile.errors)}`).toBe(true);
    }
    expect(accepted).toBeGreaterThan(140);
  });

  /** Files fray refuses for an unknown key or a wrong type; the schema must refuse each (the code is fray's). */
  const refused: { name: string; kind: SchemaKind; text: string; code: string }[] = [
    { name: 'unknown top-level key', kind: 'circuit', text: 'qubits: 1\nstpes: []\nsteps:\n  - h: 0\n', code: 'unknown-key' },
    { name: 'no steps', kind: 'circuit', text: 'qubits: 1\n', code: 'missing-key' },
    { name: 'qubits as text', kind: 'circuit', text: 'qubits: five\nsteps:\n  - h: 0\n', code: 'bad-qubits' },
    { name: 'steps as a map', kind: 'circuit', text: 'qubits: 1\nsteps: { h: 0 }\n', code: 'bad-steps' },
    { name: 'duration without a unit', kind: 'circuit', text: 'qubits: 1\nsteps:\n  - idle: 0\n    for: 35\n', code: 'bad-duration' },
    { name: 'unknown noise kind on a step', kind: 'circuit', text: 'qubits: 1\nsteps:\n  - h: 0\n    noise: { depolarising: 0.1 }\n', code: 'unknown-key' },
    { name: 'probability above 1', kind: 'circuit', text: 'qubits: 1\nsteps:\n  - h: 0\n    noise: { bit_flip: 1.5 }\n', code: 'out-of-range' },
    { name: 'unknown key in inline noise', kind: 'circuit', text: 'qubits: 1\nnoise: { schedul: alap }\nsteps:\n  - h: 0\n', code: 'unknown-key' },
    { name: 'unknown qubit key in inline noise', kind: 'circuit', text: 'qubits: 1\nnoise:\n  qubits:\n    all: { t3: 5us }\nsteps:\n  - h: 0\n', code: 'unknown-key' },
    { name: 'bad schedule word', kind: 'circuit', text: 'qubits: 1\nnoise: { schedule: soon }\nsteps:\n  - h: 0\n', code: 'bad-choice' },
    { name: 'thermal as text', kind: 'circuit', text: 'qubits: 1\nnoise:\n  gates:\n    h: { thermal: yes please }\nsteps:\n  - h: 0\n', code: 'expected-boolean' },
    { name: 'unknown key in a composite gate', kind: 'circuit', text: 'qubits: 1\ngates:\n  g: { qubits: 1, stpes: [ { h: 0 } ] }\nsteps:\n  - g: 0\n', code: 'unknown-key' },
    { name: 'custom gate named like a built-in', kind: 'circuit', text: 'qubits: 1\ngates:\n  h: { matrix: [[1, 0], [0, 1]] }\nsteps:\n  - h: 0\n', code: 'reserved-gate-name' },
    { name: 'unknown key in a channel definition', kind: 'circuit', text: 'qubits: 1\nchannels:\n  c: { krauss: [[[1, 0], [0, 1]]] }\nsteps:\n  - h: 0\n', code: 'unknown-key' },
    { name: 'two channel forms', kind: 'circuit', text: 'qubits: 1\nchannels:\n  c: { bit_flip: 0.1, phase_flip: 0.1 }\nsteps:\n  - h: 0\n', code: 'bad-channel' },
    { name: 'observe with lowercase letters', kind: 'circuit', text: 'qubits: 1\nobserve: [z]\nsteps:\n  - h: 0\n', code: 'bad-pauli' },
    { name: 'parameter named pi', kind: 'circuit', text: 'qubits: 1\nparams: { pi: 3 }\nsteps:\n  - h: 0\n', code: 'bad-param-name' },
    { name: 'step key that is not a word', kind: 'circuit', text: 'qubits: 1\nsteps:\n  - "h!": 0\n', code: 'unknown-gate' },
    { name: 'unknown profile key', kind: 'profile', text: 'name: d\nidel: none\n', code: 'unknown-key' },
    { name: 'unknown readout key', kind: 'profile', text: 'qubits:\n  all: { readout: { zero_as_one: 0.1, one_as_two: 0.1 } }\n', code: 'unknown-key' },
    { name: 't1 as a number', kind: 'profile', text: 'qubits:\n  all: { t1: 50 }\n', code: 'bad-duration' },
    { name: 'noise on a measurement', kind: 'profile', text: 'gates:\n  measure: { duration: 1us, bit_flip: 0.1 }\n', code: 'bad-measure-entry' },
    { name: 'thermal on a reset', kind: 'profile', text: 'gates:\n  reset: { thermal: false }\n', code: 'bad-reset-entry' },
    { name: 'unknown pauli key', kind: 'profile', text: 'gates:\n  all: { pauli: { x: 0.1, w: 0.1 } }\n', code: 'unknown-key' },
    { name: 'detuning without a unit', kind: 'profile', text: 'qubits:\n  all: { detuning: 20 }\n', code: 'bad-frequency' },
    { name: 'unknown key in a coupling', kind: 'profile', text: 'couplings:\n  "0 1": { xx: 80kHz }\n', code: 'unknown-key' },
    { name: 'unknown coherent key', kind: 'profile', text: 'gates:\n  all: { coherent: { w: 0.01 } }\n', code: 'unknown-key' },
    { name: 'coherent on a reset', kind: 'profile', text: 'gates:\n  reset: { coherent: { x: 0.01 } }\n', code: 'coherent-on-reset' },
    { name: 'channel file without channels', kind: 'channels', text: 'name: none here\n', code: 'missing-key' },
  ];

  /** The codes of the errors fray records for `text` read as `kind`. */
  function frayCodes(kind: SchemaKind, text: string): string[] {
    if (kind === 'channels') {
      try {
        readChannelFile(text, 'c.yaml');
        return [];
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
        return e.problems.map((p) => p.code);
      }
    }
    const problems = new ProblemList();
    if (kind === 'circuit') parseCircuitText(text, 'c.yaml', problems);
    else {
      // a device file is resolved against a circuit: measure/reset checks live in the resolution
      parseCircuitText('qubits: 1\ndevice: dev.yaml\nsteps:\n  - h: 0\n', 'c.yaml', problems, { readDevice: () => ({ text, file: 'dev.yaml' }) });
    }
    return problems.errors.map((p) => p.code);
  }

  for (const c of refused) {
    it(`refuses what fray refuses: ${c.name}`, () => {
      expect(frayCodes(c.kind, c.text)).toContain(c.code);
      expect(valid(c.kind, c.text)).toBe(false);
    });
  }

  it('lets each action take exactly the modifiers fray lets it take (every action × every modifier, tried in both)', () => {
    const values: Record<string, string> = { angle: '0.1', angles: '[0.1]', noise: '{ bit_flip: 0.1 }', for: '10ns', on: '0', label: 'x', into: 'm0', if: 'm0' };
    expect(Object.keys(values).sort()).toEqual([...STEP_MODIFIERS].sort());
    let accepted = 0;
    for (const action of STEP_ACTIONS) {
      for (const modifier of STEP_MODIFIERS) {
        const extra = action === 'idle' && modifier !== 'for' ? '\n    for: 10ns' : '';
        const text = `qubits: 1\nsteps:\n  - ${action}: 0\n    ${modifier}: ${values[modifier]}${extra}\n`;
        const problems = new ProblemList();
        parseCircuitText(text, 'c.yaml', problems);
        const frayTakes = !problems.errors.some((p) => p.code === 'bad-modifier');
        if (frayTakes) accepted++;
        expect(valid('circuit', text), `${action} with ${modifier}: fray ${frayTakes ? 'takes' : 'refuses'} it`).toBe(frayTakes);
        expect(ACTION_MODIFIERS[action].includes(modifier)).toBe(frayTakes);
      }
    }
    expect(accepted).toBe(8);
    expect(valid('circuit', 'qubits: 1\nsteps:\n  - idle: 0\n')).toBe(false); // fray: missing-for
  });

  it('accepts a custom gate name it cannot know (fray checks those names itself)', () => {
    const text = 'qubits: 2\ngates:\n  swing: { matrix: [[0, 1], [1, 0]] }\nsteps:\n  - swing: [0, 1]\n  - rz: 0\n    angle: 90deg\n';
    expect(valid('circuit', text)).toBe(true);
    const schema = schemas.circuit['$defs'] as Record<string, JsonSchema>;
    expect(Object.keys(schema['step']!['properties'] as object)).toEqual(expect.arrayContaining(['h', 'cx', 'idle', 'measure', 'angle', 'for', 'label']));
  });
});
