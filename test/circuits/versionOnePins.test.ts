/**
 * Version-1 outputs pinned bit for bit (issue 7: "a version-1 file gives the same results").
 *
 * The fixtures in test/fixtures/v1/ are the `fray run --json` text of every demo in circuits/
 * and of a few seeded contract circuits, written by the code on main before the coherent-noise
 * change (format version 2). They are regression pins, not physics truth: the physics of each
 * demo is checked by independent routes in demos.test.ts and test/contract/. One change is
 * deliberate: issue 7 asks for a warning when a multi-qubit or composite gate silently takes the
 * `all` entry, so those warnings (and only those) may be new; everything else must be the same text.
 * Issue 12 adds the `engine` key (which kernels ran, on how many threads: engine information, not
 * a result), which the comparison leaves out, and replaces the shot sampler by a multinomial drawn
 * by successive binomials (cost independent of the number of shots), so ghz5-shots.json's counts
 * were regenerated once for it (their statistics are tested in test/results/sampling.test.ts).
 * Regenerate only
 * for a deliberate version-1 change, with FRAY_WRITE_PINS=1 npx vitest run test/circuits/versionOnePins.test.ts.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { toJson } from '../../src/results/json.js';
import { fray } from '../helpers/cli.js';

/** The warning issue 7 adds to version-1 files whose multi-qubit gates fall back to the `all` entry. */
const FALLBACK_WARNING = /has no entry in the profile's 'gates', so it takes the 'all' entry/;

/** The JSON text without the `engine` key (issue 12), as `fray run --json` prints it. */
function withoutEngine(text: string): string {
  const o = JSON.parse(text) as Record<string, unknown>;
  delete o['engine'];
  return toJson(o) + '\n';
}

/** The JSON text without its warnings and `engine`, and the warnings apart. */
function split(text: string): { rest: string; warnings: string[] } {
  const o = JSON.parse(text) as { warnings: string[]; engine?: unknown };
  delete o.engine;
  const warnings = o.warnings;
  const rest: Record<string, unknown> = { ...o };
  delete rest['warnings'];
  return { rest: toJson(rest), warnings };
}

const PINS = 'test/fixtures/v1';
const CASES = join(PINS, 'cases');
const WRITE = process.env.FRAY_WRITE_PINS === '1';
/** Seeds of the contract generator pinned as version-1 cases (small registers, every feature mix). */
const CONTRACT_SEEDS = [3, 7, 11, 19, 23, 42];

interface Pin {
  readonly name: string;
  readonly argv: readonly string[];
}

/** The demos of circuits/ that existed in version 1 (the later ones use version-2 keys). */
const V1_DEMOS = ['coupler-swap', 'ghz5', 'qpe3-alap', 'qpe3-asap', 'ramsey-echo'];

function pins(): Pin[] {
  const out: Pin[] = V1_DEMOS.map((f) => ({ name: f, argv: ['run', `circuits/${f}.yaml`, '--json'] }));
  out.push({ name: 'ghz5-shots', argv: ['run', 'circuits/ghz5.yaml', '--json', '--shots', '500', '--seed', '9', '--observe', 'ZZIII,XXXXX'] });
  for (const seed of CONTRACT_SEEDS) out.push({ name: `contract-${seed}`, argv: ['run', join(CASES, `contract-${seed}.yaml`), '--json'] });
  return out;
}

async function writeContractCases(): Promise<void> {
  const { generateCase } = await import('../contract/generator.js');
  mkdirSync(CASES, { recursive: true });
  for (const seed of CONTRACT_SEEDS) {
    const c = generateCase(seed, { maxQubits: 5 });
    let yaml = c.circuitYaml;
    if (c.devicePath !== undefined && c.deviceYaml !== undefined) {
      const dev = `contract-${seed}-device.yaml`;
      writeFileSync(join(CASES, dev), c.deviceYaml);
      yaml = yaml.replace(c.devicePath, dev);
    }
    writeFileSync(join(CASES, `contract-${seed}.yaml`), yaml);
  }
}

describe('version-1 outputs stay bit-for-bit identical', () => {
  it('the pinned cases exist', async () => {
    if (WRITE) await writeContractCases();
    for (const p of pins()) if (!WRITE) expect(existsSync(join(PINS, `${p.name}.json`)), p.name).toBe(true);
  });
  for (const p of pins()) {
    it(`${p.name}: fray ${p.argv.join(' ')}`, async () => {
      const r = await fray(...p.argv);
      expect(r.err).toBe('');
      expect(r.code).toBe(0);
      const file = join(PINS, `${p.name}.json`);
      if (WRITE) writeFileSync(file, withoutEngine(r.out));
      else {
        const now = split(r.out);
        const pinned = split(readFileSync(file, 'utf8'));
        expect(now.rest).toBe(pinned.rest);
        expect(now.warnings.filter((w) => !FALLBACK_WARNING.test(w))).toEqual(pinned.warnings);
        if (now.warnings.length === pinned.warnings.length) expect(withoutEngine(r.out)).toBe(readFileSync(file, 'utf8'));
      }
    });
  }
});
