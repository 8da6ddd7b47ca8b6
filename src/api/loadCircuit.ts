import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import type { Circuit } from '../circuit/circuit.js';
import { readCircuitTree } from '../format/circuitFile.js';
import { explainCommandLine, readOverrideProfile, splitOverrides, COMMAND_LINE, type Override } from '../format/overrides.js';
import { fileStart, InputError, ProblemList, type Problem, type SourcePosition } from '../format/problem.js';
import { readProfile, type ProfileSpec } from '../format/profileSpec.js';
import { entryOf } from '../format/read.js';
import { parseYamlTree, type YNode } from '../format/yamlTree.js';
import { isQasmPath, lowerQasm, parseQasm, type QasmProgram } from '../format/qasm/index.js';
import { resolveProfile, type NoiseProfile } from '../noise/profile.js';
import { scaleNoise } from '../noise/scale.js';

/** Options for reading a circuit and its noise profile. */
export interface LoadOptions {
  /**
   * Overrides KEY → VALUE (the CLI's --set): a circuit parameter by bare name or
   * `params.NAME`, or a noise-profile field by dotted path (`qubits.all.t1`, `gates.cx.error`,
   * `"gates.cx 1 2.error"`, `idle`, `schedule`); see src/format/overrides.ts.
   */
  readonly set?: Readonly<Record<string, string>> | readonly Override[];
  /** A device profile path that replaces the circuit's `device:` (relative to the working directory). */
  readonly device?: string;
  /** Multiply every noise strength by this C ≥ 0 (src/noise/scale.ts); 1 = as written. */
  readonly noiseScale?: number;
  /** Circuit qubit i on device qubit layout[i] (src/noise/profile.ts ResolveOptions). */
  readonly layout?: readonly number[];
}

/** A validated circuit with its resolved noise profile, and the warnings found on the way. */
export interface LoadedCircuit {
  readonly circuit: Circuit;
  readonly profile: NoiseProfile;
  readonly warnings: readonly Problem[];
  /** The noise scale applied, when not 1. */
  readonly noiseScale?: number;
  /** The placement on the device, when one was given. */
  readonly layout?: readonly number[];
  /** The `--set` overrides as given (problems located on the command line name them). */
  readonly overrideTexts?: readonly string[];
}

/**
 * A circuit file and its device profile, parsed once (YAML → located trees → device spec);
 * `instantiate` types it for one choice of overrides, scale and layout without parsing again.
 */
export interface CircuitSource {
  readonly file: string;
  /** The YAML circuit's located tree (undefined for an OpenQASM program). */
  readonly root: YNode | undefined;
  /** The OpenQASM program's syntax tree (for a `.qasm` file; docs/qasm.md). */
  readonly qasm?: QasmProgram;
  /** The device profile (from `device:` or the device option), read once. */
  readonly deviceSpec: ProfileSpec | undefined;
  /** Problems of reading the files (only warnings when the source exists). */
  readonly warnings: readonly Problem[];
}

/** Reads a file's text, or records a located problem. */
function readText(path: string, at: SourcePosition, what: string, problems: ProblemList): string | undefined {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
    problems.error(at, 'cannot-read', `cannot read ${what} '${path}': ${why}`);
    return undefined;
  }
}

/** Parses a noise profile file's text (a device file). */
export function parseProfileText(text: string, file: string, problems: ProblemList): ProfileSpec | undefined {
  const root = parseYamlTree(text, file, problems);
  return root === undefined ? undefined : readProfile(root, file, 'the noise profile', problems, 'device');
}

/** Supplies a device file's text by path, or records a problem and returns undefined. */
export type DeviceReader = (path: string, at: SourcePosition) => { text: string; file: string } | undefined;

/**
 * Parses circuit text (and its device file through `readDevice`) into a CircuitSource;
 * problems are collected, not thrown.
 */
