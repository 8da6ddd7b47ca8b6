// The example of docs/library.md, run as it stands there (test/docs/library.test.ts checks that the two agree).
import { describe, expect, it } from 'vitest';
import { loadCircuit, mitigate } from 'fray';

describe('mitigation of the GHZ line', () => {
  const loaded = loadCircuit('circuits/mitigation/ghz-line.yaml');

  it('twirling then zero-noise extrapolation brings ⟨XXXX⟩ at least 10× closer to the ideal', () => {
    const r = mitigate(loaded, { twirl: {}, zne: { scales: [1, 3, 5], fit: 'richardson', amplify: 'fold' } });
    const { ideal, noisy, mitigated } = r.observables['XXXX']!;
    expect(Math.abs(mitigated - ideal)).toBeLessThan(Math.abs(noisy - ideal) / 10);
  });

  it('readout correction halves the distance to the ideal distribution', () => {
    const { readout } = mitigate(loaded, { readout: 'bounded' });
    expect(readout!.tvd_after).toBeLessThan(readout!.tvd_before / 2);
  });
});
