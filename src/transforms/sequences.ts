/** The dynamical-decoupling sequences by name (src/transforms/decouple.ts defines them; kept apart so the file format can name them without importing the run path). */
export type DecouplingSequence = 'xx' | 'xy4';

/** The sequences in the order help texts list them. */
export const DECOUPLING_SEQUENCES: readonly DecouplingSequence[] = ['xx', 'xy4'];
