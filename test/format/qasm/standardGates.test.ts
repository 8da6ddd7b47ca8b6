/**
 * Every standard gate of qelib1.inc and stdgates.inc against its published definition,
 * computed independently with dense mathjs matrices.
 *
 * OpenQASM 2.0 (A. W. Cross, L. S. Bishop, J. A. Smolin, J. M. Gambetta, arXiv:1707.03429,
 * 2017): the only primitives are U(θ, φ, λ) = Rz(φ) Ry(θ) Rz(λ) and CX; every header gate is
 * a body of these (bodies below written from memory). With no controlled modifier, a global
 * phase cannot be observed in 2.0, so the bodies are compared with fray's matrices up to one.
 * OpenQASM 3 (A. Cross et al., ACM Trans. Quantum Comput. 3, 12 (2022)): U(θ, φ, λ) =
 * [[cos θ/2, −e^{iλ} sin θ/2], [e^{iφ} sin θ/2, e^{i(φ+λ)} cos θ/2]] and ctrl @ U =
 * |0⟩⟨0| ⊗ I + |1⟩⟨1| ⊗ U (from memory): compared exactly.
 */
import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { builtinGate } from '../../../src/circuit/gates.js';
import { zyzAngles } from '../../../src/circuit/zyz.js';
import { frayGateOf, QELIB1_GATES, STDGATES } from '../../../src/format/qasm/library.js';
import { type CMatrix } from '../../../src/linalg/cmatrix.js';
import { fromMath, toMath } from '../../helpers/mathjs.js';
import { mulberry32 } from '../../helpers/random.js';

/** Entrywise agreement for products of a few dense matrices (double rounding only). */
const TIGHT = 1e-12;
const PI = Math.PI;
const c = (re: number, im = 0): math.Complex => math.complex(re, im);
const cis = (t: number): math.Complex => c(Math.cos(t), Math.sin(t));

/** The 2017 paper's U: Rz(φ) Ry(θ) Rz(λ) with Rz(a) = diag(e^{−ia/2}, e^{ia/2}), Ry(a) = exp(−iaY/2). */
function paperU(t: number, p: number, l: number): math.Matrix {
  const rz = (a: number) => math.matrix([[cis(-a / 2), c(0)], [c(0), cis(a / 2)]]);
  const ry = math.matrix([[c(Math.cos(t / 2)), c(-Math.sin(t / 2))], [c(Math.sin(t / 2)), c(Math.cos(t / 2))]]);
  return math.multiply(rz(p), math.multiply(ry, rz(l))) as math.Matrix;
}

/** The 2022 paper's U, exactly. */
function spec3U(t: number, p: number, l: number): math.Matrix {
  const [co, si] = [Math.cos(t / 2), Math.sin(t / 2)];
  return math.matrix([[c(co), math.multiply(cis(l), -si) as math.Complex], [math.multiply(cis(p), si) as math.Complex, math.multiply(cis(p + l), co) as math.Complex]]);
}

/** A gate on `targets` of an n-qubit block (qubit 0 most significant) by dense Kronecker products and a permutation. */
function onQubits(u: math.Matrix, targets: number[], n: number): math.Matrix {
  const k = targets.length;
  const d = 1 << n;
  const rows: math.Complex[][] = [];
  const U = u.toArray() as unknown as math.Complex[][];
  for (let r = 0; r < d; r++) {
    const row: math.Complex[] = [];
    for (let col = 0; col < d; col++) {
      let restSame = true;
      for (let q = 0; q < n; q++) if (!targets.includes(q) && ((r >> (n - 1 - q)) & 1) !== ((col >> (n - 1 - q)) & 1)) restSame = false;
      if (!restSame) {
        row.push(c(0));
        continue;
      }
      let a = 0;
      let b = 0;
      for (let j = 0; j < k; j++) {
        a = (a << 1) | ((r >> (n - 1 - targets[j]!)) & 1);
        b = (b << 1) | ((col >> (n - 1 - targets[j]!)) & 1);
      }
      row.push(math.complex(U[a]![b]!));
    }
    rows.push(row);
  }
  return math.matrix(rows);
}

const CXm = math.matrix([[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 0, 1], [0, 0, 1, 0]].map((r) => r.map((x) => c(x))));

