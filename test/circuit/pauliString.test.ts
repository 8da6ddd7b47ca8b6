import { describe, expect, it } from 'vitest';
import { pauliStringProblem } from '../../src/circuit/pauliString.js';

// Pauli strings: one letter per qubit, qubit 0 leftmost (fray's convention, src/engine/layout.ts).
describe('pauliStringProblem', () => {
  it('accepts I X Y Z uppercase of length n and explains anything else', () => {
    expect(pauliStringProblem('IXYZ', 4)).toBeUndefined();
    expect(pauliStringProblem('XX', 3)).toMatch(/2 letters.*3/);
    expect(pauliStringProblem('XxZ', 3)).toMatch(/'x' for qubit 1.*uppercase/);
    expect(pauliStringProblem('XAZ', 3)).toMatch(/'A'/);
    expect(pauliStringProblem('', 0)).toBeUndefined();
  });
});