export function parseCircuitSource(
  text: string,
  file: string,
  problems: ProblemList,
  options: { device?: string; readDevice?: DeviceReader } = {},
): CircuitSource | undefined {
  if (isQasmPath(file)) return parseQasmSource(text, file, problems, options);
  const root = parseYamlTree(text, file, problems);
  if (root === undefined) return undefined;
  // The device path is read straight from the tree; readCircuitTree validates the key itself.
  const de = root.kind === 'map' ? entryOf(root, 'device') : undefined;
  const written = de !== undefined && de.value.kind === 'scalar' && typeof de.value.value === 'string' ? { path: de.value.value, at: de.value.at } : undefined;
  const devicePath = options.device ?? written?.path;
  let deviceSpec: ProfileSpec | undefined;
  if (devicePath !== undefined) {
    const at = options.device !== undefined ? fileStart(options.device) : written!.at;
    if (options.readDevice === undefined) {
      problems.error(at, 'no-device-reader', `the circuit names device '${devicePath}' but no file reader was given`);
      return undefined;
    }
    const dev = options.readDevice(devicePath, at);
    if (dev === undefined) return undefined;
    deviceSpec = parseProfileText(dev.text, dev.file, problems);
    if (deviceSpec === undefined) return undefined;
  }
  if (!problems.ok) return undefined;
  return { file, root, deviceSpec, warnings: problems.warnings };
}

/** An OpenQASM program as a source: its syntax tree, and the device option's profile (a program names no device). */
function parseQasmSource(text: string, file: string, problems: ProblemList, options: { device?: string; readDevice?: DeviceReader }): CircuitSource | undefined {
  const parsed = parseQasm(text);
  if ('problem' in parsed) {
    problems.error({ file, ...parsed.problem.at }, 'qasm-syntax', parsed.problem.message);
    return undefined;
  }
  let deviceSpec: ProfileSpec | undefined;
  if (options.device !== undefined) {
    const at = fileStart(options.device);
    if (options.readDevice === undefined) {
      problems.error(at, 'no-device-reader', `a device '${options.device}' was given but no file reader`);
      return undefined;
    }
    const dev = options.readDevice(options.device, at);
    if (dev === undefined) return undefined;
    deviceSpec = parseProfileText(dev.text, dev.file, problems);
    if (deviceSpec === undefined) return undefined;
  }
  if (!problems.ok) return undefined;
  return { file, root: undefined, qasm: parsed.program, deviceSpec, warnings: problems.warnings };
}

/** The typed circuit of a source: the YAML reader or the OpenQASM one (which has no parameters to set). */
function readSourceCircuit(source: CircuitSource, params: Readonly<Record<string, string>>, problems: ProblemList): Circuit | undefined {
  if (source.qasm === undefined) return readCircuitTree(source.root!, source.file, problems, { set: params });
  for (const name of Object.keys(params)) {
    problems.error({ file: COMMAND_LINE, line: 1, col: 1 }, 'unknown-param', `--set ${name}: an OpenQASM program has no parameters to set (profile fields such as gates.cx.error can be set)`);
  }
  return lowerQasm(source.qasm, source.file, problems);
}

/** The overrides of LoadOptions.set as a list (a record keeps its insertion order). */
export function overrideList(set: LoadOptions['set']): Override[] {
  if (set === undefined) return [];
  if (Array.isArray(set)) return [...(set as readonly Override[])];
  return Object.entries(set as Readonly<Record<string, string>>).map(([key, value]) => ({ key, value }));
}

/**
 * Types a parsed source for one set of overrides, noise scale and layout: the circuit from
 * its tree, the profile levels device → inline → command line, the layout, then the scale.
 * No YAML is parsed here. Problems are collected, not thrown.
 */