/** A body of U and CX steps (and previously defined gates) on n qubits, as one matrix (first step acts first). */
type Step = [name: string, targets: number[], ...angles: number[]];
const BODIES: Record<string, { n: number; params: number; body: (a: number[]) => Step[] }> = {
  // qelib1.inc (OpenQASM 2.0), from memory
  u3: { n: 1, params: 3, body: ([t, p, l]) => [['U', [0], t!, p!, l!]] },
  u2: { n: 1, params: 2, body: ([p, l]) => [['U', [0], PI / 2, p!, l!]] },
  u1: { n: 1, params: 1, body: ([l]) => [['U', [0], 0, 0, l!]] },
  cx: { n: 2, params: 0, body: () => [['CX', [0, 1]]] },
  id: { n: 1, params: 0, body: () => [['U', [0], 0, 0, 0]] },
  x: { n: 1, params: 0, body: () => [['U', [0], PI, 0, PI]] },
  y: { n: 1, params: 0, body: () => [['U', [0], PI, PI / 2, PI / 2]] },
  z: { n: 1, params: 0, body: () => [['U', [0], 0, 0, PI]] },
  h: { n: 1, params: 0, body: () => [['U', [0], PI / 2, 0, PI]] },
  s: { n: 1, params: 0, body: () => [['U', [0], 0, 0, PI / 2]] },
  sdg: { n: 1, params: 0, body: () => [['U', [0], 0, 0, -PI / 2]] },
  t: { n: 1, params: 0, body: () => [['U', [0], 0, 0, PI / 4]] },
  tdg: { n: 1, params: 0, body: () => [['U', [0], 0, 0, -PI / 4]] },
  rx: { n: 1, params: 1, body: ([t]) => [['U', [0], t!, -PI / 2, PI / 2]] },
  ry: { n: 1, params: 1, body: ([t]) => [['U', [0], t!, 0, 0]] },
  rz: { n: 1, params: 1, body: ([p]) => [['U', [0], 0, 0, p!]] },
  cz: { n: 2, params: 0, body: () => [['h', [1]], ['CX', [0, 1]], ['h', [1]]] },
  cy: { n: 2, params: 0, body: () => [['sdg', [1]], ['CX', [0, 1]], ['s', [1]]] },
  ch: { n: 2, params: 0, body: () => [['h', [1]], ['sdg', [1]], ['CX', [0, 1]], ['h', [1]], ['t', [1]], ['CX', [0, 1]], ['t', [1]], ['h', [1]], ['s', [1]], ['x', [1]], ['s', [0]]] },
  ccx: { n: 3, params: 0, body: () => [['h', [2]], ['CX', [1, 2]], ['tdg', [2]], ['CX', [0, 2]], ['t', [2]], ['CX', [1, 2]], ['tdg', [2]], ['CX', [0, 2]], ['t', [1]], ['t', [2]], ['h', [2]], ['CX', [0, 1]], ['t', [0]], ['tdg', [1]], ['CX', [0, 1]]] },
  crz: { n: 2, params: 1, body: ([l]) => [['u1', [1], l! / 2], ['CX', [0, 1]], ['u1', [1], -l! / 2], ['CX', [0, 1]]] },
  cu1: { n: 2, params: 1, body: ([l]) => [['u1', [0], l! / 2], ['CX', [0, 1]], ['u1', [1], -l! / 2], ['CX', [0, 1]], ['u1', [1], l! / 2]] },
  cu3: { n: 2, params: 3, body: ([t, p, l]) => [['u1', [0], (l! + p!) / 2], ['u1', [1], (l! - p!) / 2], ['CX', [0, 1]], ['u3', [1], -t! / 2, 0, -(p! + l!) / 2], ['CX', [0, 1]], ['u3', [1], t! / 2, p!, 0]] },
  // gates added to qelib1.inc after the paper (from memory)
  u: { n: 1, params: 3, body: ([t, p, l]) => [['U', [0], t!, p!, l!]] },
  p: { n: 1, params: 1, body: ([l]) => [['U', [0], 0, 0, l!]] },
  sx: { n: 1, params: 0, body: () => [['sdg', [0]], ['h', [0]], ['sdg', [0]]] },
  sxdg: { n: 1, params: 0, body: () => [['s', [0]], ['h', [0]], ['s', [0]]] },
  swap: { n: 2, params: 0, body: () => [['CX', [0, 1]], ['CX', [1, 0]], ['CX', [0, 1]]] },
  cswap: { n: 3, params: 0, body: () => [['CX', [2, 1]], ['ccx', [0, 1, 2]], ['CX', [2, 1]]] },
  crx: { n: 2, params: 1, body: ([l]) => [['u1', [1], PI / 2], ['CX', [0, 1]], ['u3', [1], -l! / 2, 0, 0], ['CX', [0, 1]], ['u3', [1], l! / 2, -PI / 2, 0]] },
  cry: { n: 2, params: 1, body: ([l]) => [['ry', [1], l! / 2], ['CX', [0, 1]], ['ry', [1], -l! / 2], ['CX', [0, 1]]] },
  cp: { n: 2, params: 1, body: ([l]) => [['p', [0], l! / 2], ['CX', [0, 1]], ['p', [1], -l! / 2], ['CX', [0, 1]], ['p', [1], l! / 2]] },
  csx: { n: 2, params: 0, body: () => [['h', [1]], ['cu1', [0, 1], PI / 2], ['h', [1]]] },
  cu: { n: 2, params: 4, body: ([t, p, l, g]) => [['p', [0], g!], ['p', [0], (l! + p!) / 2], ['p', [1], (l! - p!) / 2], ['CX', [0, 1]], ['u', [1], -t! / 2, 0, -(p! + l!) / 2], ['CX', [0, 1]], ['u', [1], t! / 2, p!, 0]] },
  rxx: { n: 2, params: 1, body: ([t]) => [['u3', [0], PI / 2, t!, 0], ['h', [1]], ['CX', [0, 1]], ['u1', [1], -t!], ['CX', [0, 1]], ['h', [1]], ['u2', [0], -PI, PI - t!]] },
  rzz: { n: 2, params: 1, body: ([t]) => [['CX', [0, 1]], ['u1', [1], t!], ['CX', [0, 1]]] },
  c3x: { n: 4, params: 0, body: () => [['h', [3]], ['p', [0], PI / 8], ['p', [1], PI / 8], ['p', [2], PI / 8], ['p', [3], PI / 8], ['CX', [0, 1]], ['p', [1], -PI / 8], ['CX', [0, 1]], ['CX', [1, 2]], ['p', [2], -PI / 8], ['CX', [0, 2]], ['p', [2], PI / 8], ['CX', [1, 2]], ['p', [2], -PI / 8], ['CX', [0, 2]], ['CX', [2, 3]], ['p', [3], -PI / 8], ['CX', [1, 3]], ['p', [3], PI / 8], ['CX', [2, 3]], ['p', [3], -PI / 8], ['CX', [0, 3]], ['p', [3], PI / 8], ['CX', [2, 3]], ['p', [3], -PI / 8], ['CX', [1, 3]], ['p', [3], PI / 8], ['CX', [2, 3]], ['p', [3], -PI / 8], ['CX', [0, 3]], ['h', [3]]] },
};

