/**
 * Names people type for a gate that are not close to fray's name by edit distance: other
 * names of the same gate in the trade (common practice). suggest() offers the fray name
 * whenever it is among the candidates, so "cnot" gets "did you mean 'cx'?".
 */

/** Other name (lowercase) → fray's gate name. */
export const NEAR_MISS_NAMES: ReadonlyMap<string, string> = new Map([
  ['cnot', 'cx'],
  ['toffoli', 'ccx'],
  ['ccnot', 'ccx'],
  ['hadamard', 'h'],
  ['not', 'x'],
  ['cphase', 'cp'],
  ['fredkin', 'cswap'],
  ['identity', 'i'],
]);
