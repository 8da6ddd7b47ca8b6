/**
 * Seeded generator of random valid record-mode circuits for issue 8 (mid-circuit measurement
 * and classical feed-forward): the version-1 generator's case (1–6 qubits, every gate and
 * noise kind, readout error, both schedules, device and inline profiles), into which this
 * inserts 1–4 mid-circuit measurements recording into bits (words and `c[i]`, some bits
 * written twice), gives every `measure` step its `into`, conditions later gate, reset and
 * standalone noise steps with `if` (a bit name, or a map of bits to 0/1), sometimes declares
 * `bits:` and sometimes sets the `measure` entry's `latency`. Optionally (for runs after
 * issue 7 has landed too) it adds issue 7's coherent noise on top.
 *
 * Each case lists the feature tags it exercises, so a test can check coverage.
 */
import type { GeneratedCase, GeneratorOptions } from './generator.js';
import { generateCase } from './generator.js';
import type { CaseParts } from './generatorCoherent.js';
import { actionOf, addCoherentNoise, caseOf, partsOf, registerOf } from './generatorCoherent.js';
import { mulberry32, pick, shuffle } from './helpers.js';

type Dict = Record<string, unknown>;
type Rng = () => number;

/** Most mid-circuit measurement applications per case (issue 8, "Done means": up to 4). */
export const MAX_MID_MEASUREMENTS = 4;

const BIT_WORDS = ['m1', 'm2', 'syn', 'flag_b', 'herald', 'k'];
const STEP_KEYWORDS = new Set(['idle', 'barrier', 'measure']);

/** Options of the record-mode generator. */
export interface RecordOptions extends GeneratorOptions {
  /** Also add issue 7's drift, couplings and coherent errors. */
  readonly withCoherent?: boolean;
}

