/**
 * An independent, deliberately plain implementation of fray's format version 2 — issue 7
 * (coherent device noise: detuning, ZZ couplings, the coupling map, coherent gate error, the
 * event timing model) and issue 8 (mid-circuit measurement into classical bits, conditions,
 * latency, the branch ensemble, results in record mode) — written from the issue texts only,
 * without reading fray's implementation. It extends the version-1 oracle (`reference.ts`),
 * whose dense whole-register primitives it reuses: slow, but each step is its definition.
 *
 * Conventions as in `reference.ts` (qubit 0 most significant; first target the leftmost
 * factor; durations in ns). Frequencies are kept in Hz, so a phase over τ ns is 2π·δ·τ·1e-9.
 *
 * Readings chosen where the issue texts are ambiguous (the most literal one each time):
 *  R1  Coupling map for a gate of 3 or more qubits: "connected through listed pairs" is read
 *      as: the listed pairs *among the gate's own qubits* connect them (the induced graph is
 *      connected), as "for two qubits: the pair is not listed" says for k = 2. Only gate
 *      applications are checked (not resets, measurements, standalone noise steps).
 *  R2  "When the merged profile has a couplings section": a `couplings:` key in either file,
 *      even one whose device entries were all skipped as beyond the register. (The generator
 *      never produces that edge, nor an empty `couplings: {}`, so the tests do not hinge on it.)
 *  R3  `coherent` in a standalone noise step acts first, then the other kinds in version-1
 *      order (a noise step is an application without U and without duration).
 *  R4  `zz` in a gate entry that also serves 1-qubit gates (`all`) would be an input error
 *      for those; the generator puts `zz` only in entries and steps of 2-qubit applications.
 *  R5  Drift in record mode: no measurement is terminal, so every qubit drifts (and every
 *      pair couples) from t = 0 to the circuit's end, during measurements too; idle relaxation
 *      likewise runs to the circuit's end, and a mid-circuit measurement makes its qubit busy
 *      for its duration (its relaxation for that duration is part of the measurement).
 *  R6  Latency: a step with `if` starts no earlier than, for each bit it reads, the end of the
 *      last earlier measurement that wrote that bit, plus the latency (all of its bits must be
 *      known; the maximum over its bits).
 *  R7  ALAP with classical constraints: every constraint "X_j ≥ Y_i + c" (i before j, X and Y
 *      a start or an end) is mirrored to "Ȳ_i ≥ X̄_j + c" on the reversed program (start and
 *      end swap under t → T − t), scheduled ASAP, and the times are mirrored back.
 *  R8  A failed condition under `idle: thermal` relaxes each qubit of the application for its
 *      duration whatever the gate entry's `thermal:` says (the text names no exception); a
 *      failed reset likewise relaxes for the reset's duration.
 *  R9  The record key while a declared bit is still unwritten: the bit is read as 0 (no
 *      condition can read it before a write, so the placeholder never shows).
 *  R10 The record-mode ideal run branches on the true outcome and records it; its branch
 *      states σ_r are sums over pure vectors (a reset splits a vector in two, as in version 1).
 *  R11 Measurement durations come from the `measure` entry only (no per-qubit tuple entries
 *      for `measure`); the generator writes none.
 *  R12 The error solve includes the coherent part: its channel is U → coherent → thermal for
 *      the gate's duration → the listed kinds, all before the solved depolarizing step.
 *  R13 `split: true` (fray's key, learnt from its error message) in the merged entry of a
 *      composite application runs it as its parts: each part is a gate application of its own
 *      (own entry by its name and mapped qubits, own schedule slot, own coherent/error, own
 *      coupling-map check); the composite as a whole is then not checked against the map. A
 *      step's `noise:` on a split composite would replace each part's kinds (not generated).
 *  R14 `simultaneous: true` in the `measure` entry (fray's key): each measure step is preceded
 *      by a barrier over its qubits, in both schedules (ALAP mirrors it like any barrier).
 */
import type { Dict, Mat, Op, RefApplication, ReferenceResult, Vec } from './reference.js';
import {
  BUILTIN_GATES,
  NOISE_KEYS,
  angleValue,
  applyKraus,
  applyOp,
  applyThermal,
  applyUnitaryToVectors,
  bit,
  circuitSetup,
  durationNs,
  ensembleFidelity,
  fromRows,
  observablesOf,
  remapOp,
  scale,
  solveErrorByBisection,
  terminalDistributions,
  zeros,
} from './reference.js';

