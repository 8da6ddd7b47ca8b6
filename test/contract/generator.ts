/**
 * Seeded generator of random valid circuits (1–6 qubits) for the contract oracle: every
 * built-in gate, custom matrix / composite gates, custom Kraus channels, idle, barrier,
 * reset, terminal measure (also early, partial, and none), standalone noise steps, per-step
 * `noise:` replace and `noise: none`, inline profile and/or a device file, qubit labels,
 * every noise kind, thermal relaxation with t1/t2/excited, readout, the three precedence
 * levels, both schedules, `idle: thermal | none`, and `observe:`.
 *
 * Each case also lists the feature tags it exercises, so a test can check coverage.
 */
import { gaussian, mulberry32, pick, shuffle, toYaml } from './helpers.js';

/** One generated case: the circuit text, the device profile text (if any) and its relative path. */
export interface GeneratedCase {
  readonly seed: number;
  readonly circuitYaml: string;
  readonly devicePath?: string;
  readonly deviceYaml?: string;
  readonly features: ReadonlySet<string>;
}

type Dict = Record<string, unknown>;
type Rng = () => number;

const ONE_QUBIT_FIXED = ['i', 'id', 'x', 'y', 'z', 'h', 's', 'sdg', 't', 'tdg', 'sx', 'sxdg'];
const ONE_QUBIT_ANGLE = ['rx', 'ry', 'rz', 'p'];
const TWO_QUBIT_FIXED = ['cx', 'cy', 'cz', 'ch', 'swap', 'iswap'];
const TWO_QUBIT_ANGLE = ['cp', 'crx', 'cry', 'crz', 'rxx', 'ryy', 'rzz'];
const THREE_QUBIT = ['ccx', 'cswap'];
const LABEL_POOL = ['a', 'b', 'anc', 'data', 'flag', 'qa', 'qb', 'm_1', 'm_2', 'aux'];

function uniform(rng: Rng, lo: number, hi: number): number {
  return lo + (hi - lo) * rng();
}

/** Random complex d×m matrix with orthonormal columns (Gram–Schmidt on Gaussian columns). */
function randomIsometry(rng: Rng, rows: number, cols: number): [number, number][][] {
  const cols_: [number, number][][] = [];
  for (let c = 0; c < cols; c++) {
    let v: [number, number][] = Array.from({ length: rows }, () => [gaussian(rng), gaussian(rng)] as [number, number]);
    for (let pass = 0; pass < 2; pass++) {
      for (const u of cols_) {
        // v -= <u, v> u
        let ir = 0;
        let ii = 0;
        for (let i = 0; i < rows; i++) {
          ir += u[i]![0] * v[i]![0] + u[i]![1] * v[i]![1];
          ii += u[i]![0] * v[i]![1] - u[i]![1] * v[i]![0];
        }
        v = v.map(([a, b], i) => [a - (ir * u[i]![0] - ii * u[i]![1]), b - (ir * u[i]![1] + ii * u[i]![0])]);
      }
    }
    const nrm = Math.sqrt(v.reduce((s, [a, b]) => s + a * a + b * b, 0));
    cols_.push(v.map(([a, b]) => [a / nrm, b / nrm]));
  }
  // rows × cols matrix
  return Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => cols_[c]![r]!));
}

/** A complex entry as the contract's complex string (`"0.5-0.25i"`), fixed-point so no exponent. */
function complexString([re, im]: [number, number]): string {
  return `${re.toFixed(18)}${im < 0 ? '-' : '+'}${Math.abs(im).toFixed(18)}i`;
}

function randomUnitaryYaml(rng: Rng, k: number): (string | number)[][] {
  const d = 1 << k;
  return randomIsometry(rng, d, d).map((row) => row.map((e) => complexString(e)));
}

/**
 * Kraus set of the channel (1 − w)·id + w·R on k qubits, R a random channel with m operators
 * (blocks of a random isometry): operators √(1 − w)·I and √w·R_j (w = 1: R alone).
 */
