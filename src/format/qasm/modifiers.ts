/**
 * OpenQASM 3's gate modifiers on fray's built-in gates, by name: `ctrl @ g` becomes the
 * built-in controlled gate (control first, as src/circuit/gates.ts lists controls) and
 * `inv @ g` the built-in inverse with its angles mapped, so the result is one gate with
 * its own profile entry. `pow(k) @` with integer k is k applications (see ./lower.ts).
 */

/** fray gate → the built-in gate with one more control (the new control is the first qubit). */
export const CONTROLLED: ReadonlyMap<string, string> = new Map([
  ['x', 'cx'], ['cx', 'ccx'], ['ccx', 'c3x'], ['c3x', 'c4x'],
  ['y', 'cy'], ['z', 'cz'], ['h', 'ch'], ['sx', 'csx'], ['swap', 'cswap'],
  ['p', 'cp'], ['u1', 'cu1'], ['rx', 'crx'], ['ry', 'cry'], ['rz', 'crz'],
  ['u', 'cu3'], ['u3', 'cu3'],
]);

const SELF_INVERSE = new Set(['i', 'x', 'y', 'z', 'h', 'cx', 'cy', 'cz', 'ch', 'swap', 'ccx', 'cswap', 'c3x', 'c4x']);
const PAIRS = new Map([['s', 'sdg'], ['sdg', 's'], ['t', 'tdg'], ['tdg', 't'], ['sx', 'sxdg'], ['sxdg', 'sx']]);
const NEGATED = new Set(['rx', 'ry', 'rz', 'p', 'u1', 'cp', 'cu1', 'crx', 'cry', 'crz', 'rxx', 'ryy', 'rzz']);

/**
 * The built-in inverse of gate `name` at `angles`: U(θ, φ, λ)† = U(−θ, −λ, −φ) (from the
 * matrix of src/circuit/gates.ts), u2(φ, λ)† = u3(−π/2, −λ, −φ); undefined when fray has no
 * built-in inverse (csx, iswap, composite gates).
 */
export function inverseOf(name: string, angles: readonly number[]): { name: string; angles: number[] } | undefined {
  if (SELF_INVERSE.has(name)) return { name, angles: [] };
  const pair = PAIRS.get(name);
  if (pair !== undefined) return { name: pair, angles: [] };
  if (NEGATED.has(name)) return { name, angles: angles.map((a) => -a) };
  const [t, p, l, g] = angles as [number, number, number, number];
  if (name === 'u' || name === 'u3' || name === 'cu3') return { name, angles: [-t, -l, -p] };
  if (name === 'cu') return { name, angles: [-t, -l, -p, -g] };
  if (name === 'u2') return { name: 'u3', angles: [-Math.PI / 2, -(angles[1]!), -(angles[0]!)] };
  return undefined;
}
