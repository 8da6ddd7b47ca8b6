/**
 * Compositions of superoperators memoised by the identity of their operands: with the
 * instruction superoperators memoised by content (./instructionSuperoperator.ts), a group that
 * fuses the same instructions as a group of an earlier layer is built from the very same
 * objects, so each composition is computed once per distinct (map, positions, group) and
 * shared. Exact: the same operands give the same bits. Results are never modified.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { composeEmbedded, composeEmbeddedBefore } from './embedSuperoperator.js';

/**
 * Bytes of results a CompositionMemo keeps before it starts afresh: a long circuit whose
 * compositions are all distinct (say, a new angle in every layer) would otherwise hold every
 * intermediate superoperator (64 KiB each for a 3-qubit group) until its plan is built.
 */
export const COMPOSITION_MEMO_BYTES = 8 * 1024 * 1024;

/** composeEmbedded / composeEmbeddedBefore with a memo keyed by operand identity (one per fusion run; at most `limitBytes` of results, then emptied: a result computed again has the same bits). */
export class CompositionMemo {
  private readonly ids = new WeakMap<CMatrix, number>();
  private nextId = 0;
  private readonly results = new Map<string, CMatrix>();
  private bytes = 0;

  constructor(private readonly limitBytes = COMPOSITION_MEMO_BYTES) {}

  /** Results held now (for tests of the bound). */
  get size(): number {
    return this.results.size;
  }

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
      if (this.bytes + r.data.byteLength > this.limitBytes) {
        this.results.clear();
        this.bytes = 0;
      }
      this.results.set(key, r);
      this.bytes += r.data.byteLength;
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