// ---------------------------------------------------------------------------------------
// Frequencies and angle expressions
// ---------------------------------------------------------------------------------------

const UNIT_HZ: Readonly<Record<string, number>> = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 };

/** A contract frequency string (`80kHz`, `-1.5MHz`; units Hz, kHz, MHz, GHz) in Hz. */
export function frequencyHz(text: unknown): number {
  if (typeof text !== 'string') throw new Error(`frequency must be a string with a unit: ${String(text)}`);
  const m = /^\s*([+-]?[0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*(Hz|kHz|MHz|GHz)\s*$/.exec(text);
  if (!m) throw new Error(`bad frequency ${text}`);
  return Number(m[1]) * UNIT_HZ[m[2]!]!;
}

// ---------------------------------------------------------------------------------------
// Coherent error and drift (issue 7)
// ---------------------------------------------------------------------------------------

/** exp(−i(a·X + b·Y + c·Z)/2) = cos(θ/2)·I − i·sin(θ/2)·(n̂·σ), θ = |(a, b, c)| (Nielsen & Chuang eq. 4.8). */
export function coherentRotation(a: number, b: number, c: number): Mat {
  const th = Math.hypot(a, b, c);
  const co = Math.cos(th / 2);
  const s = th === 0 ? 0 : Math.sin(th / 2) / th;
  // a·X + b·Y + c·Z = [[c, a − ib], [a + ib, −c]]; multiply by −i·s
  return fromRows([
    [[co, -s * c], [-s * b, -s * a]],
    [[s * b, -s * a], [co, s * c]],
  ]);
}

/** rzz(θ) = exp(−iθ Z⊗Z/2) (the contract's built-in). */
function rzz(theta: number): Mat {
  return BUILTIN_GATES.rzz!.matrix([theta]);
}

/** One drift term: a detuning on qubit a (b undefined, H = π·δ·Z_a) or a ZZ term (H = (π·ζ/2)·Z_a Z_b), in Hz. */
interface DriftTerm {
  readonly a: number;
  readonly b?: number;
  readonly hz: number;
}

/** ρ → UρU† with U = exp(−i·H·τ) for the diagonal H of `terms` (τ in ns). Z eigenvalue +1 on bit 0. */
function applyDrift(rho: Mat, terms: readonly DriftTerm[], tau: number, n: number): Mat {
  const D = rho.d;
  const phase = new Float64Array(D); // −H(i)·τ
  for (let i = 0; i < D; i++) {
    let h = 0;
    for (const t of terms) {
      const za = 1 - 2 * bit(i, t.a, n);
      if (t.b === undefined) h += Math.PI * t.hz * za;
      else h += ((Math.PI * t.hz) / 2) * za * (1 - 2 * bit(i, t.b, n));
    }
    phase[i] = -h * tau * 1e-9;
  }
  const out = zeros(D);
  for (let i = 0; i < D; i++) {
    for (let j = 0; j < D; j++) {
      const ph = phase[i]! - phase[j]!;
      const c = Math.cos(ph);
      const s = Math.sin(ph);
      const k = i * D + j;
      out.re[k] = rho.re[k]! * c - rho.im[k]! * s;
      out.im[k] = rho.re[k]! * s + rho.im[k]! * c;
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------
// The run
// ---------------------------------------------------------------------------------------

/** One scheduled application (times in ns), version 2: the version-1 fields plus its step and the classical bits it reads or writes. */
export interface V2Application extends RefApplication {
  /** Index of the step it comes from (0-based, in file order). */
  readonly step: number;
  /** `if`: every listed bit must hold its value. */
  readonly cond?: Readonly<Record<string, 0 | 1>>;
  /** The bit a record-mode measurement writes. */
  readonly into?: string;
}

/** A coupling-map warning the contract requires: gate, qubits, step (0-based). */
export interface CouplingWarning {
  readonly gate: string;
  readonly qubits: readonly number[];
  readonly step: number;
}

/** The oracle's version-2 result, named after the keys of `fray run --json`: the version-1 result plus the keys below. */
export interface ReferenceResultV2 extends Omit<ReferenceResult, 'applications'> {
  /** Record mode: the record's bit names in order (undefined outside record mode). */
  readonly bits?: string[];
  /** Per-qubit Bloch vectors [⟨X⟩, ⟨Y⟩, ⟨Z⟩], of the ideal and of the noisy state (Σ_r ρ_r in record mode). */
  readonly bloch: { ideal: number[][]; noisy: number[][] };
  /** One per gate application whose qubits the coupling map does not connect. */
  readonly couplingWarnings: CouplingWarning[];
  readonly applications: readonly V2Application[];
  /** The drift terms in force (Hz). */
  readonly drift: readonly DriftTerm[];
}

const NOISE_KEYS_V2 = new Set<string>([...NOISE_KEYS, 'coherent']);

/** The noise-kind fields of a profile entry (version 2: `coherent` included). */
function pickKindsV2(e: Dict): Dict {
  const out: Dict = {};
  for (const [k, v] of Object.entries(e)) if (NOISE_KEYS_V2.has(k)) out[k] = v;
  return out;
}

/** Unordered pair key "a b" with a < b. */
function pairKey(a: number, b: number): string {
  return a < b ? `${a} ${b}` : `${b} ${a}`;
}

/** Runs a version-2 circuit file text (and its device profile text, if it names one) by the contract of issues 7 and 8. */
export function referenceRunV2(circuitText: string, deviceText?: string): ReferenceResultV2 {
  const { doc, labels, n, D, ref, keyQubit, device, schedulePolicy, idlePolicy, thermal, readout, qubitProps, entryFor, circuitParams, stepAngles, customGates, kindOps, listOf } =
    circuitSetup(circuitText, deviceText);

  // --- couplings: device then inline, merged per (unordered) pair and per field
  const d0 = device ?? {};
  const i0 = (doc.noise as Dict | undefined) ?? {};
  const hasCouplings = d0.couplings !== undefined || i0.couplings !== undefined;
  const couplings = new Map<string, Dict>();
  for (const [src, inDevice] of [[d0, true], [i0, false]] as const) {
    for (const [key, v] of Object.entries((src.couplings ?? {}) as Dict)) {
      const qs = key.trim().split(/\s+/).map((tok) => keyQubit(tok));
      if (qs.some((q) => q === undefined || q >= n)) {
        if (inDevice) continue; // beyond the register: skipped in a device file
        throw new Error(`coupling ${key} beyond the register`);
      }
      const pk = pairKey(qs[0]!, qs[1]!);
      couplings.set(pk, { ...(couplings.get(pk) ?? {}), ...((v as Dict | null) ?? {}) });
    }
  }
  // --- drift terms: detuning per qubit (its merged entry), zz per coupled pair
  const drift: DriftTerm[] = [];
  qubitProps.forEach((props, q) => {
    if (props.detuning !== undefined) drift.push({ a: q, hz: frequencyHz(props.detuning) });
  });
  for (const [pk, e] of couplings) {
    if (e.zz === undefined) continue;
    const [a, b] = pk.split(' ').map(Number) as [number, number];
    drift.push({ a, b, hz: frequencyHz(e.zz) });
  }

  /** The coherent part of a set of kinds on k local qubits: a rotation on each, then rzz(d) on a pair. */
  const coherentOps = (kinds: Dict, k: number): Op[] => {
    const c = kinds.coherent as Dict | undefined;
    if (c === undefined) return [];
    const val = (x: unknown): number => (x === undefined ? 0 : angleValue(x, circuitParams));
    const rot = coherentRotation(val(c.x), val(c.y), val(c.z));
    const ops: Op[] = [];
    for (let q = 0; q < k; q++) ops.push({ type: 'kraus', kraus: [rot], targets: [q] });
    if (c.zz !== undefined) {
      if (k !== 2) throw new Error('coherent zz on an application of arity other than 2');
      ops.push({ type: 'kraus', kraus: [rzz(val(c.zz))], targets: [0, 1] });
    }
    return ops;
  };

  // --- steps → applications
  const apps: V2Application[] = [];
  const measuredSet = new Set<number>();
  const warnings: string[] = [];
  const solvedErrors: number[] = [];
  const couplingWarnings: CouplingWarning[] = [];
  let anyMeasure = false;
  const steps = doc.steps as Dict[];
  const recordMode = steps.some((s) => s.measure !== undefined && s.into !== undefined);
  const bitOrder: string[] = Array.isArray(doc.bits) ? (doc.bits as unknown[]).map(String) : [];
  const declaredBits = Array.isArray(doc.bits);
  const MODIFIERS = new Set(['angle', 'angles', 'noise', 'for', 'on', 'label', 'into', 'if']);
  const condOf = (st: Dict): Record<string, 0 | 1> | undefined => {
    if (st.if === undefined) return undefined;
    if (typeof st.if === 'string') return { [st.if]: 1 };
    const c: Record<string, 0 | 1> = {};
    for (const [b, v] of Object.entries(st.if as Dict)) c[b] = Number(v) === 1 ? 1 : 0;
    return c;
  };
  const connected = (qs: readonly number[]): boolean => {
    const seen = new Set([qs[0]!]);
    for (let grew = true; grew; ) {
      grew = false;
      for (const a of qs) for (const b of qs) if (seen.has(a) && !seen.has(b) && couplings.has(pairKey(a, b))) {
        seen.add(b);
        grew = true;
      }
    }
    return qs.every((q) => seen.has(q));
  };

  steps.forEach((step, stepIndex) => {
    const action = Object.keys(step).find((k) => !MODIFIERS.has(k));
    const cond = condOf(step);
    const base = { step: stepIndex, start: 0, end: 0, ...(cond ? { cond } : {}) };
    if (action === undefined) {
      const kinds = step.noise as Dict;
      const on = listOf(step.on);
      const groups: number[][] = on.some(Array.isArray) ? on.map((g) => (g as unknown[]).map(ref)) : on.map((q) => [ref(q)]);
      for (const g of groups) {
        const ops = [...coherentOps(kinds, g.length), ...kindOps(kinds, g.length, false).ops];
        apps.push({ ...base, kind: 'noise', name: 'noise', qubits: g, duration: 0, ops });
      }
      return;
    }
    const target = step[action];
    if (action === 'barrier') {
      apps.push({ ...base, kind: 'barrier', name: 'barrier', qubits: listOf(target).map(ref), duration: 0 });
      return;
    }
    if (action === 'idle') {
      const dur = durationNs(step.for);
      for (const q of listOf(target).map(ref)) apps.push({ ...base, kind: 'idle', name: 'idle', qubits: [q], duration: dur });
      return;
    }
    if (action === 'measure') {
      anyMeasure = true;
      const e = entryFor('measure', []);
      const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
      const qs = listOf(target).map(ref);
      // simultaneous readout: as if a barrier over the step's qubits came first
      if (e.simultaneous === true) apps.push({ ...base, kind: 'barrier', name: 'barrier', qubits: qs, duration: 0 });
      const into = step.into === undefined ? undefined : listOf(step.into).map(String);
      if (into && into.length !== qs.length) throw new Error('into: one bit per target');
      qs.forEach((q, j) => {
        measuredSet.add(q);
        const b = into?.[j];
        if (b !== undefined && !bitOrder.includes(b)) {
          if (declaredBits) throw new Error(`bit ${b} not declared`);
          bitOrder.push(b);
        }
        apps.push({ ...base, kind: 'measure', name: 'measure', qubits: [q], duration: dur, ...(b !== undefined ? { into: b } : {}) });
      });
      return;
    }
    if (action === 'reset') {
      for (const q of listOf(target).map(ref)) {
        const e = entryFor('reset', [q]);
        const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
        const kinds = step.noise === 'none' ? {} : step.noise !== undefined ? (step.noise as Dict) : pickKindsV2(e);
        apps.push({ ...base, kind: 'reset', name: 'reset', qubits: [q], duration: dur, ops: kindOps(kinds, 1, false).ops });
      }
      return;
    }
    /** One gate application: U → coherent → thermal for its duration → listed kinds → solved depolarizing. */
    const pushGate = (name: string, u: Mat, g: readonly number[]): void => {
      const k = g.length;
      if (hasCouplings && k >= 2 && !connected(g)) couplingWarnings.push({ gate: name, qubits: g, step: stepIndex });
      const e = entryFor(name, g);
      const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
      const kinds = step.noise === 'none' ? {} : step.noise !== undefined ? (step.noise as Dict) : pickKindsV2(e);
      const ops: Op[] = [...coherentOps(kinds, k)];
      if (e.thermal !== false) {
        g.forEach((q, local) => {
          const th = thermal[q];
          if (th && dur > 0) ops.push({ type: 'thermal', q: local, th, tau: dur });
        });
      }
      const kn = kindOps(kinds, k, true);
      ops.push(...kn.ops);
      if (kn.error !== undefined) {
        const { p, limited } = solveErrorByBisection(u, ops, k, kn.error);
        solvedErrors.push(p);
        if (limited) warnings.push(`${name} ${g.join(' ')}: error ${kn.error} below the rest of its channel`);
        if (p > 0) ops.push({ type: 'depolarizing', p, targets: Array.from({ length: k }, (_, i) => i) });
      }
      apps.push({ ...base, kind: 'gate', name, qubits: g, duration: dur, unitary: u, ops });
    };
    let k: number;
    let angles: number[];
    const bg = BUILTIN_GATES[action];
    const cg = customGates.get(action);
    if (bg) {
      k = bg.k;
      angles = stepAngles(step, bg.angles, circuitParams);
    } else {
      if (!cg) throw new Error(`unknown gate ${action}`);
      k = cg.k;
      angles = stepAngles(step, cg.params, circuitParams);
    }
    const groups: number[][] =
      k === 1
        ? listOf(target).map((q) => [ref(q)])
        : (target as unknown[]).some(Array.isArray)
          ? (target as unknown[]).map((g) => (g as unknown[]).map(ref))
          : [(target as unknown[]).map(ref)];
    for (const g of groups) {
      if (g.length !== k) throw new Error(`${action} needs ${k} qubits`);
      if (cg?.parts && entryFor(action, g).split === true) {
        // run as its parts: each scheduled and noisy as its own gate under its own entry (R13)
        for (const part of cg.parts(angles)) pushGate(part.name, part.u, part.targets.map((t) => g[t]!));
        continue;
      }
      pushGate(action, bg ? bg.matrix(angles) : cg!.unitary(angles), g);
    }
  });

  // --- schedule: qubit occupancy plus the classical constraints X_j ≥ Y_i + c (record mode)
  const latency = (() => {
    const e = entryFor('measure', []);
    return e.latency !== undefined ? durationNs(e.latency) : 0;
  })();
  interface Constraint {
    readonly from: number;
    readonly fromEdge: 's' | 'e';
    readonly toEdge: 's' | 'e';
    readonly offset: number;
  }
  const cons: Constraint[][] = apps.map(() => []);
  if (recordMode) {
    apps.forEach((a, j) => {
      if (a.cond) {
        for (const b of Object.keys(a.cond)) {
          let last = -1;
          for (let i = 0; i < j; i++) if (apps[i]!.kind === 'measure' && apps[i]!.into === b) last = i;
          if (last < 0) throw new Error(`bit ${b} read before any write`);
          cons[j]!.push({ from: last, fromEdge: 'e', toEdge: 's', offset: latency });
        }
      }
      if (a.kind === 'measure' && a.into !== undefined) {
        for (let i = 0; i < j; i++) {
          const x = apps[i]!;
          if (x.into === a.into || (x.cond && a.into in x.cond)) cons[j]!.push({ from: i, fromEdge: 's', toEdge: 's', offset: 0 });
        }
      }
    });
  }
  const asap = (order: readonly number[], cs: ReadonlyMap<number, Constraint[]>): { s: Map<number, number>; e: Map<number, number>; T: number } => {
    const free = new Array<number>(n).fill(0);
    const s = new Map<number, number>();
    const e = new Map<number, number>();
    for (const idx of order) {
      const a = apps[idx]!;
      let t0 = Math.max(0, ...a.qubits.map((q) => free[q]!));
      for (const c of cs.get(idx) ?? []) {
        const y = (c.fromEdge === 's' ? s : e).get(c.from)! + c.offset;
        t0 = Math.max(t0, c.toEdge === 's' ? y : y - a.duration);
      }
      if (a.kind === 'barrier') {
        for (const q of a.qubits) free[q] = t0;
        s.set(idx, t0);
        e.set(idx, t0);
        continue;
      }
      s.set(idx, t0);
      e.set(idx, t0 + a.duration);
      for (const q of a.qubits) free[q] = t0 + a.duration;
    }
    return { s, e, T: Math.max(0, ...free, ...e.values()) };
  };
  const indices = apps.map((_, i) => i);
  let T: number;
  if (schedulePolicy === 'asap') {
    const byTarget = new Map<number, Constraint[]>(cons.map((c, j) => [j, c]));
    const r = asap(indices, byTarget);
    apps.forEach((a, i) => {
      a.start = r.s.get(i)!;
      a.end = r.e.get(i)!;
    });
    T = r.T;
  } else {
    // mirror: X_j ≥ Y_i + c  →  swap(Y)_i ≥ swap(X)_j + c on the reversed program
    const swap = (x: 's' | 'e'): 's' | 'e' => (x === 's' ? 'e' : 's');
    const mirrored = new Map<number, Constraint[]>();
    cons.forEach((cs, j) => {
      for (const c of cs) {
        const list = mirrored.get(c.from) ?? [];
        list.push({ from: j, fromEdge: swap(c.toEdge), toEdge: swap(c.fromEdge), offset: c.offset });
        mirrored.set(c.from, list);
      }
    });
    const r = asap([...indices].reverse(), mirrored);
    T = r.T;
    apps.forEach((a, i) => {
      a.start = T - r.e.get(i)!;
      a.end = T - r.s.get(i)!;
    });
  }

  // --- the event timeline (issue 7, "When things happen")
  const isOperation = (a: V2Application): boolean => a.kind === 'gate' || a.kind === 'reset' || a.kind === 'noise' || a.kind === 'measure';
  const stop = new Array<number>(n).fill(T); // drift and idle relaxation act on q before stop[q]
  if (!recordMode) for (const a of apps) if (a.kind === 'measure') stop[a.qubits[0]!] = Math.min(stop[a.qubits[0]!]!, a.start);
  const events = [...new Set([0, T, ...apps.filter(isOperation).flatMap((a) => [a.start, a.end])])].sort((x, y) => x - y);
  const busy = (q: number, t0: number, t1: number): boolean => apps.some((a) => isOperation(a) && a.qubits.includes(q) && a.end > a.start && a.start <= t0 && a.end >= t1);
  const bitIndex = new Map(bitOrder.map((b, i) => [b, i]));
  const holds = (key: string, cond: Readonly<Record<string, 0 | 1>> | undefined): boolean =>
    cond === undefined || Object.entries(cond).every(([b, v]) => key[bitIndex.get(b)!] === String(v));
  const setBit = (key: string, b: string, v: number): string => {
    const i = bitIndex.get(b)!;
    return key.slice(0, i) + String(v) + key.slice(i + 1);
  };
  const emptyKey = '0'.repeat(bitOrder.length);

  /** The noisy run: a map record → unnormalised ρ_r; `withReadout` false for `noisy`. */
  const noisyRun = (withReadout: boolean): Map<string, Mat> => {
    let rho = zeros(D);
    rho.re[0] = 1;
    let branches = new Map<string, Mat>([[emptyKey, rho]]);
    const eachBranch = (f: (m: Mat, key: string) => Mat): void => {
      const next = new Map<string, Mat>();
      for (const [k, m] of branches) next.set(k, f(m, k));
      branches = next;
    };
    const relaxAll = (q: number, tau: number, m: Mat): Mat => {
      const th = thermal[q];
      return th && tau > 0 ? applyThermal(m, q, th, tau, n) : m;
    };
    for (let ei = 0; ei < events.length; ei++) {
      const t = events[ei]!;
      if (ei > 0) {
        const t0 = events[ei - 1]!;
        const tau = t - t0;
        const terms = drift.filter((d) => t <= stop[d.a]! && (d.b === undefined || t <= stop[d.b]!));
        if (terms.length > 0) eachBranch((m) => applyDrift(m, terms, tau, n));
        if (idlePolicy === 'thermal') {
          for (let q = 0; q < n; q++) if (t <= stop[q]! && !busy(q, t0, t)) eachBranch((m) => relaxAll(q, tau, m));
        }
      }
      for (const a of apps) {
        if (!isOperation(a) || a.start !== t) continue;
        if (a.kind === 'measure') {
          if (!recordMode) continue; // terminal: the qubit is left alone from here on
          const q = a.qubits[0]!;
          const mask = 1 << (n - 1 - q);
          const e = withReadout ? [readout[q]!.z1, readout[q]!.o0] : [0, 0];
          const next = new Map<string, Mat>();
          for (const [key, m] of branches) {
            for (const outcome of [0, 1]) {
              const proj = zeros(D);
              let tr = 0;
              for (let r = 0; r < D; r++) {
                if (((r & mask) !== 0 ? 1 : 0) !== outcome) continue;
                tr += m.re[r * D + r]!;
                for (let c = 0; c < D; c++) {
                  if (((c & mask) !== 0 ? 1 : 0) !== outcome) continue;
                  proj.re[r * D + c] = m.re[r * D + c]!;
                  proj.im[r * D + c] = m.im[r * D + c]!;
                }
              }
              if (tr <= BRANCH_FLOOR) continue;
              for (const recorded of [0, 1]) {
                const w = recorded === outcome ? 1 - e[outcome]! : e[outcome]!;
                if (w === 0) continue;
                const nk = setBit(key, a.into!, recorded);
                const prev = next.get(nk);
                const add = scale(proj, w);
                if (prev) for (let i = 0; i < D * D; i++) {
                  prev.re[i] += add.re[i]!;
                  prev.im[i] += add.im[i]!;
                }
                else next.set(nk, add);
              }
            }
          }
          branches = next;
          // busy for its duration, relaxing whatever the idle mode
          eachBranch((m) => relaxAll(q, a.duration, m));
          continue;
        }
        eachBranch((m, key) => {
          if (!holds(key, a.cond)) {
            if (idlePolicy !== 'thermal') return m;
            let x = m;
            for (const q of a.qubits) x = relaxAll(q, a.duration, x);
            return x;
          }
          let x = m;
          if (a.kind === 'gate') x = applyKraus(x, [a.unitary!], a.qubits, n);
          if (a.kind === 'reset') x = applyOp(x, { type: 'reset', q: a.qubits[0]! }, n);
          for (const op of a.ops ?? []) x = applyOp(x, remapOp(op, a.qubits), n);
          return x;
        });
      }
    }
    return branches;
  };

  /** The ideal run: per record, an ensemble of unnormalised pure states (no noise, no drift, no readout error). */
  const idealRun = (): Map<string, Vec[]> => {
    const v0 = { re: new Float64Array(D), im: new Float64Array(D) };
    v0.re[0] = 1;
    let branches = new Map<string, Vec[]>([[emptyKey, [v0]]]);
    const norm2 = (w: Vec): number => w.re.reduce((s, x, i) => s + x * x + w.im[i]! ** 2, 0);
    for (const a of [...apps].filter(isOperation).sort((x, y) => x.start - y.start || apps.indexOf(x) - apps.indexOf(y))) {
      if (a.kind === 'gate') {
        for (const [key, vs] of branches) if (holds(key, a.cond)) branches.set(key, applyUnitaryToVectors(vs, a.unitary!, a.qubits, n));
      } else if (a.kind === 'reset' || (a.kind === 'measure' && recordMode)) {
        const mask = 1 << (n - 1 - a.qubits[0]!);
        const next = new Map<string, Vec[]>();
        for (const [key, vs] of branches) {
          if (a.kind === 'reset' && !holds(key, a.cond)) {
            next.set(key, [...(next.get(key) ?? []), ...vs]);
            continue;
          }
          for (const v of vs) {
            for (const outcome of [0, 1]) {
              const w = { re: new Float64Array(D), im: new Float64Array(D) };
              for (let i = 0; i < D; i++) {
                if (((i & mask) !== 0 ? 1 : 0) !== outcome) continue;
                const to = a.kind === 'reset' ? i & ~mask : i;
                w.re[to] = v.re[i]!;
                w.im[to] = v.im[i]!;
              }
              if (norm2(w) <= BRANCH_FLOOR) continue;
              const nk = a.kind === 'measure' ? setBit(key, a.into!, outcome) : key;
              next.set(nk, [...(next.get(nk) ?? []), w]);
            }
          }
        }
        branches = next;
      }
    }
    return branches;
  };

  const ideal = idealRun();
  const full = noisyRun(true);
  const anyReadout = readout.some((r) => r.z1 !== 0 || r.o0 !== 0);
  const noReadout = recordMode && anyReadout ? noisyRun(false) : full;
  const rhoSum = zeros(D);
  for (const m of full.values()) for (let i = 0; i < D * D; i++) {
    rhoSum.re[i] += m.re[i]!;
    rhoSum.im[i] += m.im[i]!;
  }
  const allIdeal = [...ideal.values()].flat();

  const probabilities = { ideal: {} as Record<string, number>, noisy: {} as Record<string, number>, measured: {} as Record<string, number> };
  let classical: number;
  let tvd = 0;
  let fstate: number;
  let measured: number[];
  const keyOf = (s: number, m: number): string => Array.from({ length: m }, (_, j) => String((s >> (m - 1 - j)) & 1)).join('');
  const trace = (m: Mat): number => {
    let t = 0;
    for (let i = 0; i < m.d; i++) t += m.re[i * m.d + i]!;
    return t;
  };
  if (recordMode) {
    measured = [];
    const m = bitOrder.length;
    let fc = 0;
    for (let s = 0; s < 1 << m; s++) {
      const key = keyOf(s, m);
      const pi = (ideal.get(key) ?? []).reduce((acc, v) => acc + v.re.reduce((x, y, i) => x + y * y + v.im[i]! ** 2, 0), 0);
      const pn = noReadout.has(key) ? trace(noReadout.get(key)!) : 0;
      const pm = full.has(key) ? trace(full.get(key)!) : 0;
      probabilities.ideal[key] = pi;
      probabilities.noisy[key] = pn;
      probabilities.measured[key] = pm;
      fc += Math.sqrt(Math.max(0, pi) * Math.max(0, pm));
      tvd += 0.5 * Math.abs(pi - pm);
    }
    classical = fc * fc;
    // fidelity.state = (Σ_r Tr√(√σ_r ρ_r √σ_r))², over the records of the run with readout error
    let root = 0;
    for (const [key, rho] of full) {
      const vs = ideal.get(key);
      if (!vs || vs.length === 0) continue;
      root += Math.sqrt(Math.max(0, ensembleFidelity(vs, rho)));
    }
    fstate = root * root;
  } else {
    measured = anyMeasure ? [...measuredSet].sort((x, y) => x - y) : Array.from({ length: n }, (_, i) => i);
    const rho = full.get(emptyKey)!;
    const d = terminalDistributions(measured, n, allIdeal, rho, readout);
    Object.assign(probabilities, d.probabilities);
    classical = d.classical;
    tvd = d.tvd;
    fstate = ensembleFidelity(allIdeal, rho);
  }

  let purity = 0;
  for (const m of full.values()) for (let i = 0; i < D * D; i++) purity += m.re[i]! ** 2 + m.im[i]! ** 2;

  // Bloch vectors (⟨X⟩, ⟨Y⟩, ⟨Z⟩) per qubit: ⟨X⟩ = 2·Re ρ_01, ⟨Y⟩ = 2·Im ρ_10, ⟨Z⟩ = ρ_00 − ρ_11 (reduced state of the qubit)
  const blochOf = (entry: (r: number, c: number) => [number, number]): number[][] =>
    Array.from({ length: n }, (_, q) => {
      const mask = 1 << (n - 1 - q);
      let x = 0;
      let y = 0;
      let z = 0;
      for (let i = 0; i < D; i++) {
        if (i & mask) {
          z -= entry(i, i)[0];
          continue;
        }
        z += entry(i, i)[0];
        x += 2 * entry(i, i | mask)[0];
        y += 2 * entry(i | mask, i)[1];
      }
      return [x, y, z];
    });
  const bloch = {
    ideal: blochOf((r, c) => {
      let re = 0;
      let im = 0;
      for (const v of allIdeal) {
        // v_r · conj(v_c)
        re += v.re[r]! * v.re[c]! + v.im[r]! * v.im[c]!;
        im += v.im[r]! * v.re[c]! - v.re[r]! * v.im[c]!;
      }
      return [re, im];
    }),
    noisy: blochOf((r, c) => [rhoSum.re[r * D + c]!, rhoSum.im[r * D + c]!]),
  };

  const observables = observablesOf(doc.observe, rhoSum, allIdeal);

  return {
    name: (doc.name as string | undefined) ?? null,
    qubits: n,
    measured,
    ...(labels && !recordMode ? { measured_labels: measured.map((q) => labels[q]!) } : {}),
    ...(recordMode ? { bits: bitOrder } : {}),
    schedule: schedulePolicy,
    duration_ns: T,
    probabilities,
    fidelity: { state: fstate, classical },
    tvd,
    purity,
    bloch,
    ...(observables ? { observables } : {}),
    warnings,
    couplingWarnings,
    solvedErrors,
    applications: apps,
    drift,
  };
}

/** A branch (or ideal vector) of weight at most this is dropped: it is zero up to rounding (weights are probabilities). */
export const BRANCH_FLOOR = 1e-30;