/** The matrix of a body step: U and CX are primitives; other names expand their own bodies. */
function stepMatrix(name: string, angles: number[]): math.Matrix {
  if (name === 'U') return paperU(angles[0]!, angles[1]!, angles[2]!);
  if (name === 'CX') return CXm;
  const b = BODIES[name]!;
  return bodyMatrix(b.n, b.body(angles));
}

function bodyMatrix(n: number, steps: Step[]): math.Matrix {
  let acc = math.identity(1 << n) as math.Matrix;
  for (const [name, targets, ...angles] of steps) acc = math.multiply(onQubits(stepMatrix(name, angles), targets, n), acc) as math.Matrix;
  return acc;
}

/** max |A − e^{iα}B| with the phase α fitted at B's largest entry. */
function distanceUpToPhase(a: CMatrix, b: CMatrix): number {
  let k = 0;
  for (let i = 0; i < b.data.length / 2; i++) if (Math.hypot(b.data[2 * i]!, b.data[2 * i + 1]!) > Math.hypot(b.data[2 * k]!, b.data[2 * k + 1]!)) k = i;
  const ph = math.divide(math.complex(a.data[2 * k]!, a.data[2 * k + 1]!), math.complex(b.data[2 * k]!, b.data[2 * k + 1]!)) as math.Complex;
  let worst = 0;
  for (let i = 0; i < a.data.length / 2; i++) {
    const bb = math.multiply(ph, math.complex(b.data[2 * i]!, b.data[2 * i + 1]!)) as math.Complex;
    worst = Math.max(worst, Math.hypot(a.data[2 * i]! - bb.re, a.data[2 * i + 1]! - bb.im));
  }
  return worst;
}