export function instantiate(source: CircuitSource, problems: ProblemList, options: LoadOptions = {}): LoadedCircuit | undefined {
  for (const w of source.warnings) problems.items.push(w);
  const split = splitOverrides(overrideList(options.set), problems);
  const finish = (): void => {
    const explained = explainCommandLine(problems.items, split.texts);
    problems.items.splice(0, problems.items.length, ...explained);
  };
  const circuit = readSourceCircuit(source, split.params, problems);
  if (circuit === undefined || !problems.ok) return finish(), undefined;
  const specs: ProfileSpec[] = [];
  if (source.deviceSpec !== undefined) specs.push(source.deviceSpec);
  if (circuit.inlineNoise !== null) specs.push(circuit.inlineNoise);
  const over = readOverrideProfile(split, problems, circuit.params);
  if (over !== undefined) specs.push(over);
  if (options.layout !== undefined) checkLayout(options.layout, circuit, problems);
  if (!problems.ok) return finish(), undefined;
  let profile = resolveProfile(specs, circuit, problems, options.layout !== undefined ? { layout: options.layout } : {});
  let typed = circuit;
  const scale = options.noiseScale;
  if (scale !== undefined && scale !== 1 && problems.ok) ({ circuit: typed, profile } = scaleNoise(circuit, profile, scale, problems));
  finish();
  if (!problems.ok) return undefined;
  return {
    circuit: typed,
    profile,
    warnings: problems.warnings,
    ...(scale !== undefined && scale !== 1 ? { noiseScale: scale } : {}),
    ...(options.layout !== undefined ? { layout: [...options.layout] } : {}),
    ...(split.texts.length > 0 ? { overrideTexts: split.texts } : {}),
  };
}

/** A layout names one distinct device qubit (a whole number ≥ 0) per circuit qubit. */
function checkLayout(layout: readonly number[], circuit: Circuit, problems: ProblemList): void {
  const at = { file: COMMAND_LINE, line: 1, col: 1 };
  const n = circuit.register.n;
  if (layout.length !== n) problems.error(at, 'bad-layout', `--layout ${layout.join(',')}: names ${layout.length} device qubit${layout.length === 1 ? '' : 's'} but the circuit has ${n}; give one per circuit qubit, in order`);
  else if (layout.some((p) => !Number.isSafeInteger(p) || p < 0)) problems.error(at, 'bad-layout', `--layout ${layout.join(',')}: device qubits are whole numbers from 0`);
  else if (new Set(layout).size !== n) problems.error(at, 'bad-layout', `--layout ${layout.join(',')}: names a device qubit twice`);
}

/**
 * Validates circuit text and resolves its noise profile. `readDevice` supplies a device
 * file's text by path (so callers decide about I/O); problems are collected, not thrown.
 */
export function parseCircuitText(
  text: string,
  file: string,
  problems: ProblemList,
  options: LoadOptions & { readDevice?: DeviceReader } = {},
): LoadedCircuit | undefined {
  const source = parseCircuitSource(text, file, problems, options);
  if (source === undefined) return undefined;
  const p2 = new ProblemList();
  const loaded = instantiate(source, p2, options);
  problems.items.splice(0, problems.items.length, ...p2.items);
  return loaded;
}

/** Reads a circuit file and its device profile from disk into a CircuitSource; throws InputError on bad input. */
export function readCircuitSource(path: string, options: { device?: string } = {}): CircuitSource {
  const problems = new ProblemList();
  const text = readText(path, fileStart(path), 'circuit file', problems);
  if (text === undefined) throw new InputError(problems.errors);
  const source = parseCircuitSource(text, path, problems, {
    ...options,
    readDevice: (devicePath, at) => {
      // A circuit's `device:` is relative to the circuit file; --device to the working directory.
      const full = options.device !== undefined ? devicePath : resolve(dirname(path), devicePath);
      const shown = options.device !== undefined ? devicePath : relativeShown(path, devicePath);
      const t = readText(full, at, 'device profile', problems);
      return t === undefined ? undefined : { text: t, file: shown };
    },
  });
  if (source === undefined) throw new InputError(problems.errors);
  return source;
}

/** Types a source for one choice of options; throws InputError on bad input. */
export function instantiateOrThrow(source: CircuitSource, options: LoadOptions = {}): LoadedCircuit {
  const problems = new ProblemList();
  const loaded = instantiate(source, problems, options);
  if (loaded === undefined) throw new InputError(problems.errors);
  return loaded;
}

/** Reads and validates a circuit file and its device profile from disk; throws InputError on bad input. */
export function loadCircuit(path: string, options: LoadOptions = {}): LoadedCircuit {
  return instantiateOrThrow(readCircuitSource(path, options), options);
}

/** The device path as a user would type it from the working directory. */
function relativeShown(circuitPath: string, devicePath: string): string {
  const dir = dirname(circuitPath);
  return dir === '.' || devicePath.startsWith('/') ? devicePath : `${dir}/${devicePath}`;
}
