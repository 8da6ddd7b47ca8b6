import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fray } from '../helpers/cli.js';

/**
 * Regression pin, not a physics check: the `fray run --json` output of version-1 demos
 * (no `into`) as it was before record mode existed (format version 2, part B). Record mode
 * must leave circuits without `into` exactly as they were, so these compare byte for byte.
 * The physics of these demos is checked against independent routes in demos.test.ts.
 */
const PINNED: readonly { file: string; args: readonly string[]; pin: string }[] = [
  { file: 'circuits/ghz5.yaml', args: ['--observe', 'ZZIII'], pin: 'ghz5.json' },
  { file: 'circuits/qpe3-alap.yaml', args: ['--shots', '500'], pin: 'qpe3-alap.json' },
  { file: 'circuits/ramsey-echo.yaml', args: [], pin: 'ramsey-echo.json' },
  { file: 'circuits/coupler-swap.yaml', args: [], pin: 'coupler-swap.json' },
  { file: 'circuits/channels/parity-check.yaml', args: [], pin: 'parity-check.json' },
];

describe('version-1 circuits are unchanged by record mode', () => {
  for (const { file, args, pin } of PINNED) {
    it(`${file} gives the pinned JSON`, async () => {
      const { code, out } = await fray('run', file, '--json', ...args);
      expect(code).toBe(0);
      expect(out).toBe(readFileSync(`test/circuits/pinned/${pin}`, 'utf8'));
    });
  }
});
