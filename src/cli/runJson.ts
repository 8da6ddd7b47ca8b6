import type { RunResult, Simulation } from '../api/simulate.js';
import { hasDrift } from '../program/program.js';

/** Largest register whose noisy density matrix `fray run --json --state` includes (64 × 64 entries). */
export const STATE_JSON_MAX_QUBITS = 6;

/** One scheduled application in the JSON of `--json --schedule` (times in ns, step 1-based as in the report). */
export interface TimedOperationJson {
  readonly step: number;
  readonly operation: string;
  readonly qubits: readonly number[];
  readonly start_ns: number;
  readonly end_ns: number;
}

/** The always-on drift the report's schedule lists: detuning per qubit and zz per coupled pair (Hz), acting from 0 to until_ns. */
export interface DriftJson {
  readonly qubits: readonly { readonly qubit: number; readonly detuning_hz: number; readonly until_ns: number }[];
  readonly pairs: readonly { readonly qubits: readonly [number, number]; readonly zz_hz: number; readonly until_ns: number }[];
}

/** What `--json --schedule` adds: every application placed in time, every idle window, and the drift when there is any. */
export interface TimelineJson {
  readonly operations: readonly TimedOperationJson[];
  readonly idle_windows: readonly { readonly qubit: number; readonly start_ns: number; readonly end_ns: number }[];
  readonly drift?: DriftJson;
}

/** ρ as two row-major real matrices (rows and columns in basis order, qubit 0 leftmost), as `--json --state` adds it. */
export interface DensityMatrixJson {
  readonly re: readonly (readonly number[])[];
  readonly im: readonly (readonly number[])[];
}

/** The JSON object of `fray run --json`: the result, plus the schedule and ρ when the report would show them. */
export function runJson(sim: Simulation, opts: { readonly showSchedule: boolean; readonly showState: boolean }): RunResult & { timeline?: TimelineJson; density_matrix?: DensityMatrixJson } {
  return {
    ...sim.result,
    ...(opts.showSchedule ? { timeline: timelineJson(sim) } : {}),
    ...(opts.showState && sim.result.qubits <= STATE_JSON_MAX_QUBITS ? { density_matrix: densityMatrixJson(sim) } : {}),
  };
}

function timelineJson(sim: Simulation): TimelineJson {
  return {
    operations: sim.schedule.items.map((it) => ({
      step: it.op.step + 1,
      operation: it.op.kind === 'gate' ? it.op.name : it.op.kind === 'channel' ? 'noise' : it.op.kind,
      qubits: it.op.qubits,
      start_ns: it.start,
      end_ns: it.end,
    })),
    idle_windows: sim.schedule.idleWindows.map((w) => ({ qubit: w.qubit, start_ns: w.start, end_ns: w.end })),
    ...(sim.profile.couplings !== null || hasDrift(sim.profile) ? { drift: driftJson(sim) } : {}),
  };
}

function driftJson(sim: Simulation): DriftJson {
  const until = (q: number): number => sim.schedule.measureStart[q] ?? sim.schedule.duration;
  return {
    qubits: sim.profile.qubits.flatMap((q, i) => (q.detuning === 0 ? [] : [{ qubit: i, detuning_hz: q.detuning, until_ns: until(i) }])),
    pairs: (sim.profile.couplings ?? []).map((c) => ({ qubits: [c.a, c.b] as [number, number], zz_hz: c.zz, until_ns: Math.min(until(c.a), until(c.b)) })),
  };
}

function densityMatrixJson(sim: Simulation): DensityMatrixJson {
  const d = 1 << sim.rho.n;
  const data = sim.rho.data;
  const part = (offset: 0 | 1) => Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => data[2 * (i * d + j) + offset]!));
  return { re: part(0), im: part(1) };
}
