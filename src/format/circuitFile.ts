import { evaluateReal, RESERVED_NAMES } from '../circuit/expression.js';
import { pauliStringProblem } from '../circuit/pauliString.js';
import { suggest } from '../circuit/suggest.js';
import type { Circuit, CustomChannel, Register } from '../circuit/circuit.js';
import { readCustomChannels } from './customChannels.js';
import { GateLibrary } from './gateLibrary.js';
import type { Loc } from './noiseKindsSpec.js';
import { fileStart, ProblemList, type SourcePosition } from './problem.js';
import { readProfile, type ProfileSpec } from './profileSpec.js';
import { asMap, checkKeys, entryOf, offsetInto, readString } from './read.js';
import { readRegister } from './register.js';
import { readMitigation } from './mitigationBlock.js';
import { RecordReader } from './record.js';
import { readSteps } from './steps.js';
import { describe, parseYamlTree, type YNode } from './yamlTree.js';

/** Top-level keys of a circuit file. */
export const CIRCUIT_KEYS = ['name', 'qubits', 'device', 'noise', 'params', 'gates', 'channels', 'observe', 'bits', 'mitigation', 'expect', 'steps'] as const;

/** Options that change how a circuit file reads. */
export interface CircuitReadOptions {
  /** Parameter overrides `name → expression` (the CLI's --set name=value). */
  readonly set?: Readonly<Record<string, string>>;
}

/** Parses and validates circuit YAML text; problems (errors and warnings) are collected in `problems`. */
export function readCircuit(
  text: string,
  file: string,
  problems: ProblemList,
  options: CircuitReadOptions = {},
): Circuit | undefined {
  const root = parseYamlTree(text, file, problems);
  if (root === undefined) return undefined;
  return readCircuitTree(root, file, problems, options);
}

/**
 * Validates a circuit file's located YAML tree (parsed once by parseYamlTree) into the typed
 * circuit. Studies call this again per parameter point with new `set` values: the YAML is
 * never re-parsed, only re-typed (angles, durations and matrices depend on the params).
 */
export function readCircuitTree(
  root: YNode,
  file: string,
  problems: ProblemList,
  options: CircuitReadOptions = {},
): Circuit | undefined {
  const map = asMap(root, 'a circuit file', problems);
  if (map === undefined) return undefined;
  checkKeys(map, CIRCUIT_KEYS, 'the circuit file', problems);

  const qe = entryOf(map, 'qubits');
  const se = entryOf(map, 'steps');
  if (qe === undefined) problems.error(fileStart(file), 'missing-key', `the circuit has no 'qubits:' (a count, or a list of labels)`);
  if (se === undefined) problems.error(fileStart(file), 'missing-key', `the circuit has no 'steps:' (the list of gates and other steps)`);
  const register: Register | undefined = qe === undefined ? undefined : readRegister(qe.value, problems);

  const nameEntry = entryOf(map, 'name');
  const name = nameEntry === undefined ? null : (readString(nameEntry.value, "'name'", problems, true) ?? null);

  const params = readParams(entryOf(map, 'params')?.value, options.set ?? {}, file, problems);

  let device: Loc<string> | null = null;
  const de = entryOf(map, 'device');
  if (de !== undefined) {
    const p = readString(de.value, "'device' (a path to a noise profile, relative to this file)", problems);
    if (p !== undefined) device = { value: p, at: de.value.at };
  }

  const ne = entryOf(map, 'noise');
  const inlineNoise: ProfileSpec | null = ne === undefined ? null : (readProfile(ne.value, file, "the circuit's 'noise'", problems, 'inline', params) ?? null);

  const channels: Map<string, CustomChannel> = (() => {
    const ce = entryOf(map, 'channels');
    return ce === undefined ? new Map() : readCustomChannels(ce.value, params, problems);
  })();

  const gates = new GateLibrary(params);
  const ge = entryOf(map, 'gates');
  if (ge !== undefined) gates.readCustomGates(ge.value, problems);

  const observe: Loc<string>[] = [];
  const oe = entryOf(map, 'observe');
  if (oe !== undefined && register !== undefined) {
    const items = oe.value.kind === 'seq' ? oe.value.items : [oe.value];
    for (const item of items) {
      const s = readString(item, "an 'observe' entry (a Pauli string such as ZZI)", problems);
      if (s === undefined) continue;
      const bad = pauliStringProblem(s, register.n);
      if (bad !== undefined) problems.error(item.at, 'bad-pauli', bad);
      else observe.push({ value: s, at: item.at });
    }
  }

  const expect: Loc<string>[] = [];
  const ee = entryOf(map, 'expect');
  if (ee !== undefined) {
    if (ee.value.kind !== 'seq') problems.error(ee.value.at, 'expected-list', `'expect' must be a list of conditions such as 'state >= 0.9', not ${describe(ee.value)}`);
    else {
      for (const item of ee.value.items) {
        const s = readString(item, "an 'expect' entry (a condition such as 'state >= 0.9')", problems);
        if (s !== undefined) expect.push({ value: s, at: item.at });
      }
    }
  }
  const me = entryOf(map, 'mitigation');
  const mitigation = me === undefined ? undefined : readMitigation(me.value, problems);

  if (register === undefined || se === undefined) return undefined;
  const record = new RecordReader(se.value);
  const read = readSteps(se.value, { register, params, gates, channels }, problems, record);
  const { bits, operations } = record.finish(entryOf(map, 'bits'), read, problems);
  if (!problems.ok) return undefined;

  const gateArity = new Map<string, number>();
  const compositeGates = new Set<string>();
  for (const g of gates.names()) {
    gateArity.set(g, gates.get(g)!.qubits);
    if (gates.get(g)!.kind === 'composite') compositeGates.add(g);
  }
  return {
    file,
    name,
    register,
    params,
    channels,
    gateArity,
    definitions: gates.definitions(),
    compositeGates,
    observe,
    ...(mitigation !== undefined ? { mitigation } : {}),
    ...(ee !== undefined ? { expect } : {}),
    device,
    inlineNoise,
    operations,
    stepsAt: se.keyAt,
    qubitsAt: qe!.value.at,
    bits,
  };
}

