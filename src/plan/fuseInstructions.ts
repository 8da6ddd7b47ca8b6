/**
 * Fusion of an instruction list into groups, each one superoperator on a few qubits.
 *
 * Rule (greedy, in program order; `last[q]` = the group that acted last on qubit q):
 *  - an instruction on Q merges into group G when last[q] = G for every q in Q (so Q ⊆ G's
 *    qubits and nothing acted on Q in between): S_G ← S_ins ∘ S_G;
 *  - otherwise it opens a new group on Q, which first absorbs every group P with all its
 *    qubits in Q and last[p] = P for each of them (P is then the latest thing on its qubits, so
 *    it may move forward to the new group's place: only operations on disjoint qubits lie in
 *    between, and those commute with it): S_new = S_ins ∘ (⊗ S_P).
 * A gate's noise and idle channels therefore fold into the gate's superoperator, and 1-qubit
 * groups fold into the next 2-qubit group on their qubit. Groups keep the position of their
 * creation; the result lists them in that order, which is consistent with every qubit's
 * timeline, so applying them in order reproduces the instruction list exactly.
 *
 * With `keepDiagonal` (used for programs with drift, whose always-on zz terms put a diagonal
 * 2-qubit unitary on every coupled pair in every segment), diagonal groups stay diagonal so that
 * the plan can batch them into single diagonal passes: a non-diagonal instruction does not merge
 * into a diagonal group on more qubits than its own, and a diagonal instruction on several
 * qubits does not absorb non-diagonal groups. Both only decline a fusion, so the order on every
 * qubit is kept as before. (Off by default: it changes how version-1 programs fuse.)
 *
 * Work once per distinct computation: a group's superoperator is a function of its history (the
 * payloads composed into it, at which positions, in which order), so groups with the same history
 * (the ten 1-qubit groups of one layer's `ry` and noise, the five cx groups of one brickwork
 * layer) share one superoperator, computed once: the same numbers each would get alone. Histories
 * are numbered; a superoperator is kept while an open group holds its history, and a while after.
 */
import type { Instruction } from '../engine/instruction.js';
import type { CMatrix } from '../linalg/cmatrix.js';
import { isDiagonalSuperoperator } from './diagonalBatch.js';
import { composeEmbedded, composeEmbeddedBefore } from './embedSuperoperator.js';
import { instructionQubits, superoperatorsByPayload } from './instructionSuperoperator.js';

/** One fused group: a superoperator on `qubits` (first = most significant) and the instruction indices it contains, ascending. */
export interface FusedGroup {
  readonly qubits: readonly number[];
  readonly superop: CMatrix;
  readonly sources: readonly number[];
}

interface OpenGroup {
  qubits: number[];
  superop: CMatrix;
  sources: number[];
  alive: boolean;
  /** Whether superop is diagonal (tracked only with keepDiagonal). */
  diagonal: boolean;
  /** The number of the group's history (see above). */
  history: number;
}

/** Bytes of superoperators no open group holds that SharedHistories keeps for histories that recur (the five cx groups of a layer form one after the other). */
export const RELEASED_SUPEROPERATOR_BYTES = 8 << 20;

/**
 * Superoperators by history number, shared between the groups of one history: `step` names a
 * history (the previous one, what is composed onto it, where) and computes its superoperator only
 * if it is not at hand: held by an open group, or released recently (the last
 * RELEASED_SUPEROPERATOR_BYTES of them, least recently released dropped first).
 */
class SharedHistories {
  private readonly numbers = new Map<string, number>();
  private readonly held = new Map<number, { superop: CMatrix; holders: number }>();
  private readonly released = new Map<number, CMatrix>();
  private releasedBytes = 0;
  private readonly payloads = new Map<object, number>();

  /** A number per distinct payload object (the same object: the same superoperator). */
  payload(p: object): number {
    let id = this.payloads.get(p);
    if (id === undefined) {
      id = this.payloads.size;
      this.payloads.set(p, id);
    }
    return id;
  }