const fray = (qasmName: string, angles: number[]): CMatrix => builtinGate(frayGateOf(qasmName))!.matrix(angles);

describe('qelib1.inc against the OpenQASM 2.0 definitions (bodies of U and CX, up to a global phase)', () => {
  const rng = mulberry32(1707);
  const names = QELIB1_GATES.filter((n) => BODIES[n] !== undefined);
  it('covers every header gate fray reads except c4x (a five-qubit body; checked as ctrl⁴ x below)', () => {
    expect(QELIB1_GATES.filter((n) => BODIES[n] === undefined)).toEqual(['c4x']);
  });
  it.each(names)('%s', (name) => {
    const b = BODIES[name]!;
    for (let trial = 0; trial < 3; trial++) {
      const angles = Array.from({ length: b.params }, () => (rng() * 4 - 2) * PI);
      const want = fromMath(bodyMatrix(b.n, b.body(angles)));
      expect(distanceUpToPhase(fray(name, angles), want)).toBeLessThan(TIGHT);
    }
  });
});

describe('stdgates.inc against the OpenQASM 3 definitions (exact, phases included)', () => {
  const rng = mulberry32(2022);
  const I2 = math.identity(2) as math.Matrix;
  const X = spec3U(PI, 0, PI);
  const ctrl = (u: math.Matrix): math.Matrix => {
    const d = u.size()[0]!;
    const out = math.zeros(2 * d, 2 * d) as math.Matrix;
    for (let i = 0; i < d; i++) out.set([i, i], 1);
    for (let r = 0; r < d; r++) for (let col = 0; col < d; col++) out.set([d + r, d + col], u.get([r, col]));
    return out;
  };
  // One-qubit gates as the 2022 paper's U with a global phase e^{iγ} where stdgates adds gphase(γ) (from memory).
  const one: Record<string, (a: number[]) => math.Matrix> = {
    U: ([t, p, l]) => spec3U(t!, p!, l!),
    u3: ([t, p, l]) => spec3U(t!, p!, l!),
    u2: ([p, l]) => spec3U(PI / 2, p!, l!),
    u1: ([l]) => spec3U(0, 0, l!),
    p: ([l]) => spec3U(0, 0, l!),
    phase: ([l]) => spec3U(0, 0, l!),
    id: () => I2,
    x: () => X,
    y: () => spec3U(PI, PI / 2, PI / 2),
    z: () => spec3U(0, 0, PI),
    h: () => spec3U(PI / 2, 0, PI),
    s: () => spec3U(0, 0, PI / 2),
    sdg: () => spec3U(0, 0, -PI / 2),
    t: () => spec3U(0, 0, PI / 4),
    tdg: () => spec3U(0, 0, -PI / 4),
    sx: () => math.multiply(cis(PI / 4), spec3U(PI / 2, -PI / 2, PI / 2)) as math.Matrix,
    rx: ([t]) => math.multiply(cis(0), spec3U(t!, -PI / 2, PI / 2)) as math.Matrix,
    ry: ([t]) => spec3U(t!, 0, 0),
    rz: ([l]) => math.multiply(cis(-l! / 2), spec3U(0, 0, l!)) as math.Matrix,
  };
  const two: Record<string, (a: number[]) => math.Matrix> = {
    cx: () => ctrl(X),
    CX: () => ctrl(X),
    cy: () => ctrl(one['y']!([])),
    cz: () => ctrl(one['z']!([])),
    ch: () => ctrl(one['h']!([])),
    cp: ([l]) => ctrl(one['p']!([l!])),
    cphase: ([l]) => ctrl(one['p']!([l!])),
    crx: ([t]) => ctrl(one['rx']!([t!])),
    cry: ([t]) => ctrl(one['ry']!([t!])),
    crz: ([t]) => ctrl(one['rz']!([t!])),
    cu: ([t, p, l, g]) => ctrl(math.multiply(cis(g!), spec3U(t!, p!, l!)) as math.Matrix),
    swap: () => bodyMatrix(2, [['CX', [0, 1]], ['CX', [1, 0]], ['CX', [0, 1]]]),
    ccx: () => ctrl(ctrl(X)),
    cswap: () => ctrl(bodyMatrix(2, [['CX', [0, 1]], ['CX', [1, 0]], ['CX', [0, 1]]])),
  };
  it('covers every gate of the header', () => {
    expect(STDGATES.filter((n) => one[n] === undefined && two[n] === undefined)).toEqual([]);
  });
  it.each(STDGATES)('%s', (name) => {
    const def = builtinGate(frayGateOf(name))!;
    const make = one[name] ?? two[name]!;
    for (let trial = 0; trial < 3; trial++) {
      const angles = def.params.map(() => (rng() * 4 - 2) * PI);
      const want = fromMath(make(angles));
      const got = def.matrix(angles);
      let worst = 0;
      for (let i = 0; i < got.data.length; i++) worst = Math.max(worst, Math.abs(got.data[i]! - want.data[i]!));
      expect(worst).toBeLessThan(TIGHT);
    }
  });
  it('c3x and c4x are X with three and four controls (ctrl @ ctrl @ … x, the 2022 modifier semantics)', () => {
    const want4 = fromMath(ctrl(ctrl(ctrl(X))));
    const want5 = fromMath(ctrl(ctrl(ctrl(ctrl(X)))));
    expect(distanceUpToPhase(fray('c3x', []), want4)).toBeLessThan(TIGHT);
    expect(Math.max(...Array.from(fray('c4x', []).data, (x, i) => Math.abs(x - want5.data[i]!)))).toBeLessThan(TIGHT);
  });
});

