/**
 * The standard gate headers of OpenQASM and how their gates map onto fray's built-in gates
 * (src/circuit/gates.ts). Every gate keeps its own name, so each has its own profile
 * entry (u1 and p are one matrix but can have different durations on a device), except
 * the language's primitives and spelled-out aliases, which become the fray gate of the same
 * matrix: U → u, CX → cx, phase → p, cphase → cp, id → i.
 *
 * Global phase: OpenQASM 2.0 (Cross et al. 2017) defines U(θ, φ, λ) = Rz(φ)Ry(θ)Rz(λ), which
 * is e^{−i(φ+λ)/2} times fray's u(θ, φ, λ); OpenQASM 3 (Cross et al. 2022) defines U as fray's
 * u exactly. fray uses the OpenQASM 3 matrices for both versions: OpenQASM 2.0 has no
 * controlled modifier, so the difference is a phase of the whole state and cannot be observed.
 */
import { BUILTIN_GATES } from '../../circuit/gates.js';

/** The header file each version includes for its standard gates. */
export const HEADER: Readonly<Record<2 | 3, string>> = { 2: 'qelib1.inc', 3: 'stdgates.inc' };

/**
 * Gates of qelib1.inc: the set published with OpenQASM 2.0 (Cross et al. 2017) followed by
 * the gates later added to the header that toolchains ship (from memory).
 */
export const QELIB1_GATES: readonly string[] = [
  'u3', 'u2', 'u1', 'cx', 'id', 'x', 'y', 'z', 'h', 's', 'sdg', 't', 'tdg', 'rx', 'ry', 'rz', 'cz', 'cy', 'ch', 'ccx', 'crz', 'cu1', 'cu3',
  'u', 'p', 'sx', 'sxdg', 'swap', 'cswap', 'crx', 'cry', 'cp', 'csx', 'cu', 'rxx', 'rzz', 'c3x', 'c4x',
];

/** Gates of stdgates.inc (Cross et al. 2022, from memory). */
export const STDGATES: readonly string[] = [
  'p', 'x', 'y', 'z', 'h', 's', 'sdg', 't', 'tdg', 'sx', 'rx', 'ry', 'rz', 'cx', 'cy', 'cz', 'cp', 'crx', 'cry', 'crz', 'ch', 'swap', 'ccx', 'cswap', 'cu',
  'CX', 'phase', 'cphase', 'id', 'u1', 'u2', 'u3',
];

/** Gates of the headers that fray does not simulate, and why. */
export const UNSUPPORTED_STANDARD_GATES: ReadonlyMap<string, string> = new Map([
  ['u0', "u0 is a wait counted in device cycles; write an OpenQASM 3 'delay' with a time unit instead"],
  ['rccx', 'the relative-phase Toffoli rccx is not among fray\'s gates; define it with a gate definition'],
  ['rc3x', 'the relative-phase rc3x is not among fray\'s gates; define it with a gate definition'],
  ['c3sqrtx', 'c3sqrtx is not among fray\'s gates; define it with a gate definition'],
]);

/** Names a program may use without any header: the language's own gates. */
export const PRIMITIVES: Readonly<Record<2 | 3, readonly string[]>> = { 2: ['U', 'CX'], 3: ['U'] };

/** OpenQASM names that are another name of a fray gate (same matrix, one profile entry). */
export const QASM_ALIASES: ReadonlyMap<string, string> = new Map([
  ['U', 'u'],
  ['CX', 'cx'],
  ['phase', 'p'],
  ['cphase', 'cp'],
  ['id', 'i'],
]);

/** The gates a version offers without definitions: its primitives, plus its header's when included. */
export function standardGates(version: 2 | 3, included: boolean): string[] {
  return [...PRIMITIVES[version], ...(included ? (version === 2 ? QELIB1_GATES : STDGATES) : [])];
}

/** The fray built-in gate a standard OpenQASM name stands for. */
export function frayGateOf(qasmName: string): string {
  const name = QASM_ALIASES.get(qasmName) ?? qasmName;
  if (!BUILTIN_GATES.has(name)) throw new Error(`internal: standard gate '${qasmName}' has no fray gate`);
  return BUILTIN_GATES.get(name)!.name;
}