  /** The history named `key` and its superoperator (`compute` runs when it is not at hand); held once for the caller. */
  step(key: string, compute: () => CMatrix): { history: number; superop: CMatrix } {
    let history = this.numbers.get(key);
    if (history === undefined) {
      history = this.numbers.size;
      this.numbers.set(key, history);
    }
    let h = this.held.get(history);
    if (h === undefined) {
      const kept = this.released.get(history);
      if (kept !== undefined) {
        this.released.delete(history);
        this.releasedBytes -= kept.data.byteLength;
      }
      h = { superop: kept ?? compute(), holders: 0 };
      this.held.set(history, h);
    }
    h.holders++;
    return { history, superop: h.superop };
  }

  /** One open group no longer holds `history`. */
  release(history: number): void {
    const h = this.held.get(history)!;
    if (--h.holders > 0) return;
    this.held.delete(history);
    this.released.set(history, h.superop);
    this.releasedBytes += h.superop.data.byteLength;
    for (const [old, m] of this.released) {
      if (this.releasedBytes <= RELEASED_SUPEROPERATOR_BYTES) break;
      this.released.delete(old);
      this.releasedBytes -= m.data.byteLength;
    }
  }
}

/** Options of fuseInstructions. */
export interface FuseOptions {
  /** Keep diagonal groups diagonal (see above). */
  readonly keepDiagonal?: boolean;
}

/** Positions of `sub`'s qubits inside `group` (each must be present). */
function positionsIn(sub: readonly number[], group: readonly number[]): number[] {
  return sub.map((q) => {
    const p = group.indexOf(q);
    if (p < 0) throw new Error(`fuseInstructions: qubit ${q} not in group [${group.join(', ')}]`);
    return p;
  });
}

/** Fuses `instructions` on n qubits into groups by the rule above, in application order. */
export function fuseInstructions(n: number, instructions: readonly Instruction[], options: FuseOptions = {}): FusedGroup[] {
  const keep = options.keepDiagonal === true;
  const superoperatorOf = superoperatorsByPayload();
  const shared = new SharedHistories();
  const last: (OpenGroup | undefined)[] = new Array<OpenGroup | undefined>(n).fill(undefined);
  const groups: OpenGroup[] = [];
  instructions.forEach((ins, i) => {
    const Q = instructionQubits(ins);
    const S = superoperatorOf(ins);
    const s = shared.payload(S);
    const diagonal = keep && isDiagonalSuperoperator(S);
    const g0 = last[Q[0]!];
    if (g0 !== undefined && Q.every((q) => last[q] === g0) && !(keep && g0.diagonal && !diagonal && g0.qubits.length > Q.length)) {
      const at = positionsIn(Q, g0.qubits);
      const next = shared.step(`${g0.history} then ${s} at ${at}`, () => composeEmbedded(S, at, g0.qubits.length, g0.superop));
      shared.release(g0.history);
      g0.superop = next.superop;
      g0.history = next.history;
      g0.sources.push(i);
      g0.diagonal = g0.diagonal && diagonal;
      return;
    }
    const k = Q.length;
    let current = shared.step(`${s} on ${k}`, () => S);
    const sources: number[] = [];
    const seen = new Set<OpenGroup>();
    let groupDiagonal = diagonal;
    for (const q of Q) {
      const p = last[q];
      if (p === undefined || seen.has(p)) continue;
      seen.add(p);
      if (keep && diagonal && k > 1 && !p.diagonal) continue;
      if (p.qubits.every((x) => Q.includes(x) && last[x] === p)) {
        groupDiagonal = groupDiagonal && p.diagonal;
        // P acts before the instruction and on other qubits than any other absorbed group: S ∘ (⊗ S_P)
        const at = positionsIn(p.qubits, Q);
        const before = current;
        current = shared.step(`${before.history} after ${p.history} at ${at} of ${k}`, () => composeEmbeddedBefore(before.superop, p.superop, at, k));
        shared.release(before.history);
        shared.release(p.history);
        sources.push(...p.sources);
        p.alive = false;
      }
    }
    sources.push(i);
    sources.sort((a, b) => a - b);
    const g: OpenGroup = { qubits: [...Q], superop: current.superop, sources, alive: true, diagonal: groupDiagonal, history: current.history };
    for (const q of Q) last[q] = g;
    groups.push(g);
  });
  return groups.filter((g) => g.alive).map((g) => ({ qubits: g.qubits, superop: g.superop, sources: g.sources }));
}
