/**
 * Seeded generator of random valid version-2 circuits for issue 7 (coherent device noise):
 * the version-1 generator's case (every gate, noise kind, schedule, profile placement), to
 * which this adds qubit detuning (every unit, either sign, on `all` and per qubit), a
 * `couplings` map (indices or labels, either order, `zz` or `{}`, split between the device
 * and the inline profile with pairs in both, device entries beyond the register), and
 * `coherent: {x, y, z, zz}` in gate entries, step `noise:` and standalone noise steps
 * (numbers and angle expressions; `zz` only on 2-qubit applications).
 *
 * Each case lists the feature tags it exercises, so a test can check coverage.
 */
import YAML from 'yaml';
import type { GeneratedCase, GeneratorOptions } from './generator.js';
import { generateCase } from './generator.js';
import { mulberry32, pick, toYaml } from './helpers.js';

type Dict = Record<string, unknown>;
type Rng = () => number;

const BUILTIN_ARITY: Readonly<Record<string, number>> = {
  ...Object.fromEntries(['i', 'id', 'x', 'y', 'z', 'h', 's', 'sdg', 't', 'tdg', 'sx', 'sxdg', 'rx', 'ry', 'rz', 'p', 'u'].map((g) => [g, 1])),
  ...Object.fromEntries(['cx', 'cy', 'cz', 'ch', 'cp', 'crx', 'cry', 'crz', 'swap', 'iswap', 'rxx', 'ryy', 'rzz'].map((g) => [g, 2])),
  ccx: 3,
  cswap: 3,
};
const STEP_KEYWORDS = new Set(['idle', 'barrier', 'measure', 'reset']);
const MODIFIERS = new Set(['angle', 'angles', 'noise', 'for', 'on', 'label', 'into', 'if']);

/** A parsed generated case that transforms can extend before it is written out again. */
export interface CaseParts {
  readonly seed: number;
  readonly circuit: Dict;
  /** The device profile (undefined when the case has none). */
  device?: Dict;
  readonly devicePath?: string;
  readonly features: Set<string>;
}

/** Parses a version-1 generated case into editable parts. */
export function partsOf(c: GeneratedCase): CaseParts {
  return {
    seed: c.seed,
    circuit: YAML.parse(c.circuitYaml) as Dict,
    ...(c.deviceYaml !== undefined ? { device: YAML.parse(c.deviceYaml) as Dict, devicePath: c.devicePath! } : {}),
    features: new Set(c.features),
  };
}

/** Writes the parts back as a case. */
export function caseOf(p: CaseParts, header: string): GeneratedCase {
  return {
    seed: p.seed,
    circuitYaml: `# ${header}, seed ${p.seed}\n${toYaml(p.circuit)}`,
    ...(p.device ? { devicePath: p.devicePath!, deviceYaml: toYaml(p.device) } : {}),
    features: p.features,
  };
}

/** The number of qubits and the labels (if any) of a parsed circuit. */
export function registerOf(circuit: Dict): { n: number; labels?: string[] } {
  if (Array.isArray(circuit.qubits)) return { n: circuit.qubits.length, labels: (circuit.qubits as unknown[]).map(String) };
  return { n: circuit.qubits as number };
}

/** The arity of a gate name in a parsed circuit (built-in or custom). */
export function arityOf(circuit: Dict, name: string): number {
  if (BUILTIN_ARITY[name] !== undefined) return BUILTIN_ARITY[name]!;
  const g = ((circuit.gates ?? {}) as Dict)[name] as Dict | undefined;
  if (!g) throw new Error(`unknown gate ${name}`);
  if (g.matrix !== undefined) return Math.round(Math.log2((g.matrix as unknown[]).length));
  return g.qubits as number;
}

/** The action key of a step (undefined for a standalone noise step). */
export function actionOf(step: Dict): string | undefined {
  return Object.keys(step).find((k) => !MODIFIERS.has(k));
}

/** A frequency in Hz written with a random unit and sign kept (no exponent). */
function frequencyText(rng: Rng, hz: number, features: Set<string>): string {
  const unit = pick(rng, ['Hz', 'kHz', 'kHz', 'kHz', 'MHz', 'GHz']);
  features.add(`unit:${unit}`);
  const scale = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 }[unit]!;
  return `${hz / scale}${unit}`;
}

