import type { MitigationSpec } from '../format/mitigationBlock.js';
import type { MitigateOptions } from './mitigate.js';

/** The options of `mitigate` that a circuit file's `mitigation:` block asks for (observables come from its `observe:`). */
export function recipeOptions(spec: MitigationSpec): MitigateOptions {
  return {
    ...(spec.dd !== undefined ? { dd: spec.dd } : {}),
    ...(spec.twirl !== undefined ? { twirl: spec.twirl } : {}),
    ...(spec.zne !== undefined
      ? { zne: { scales: spec.zne.scales, fit: spec.zne.fit, amplify: spec.zne.amplify, ...(spec.zne.order !== undefined ? { order: spec.zne.order } : {}), ...(spec.zne.seed !== undefined ? { seed: spec.zne.seed } : {}) } }
      : {}),
    ...(spec.readout !== undefined ? { readout: spec.readout } : {}),
  };
}
