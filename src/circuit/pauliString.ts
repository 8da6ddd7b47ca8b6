/**
 * Pauli strings over a register: one letter I, X, Y or Z (uppercase) per qubit, character q
 * acting on qubit q, so qubit 0 is leftmost (the bit order of src/engine/layout.ts).
 */

/** Why `s` is not a Pauli string over n qubits, or undefined when it is one. */
export function pauliStringProblem(s: string, n: number): string | undefined {
  for (let q = 0; q < s.length; q++) {
    const c = s[q]!;
    if (c !== 'I' && c !== 'X' && c !== 'Y' && c !== 'Z') {
      return `Pauli string '${s}' has '${c}' for qubit ${q}; use the uppercase letters I, X, Y, Z, one per qubit`;
    }
  }
  if (s.length !== n) return `Pauli string '${s}' has ${s.length} letters but the circuit has ${n} qubits; give one letter per qubit (qubit 0 leftmost)`;
  return undefined;
}
