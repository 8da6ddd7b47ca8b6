import { describe, expect, it } from 'vitest';
import { settleOptionalValues } from '../../src/cli/optionalValues.js';
import { fray } from '../helpers/cli.js';

describe('options with an optional value (fray mitigate --twirl [instances], --fold [order])', () => {
  it('keep a value of their own and give any other word back to the command', () => {
    expect(settleOptionalValues(['mitigate', '--twirl', 'c.yaml', '--zne', '1,3'])).toEqual(['mitigate', 'c.yaml', '--zne', '1,3', '--twirl']);
    expect(settleOptionalValues(['mitigate', '--twirl', '50', 'c.yaml'])).toEqual(['mitigate', '--twirl', '50', 'c.yaml']);
    expect(settleOptionalValues(['mitigate', '--fold', 'c.yaml', '--zne', '1,3'])).toEqual(['mitigate', 'c.yaml', '--zne', '1,3', '--fold']);
    expect(settleOptionalValues(['mitigate', '--fold', 'random', 'c.yaml'])).toEqual(['mitigate', '--fold', 'random', 'c.yaml']);
    expect(settleOptionalValues(['mitigate', 'c.yaml', '--twirl', '--json'])).toEqual(['mitigate', 'c.yaml', '--twirl', '--json']);
    // a word that is not a path stays the value, so a mistyped value gets the option's own message
    expect(settleOptionalValues(['mitigate', '--fold', 'middle', 'c.yaml'])).toEqual(['mitigate', '--fold', 'middle', 'c.yaml']);
    // other commands' options of the same name take a required value and are left alone
    expect(settleOptionalValues(['transform', 'c.yaml', '--fold', '3'])).toEqual(['transform', 'c.yaml', '--fold', '3']);
  });

  it('fray mitigate --twirl FILE twirls FILE exactly instead of refusing FILE as a count', async () => {
    const r = await fray('mitigate', '--twirl', 'circuits/mitigation/ghz-line.yaml', '--json');
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(r.out).twirl.mode).toBe('exact');
  });
});