function randomKrausYaml(rng: Rng, k: number, m: number, w: number): (string | number)[][][] {
  const d = 1 << k;
  const v = randomIsometry(rng, m * d, d);
  const ops = Array.from({ length: m }, (_, j) => v.slice(j * d, (j + 1) * d).map((row) => row.map(([a, b]) => [a * Math.sqrt(w), b * Math.sqrt(w)] as [number, number])));
  if (w < 1) ops.unshift(Array.from({ length: d }, (_, r) => Array.from({ length: d }, (_, c) => [r === c ? Math.sqrt(1 - w) : 0, 0] as [number, number])));
  return ops.map((op) => op.map((row) => row.map((e) => (e[1] === 0 && (e[0] === 0 || rng() < 0.5) ? e[0] : complexString(e)))));
}

/** A duration in ns written with a random unit. */
function durationText(rng: Rng, ns: number): string {
  const u = rng();
  if (u < 0.55) return `${ns}ns`;
  if (u < 0.85) return `${ns / 1000}us`;
  if (u < 0.95) return `${ns / 1000}µs`;
  return `${ns / 1e6}ms`;
}

/** Options of the generator. */
export interface GeneratorOptions {
  /** Maximum number of qubits (default 6). */
  readonly maxQubits?: number;
  /** Minimum number of qubits (default 1). */
  readonly minQubits?: number;
}