/** A random frequency: 0.5 .. 600 kHz in half-kHz steps, either sign. */
function randomHz(rng: Rng, features: Set<string>): number {
  const hz = 500 * (1 + Math.floor(rng() * 1200));
  if (rng() < 0.35) {
    features.add('frequency-negative');
    return -hz;
  }
  return hz;
}

/** A small coherent angle: a number or an angle expression. */
function coherentAngle(rng: Rng, features: Set<string>): number | string {
  const u = rng();
  if (u < 0.15) {
    features.add('coherent-expression');
    return pick(rng, ['pi/40', '-pi/64', '2deg', '-3.5deg', '0.02*pi', 'sqrt(2)/50', '-(pi/100 + 0.01)']);
  }
  return Math.round((rng() - 0.5) * 0.6 * 1e6) / 1e6;
}

/** A random `coherent` map for an application of k qubits (`zz` only when k = 2). */
function randomCoherent(rng: Rng, k: number, features: Set<string>): Dict {
  const c: Dict = {};
  for (const ax of ['x', 'y', 'z']) if (rng() < 0.5) c[ax] = coherentAngle(rng, features);
  if (k === 2 && rng() < 0.6) c.zz = coherentAngle(rng, features);
  if (Object.keys(c).length === 0) c[k === 2 ? 'zz' : 'x'] = coherentAngle(rng, features);
  for (const ax of Object.keys(c)) features.add(`coherent:${ax}`);
  return c;
}

