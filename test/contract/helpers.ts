/**
 * Small helpers of the contract oracle: a seeded PRNG and a YAML emitter that writes
 * the generated circuits the way a person would (integer keys stay integers).
 */

/** mulberry32 (Tommy Ettinger, public domain; from memory): seeded uniforms in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal sample by the Box–Muller transform (common practice). */
export function gaussian(rng: () => number): number {
  const u = 1 - rng();
  const v = rng();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

const PLAIN_STRING = /^[A-Za-z_][A-Za-z0-9_]*$/;
const DURATION_STRING = /^[0-9]+(\.[0-9]+)?(ns|us|ms|s)$/;
const PLAIN_KEY = /^([A-Za-z_][A-Za-z0-9_]*|[0-9]+)$/;
const YAML_WORDS = new Set(['true', 'false', 'null', 'yes', 'no', 'y', 'n', 'off', 'True', 'False', 'Null', 'NULL', 'TRUE', 'FALSE']);

function emitKey(key: string): string {
  return PLAIN_KEY.test(key) && !YAML_WORDS.has(key) ? key : JSON.stringify(key);
}

function emitScalar(value: unknown): string {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`cannot emit ${value}`);
    return String(value);
  }
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (typeof value === 'string') {
    if ((PLAIN_STRING.test(value) && !YAML_WORDS.has(value)) || DURATION_STRING.test(value)) return value;
    return JSON.stringify(value);
  }
  if (value === null) return 'null';
  throw new Error(`cannot emit ${typeof value}`);
}

function emitFlow(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(emitFlow).join(', ')}]`;
  if (value !== null && typeof value === 'object') {
    const parts = Object.entries(value as Record<string, unknown>).map(([k, v]) => `${emitKey(k)}: ${emitFlow(v)}`);
    return `{ ${parts.join(', ')} }`;
  }
  return emitScalar(value);
}

/** Emits a JS value as block-style YAML; arrays and maps inside arrays are written in flow style. */
export function toYaml(value: unknown, indent = 0): string {
  const pad = ' '.repeat(indent);
  if (Array.isArray(value)) {
    return value.map((item) => `${pad}- ${emitFlow(item)}\n`).join('');
  }
  if (value !== null && typeof value === 'object') {
    let out = '';
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
      if (v === undefined) continue;
      if (Array.isArray(v)) {
        if (k === 'steps') out += `${pad}${emitKey(k)}:\n${toYaml(v, indent + 2)}`;
        else out += `${pad}${emitKey(k)}: ${emitFlow(v)}\n`;
      } else if (v !== null && typeof v === 'object') {
        if (Object.keys(v).length === 0) out += `${pad}${emitKey(k)}: {}\n`;
        else out += `${pad}${emitKey(k)}:\n${toYaml(v, indent + 2)}`;
      } else {
        out += `${pad}${emitKey(k)}: ${emitScalar(v)}\n`;
      }
    }
    return out;
  }
  return `${pad}${emitScalar(value)}\n`;
}

/** A uniformly chosen element of a non-empty list. */
export function pick<T>(rng: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rng() * xs.length)]!;
}

/** A uniformly shuffled copy (Fisher–Yates; D. E. Knuth, TAOCP vol. 2, §3.4.2). */
export function shuffle<T>(rng: () => number, xs: readonly T[]): T[] {
  const a = [...xs];
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rng() * (i + 1));
    [a[i], a[j]] = [a[j]!, a[i]!];
  }
  return a;
}
