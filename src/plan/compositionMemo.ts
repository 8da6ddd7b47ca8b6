/**
 * Compositions of superoperators memoised by the identity of their operands: with the
 * instruction superoperators memoised by content (./instructionSuperoperator.ts), a group that
 * fuses the same instructions as a group of an earlier layer is built from the very same
 * objects, so each composition is computed once per distinct (map, positions, group) and
 * shared. Exact: the same operands give the same bits. Results are never modified.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { composeEmbedded, composeEmbeddedBefore } from './embedSuperoperator.js';

/** composeEmbedded / composeEmbeddedBefore with a memo keyed by operand identity (one per fusion run). */
export class CompositionMemo {
  private readonly ids = new WeakMap<CMatrix, number>();
  private nextId = 0;
  private readonly results = new Map<string, CMatrix>();

  private idOf(m: CMatrix): number {
    let id = this.ids.get(m);
    if (id === undefined) {
      id = this.nextId++;
      this.ids.set(m, id);
    }
    return id;
  }

  private memo(key: string, compute: () => CMatrix): CMatrix {
    let r = this.results.get(key);
    if (r === undefined) {
      r = compute();
      this.results.set(key, r);
    }
    return r;
  }

  /** composeEmbedded(s, positions, k, g): `s` on the group positions applied after g. */
  after(s: CMatrix, positions: readonly number[], k: number, g: CMatrix): CMatrix {
    return this.memo(`a${this.idOf(s)},${this.idOf(g)},${k}:${positions.join(',')}`, () => composeEmbedded(s, positions, k, g));
  }

  /** composeEmbeddedBefore(g, s, positions, k): `s` on the group positions applied before g. */
  before(g: CMatrix, s: CMatrix, positions: readonly number[], k: number): CMatrix {
    return this.memo(`b${this.idOf(s)},${this.idOf(g)},${k}:${positions.join(',')}`, () => composeEmbeddedBefore(g, s, positions, k));
  }
}
