/**
 * Conversions between circuit formats, through the typed circuit: an OpenQASM program to a
 * YAML circuit file (`fray convert`), and a circuit file (YAML or OpenQASM) to an OpenQASM
 * 2.0 or 3 program (`fray export`). Nothing is written here; the caller decides where.
 */
import { basename } from 'node:path';
import type { Circuit } from '../circuit/circuit.js';
import { InputError, ProblemList, type Problem } from '../format/problem.js';
import { writeQasm } from '../format/qasm/index.js';
import { writeCircuitYaml } from '../format/writeCircuit.js';
import { loadCircuit, type LoadOptions } from './loadCircuit.js';

/** A converted text and the warnings met on the way. */
export interface Converted {
  readonly text: string;
  readonly warnings: readonly Problem[];
}

/** Reads an OpenQASM program and writes the equivalent YAML circuit, with a header naming the source. Throws InputError on bad input. */
export function convertToYaml(path: string): Converted {
  const loaded = loadCircuit(path);
  return { text: programAsYaml(path, loaded.circuit), warnings: loaded.warnings };
}

/** The YAML circuit file of a circuit read from the OpenQASM program at `path` (named after the file, with a header naming it). */
export function programAsYaml(path: string, circuit: Circuit): string {
  const name = basename(path).replace(/\.[^.]*$/, '');
  return writeCircuitYaml(circuit, {
    name,
    header: [`converted by fray from ${path}`, "add noise per step with 'noise:', or name a device profile with 'device:' or --device"],
  });
}

/** Reads a circuit file (and its profile) and writes it as an OpenQASM program of `version`. Throws InputError on bad input. */
export function exportQasm(path: string, version: 2 | 3, options: LoadOptions = {}): Converted {
  const loaded = loadCircuit(path, options);
  const problems = new ProblemList();
  const text = writeQasm(loaded.circuit, { version, source: path, profile: loaded.profile.name }, problems);
  if (text === undefined) throw new InputError(problems.errors);
  return { text, warnings: [...loaded.warnings, ...problems.warnings] };
}
