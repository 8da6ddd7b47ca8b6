/**
 * The built-in gate table: trade-standard names with exact matrices.
 *
 * Conventions (see src/engine/layout.ts): the first qubit a gate lists is its leftmost,
 * most significant tensor factor; basis order |00⟩, |01⟩, |10⟩, |11⟩. Controlled gates list
 * their controls first: c-U = |0⟩⟨0| ⊗ I + |1⟩⟨1| ⊗ U. Angles are in radians. Rotations
 * are exp(−iθP/2) for a Pauli string P. Every call to matrix() returns a fresh CMatrix.
 */
import { type CMatrix, type Complex, add, diag, fromRows, identity, kron, scale, zeros } from '../linalg/cmatrix.js';

/** A named gate on `qubits` qubits whose matrix depends on the angles `params` (radians, in order). */
export interface GateDef {
  name: string;
  qubits: number;
  params: readonly string[];
  matrix(angles: readonly number[]): CMatrix;
}

const R = Math.SQRT1_2; // 1/√2, exact to the last bit

/** e^{iφ} as [re, im]. */
const cis = (phi: number): Complex => [Math.cos(phi), Math.sin(phi)];

const pauliX = (): CMatrix => fromRows([[0, 1], [1, 0]]);
const pauliY = (): CMatrix => fromRows([[0, [0, -1]], [[0, 1], 0]]);
const pauliZ = (): CMatrix => fromRows([[1, 0], [0, -1]]);

/** exp(−iθP/2) = cos(θ/2)·I − i·sin(θ/2)·P for a Pauli string P (P² = I). */
function pauliRotation(p: CMatrix, theta: number): CMatrix {
  return add(scale(identity(p.rows), Math.cos(theta / 2)), scale(p, 0, -Math.sin(theta / 2)));
}

/** The controlled gate |0⟩⟨0| ⊗ I + |1⟩⟨1| ⊗ U (control = the new leftmost qubit). */
export function controlled(u: CMatrix): CMatrix {
  const d = u.rows;
  const out = zeros(2 * d, 2 * d);
  const n = 2 * d;
  for (let i = 0; i < d; i++) out.data[2 * (i * n + i)] = 1;
  for (let r = 0; r < d; r++) {
    for (let c = 0; c < d; c++) {
      out.data[2 * ((d + r) * n + d + c)] = u.data[2 * (r * d + c)]!;
      out.data[2 * ((d + r) * n + d + c) + 1] = u.data[2 * (r * d + c) + 1]!;
    }
  }
  return out;
}

/** u(θ, φ, λ) = [[cos θ/2, −e^{iλ} sin θ/2], [e^{iφ} sin θ/2, e^{i(φ+λ)} cos θ/2]]. */
function u3(theta: number, phi: number, lambda: number): CMatrix {
  const c = Math.cos(theta / 2);
  const s = Math.sin(theta / 2);
  const [lr, li] = cis(lambda);
  const [pr, pi] = cis(phi);
  const [br, bi] = cis(phi + lambda);
  return fromRows([
    [c, [-lr * s, -li * s]],
    [[pr * s, pi * s], [br * c, bi * c]],
  ]);
}

const hadamard = (): CMatrix => fromRows([[R, R], [R, -R]]);
const swapMatrix = (): CMatrix => fromRows([[1, 0, 0, 0], [0, 0, 1, 0], [0, 1, 0, 0], [0, 0, 0, 1]]);

/** A table entry whose matrix() checks the number of angles it is given. */
function gate(name: string, qubits: number, params: readonly string[], build: (a: readonly number[]) => CMatrix): GateDef {
  return {
    name,
    qubits,
    params,
    matrix(angles: readonly number[]): CMatrix {
      if (angles.length !== params.length) {
        throw new RangeError(`gate '${name}' takes ${params.length} angle(s), got ${angles.length}`);
      }
      return build(angles);
    },
  };
}

const TH = ['theta'] as const;
const LA = ['lambda'] as const;