describe('u3, u2, u1 and U against fray’s u and p', () => {
  const rng = mulberry32(3);
  it('u3(θ, φ, λ) = u(θ, φ, λ) and U = u exactly; u1(λ) = p(λ) exactly (OpenQASM 3 phases)', () => {
    for (let k = 0; k < 10; k++) {
      const [t, p, l] = [rng() * 6, rng() * 6, rng() * 6];
      expect(Array.from(fray('u3', [t, p, l]).data)).toEqual(Array.from(builtinGate('u')!.matrix([t, p, l]).data));
      expect(Array.from(fray('U', [t, p, l]).data)).toEqual(Array.from(builtinGate('u')!.matrix([t, p, l]).data));
      expect(Array.from(fray('u1', [l]).data)).toEqual(Array.from(builtinGate('p')!.matrix([l]).data));
      expect(Array.from(fray('u2', [p, l]).data)).toEqual(Array.from(builtinGate('u')!.matrix([PI / 2, p, l]).data));
    }
  });
  it('the 2017 U = Rz(φ)Ry(θ)Rz(λ) is e^{−i(φ+λ)/2} · u(θ, φ, λ), and its u1(λ) = U(0,0,λ) is e^{−iλ/2} · p(λ)', () => {
    for (let k = 0; k < 10; k++) {
      const [t, p, l] = [rng() * 6, rng() * 6, rng() * 6];
      const u = toMath(builtinGate('u')!.matrix([t, p, l]));
      const d = math.subtract(paperU(t, p, l), math.multiply(cis(-(p + l) / 2), u)) as math.Matrix;
      expect(math.max(math.abs(d) as unknown as math.Matrix) as unknown as number).toBeLessThan(TIGHT);
      const d1 = math.subtract(paperU(0, 0, l), math.multiply(cis(-l / 2), toMath(builtinGate('p')!.matrix([l])))) as math.Matrix;
      expect(math.max(math.abs(d1) as unknown as math.Matrix) as unknown as number).toBeLessThan(TIGHT);
    }
  });
});

describe('ZYZ decomposition of one-qubit unitaries', () => {
  it('U = e^{iα} u(θ, φ, λ) for seeded random unitaries (QR of a random matrix) and the edge cases θ = 0, π', () => {
    const rng = mulberry32(411);
    const cases: math.Matrix[] = [spec3U(0, 0, 0.7), spec3U(PI, 0, 1.3), spec3U(PI, 2, 1.3), math.identity(2) as math.Matrix];
    for (let k = 0; k < 20; k++) {
      const m = math.matrix([[c(rng() - 0.5, rng() - 0.5), c(rng() - 0.5, rng() - 0.5)], [c(rng() - 0.5, rng() - 0.5), c(rng() - 0.5, rng() - 0.5)]]);
      cases.push(math.qr(m).Q as math.Matrix);
    }
    for (const m of cases) {
      const u = fromMath(m);
      const z = zyzAngles(u);
      const back = math.multiply(cis(z.phase), toMath(builtinGate('u')!.matrix([z.theta, z.phi, z.lambda]))) as math.Matrix;
      const d = math.subtract(back, m) as math.Matrix;
      expect(math.max(math.abs(d) as unknown as math.Matrix) as unknown as number).toBeLessThan(TIGHT);
    }
  });
});
