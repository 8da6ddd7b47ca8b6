/**
 * A one-qubit circuit for `fray check` tests: x then depolarizing 0.02 on every gate, so
 * ⟨Z⟩ = −0.98, P(1) = 0.99 and state fidelity 0.99 (derived from the depolarizing definition,
 * Nielsen & Chuang §8.3.4, section number recalled from memory); `extra` is appended (an `expect:` block, for instance).
 */
export const CHECK_CIRCUIT = (extra: string): string => `qubits: 1
noise:
  gates:
    all: { depolarizing: 0.02 }
observe: [Z]
steps:
  - x: 0
${extra}`;
