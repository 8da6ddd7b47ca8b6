import { instantiateOrThrow } from '../api/loadCircuit.js';
import { scheduleCircuit, simulateLoaded } from '../api/simulate.js';
import type { LoadedCircuit } from '../api/loadCircuit.js';
import type { Operation } from '../circuit/circuit.js';
import { plainKinds, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { gateNoise } from '../noise/gateNoise.js';
import type { QubitNoise } from '../noise/profile.js';
import { qubitName } from '../format/register.js';
import { metricLoss, metricName, metricValue, observablesOf, type Metric } from './metrics.js';
import { loadOptionsOf, SourceCache, type StudyTarget } from './variant.js';

/**
 * `fray budget`: where a circuit's loss comes from. The noise is cut into disjoint sources
 * (relaxation T1 and pure dephasing per qubit, each gate name's noise kinds, each custom
 * channel, step annotations, readout, and the coherent errors: detuning, always-on ZZ of the
 * couplings, the gates' `coherent:` rotations), and each source's loss is measured two ways: with
 * only that source on, and as the loss removed when only that source is off. Noise does not
 * add up exactly, so the total minus the sum of the single-source losses is reported as the
 * remainder (the interaction of the sources), never dropped.
 *
 * A calibrated `error: r` is a total that includes the relaxation during the gate; switching
 * relaxation off would make its solve put more depolarizing in. So every `error:` is first
 * frozen into the depolarizing probability it solves to in the full run, and that
 * depolarizing is the gate's own source: with everything on, the run is exactly `fray run`.
 */

/** One source's share of the loss. */
export interface BudgetSource {
  /** Stable id: relaxation, dephasing, gate:cx, channel:leak, step, readout (qubit rows: relaxation:q, dephasing:q). */
  readonly id: string;
  readonly label: string;
  /** The metric's loss with only this source on. */
  readonly only_on: number;
  /** The loss removed when only this source is off: total − loss(everything else). */
  readonly removed_when_off: number;
  /** only_on / total (0 when there is no loss). */
  readonly share: number;
}

/** The budget of one run. */
export interface BudgetResult {
  readonly file: string;
  readonly name: string | null;
  readonly device: string | null;
  readonly by: string;
  /** The metric's loss with every source on (equals the plain run's). */
  readonly total: number;
  /** Sources, largest share first. */
  readonly sources: readonly BudgetSource[];
  /** Σ only_on over the sources. */
  readonly sum_only_on: number;
  /** total − sum_only_on: what no single source explains (interaction between sources). */
  readonly remainder: number;
  /** Relaxation and dephasing split by where they act: idle windows, during gates. */
  readonly where: readonly BudgetSource[];
  /** Relaxation and dephasing of each qubit. */
  readonly qubits: readonly BudgetSource[];
  /** Runs made. */
  readonly runs: number;
}

/** Options of a budget. */
export interface BudgetOptions extends Omit<StudyTarget, 'file'> {
  /** The metric whose loss is split (default state fidelity: loss 1 − F). */
  readonly by?: Metric;
}

/** The noise kinds of one operation with `error:` frozen to its solved depolarizing, and each kind's source id. */
interface FrozenNoise {
  readonly kinds: NoiseKindsSpec;
  readonly sourceOf: (kind: string) => string;
}

/** Computes the budget. Throws InputError on bad input. */
export function noiseBudget(file: string, options: BudgetOptions = {}): BudgetResult {
  const by = options.by ?? { kind: 'state' };
  if (by.kind === 'duration') throw new RangeError('noiseBudget: duration is not a loss of noise');
  const source = new SourceCache().get(file, options.device);
  const loaded = instantiateOrThrow(source, loadOptionsOf(options));
  const { circuit, profile } = loaded;
  const n = circuit.register.n;
  const schedule = scheduleCircuit(circuit, profile);
  const span = new Map(schedule.items.map((it) => [it.op, it.end - it.start]));

  // Freeze every application's noise (error → the depolarizing it solves to in the full run).
  const frozen = new Map<Operation, FrozenNoise>();
  for (const op of circuit.operations) {
    if (op.kind !== 'gate' && op.kind !== 'reset' && op.kind !== 'channel') continue;
    const own = op.noise !== undefined;
    const kinds: NoiseKindsSpec = { ...(op.noise?.kinds ?? (op.kind === 'gate' ? profile.gateEntry(op.name, op.qubits).kinds : profile.reset.kinds)) };
    if (op.kind === 'gate' && kinds.error !== undefined) {
      const entry = profile.gateEntry(op.name, op.qubits);
      const g = gateNoise({ k: op.qubits.length, duration: span.get(op) ?? 0, thermal: entry.thermal, decay: op.qubits.map((q) => profile.qubits[q]!), kinds: plainKinds(kinds), channels: circuit.channels });
      const at = kinds.error.at;
      delete kinds.error;
      kinds.depolarizing = { value: g.solvedDepolarizing ?? 0, at };
    }
    const gateSource = op.kind === 'gate' ? `gate:${op.name}` : op.kind === 'reset' ? 'gate:reset' : 'step';
    frozen.set(op, { kinds, sourceOf: (k) => (k === 'channel' ? `channel:${kinds.channel!.value}` : k === 'coherent' ? 'coherent' : own ? 'step' : gateSource) });
  }

  // Which sources exist (each with at least some noise).
  const pureDephasingRate = (q: QubitNoise) => Math.max(0, 1 / q.t2 - 1 / (2 * q.t1));
  const present = new Set<string>();
  profile.qubits.forEach((q, i) => {
    if (Number.isFinite(q.t1)) present.add(`relaxation:${i}`);
    if (pureDephasingRate(q) > 0) present.add(`dephasing:${i}`);
    if (q.readout.zeroAsOne > 0 || q.readout.oneAsZero > 0) present.add('readout');
    if (q.detuning !== 0) present.add('detuning');
  });
  if ((profile.couplings ?? []).some((c) => c.zz !== 0)) present.add('zz');
  for (const f of frozen.values()) for (const [k, v] of Object.entries(f.kinds)) if (v !== undefined && nonZero(v.value)) present.add(f.sourceOf(k));
  const WHERE = ['where:idle', 'where:gates'];
  const all = new Set([...present, ...WHERE]);

  /** The run with only the atoms in `on` switched on. */
  const masked = (on: ReadonlySet<string>): LoadedCircuit => {
    const qubits = profile.qubits.map((q, i): QubitNoise => {
      const t1 = on.has(`relaxation:${i}`) ? q.t1 : Infinity;
      const phi = on.has(`dephasing:${i}`) ? pureDephasingRate(q) : 0;
      const rate2 = (Number.isFinite(t1) ? 1 / (2 * t1) : 0) + phi;
      return {
        ...q,
        t1,
        t2: rate2 > 0 ? 1 / rate2 : Infinity,
        readout: on.has('readout') ? q.readout : { zeroAsOne: 0, oneAsZero: 0 },
        detuning: on.has('detuning') ? q.detuning : 0,
      };
    });
    const gatesRelax = on.has('where:gates');
    const operations = circuit.operations.map((op): Operation => {
      const f = frozen.get(op);
      if (f === undefined || (op.kind !== 'gate' && op.kind !== 'reset' && op.kind !== 'channel')) return op;
      const kinds: NoiseKindsSpec = {};
      for (const [k, v] of Object.entries(f.kinds)) if (v !== undefined && on.has(f.sourceOf(k))) (kinds as Record<string, unknown>)[k] = v;
      return { ...op, noise: { kinds, at: op.noise?.at ?? op.at } } as Operation;
    });
    return {
      circuit: { ...circuit, operations },
      profile: {
        ...profile,
        qubits,
        couplings: profile.couplings === null ? null : profile.couplings.map((c) => ({ ...c, zz: on.has('zz') ? c.zz : 0 })),
        idle: on.has('where:idle') ? profile.idle : 'none',
        gateEntry: (name, qs) => {
          const e = profile.gateEntry(name, qs);
          return gatesRelax ? e : { ...e, thermal: false };
        },
      },
      warnings: [],
    };
  };
  const observe = observablesOf([by]);
  let runs = 0;
  const loss = (on: ReadonlySet<string>): number => {
    runs++;
    return metricLoss(by, metricValue(simulateLoaded(masked(on), { observe, threads: 1 }).result, by));
  };
  const total = loss(all);
  const without = (ids: readonly string[]) => new Set([...all].filter((a) => !ids.includes(a)));
  const row = (id: string, label: string, atoms: readonly string[], onlyOnAtoms: readonly string[] = [...atoms, ...WHERE]): BudgetSource => {
    const onlyOn = loss(new Set(onlyOnAtoms));
    return { id, label, only_on: onlyOn, removed_when_off: total - loss(without(atoms)), share: total > 0 ? onlyOn / total : 0 };
  };

  const relaxAtoms = [...present].filter((a) => a.startsWith('relaxation:'));
  const dephAtoms = [...present].filter((a) => a.startsWith('dephasing:'));
  const sources: BudgetSource[] = [];
  if (relaxAtoms.length > 0) sources.push(row('relaxation', 'relaxation (T1)', relaxAtoms));
  if (dephAtoms.length > 0) sources.push(row('dephasing', 'pure dephasing (T2 beyond T1)', dephAtoms));
  for (const id of [...present].filter((a) => a.startsWith('gate:')).sort()) sources.push(row(id, `${id.slice(5)} gate noise`, [id]));
  for (const id of [...present].filter((a) => a.startsWith('channel:')).sort()) sources.push(row(id, `custom channel '${id.slice(8)}'`, [id]));
  if (present.has('step')) sources.push(row('step', "steps' own noise", ['step']));
  if (present.has('readout')) sources.push(row('readout', 'readout error', ['readout']));
  if (present.has('detuning')) sources.push(row('detuning', 'detuning (drift of each qubit)', ['detuning']));
  if (present.has('zz')) sources.push(row('zz', 'always-on ZZ of the couplings', ['zz']));
  if (present.has('coherent')) sources.push(row('coherent', "gates' coherent errors", ['coherent']));
  sources.sort((a, b) => b.share - a.share || (a.id < b.id ? -1 : 1));
  const sum = sources.reduce((s, r) => s + r.only_on, 0);

  const decay = [...relaxAtoms, ...dephAtoms];
  const where: BudgetSource[] =
    decay.length === 0
      ? []
      : [row('where:idle', 'relaxation and dephasing while idle', ['where:idle'], [...decay, 'where:idle']), row('where:gates', 'relaxation and dephasing during gates', ['where:gates'], [...decay, 'where:gates'])];
  const perQubit: BudgetSource[] = [];
  for (let q = 0; q < n; q++) {
    const name = qubitName(q, circuit.register);
    if (present.has(`relaxation:${q}`)) perQubit.push(row(`relaxation:${q}`, `T1 on qubit ${name}`, [`relaxation:${q}`]));
    if (present.has(`dephasing:${q}`)) perQubit.push(row(`dephasing:${q}`, `dephasing on qubit ${name}`, [`dephasing:${q}`]));
  }
  perQubit.sort((a, b) => b.only_on - a.only_on || (a.id < b.id ? -1 : 1));
  return { file, name: circuit.name, device: profile.name, by: metricName(by), total, sources, sum_only_on: sum, remainder: total - sum, where, qubits: perQubit, runs };
}

/** Whether a noise-kind value does anything (a probability above 0, a Pauli component above 0, a channel). */
function nonZero(v: unknown): boolean {
  if (typeof v === 'number') return v > 0;
  if (typeof v === 'object' && v !== null) return Object.values(v).some((x) => typeof x === 'number' && x > 0);
  return true;
}