/** Turns a parsed version-1 case into a record-mode case (in place). */
export function addRecord(p: CaseParts, rng: Rng): void {
  const { circuit, features } = p;
  const { n, labels } = registerOf(circuit);
  const qref = (q: number): number | string => (labels && rng() < 0.5 ? labels[q]! : q);
  const steps = circuit.steps as Dict[];
  features.add('record');

  // fresh bit names: words first, then c[i]
  let wordNext = 0;
  let indexNext = 0;
  const freshBit = (): string => {
    if (wordNext < BIT_WORDS.length && rng() < 0.55) return BIT_WORDS[wordNext++]!;
    features.add('bit-indexed');
    return `c[${indexNext++}]`;
  };

  // --- 1–4 mid-circuit measurement applications at random places (not after the last step)
  const written: string[] = [];
  let budget = 1 + Math.floor(rng() * MAX_MID_MEASUREMENTS);
  const inserts: { at: number; step: Dict }[] = [];
  while (budget > 0) {
    const count = n >= 2 && budget >= 2 && rng() < 0.3 ? 2 : 1;
    budget -= count;
    const qs = shuffle(rng, [...Array(n).keys()]).slice(0, count);
    const bits = qs.map(() => {
      if (written.length > 0 && rng() < 0.2) {
        features.add('bit-rewrite');
        return pick(rng, written);
      }
      const b = freshBit();
      written.push(b);
      return b;
    });
    if (new Set(bits).size !== bits.length) bits[1] = freshBit();
    const step: Dict = count === 1 ? { measure: qref(qs[0]!), into: rng() < 0.7 ? bits[0] : [bits[0]] } : { measure: qs.map(qref), into: bits };
    if (count === 2) features.add('mid-measure-multi');
    inserts.push({ at: Math.floor(rng() * Math.max(1, steps.length)), step });
    // active reset: the measured qubit flipped back where its bit reads 1
    if (count === 1 && rng() < 0.3) {
      inserts.push({ at: inserts.at(-1)!.at, step: { x: qref(qs[0]!), if: bits[0] } });
      features.add('active-reset');
    }
  }
  // insert from the back so earlier positions stay valid; inserts at one place keep their order
  const grouped = new Map<number, Dict[]>();
  for (const ins of inserts) grouped.set(ins.at, [...(grouped.get(ins.at) ?? []), ins.step]);
  for (const at of [...grouped.keys()].sort((a, b) => b - a)) steps.splice(at, 0, ...grouped.get(at)!);
  features.add('mid-measure');

  // --- every other measure step records too (one fresh bit per target)
  for (const step of steps) {
    if (step.measure === undefined || step.into !== undefined) continue;
    const targets = step.measure === 'all' ? [...Array(n).keys()] : Array.isArray(step.measure) ? step.measure : [step.measure];
    const bits = targets.map(() => freshBit());
    step.into = bits.length === 1 && rng() < 0.6 ? bits[0] : bits;
    if (step.measure === 'all') features.add('measure-all-into');
  }

  // --- conditions on later gate, reset and noise steps
  const writtenSoFar: string[] = [];
  for (const step of steps) {
    if (step.measure !== undefined) {
      for (const b of Array.isArray(step.into) ? (step.into as string[]) : [step.into as string]) if (!writtenSoFar.includes(b)) writtenSoFar.push(b);
      continue;
    }
    const action = actionOf(step);
    if (step.if !== undefined || writtenSoFar.length === 0 || (action !== undefined && STEP_KEYWORDS.has(action)) || rng() > 0.45) continue;
    if (rng() < 0.45) {
      step.if = pick(rng, writtenSoFar);
      features.add('if-name');
    } else {
      const bits = shuffle(rng, writtenSoFar).slice(0, 1 + Math.floor(rng() * 2));
      const cond: Dict = {};
      for (const b of bits) cond[b] = rng() < 0.5 ? 0 : 1;
      if (Object.values(cond).includes(0)) features.add('if-map-zero');
      step.if = cond;
      features.add('if-map');
    }
    features.add(action === undefined ? 'if-noise' : action === 'reset' ? 'if-reset' : 'if-gate');
    const target = action === undefined ? undefined : step[action];
    if (Array.isArray(target) && (target.some(Array.isArray) || action === 'reset' || target.length > 2)) features.add('if-multi-application');
  }

  // --- the record's order: declared, or by first write
  const allBits = [...new Set(steps.flatMap((s) => (s.measure === undefined ? [] : Array.isArray(s.into) ? (s.into as string[]) : [s.into as string])))];
  if (rng() < 0.4) {
    // `bits` must come before `steps` in the file for readability; rebuild the key order
    const rest = Object.entries(circuit).filter(([k]) => k !== 'steps');
    for (const k of Object.keys(circuit)) delete circuit[k];
    for (const [k, v] of rest) circuit[k] = v;
    circuit.bits = shuffle(rng, allBits);
    circuit.steps = steps;
    features.add('bits-declared');
  } else features.add('bits-first-write');

  // --- latency of the classical decision
  if (rng() < 0.55) {
    const inline = circuit.noise as Dict | undefined;
    const prof = (inline?.gates ? inline : p.device?.gates ? p.device : undefined) ?? ((circuit.noise ??= {}) as Dict);
    const gates = (prof.gates ??= {}) as Dict;
    const m = (gates.measure ??= {}) as Dict;
    m.latency = pick(rng, ['120ns', '0.3us', '45ns', '1us', '0ns']);
    features.add('latency');
  }
  const readout = JSON.stringify([p.device?.qubits, (circuit.noise as Dict | undefined)?.qubits]).includes('readout');
  if (readout) features.add('readout-mid-circuit');
}

/** Builds the random issue-8 case of one seed (a version-1 case turned into record mode). */
export function generateRecordCase(seed: number, options: RecordOptions = {}): GeneratedCase {
  const parts = partsOf(generateCase(seed, { maxQubits: options.maxQubits ?? 6, ...(options.minQubits ? { minQubits: options.minQubits } : {}) }));
  const rng = mulberry32(seed * 15485863 + 3);
  addRecord(parts, rng);
  if (options.withCoherent) addCoherentNoise(parts, rng);
  return caseOf(parts, 'generated by test/contract/generatorRecord.ts');
}