function readParams(
  node: YNode | undefined,
  overrides: Readonly<Record<string, string>>,
  file: string,
  problems: ProblemList,
): Record<string, number> {
  const params: Record<string, number> = Object.create(null) as Record<string, number>;
  const at: SourcePosition = node?.at ?? fileStart(file);
  const declared = new Set<string>();
  if (node !== undefined) {
    const map = asMap(node, "'params'", problems);
    if (map !== undefined) for (const e of map.entries) {
      if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(e.key) || RESERVED_NAMES.includes(e.key)) {
        problems.error(e.keyAt, 'bad-param-name', `parameter name '${e.key}' must be a word other than ${RESERVED_NAMES.join(', ')}`);
        continue;
      }
      declared.add(e.key);
      const v = e.value;
      const override = overrides[e.key];
      if (override !== undefined) {
        // --set replaces the file's value in place, so later params computed from it follow.
        const r = evaluateReal(override, params);
        if ('error' in r) problems.error(at, 'bad-param', `--set ${e.key}=${override}: ${r.error.message}`);
        else params[e.key] = r.value;
      } else if (v.kind === 'scalar' && typeof v.value === 'number' && Number.isFinite(v.value)) {
        params[e.key] = v.value;
      } else if (v.kind === 'scalar' && typeof v.value === 'string') {
        const r = evaluateReal(v.value, params);
        if ('error' in r) problems.error(offsetInto(v, r.error.offset), 'bad-param', `parameter '${e.key}': ${r.error.message}`);
        else params[e.key] = r.value;
      } else {
        problems.error(v.at, 'bad-param', `parameter '${e.key}' must be a number or an expression, not ${describe(v)}`);
      }
    }
  }
  for (const k of Object.keys(overrides)) {
    if (!declared.has(k)) {
      const near = suggest(k, [...declared]);
      const hint = near !== undefined ? `; did you mean '${near}'?` : declared.size > 0 ? `; it has: ${[...declared].join(', ')}` : '; it declares no params';
      problems.error(at, 'unknown-param', `--set ${k}=${overrides[k]}: the circuit has no parameter '${k}'${hint}`);
    }
  }
  return { ...params };
}
