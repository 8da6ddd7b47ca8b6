/**
 * OpenQASM 2.0 and 3 as a circuit format: reading a program into fray's typed circuit
 * (the same one the YAML reader produces) and writing a circuit back as a program.
 */
export { readQasm, lowerQasm, QASM_TIME_UNITS, SAME_GATE_TOLERANCE } from './lower.js';
export { parseQasm } from './parser.js';
export { loadQasmToolkit } from './toolkit.js';
export type { Program as QasmProgram } from './ast.js';
export { HEADER, QELIB1_GATES, STDGATES, QASM_ALIASES } from './library.js';
export { writeQasm, EXPORT_DEFINITIONS } from './write.js';
export type { QasmWriteOptions } from './write.js';

/** Whether a path names an OpenQASM program (by its `.qasm` extension, any case). */
export function isQasmPath(path: string): boolean {
  return /\.qasm$/i.test(path);
}