/** Adds issue-7 drift, couplings and coherent errors to a parsed case (in place). */
export function addCoherentNoise(p: CaseParts, rng: Rng): void {
  const { circuit, features } = p;
  const { n, labels } = registerOf(circuit);
  const qref = (q: number): string => (labels && rng() < 0.5 ? labels[q]! : String(q));
  const inline = (): Dict => (circuit.noise ??= {}) as Dict;
  // where the new keys go: device file, inline, or either per key
  const home = (): Dict => (p.device && (circuit.noise === undefined || rng() < 0.5) ? p.device : inline());

  // --- detuning
  if (rng() < 0.85) {
    if (rng() < 0.6) {
      const prof = home();
      const qs = (prof.qubits ??= {}) as Dict;
      const all = (qs.all ??= {}) as Dict;
      all.detuning = frequencyText(rng, randomHz(rng, features), features);
      features.add('detuning-all');
    }
    for (let q = 0; q < n; q++) {
      if (rng() > 0.35) continue;
      const prof = home();
      const qs = (prof.qubits ??= {}) as Dict;
      const key = qref(q);
      const e = (qs[key] ??= {}) as Dict;
      e.detuning = frequencyText(rng, randomHz(rng, features), features);
      features.add('detuning-qubit');
    }
    if (p.device && rng() < 0.4) {
      const qs = (p.device.qubits ??= {}) as Dict;
      qs[String(n + Math.floor(rng() * 2))] = { detuning: frequencyText(rng, randomHz(rng, features), features) };
      features.add('device-qubit-beyond-register');
    }
  } else features.add('no-detuning');

  // --- couplings: a random connected-ish graph, split between the files
  if (n >= 2 && rng() < 0.7) {
    const perm = [...Array(n).keys()].sort(() => rng() - 0.5);
    const pairs: [number, number][] = [];
    for (let i = 0; i + 1 < n; i++) if (rng() < 0.85) pairs.push([perm[i]!, perm[i + 1]!]);
    for (let extra = 0; extra < 2; extra++) {
      const a = Math.floor(rng() * n);
      const b = Math.floor(rng() * n);
      if (a !== b && !pairs.some(([x, y]) => (x === a && y === b) || (x === b && y === a))) pairs.push([a, b]);
    }
    if (pairs.length === 0) pairs.push([0, 1]);
    const text = (a: number, b: number): string => {
      if (rng() < 0.5) {
        features.add('coupling-reversed');
        return `${qref(b)} ${qref(a)}`;
      }
      return `${qref(a)} ${qref(b)}`;
    };
    for (const [a, b] of pairs) {
      const entry = (): Dict => {
        if (rng() < 0.7) {
          features.add('zz');
          return { zz: frequencyText(rng, randomHz(rng, features), features) };
        }
        features.add('coupling-no-zz');
        return {};
      };
      const u = rng();
      if (p.device && u < 0.45) ((p.device.couplings ??= {}) as Dict)[text(a, b)] = entry();
      else if (p.device && u < 0.6) {
        // in both files: the inline entry merges over the device's per field
        ((p.device.couplings ??= {}) as Dict)[text(a, b)] = entry();
        ((inline().couplings ??= {}) as Dict)[text(a, b)] = entry();
        features.add('coupling-in-both');
      } else ((inline().couplings ??= {}) as Dict)[text(a, b)] = entry();
    }
    if (labels) features.add('coupling-labels');
    if (p.device?.couplings && rng() < 0.4) {
      ((p.device.couplings as Dict)[`${n - 1} ${n}`] = { zz: '300kHz' });
      features.add('device-coupling-beyond-register');
    }
    features.add('couplings');
  } else features.add('no-couplings');

  // --- coherent errors in gate entries (device and inline)
  for (const prof of [p.device, circuit.noise as Dict | undefined]) {
    const gates = prof?.gates as Dict | undefined;
    if (!gates) continue;
    for (const [key, v] of Object.entries(gates)) {
      if (key === 'measure' || key === 'reset' || rng() > 0.35) continue;
      const toks = key.split(/\s+/);
      const k = key === 'all' ? 1 : toks.length > 1 ? toks.length - 1 : arityOf(circuit, toks[0]!);
      (v as Dict).coherent = randomCoherent(rng, k, features);
      features.add(key === 'all' ? 'coherent-all' : toks.length > 1 ? 'coherent-tuple' : 'coherent-name');
      if ((v as Dict).error !== undefined) features.add('coherent+error');
    }
  }
  // a name entry with only a coherent part, in either file
  const usedGates = (circuit.steps as Dict[]).map(actionOf).filter((a): a is string => a !== undefined && !STEP_KEYWORDS.has(a));
  if (usedGates.length > 0 && rng() < 0.5) {
    const name = pick(rng, usedGates);
    const prof = home();
    const gates = (prof.gates ??= {}) as Dict;
    const e = (gates[name] ??= {}) as Dict;
    e.coherent = randomCoherent(rng, arityOf(circuit, name), features);
    features.add('coherent-name');
    if (e.error !== undefined) features.add('coherent+error');
  }
  // step noise and standalone noise steps
  for (const step of circuit.steps as Dict[]) {
    const action = actionOf(step);
    if (action === undefined) {
      if (rng() > 0.4) continue;
      const on = step.on;
      const pairsOnly = Array.isArray(on) && on.some(Array.isArray) && (on as unknown[][]).every((g) => g.length === 2);
      (step.noise as Dict).coherent = randomCoherent(rng, pairsOnly ? 2 : 1, features);
      features.add('coherent-standalone');
      continue;
    }
    if (STEP_KEYWORDS.has(action) || step.noise === undefined || step.noise === 'none' || rng() > 0.5) continue;
    (step.noise as Dict).coherent = randomCoherent(rng, arityOf(circuit, action), features);
    features.add('coherent-step-noise');
    if ((step.noise as Dict).error !== undefined) features.add('coherent+error');
  }
  // a composite run as its parts (`split: true` in its entry); its steps then carry no `noise:`
  const usesComp = (circuit.steps as Dict[]).some((st) => st.comp !== undefined);
  if (usesComp && rng() < 0.45) {
    const gates = (home().gates ??= {}) as Dict;
    ((gates.comp ??= {}) as Dict).split = true;
    for (const st of circuit.steps as Dict[]) if (st.comp !== undefined) delete st.noise;
    features.add('split');
  }
  // simultaneous readout
  if ((circuit.steps as Dict[]).some((st) => st.measure !== undefined) && rng() < 0.35) {
    const gates = (home().gates ??= {}) as Dict;
    ((gates.measure ??= {}) as Dict).simultaneous = true;
    features.add('simultaneous');
  }
  if (p.device && circuit.noise) features.add('v2:device+inline');
}

/** Builds the random issue-7 case of one seed (version-1 case plus coherent device noise). */
export function generateCoherentCase(seed: number, options: GeneratorOptions = {}): GeneratedCase {
  const parts = partsOf(generateCase(seed, options));
  addCoherentNoise(parts, mulberry32(seed * 104729 + 7));
  return caseOf(parts, 'generated by test/contract/generatorCoherent.ts');
}