/** Builds the random case of one seed. */
export function generateCase(seed: number, options: GeneratorOptions = {}): GeneratedCase {
  const rng = mulberry32(seed * 7919 + 17);
  const features = new Set<string>();
  const maxQ = options.maxQubits ?? 6;
  const minQ = options.minQubits ?? 1;
  const nChoices = [1, 2, 2, 2, 3, 3, 3, 4, 4, 5, 6, 7, 8].filter((x) => x <= maxQ && x >= minQ);
  const n = pick(rng, nChoices);
  features.add(`qubits:${n}`);
  const labels = rng() < 0.25 ? shuffle(rng, LABEL_POOL).slice(0, n) : undefined;
  if (labels) features.add('labels');
  const ref = (q: number): number | string => (labels && rng() < 0.6 ? labels[q]! : q);

  // --- custom gates and channels
  const gates: Dict = {};
  const customGateArity = new Map<string, number>();
  if (rng() < 0.45) {
    gates.u1 = { matrix: randomUnitaryYaml(rng, 1) };
    customGateArity.set('u1', 1);
    features.add('custom-gate-1');
  }
  if (n >= 2 && rng() < 0.35) {
    gates.u2 = { matrix: randomUnitaryYaml(rng, 2) };
    customGateArity.set('u2', 2);
    features.add('custom-gate-2');
  }
  if (n >= 3 && rng() < 0.1) {
    gates.u3 = { matrix: randomUnitaryYaml(rng, 3) };
    customGateArity.set('u3', 3);
    features.add('custom-gate-3');
  }
  // circuit params, used by some angles as `a` / `-b` (and shadowed inside a composite)
  const circuitParams: Record<string, number> | undefined = rng() < 0.3 ? { a: uniform(rng, -3, 3), b: uniform(rng, -3, 3) } : undefined;
  const angleText = (): number | string => {
    if (circuitParams && rng() < 0.35) {
      features.add('circuit-params');
      return pick(rng, ['a', '-a', 'b', '-b']);
    }
    return uniform(rng, -4, 4);
  };
  let compParams = 0;
  if (rng() < 0.3) {
    const k = n >= 2 ? 2 : 1;
    const params = rng() < 0.5 ? (rng() < 0.5 ? ['a'] : ['a', 'c']) : [];
    compParams = params.length;
    const steps: Dict[] = [];
    const len = 1 + Math.floor(rng() * 3);
    const innerAngle = (): number | string => (params.length > 0 && rng() < 0.7 ? pick(rng, params.flatMap((p) => [p, `-${p}`])) : uniform(rng, -3, 3));
    for (let i = 0; i < len; i++) {
      if (k === 2 && rng() < 0.4) steps.push({ [pick(rng, TWO_QUBIT_FIXED)]: rng() < 0.5 ? [0, 1] : [1, 0] });
      else if (rng() < 0.6) steps.push({ [pick(rng, ONE_QUBIT_ANGLE)]: Math.floor(rng() * k), angle: innerAngle() });
      else steps.push({ [pick(rng, ONE_QUBIT_FIXED)]: Math.floor(rng() * k) });
    }
    gates.comp = params.length > 0 ? { qubits: k, params, steps } : { qubits: k, steps };
    customGateArity.set('comp', k);
    features.add(params.length > 0 ? 'composite-gate-params' : 'composite-gate');
  }
  const channels: Dict = {};
  const channelArity = new Map<string, number>();
  // near-identity channels (mixtures of identity and a random channel) go anywhere; the
  // fully random `wild1` only where no `error:` is solved (see the suspected-bug test)
  if (rng() < 0.5) {
    channels.leak1 = { kraus: randomKrausYaml(rng, 1, 2 + Math.floor(rng() * 2), uniform(rng, 0.02, 0.3)) };
    channelArity.set('leak1', 1);
    features.add('custom-channel-1');
  }
  if (n >= 2 && rng() < 0.3) {
    channels.mix2 = { kraus: randomKrausYaml(rng, 2, 2 + Math.floor(rng() * 3), uniform(rng, 0.02, 0.3)) };
    channelArity.set('mix2', 2);
    features.add('custom-channel-2');
  }
  const wild = rng() < 0.25;
  if (wild) {
    channels.wild1 = { kraus: randomKrausYaml(rng, 1, 1 + Math.floor(rng() * 3), 1) };
    features.add('custom-channel-wild');
  }

  /** Random noise kinds for something acting on k qubits. */
  const randomKinds = (k: number, allowError: boolean): Dict => {
    const kinds: Dict = {};
    const count = 1 + Math.floor(rng() * 3);
    for (let i = 0; i < count; i++) {
      const kind = pick(rng, [
        'error',
        'depolarizing',
        'amplitude_damping',
        'phase_damping',
        'bit_flip',
        'phase_flip',
        'bit_phase_flip',
        'pauli',
        'channel',
      ]);
      if (kind === 'error') {
        if (!allowError || kinds.depolarizing !== undefined) continue;
        kinds.error = uniform(rng, 0.001, 0.06);
      } else if (kind === 'depolarizing') {
        if (kinds.error !== undefined) continue;
        kinds.depolarizing = uniform(rng, 0, 0.1);
      } else if (kind === 'pauli') {
        const p: Dict = {};
        for (const ax of ['x', 'y', 'z']) if (rng() < 0.6) p[ax] = uniform(rng, 0, 0.05);
        if (Object.keys(p).length === 0) p.z = 0.02;
        kinds.pauli = p;
      } else if (kind === 'channel') {
        const fits = [...channelArity].filter(([, a]) => a === 1 || a === k).map(([nm]) => nm);
        if (wild && !allowError) fits.push('wild1');
        if (fits.length === 0) continue;
        kinds.channel = pick(rng, fits);
      } else {
        kinds[kind] = uniform(rng, 0, kind === 'amplitude_damping' || kind === 'phase_damping' ? 0.15 : 0.06);
      }
      features.add(`kind:${kind}`);
    }
    if (Object.keys(kinds).length === 0) {
      kinds.bit_flip = uniform(rng, 0, 0.05);
      features.add('kind:bit_flip');
    }
    return kinds;
  };

  // --- steps
  const steps: Dict[] = [];
  const live = new Set(Array.from({ length: n }, (_, i) => i)); // qubits not yet measured
  const usedApps: { name: string; qubits: number[] }[] = [];
  let resets = 0;
  const nSteps = 3 + Math.floor(rng() * 11);
  const randomQubits = (k: number): number[] => shuffle(rng, [...live]).slice(0, k);
  for (let s = 0; s < nSteps; s++) {
    const liveList = [...live];
    const L = liveList.length;
    if (L === 0) break;
    const r = rng();
    let step: Dict | undefined;
    if (r < 0.28) {
      // 1-qubit built-in
      const angled = rng() < 0.45;
      const name = angled ? (rng() < 0.2 ? 'u' : pick(rng, ONE_QUBIT_ANGLE)) : pick(rng, ONE_QUBIT_FIXED);
      const u = rng();
      let target: unknown;
      let qs: number[];
      if (u < 0.6) {
        qs = randomQubits(1);
        target = ref(qs[0]!);
      } else if (u < 0.8 || live.size !== n) {
        qs = randomQubits(1 + Math.floor(rng() * L));
        target = qs.map(ref);
        features.add('list-of-1q');
      } else {
        qs = [...liveList];
        target = 'all';
        features.add('target-all');
      }
      step = { [name]: target };
      if (name === 'u') step.angles = [angleText(), angleText(), angleText()];
      else if (angled) step.angle = angleText();
      for (const q of qs) usedApps.push({ name, qubits: [q] });
      features.add(`gate:${name}`);
    } else if (r < 0.48 && L >= 2) {
      const name = rng() < 0.5 ? pick(rng, TWO_QUBIT_FIXED) : pick(rng, TWO_QUBIT_ANGLE);
      if (rng() < 0.3) {
        const count = 2 + Math.floor(rng() * 2);
        const groups = Array.from({ length: count }, () => randomQubits(2));
        step = { [name]: groups.map((g) => g.map(ref)) };
        for (const g of groups) usedApps.push({ name, qubits: g });
        features.add('multi-application');
      } else {
        const g = randomQubits(2);
        step = { [name]: g.map(ref) };
        usedApps.push({ name, qubits: g });
      }
      if (TWO_QUBIT_ANGLE.includes(name)) step.angle = angleText();
      features.add(`gate:${name}`);
    } else if (r < 0.53 && L >= 3) {
      const name = pick(rng, THREE_QUBIT);
      const g = randomQubits(3);
      step = { [name]: g.map(ref) };
      usedApps.push({ name, qubits: g });
      features.add(`gate:${name}`);
    } else if (r < 0.62 && customGateArity.size > 0) {
      const [name, k] = pick(rng, [...customGateArity]);
      if (k > L) continue;
      const g = randomQubits(k);
      step = { [name]: k === 1 ? ref(g[0]!) : g.map(ref) };
      if (name === 'comp' && compParams === 1) step.angle = angleText();
      if (name === 'comp' && compParams === 2) step.angles = [angleText(), angleText()];
      usedApps.push({ name, qubits: g });
      features.add(name === 'comp' ? 'use:composite' : `use:custom-${k}`);
    } else if (r < 0.71) {
      const qs = randomQubits(1 + Math.floor(rng() * L));
      const ns = 50 * (1 + Math.floor(rng() * 40));
      step = { idle: qs.length === 1 ? ref(qs[0]!) : qs.map(ref), for: durationText(rng, ns) };
      features.add('idle');
    } else if (r < 0.76) {
      if (live.size === n && rng() < 0.6) step = { barrier: 'all' };
      else step = { barrier: randomQubits(Math.max(1, Math.floor(rng() * (L + 1)))).map(ref) };
      features.add('barrier');
    } else if (r < 0.82) {
      if (resets >= 3) continue;
      resets++;
      const q = randomQubits(1)[0]!;
      step = { reset: ref(q) };
      features.add('reset');
      if (rng() < 0.3) {
        step.noise = randomKinds(1, false);
        features.add('reset-noise-override');
      }
    } else if (r < 0.92) {
      // standalone noise step
      const twoQ = L >= 2 && rng() < 0.35;
      if (twoQ) {
        const kinds: Dict = {};
        const two = [...channelArity].filter(([, a]) => a === 2).map(([nm]) => nm);
        if (two.length > 0 && rng() < 0.5) {
          kinds.channel = two[0];
          features.add('standalone-channel-2');
        } else {
          kinds.depolarizing = uniform(rng, 0, 0.2);
          features.add('standalone-depolarizing-k');
        }
        const groups = [randomQubits(2)];
        if (L >= 4 && rng() < 0.3) groups.push(randomQubits(2));
        step = { noise: kinds, on: groups.map((g) => g.map(ref)) };
      } else {
        const qs = randomQubits(1 + Math.floor(rng() * Math.min(L, 3)));
        const kinds = randomKinds(1, false);
        if (typeof kinds.channel === 'string' && channelArity.get(kinds.channel) === 2) delete kinds.channel;
        if (Object.keys(kinds).length === 0) kinds.phase_flip = 0.03;
        step = { noise: kinds, on: qs.length === 1 && rng() < 0.5 ? ref(qs[0]!) : qs.map(ref) };
      }
      features.add('standalone-noise');
    } else if (r < 0.96 && L >= 1 && n >= 2) {
      // early measurement of one qubit; nothing touches it afterwards
      const q = randomQubits(1)[0]!;
      step = { measure: ref(q) };
      live.delete(q);
      features.add('early-measure');
    } else {
      continue;
    }
    if (step && rng() < 0.15) step.label = `step ${s}`;
    if (step) steps.push(step);
  }
  // per-step noise annotations on gate steps
  for (const step of steps) {
    const action = Object.keys(step).find((k) => !['angle', 'angles', 'noise', 'for', 'on', 'label'].includes(k))!;
    if (['idle', 'barrier', 'reset', 'measure'].includes(action) || action === undefined) continue;
    const u = rng();
    if (u < 0.18) {
      const k = BUILTIN_ARITY[action] ?? customGateArity.get(action) ?? 1;
      step.noise = randomKinds(k, true);
      features.add('step-noise-replace');
    } else if (u < 0.26) {
      step.noise = 'none';
      features.add('step-noise-none');
    }
  }
  // final measurement
  const mu = rng();
  if (mu < 0.2 && !features.has('early-measure')) {
    features.add('no-measure');
  } else if (mu < 0.55 && live.size === n) {
    steps.push({ measure: 'all' });
    features.add('measure-all');
  } else if (live.size > 0) {
    const rest = shuffle(rng, [...live]);
    const cut = Math.floor(rng() * (rest.length + 1));
    const first = rest.slice(0, cut);
    const second = rest.slice(cut).filter(() => rng() < 0.7);
    if (first.length > 0) steps.push({ measure: first.length === 1 ? ref(first[0]!) : first.map(ref) });
    if (second.length > 0) steps.push({ measure: second.map(ref) });
    features.add('measure-partial');
  }

  // --- noise profile
  const profile: Dict = {};
  const qubitsP: Dict = {};
  if (rng() < 0.9) {
    const all: Dict = {};
    let t1All: number | undefined;
    let t2All: number | undefined;
    if (rng() < 0.85) {
      t1All = 100 * (10 + Math.floor(rng() * 390)); // 1 .. 40 us in ns
      all.t1 = durationText(rng, t1All);
      features.add('t1');
      if (rng() < 0.7) {
        t2All = Math.round(t1All * uniform(rng, 0.1, 2));
        all.t2 = durationText(rng, t2All);
        features.add('t2');
      } else features.add('t2-default');
      if (rng() < 0.45) {
        all.excited = uniform(rng, 0, 0.2);
        features.add('excited');
      }
    } else if (rng() < 0.5) {
      t2All = 100 * (10 + Math.floor(rng() * 390));
      all.t2 = durationText(rng, t2All);
      features.add('t2-without-t1');
    }
    if (rng() < 0.6) {
      all.readout = rng() < 0.5 ? uniform(rng, 0, 0.06) : { zero_as_one: uniform(rng, 0, 0.05), one_as_zero: uniform(rng, 0, 0.08) };
      features.add(typeof all.readout === 'number' ? 'readout-symmetric' : 'readout-asymmetric');
    }
    if (Object.keys(all).length > 0) qubitsP.all = all;
    for (let q = 0; q < n; q++) {
      if (rng() > 0.3) continue;
      const o: Dict = {};
      if (rng() < 0.6) {
        const t1 = 100 * (10 + Math.floor(rng() * 390));
        o.t1 = durationText(rng, t1);
        // the merged t2 (from `all`, when given there) must stay ≤ 2·t1
        if (rng() < 0.5 || (t2All !== undefined && t2All > 2 * t1)) o.t2 = durationText(rng, Math.round(t1 * uniform(rng, 0.1, 2)));
      }
      if (rng() < 0.3) o.excited = uniform(rng, 0, 0.1);
      if (rng() < 0.3) o.readout = uniform(rng, 0, 0.05);
      if (Object.keys(o).length === 0) continue;
      qubitsP[labels && rng() < 0.5 ? labels[q]! : String(q)] = o;
      features.add('qubit-override');
    }
    if (Object.keys(qubitsP).length > 0) profile.qubits = qubitsP;
  }
  const gatesP: Dict = {};
  if (rng() < 0.8) {
    const all: Dict = { duration: durationText(rng, 10 * (2 + Math.floor(rng() * 6))) };
    if (rng() < 0.25) {
      Object.assign(all, randomKinds(1, true));
      features.add('all-noise');
    }
    gatesP.all = all;
  }
  const usedNames = [...new Set(usedApps.map((a) => a.name))];
  for (const name of usedNames) {
    if (rng() > 0.5) continue;
    const k = BUILTIN_ARITY[name] ?? customGateArity.get(name) ?? 1;
    const e: Dict = {};
    if (rng() < 0.7) e.duration = durationText(rng, 10 * (2 + Math.floor(rng() * (k === 1 ? 8 : 40))));
    if (rng() < 0.2) {
      e.thermal = false;
      features.add('thermal-false');
    }
    if (rng() < 0.7) Object.assign(e, randomKinds(k, true));
    gatesP[name] = e;
    features.add('name-entry');
  }
  for (const app of shuffle(rng, usedApps).slice(0, 2)) {
    if (rng() > 0.4) continue;
    const k = app.qubits.length;
    const e: Dict = {};
    if (rng() < 0.5) e.duration = durationText(rng, 10 * (2 + Math.floor(rng() * 30)));
    if (rng() < 0.8) Object.assign(e, randomKinds(k, true));
    const key = [app.name, ...app.qubits.map((q) => (labels && rng() < 0.5 ? labels[q]! : String(q)))].join(' ');
    gatesP[key] = e;
    features.add('tuple-entry');
  }
  if (rng() < 0.7) gatesP.measure = { duration: durationText(rng, 100 * (1 + Math.floor(rng() * 20))) };
  if (rng() < 0.6) {
    const e: Dict = { duration: durationText(rng, 50 * (1 + Math.floor(rng() * 20))) };
    if (rng() < 0.4) {
      Object.assign(e, randomKinds(1, false));
      features.add('reset-entry-noise');
    }
    gatesP.reset = e;
  }
  if (Object.keys(gatesP).length > 0) profile.gates = gatesP;
  const iu = rng();
  if (iu < 0.3) {
    profile.idle = 'none';
    features.add('idle:none');
  } else if (iu < 0.55) {
    profile.idle = 'thermal';
    features.add('idle:thermal');
  } else features.add('idle:thermal');
  const su = rng();
  if (su < 0.45) {
    profile.schedule = 'alap';
    features.add('schedule:alap');
  } else if (su < 0.7) {
    profile.schedule = 'asap';
    features.add('schedule:asap');
  } else features.add('schedule:asap');

  // --- where the profile goes: device file, inline, or both (disjoint top-level fields)
  let device: Dict | undefined;
  let inline: Dict | undefined;
  const pu = rng();
  if (pu < 0.4) {
    device = profile;
    features.add('device');
  } else if (pu < 0.75) {
    inline = profile;
    features.add('inline');
  } else {
    device = { name: 'generated device (invented)' };
    inline = {};
    for (const [k, v] of Object.entries(profile)) {
      if (rng() < 0.5) device[k] = v;
      else inline[k] = v;
    }
    features.add('device+inline');
  }

  const circuit: Dict = {};
  if (rng() < 0.7) circuit.name = `random case ${seed}`;
  circuit.qubits = labels ?? n;
  if (circuitParams) circuit.params = circuitParams;
  const devicePath = device ? `devices/dev-${seed}.yaml` : undefined;
  if (devicePath) circuit.device = devicePath;
  if (inline && Object.keys(inline).length > 0) circuit.noise = inline;
  if (Object.keys(gates).length > 0) circuit.gates = gates;
  if (Object.keys(channels).length > 0) circuit.channels = channels;
  if (rng() < 0.35) {
    const count = 1 + Math.floor(rng() * 2);
    circuit.observe = Array.from({ length: count }, () => Array.from({ length: n }, () => pick(rng, ['I', 'X', 'Y', 'Z'])).join(''));
    features.add('observe');
  }
  circuit.steps = steps;
  return {
    seed,
    circuitYaml: `# generated by test/contract/generator.ts, seed ${seed}\n${toYaml(circuit)}`,
    ...(devicePath ? { devicePath, deviceYaml: toYaml(device) } : {}),
    features,
  };
}

const BUILTIN_ARITY: Readonly<Record<string, number>> = Object.fromEntries([
  ...[...ONE_QUBIT_FIXED, ...ONE_QUBIT_ANGLE, 'u'].map((g) => [g, 1] as const),
  ...[...TWO_QUBIT_FIXED, ...TWO_QUBIT_ANGLE].map((g) => [g, 2] as const),
  ...THREE_QUBIT.map((g) => [g, 3] as const),
]);