const TABLE: readonly GateDef[] = [
  gate('i', 1, [], () => identity(2)),
  gate('x', 1, [], pauliX),
  gate('y', 1, [], pauliY),
  gate('z', 1, [], pauliZ),
  gate('h', 1, [], hadamard),
  gate('s', 1, [], () => diag([1, [0, 1]])),
  gate('sdg', 1, [], () => diag([1, [0, -1]])),
  gate('t', 1, [], () => diag([1, [R, R]])),
  gate('tdg', 1, [], () => diag([1, [R, -R]])),
  // √X = ½[[1+i, 1−i], [1−i, 1+i]] and its adjoint.
  gate('sx', 1, [], () => fromRows([[[0.5, 0.5], [0.5, -0.5]], [[0.5, -0.5], [0.5, 0.5]]])),
  gate('sxdg', 1, [], () => fromRows([[[0.5, -0.5], [0.5, 0.5]], [[0.5, 0.5], [0.5, -0.5]]])),
  gate('rx', 1, TH, ([t]) => pauliRotation(pauliX(), t!)),
  gate('ry', 1, TH, ([t]) => pauliRotation(pauliY(), t!)),
  gate('rz', 1, TH, ([t]) => diag([cis(-t! / 2), cis(t! / 2)])),
  gate('p', 1, LA, ([l]) => diag([1, cis(l!)])),
  gate('u', 1, ['theta', 'phi', 'lambda'], ([t, p, l]) => u3(t!, p!, l!)),
  gate('cx', 2, [], () => controlled(pauliX())),
  gate('cy', 2, [], () => controlled(pauliY())),
  gate('cz', 2, [], () => controlled(pauliZ())),
  gate('ch', 2, [], () => controlled(hadamard())),
  gate('cp', 2, LA, ([l]) => diag([1, 1, 1, cis(l!)])),
  gate('crx', 2, TH, ([t]) => controlled(pauliRotation(pauliX(), t!))),
  gate('cry', 2, TH, ([t]) => controlled(pauliRotation(pauliY(), t!))),
  gate('crz', 2, TH, ([t]) => diag([1, 1, cis(-t! / 2), cis(t! / 2)])),
  gate('swap', 2, [], swapMatrix),
  gate('iswap', 2, [], () => fromRows([[1, 0, 0, 0], [0, 0, [0, 1], 0], [0, [0, 1], 0, 0], [0, 0, 0, 1]])),
  gate('rxx', 2, TH, ([t]) => pauliRotation(kron(pauliX(), pauliX()), t!)),
  gate('ryy', 2, TH, ([t]) => pauliRotation(kron(pauliY(), pauliY()), t!)),
  gate('rzz', 2, TH, ([t]) => diag([cis(-t! / 2), cis(t! / 2), cis(t! / 2), cis(-t! / 2)])),
  gate('ccx', 3, [], () => controlled(controlled(pauliX()))),
  gate('cswap', 3, [], () => controlled(swapMatrix())),
  // OpenQASM's names (qelib1.inc and stdgates.inc), each its own gate for noise profiles:
  // u3 = u, u2(φ, λ) = u(π/2, φ, λ), u1 = p, cu1 = cp, cu3 = controlled u,
  // cu(θ, φ, λ, γ) = controlled e^{iγ}·u(θ, φ, λ), csx = controlled sx, c3x / c4x = X with 3 / 4 controls.
  gate('u1', 1, LA, ([l]) => diag([1, cis(l!)])),
  gate('u2', 1, ['phi', 'lambda'], ([p, l]) => u3(Math.PI / 2, p!, l!)),
  gate('u3', 1, ['theta', 'phi', 'lambda'], ([t, p, l]) => u3(t!, p!, l!)),
  gate('cu1', 2, LA, ([l]) => diag([1, 1, 1, cis(l!)])),
  gate('cu3', 2, ['theta', 'phi', 'lambda'], ([t, p, l]) => controlled(u3(t!, p!, l!))),
  gate('cu', 2, ['theta', 'phi', 'lambda', 'gamma'], ([t, p, l, g]) => controlled(scale(u3(t!, p!, l!), Math.cos(g!), Math.sin(g!)))),
  gate('csx', 2, [], () => controlled(fromRows([[[0.5, 0.5], [0.5, -0.5]], [[0.5, -0.5], [0.5, 0.5]]]))),
  gate('c3x', 4, [], () => controlled(controlled(controlled(pauliX())))),
  gate('c4x', 5, [], () => controlled(controlled(controlled(controlled(pauliX()))))),
];

/**
 * The built-ins added under OpenQASM's header names. A circuit's own custom gate of one of
 * these names takes precedence over the built-in, so circuits written before they existed
 * keep their meaning.
 */
export const OPENQASM_NAMED_GATES: ReadonlySet<string> = new Set(['u1', 'u2', 'u3', 'cu1', 'cu3', 'cu', 'csx', 'c3x', 'c4x']);

/** Alternative names of built-in gates → the gate's own name (`id` is `i`: one gate, one profile entry). */
export const GATE_ALIASES: ReadonlyMap<string, string> = new Map([['id', 'i']]);

/** Every built-in gate by name, aliases included (an alias maps to the same GateDef, named canonically). */
export const BUILTIN_GATES: ReadonlyMap<string, GateDef> = new Map([
  ...TABLE.map((g): [string, GateDef] => [g.name, g]),
  ...[...GATE_ALIASES].map(([alias, name]): [string, GateDef] => [alias, TABLE.find((g) => g.name === name)!]),
]);

/** The built-in gate of that exact (case-sensitive) name, or undefined. */
export function builtinGate(name: string): GateDef | undefined {
  return BUILTIN_GATES.get(name);
}
