import { dirname, resolve } from 'node:path';
import type { Circuit } from '../circuit/circuit.js';
import { readCircuit } from '../format/circuitFile.js';
import { fileStart, InputError, ProblemList, type Problem, type SourcePosition } from '../format/problem.js';
import { readProfile, type ProfileSpec } from '../format/profileSpec.js';
import { parseYamlTree } from '../format/yamlTree.js';
import { readInputFile } from './readInput.js';
import { resolveProfile, type NoiseProfile } from '../noise/profile.js';

/** Options for reading a circuit and its noise profile. */
export interface LoadOptions {
  /** Parameter overrides, name → expression (the CLI's --set). */
  readonly set?: Readonly<Record<string, string>>;
  /** A device profile path that replaces the circuit's `device:` (relative to the working directory). */
  readonly device?: string;
}

/** A validated circuit with its resolved noise profile, and the warnings found on the way. */
export interface LoadedCircuit {
  readonly circuit: Circuit;
  readonly profile: NoiseProfile;
  readonly warnings: readonly Problem[];
}

/** Parses a noise profile file's text (a device file). */
export function parseProfileText(text: string, file: string, problems: ProblemList): ProfileSpec | undefined {
  const root = parseYamlTree(text, file, problems);
  return root === undefined ? undefined : readProfile(root, file, 'the noise profile', problems, 'device');
}

/**
 * Validates circuit text and resolves its noise profile. `readDevice` supplies a device
 * file's text by path (so callers decide about I/O); problems are collected, not thrown.
 */
export function parseCircuitText(
  text: string,
  file: string,
  problems: ProblemList,
  options: LoadOptions & { readDevice?: (path: string, at: SourcePosition) => { text: string; file: string } | undefined } = {},
): LoadedCircuit | undefined {
  const circuit = readCircuit(text, file, problems, options.set ? { set: options.set } : {});
  if (circuit === undefined) return undefined;
  const specs: ProfileSpec[] = [];
  const devicePath = options.device ?? circuit.device?.value;
  if (devicePath !== undefined) {
    if (options.readDevice === undefined) {
      problems.error(circuit.device?.at ?? fileStart(file), 'no-device-reader', `the circuit names device '${devicePath}' but no file reader was given`);
      return undefined;
    }
    const at = options.device !== undefined ? fileStart(options.device) : circuit.device!.at;
    const dev = options.readDevice(devicePath, at);
    if (dev === undefined) return undefined;
    const spec = parseProfileText(dev.text, dev.file, problems);
    if (spec === undefined) return undefined;
    specs.push(spec);
  }
  if (circuit.inlineNoise !== null) specs.push(circuit.inlineNoise);
  const profile = resolveProfile(specs, circuit, problems);
  if (!problems.ok) return undefined;
  return { circuit, profile, warnings: problems.warnings };
}

/** Reads and validates a circuit file and its device profile from disk; throws InputError on bad input. */
export function loadCircuit(path: string, options: LoadOptions = {}): LoadedCircuit {
  const problems = new ProblemList();
  const text = readInputFile(path, fileStart(path), 'circuit file', problems);
  if (text === undefined) throw new InputError(problems.errors);
  const loaded = parseCircuitText(text, path, problems, {
    ...options,
    readDevice: (devicePath, at) => {
      // A circuit's `device:` is relative to the circuit file; --device to the working directory.
      const full = options.device !== undefined ? devicePath : resolve(dirname(path), devicePath);
      const shown = options.device !== undefined ? devicePath : relativeShown(path, devicePath);
      const t = readInputFile(full, at, 'device profile', problems);
      return t === undefined ? undefined : { text: t, file: shown };
    },
  });
  if (loaded === undefined) throw new InputError(problems.errors);
  return loaded;
}

/** The device path as a user would type it from the working directory. */
function relativeShown(circuitPath: string, devicePath: string): string {
  const dir = dirname(circuitPath);
  return dir === '.' || devicePath.startsWith('/') ? devicePath : `${dir}/${devicePath}`;
}
