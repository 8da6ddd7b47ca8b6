/**
 * Every unsupported construct and every malformed OpenQASM program is refused with a
 * located message `FILE:LINE:COL: …` (the CLI exits 2, see test/cli/qasm.test.ts). Each
 * case pins the position and a fragment of the message.
 */
import { describe, expect, it } from 'vitest';
import { errorsOf } from './helpers.js';

const H2 = 'OPENQASM 2.0;\ninclude "qelib1.inc";\n';
const H3 = 'OPENQASM 3;\ninclude "stdgates.inc";\n';

const cases: { name: string; text: string; where: string; says: string }[] = [
  // syntax
  { name: 'missing semicolon (placed after the statement)', text: H2 + 'qreg q[2]\nh q[0];\n', where: 'p.qasm:3:10', says: "expected ';' but found 'h'" },
  { name: 'missing semicolon at the end of the file', text: H2 + 'qreg q[1];\nh q[0]', where: 'p.qasm:4:7', says: 'the end of the file' },
  { name: 'a character outside the language', text: H2 + 'qreg q[2];\nh q[0] $;\n', where: 'p.qasm:4:8', says: "unexpected character '$'" },
  { name: 'unsupported version', text: 'OPENQASM 4.0;\n', where: 'p.qasm:1:10', says: 'fray reads 2.0 and 3' },
  // names
  { name: 'misspelled gate', text: H2 + 'qreg q[2];\nhh q[0];\n', where: 'p.qasm:4:1', says: "unknown gate 'hh'; did you mean 'h'?" },
  { name: 'misspelled register', text: H2 + 'qreg qq[2];\nh q[0];\n', where: 'p.qasm:4:3', says: "did you mean 'qq'?" },
  { name: 'misspelled angle name', text: H3 + 'qubit[1] q;\nrz(pie/2) q[0];\n', where: 'p.qasm:4:4', says: "unknown name 'pie' in an angle; did you mean 'pi'?" },
  { name: 'unknown function', text: H3 + 'qubit[1] q;\nrz(arcsin(0.5)) q[0];\n', where: 'p.qasm:4:4', says: "unknown function 'arcsin'" },
  { name: 'misspelled qubit argument in a gate body', text: H2 + 'gate g alpha { h alpah; }\n', where: 'p.qasm:3:18', says: "did you mean 'alpha'?" },
  { name: 'index out of range', text: H2 + 'qreg q[2];\nh q[5];\n', where: 'p.qasm:4:5', says: "q[5] is out of range; 'q' has indices 0 to 1" },
  { name: 'a bit register where a qubit is expected', text: H2 + 'qreg q[1];\ncreg c[1];\nh c[0];\n', where: 'p.qasm:5:3', says: "'c' is a bit register" },
  { name: 'register declared twice', text: H2 + 'qreg q[2];\ncreg q[2];\n', where: 'p.qasm:4:6', says: 'declared twice (first on line 3)' },
  // headers and declarations
  { name: 'standard gate without its header', text: 'OPENQASM 2.0;\nqreg q[1];\nh q[0];\n', where: 'p.qasm:3:1', says: 'add \'include "qelib1.inc";\'' },
  { name: 'the other version\'s header', text: 'OPENQASM 3;\ninclude "qelib1.inc";\n', where: 'p.qasm:2:1', says: 'includes "stdgates.inc"' },
  { name: 'a header of its own', text: H2 + 'include "mylib.inc";\n', where: 'p.qasm:3:1', says: "cannot include 'mylib.inc'" },
  { name: 'OpenQASM 3 declaration in a 2.0 program', text: 'OPENQASM 2.0;\nqubit[2] q;\n', where: 'p.qasm:2:1', says: "'qubit' declaration is OpenQASM 3" },
  { name: 'modifier in a 2.0 program', text: H2 + 'qreg q[2];\nctrl @ x q[0], q[1];\n', where: 'p.qasm:4:1', says: 'a gate modifier is OpenQASM 3' },
  { name: 'no qubits', text: H2 + 'creg c[1];\n', where: 'p.qasm:1:10', says: 'declares no qubits' },
  { name: 'too many qubits', text: H2 + 'qreg q[30];\n', where: 'p.qasm:3:8', says: 'at most 24' },
  // gates
  { name: 'a gate body angle that does not evaluate for this call', text: H2 + 'gate g(a) x { rz(1/a) x; }\nqreg q[1];\ng(0) q[0];\n', where: 'p.qasm:5:1', says: "gate 'g', step rz: division by zero" },
  { name: 'an unknown name in a gate body', text: H2 + 'gate g(alpha) x { rz(alpah) x; }\n', where: 'p.qasm:3:22', says: "did you mean 'alpha'?" },
  { name: 'opaque gate', text: H2 + 'opaque magic a;\nqreg q[1];\n', where: 'p.qasm:3:1', says: "opaque gate 'magic' has no definition, so fray cannot simulate it" },
  { name: 'standard gate redefined', text: H2 + 'gate h a { x a; }\n', where: 'p.qasm:3:6', says: "'h' is a standard gate of qelib1.inc" },
  { name: 'definition clashing with a fray built-in', text: 'OPENQASM 2.0;\ngate iswap a, b { CX a, b; }\n', where: 'p.qasm:2:6', says: "differently from fray's built-in 'iswap'" },
  { name: 'indexed qubit in a gate body', text: H2 + 'gate g a { h a[0]; }\n', where: 'p.qasm:3:14', says: 'without an index' },
  { name: 'too many qubits for a gate', text: H2 + 'qreg q[3];\ncx q[0], q[1], q[2];\n', where: 'p.qasm:4:4', says: "gate 'cx' acts on 2 qubits, 3 given" },
  { name: 'missing angle', text: H2 + 'qreg q[1];\nrz q[0];\n', where: 'p.qasm:4:1', says: "gate 'rz' takes 1 angle, 0 given" },
  { name: 'repeated qubit', text: H2 + 'qreg q[2];\ncx q[0], q[0];\n', where: 'p.qasm:4:4', says: 'names qubit q[0] twice' },
  { name: 'registers of different sizes', text: H2 + 'qreg q[2];\nqreg r[3];\ncx q, r;\n', where: 'p.qasm:5:1', says: 'registers of different sizes (2 and 3)' },
  { name: 'u0 (a wait in device cycles)', text: H2 + 'qreg q[1];\nu0(1) q[0];\n', where: 'p.qasm:4:1', says: "gate 'u0' is not supported" },
  { name: 'ctrl @ on a defined gate', text: H3 + 'gate g a { h a; }\nqubit[2] q;\nctrl @ g q[0], q[1];\n', where: 'p.qasm:5:1', says: "fray has no built-in controlled 'g'" },
  { name: 'inv @ on a gate whose step has no built-in inverse', text: H3 + 'gate g a, b { ctrl @ sx a, b; }\nqubit[2] q;\ninv @ g q[0], q[1];\n', where: 'p.qasm:5:1', says: "its step 'csx' has no built-in inverse" },
  { name: 'fractional power', text: H3 + 'qubit[1] q;\npow(0.5) @ x q[0];\n', where: 'p.qasm:4:5', says: 'fray applies integer powers only' },
  // measurement and conditions
  { name: 'measure of unequal registers', text: H2 + 'qreg q[2];\ncreg c[3];\nmeasure q -> c;\n', where: 'p.qasm:5:14', says: 'measure maps 2 qubits onto 3 bits' },
  { name: 'a measurement without a bit in a program with mid-circuit measurement', text: H3 + 'qubit[1] q;\nbit[1] c;\nmeasure q[0];\nc[0] = measure q[0];\nif (c[0]) x q[0];\n', where: 'p.qasm:5:1', says: 'stores no bit, but the program uses mid-circuit measurement (an operation on q[0] after its measurement on line 6)' },
  { name: 'a condition on a bit never written before it', text: H2 + 'qreg q[1];\ncreg c[2];\nmeasure q[0] -> c[0];\nif (c == 2) x q[0];\n', where: 'p.qasm:6:10', says: 'bit c[1] is not written by any measurement before this' },
  { name: 'a value the register cannot hold', text: H2 + 'qreg q[1];\ncreg c[2];\nmeasure q[0] -> c[0];\nif (c == 4) x q[0];\n', where: 'p.qasm:6:10', says: "register 'c' can hold a whole number from 0 to 3" },
  { name: 'a single bit in an OpenQASM 2.0 condition', text: H2 + 'qreg q[1];\ncreg c[2];\nmeasure q[0] -> c[0];\nif (c[0] == 1) x q[0];\n', where: 'p.qasm:6:5', says: 'OpenQASM 2.0 compares a whole bit register' },
  { name: 'a bare whole-register condition', text: H3 + 'qubit[2] q;\nbit[2] c;\nc = measure q;\nif (c) x q[0];\n', where: 'p.qasm:6:5', says: "needs '== n'" },
  { name: 'a conditional measurement', text: H3 + 'qubit[1] q;\nbit[1] c;\nc[0] = measure q[0];\nif (c[0]) { measure q[0]; }\n', where: 'p.qasm:6:13', says: "a conditional 'measure' is not supported" },
  // OpenQASM 3 constructs fray does not simulate
  { name: 'for loop', text: H3 + 'qubit[1] q;\nfor int i in [0:3] { x q[0]; }\n', where: 'p.qasm:4:1', says: "'for' loops are not supported" },
  { name: 'while loop', text: H3 + 'qubit[1] q;\nwhile (true) { x q[0]; }\n', where: 'p.qasm:4:1', says: "'while' loops are not supported" },
  { name: 'subroutine', text: H3 + 'qubit[1] q;\ndef f(qubit a) { x a; }\n', where: 'p.qasm:4:1', says: "subroutines ('def') are not supported" },
  { name: 'extern', text: H3 + 'extern f(int) -> int;\n', where: 'p.qasm:3:1', says: "'extern' functions are not supported" },
  { name: 'classical variable', text: H3 + 'qubit[1] q;\nint[32] n = 3;\n', where: 'p.qasm:4:1', says: 'classical variables and arithmetic are not supported' },
  { name: 'classical assignment', text: H3 + 'qubit[1] q;\nbit[1] c;\nc[0] = 1;\n', where: 'p.qasm:5:6', says: 'classical variables and arithmetic are not supported' },
  { name: 'else branch', text: H3 + 'qubit[1] q;\nbit[1] c;\nif (c[0]) { x q[0]; } else { h q[0]; }\n', where: 'p.qasm:5:23', says: "'else' branches are not supported" },
  { name: 'box', text: H3 + 'qubit[1] q;\nbox { x q[0]; }\n', where: 'p.qasm:4:1', says: "'box' timing blocks are not supported" },
  { name: 'pragma', text: H3 + '#pragma foo\nqubit[1] q;\n', where: 'p.qasm:3:1', says: 'pragmas are not supported' },
  { name: 'calibration', text: H3 + 'defcal x $0 { }\n', where: 'p.qasm:3:1', says: 'pulse-level calibrations are not supported' },
  { name: 'delay in device cycles', text: H3 + 'qubit[1] q;\ndelay[100dt] q[0];\n', where: 'p.qasm:4:7', says: "'dt' (one device cycle) has no fixed length" },
  { name: 'physical qubits next to declared ones', text: H3 + 'qubit[1] q;\nh $0;\n', where: 'p.qasm:3:1', says: 'uses physical qubits ($0) and declares qubits' },
  { name: 'index range', text: H3 + 'qubit[3] q;\nh q[0:2];\n', where: 'p.qasm:4:4', says: 'index ranges (q[0:2]) are not supported' },
  { name: 'index set', text: H3 + 'qubit[3] q;\nh q[{0, 2}];\n', where: 'p.qasm:4:4', says: 'index sets' },
  { name: 'delay in a 2.0 program', text: H2 + 'qreg q[1];\ndelay[100ns] q[0];\n', where: 'p.qasm:4:1', says: "'delay' is OpenQASM 3" },
];

describe('OpenQASM input errors are located', () => {
  it.each(cases)('$name', ({ text, where, says }) => {
    const errors = errorsOf(text);
    expect(errors.length, errors.join('\n')).toBeGreaterThan(0);
    expect(errors[0]!.startsWith(`${where}: `), errors[0]).toBe(true);
    expect(errors[0]).toContain(says);
  });

  it('a well-formed program has no errors (the cases above fail for their own reason)', () => {
    expect(errorsOf(H2 + 'qreg q[1];\nh q[0];\n')).toEqual([]);
  });
});
