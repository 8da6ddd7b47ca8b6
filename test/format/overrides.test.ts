import { describe, expect, it } from 'vitest';
import { parseCircuitText, type LoadOptions } from '../../src/api/loadCircuit.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';

/**
 * The override door (src/format/overrides.ts, src/noise/profile.ts): `--set` dotted keys,
 * `none`, parameters in number places, and `--layout`. Every value is checked by the same
 * reader as in a file; problems are located on the command line (line n = the n-th --set).
 */
const DEVICE = `name: dev
qubits:
  all: { t1: 50us, t2: 40us, readout: 0.02 }
  3: { t1: 10us, t2: 8us }
gates:
  all: { duration: 30ns }
  cx: { duration: 200ns, error: 0.01 }
  "cx 0 1": { error: 0.03 }
`;

const BELL = `qubits: 2
device: dev.yaml
params: { theta: 0.3 }
steps:
  - h: 0
  - cx: [0, 1]
  - rz: 1
    angle: theta
`;

function load(text: string, options: LoadOptions = {}) {
  const problems = new ProblemList();
  const loaded = parseCircuitText(text, 'c.yaml', problems, {
    ...options,
    readDevice: (path) => (path === 'dev.yaml' ? { text: DEVICE, file: 'dev.yaml' } : undefined),
  });
  return { loaded, errors: problems.errors.map(formatProblem) };
}

const ok = (text: string, options: LoadOptions = {}) => {
  const r = load(text, options);
  if (r.loaded === undefined) throw new Error(r.errors.join('\n'));
  return r.loaded;
};

describe('--set errors are located on the command line', () => {
  const cases: { set: Record<string, string>; where: string; says: string }[] = [
    { set: { 'qubits.all.t1': '-5us' }, where: '(command line):1:15', says: "--set qubits.all.t1=-5us: 't1' of qubit entry 'all': duration '-5us' is negative" },
    { set: { 'gates.cx.eror': '0.1' }, where: '(command line):1:10', says: "did you mean 'error'?" },
    { set: { 'gates.cxx.error': '0.1' }, where: '(command line):1:1', says: "no gate named 'cxx' in this circuit or the built-ins; did you mean 'cx'?" },
    { set: { 'qubit.all.t1': '3us' }, where: '(command line):1:1', says: "'qubit' is neither a parameter nor a profile key; did you mean 'qubits'?" },
    { set: { 'qubits.7.t1': '3us' }, where: '(command line):1:1', says: 'qubit 7 is out of range' },
    { set: { theta: '0.1', 'gates.cx.error': '2' }, where: '(command line):2:16', says: '--set gates.cx.error=2: \'error\' in gate entry \'cx\' must be a probability between 0 and 1, not 2' },
    { set: { 'qubits.all.t2': '900us' }, where: '(command line):1:15', says: 'exceeds 2·t1' },
    { set: { idle: 'nne' }, where: '(command line):1:6', says: "did you mean 'none'?" },
    { set: { 'qubits.all': '3us' }, where: '(command line):1:12', says: "--set qubits.all=3us: qubit entry 'all' must be a map of keys, not '3us'" },
    { set: { 'gates.cx.error': '' }, where: '(command line):1:16', says: 'the value is empty' },
    { set: { thetta: '1' }, where: 'c.yaml:3:9', says: "--set thetta=1: the circuit has no parameter 'thetta'; did you mean 'theta'?" },
  ];
  it.each(cases)('$set', ({ set, where, says }) => {
    const { errors } = load(BELL, { set });
    expect(errors.length).toBeGreaterThan(0);
    expect(errors[0]!.startsWith(`${where}: `), errors[0]).toBe(true);
    expect(errors[0]).toContain(says);
  });
});

describe('--set over the profile', () => {
  it('a parameter by bare name and as params.NAME', () => {
    const a = ok(BELL, { set: { theta: '0.7' } }).circuit.params['theta'];
    const b = ok(BELL, { set: { 'params.theta': '0.7' } }).circuit.params['theta'];
    expect([a, b]).toEqual([0.7, 0.7]);
  });

  it('qubit fields: all, by index; command line beats a per-qubit file entry', () => {
    const p = ok(BELL, { set: { 'qubits.all.t1': '20us', 'qubits.1.readout': '0.1' } }).profile;
    expect(p.qubits.map((q) => q.t1)).toEqual([20_000, 20_000]);
    expect(p.qubits[1]!.readout).toEqual({ zeroAsOne: 0.1, oneAsZero: 0.1 });
    expect(p.qubits[0]!.readout.zeroAsOne).toBe(0.02);
  });

  it('gates.cx applies to every cx, also where the file has a tuple entry; a tuple key to that tuple only', () => {
    expect(ok(BELL, { set: { 'gates.cx.error': '0.005' } }).profile.gateEntry('cx', [0, 1]).kinds.error?.value).toBe(0.005);
    const p = ok(BELL, { set: { 'gates.cx 1 0.error': '0.002' } }).profile;
    expect(p.gateEntry('cx', [1, 0]).kinds.error?.value).toBe(0.002);
    expect(p.gateEntry('cx', [0, 1]).kinds.error?.value).toBe(0.03);
  });

  it('error and depolarizing replace each other across the layers', () => {
    const e = ok(BELL, { set: { 'gates.cx.depolarizing': '0.02' } }).profile.gateEntry('cx', [0, 1]);
    expect(e.kinds.error).toBeUndefined();
    expect(e.kinds.depolarizing?.value).toBe(0.02);
  });

  it('idle and schedule', () => {
    const p = ok(BELL, { set: { idle: 'none', schedule: 'alap' } }).profile;
    expect([p.idle, p.schedule]).toEqual(['none', 'alap']);
  });

  it('a flow map as the value (readout with two probabilities)', () => {
    const p = ok(BELL, { set: { 'qubits.0.readout': '{zero_as_one: 0.01, one_as_zero: 0.04}' } }).profile;
    expect(p.qubits[0]!.readout).toEqual({ zeroAsOne: 0.01, oneAsZero: 0.04 });
  });
});

describe('none switches a field off', () => {
  it('on the command line: t1 (t2 then falls back to no relaxation), error, readout', () => {
    const p = ok(BELL, { set: { 'qubits.all.t1': 'none', 'qubits.all.t2': 'none', 'gates.cx.error': 'none', 'qubits.1.readout': 'none' } }).profile;
    expect(p.qubits.map((q) => [q.t1, q.t2])).toEqual([[Infinity, Infinity], [Infinity, Infinity]]);
    expect(p.gateEntry('cx', [0, 1]).kinds.error).toBeUndefined();
    expect(p.qubits[1]!.readout).toEqual({ zeroAsOne: 0, oneAsZero: 0 });
  });

  it('a more specific none beats a less specific value: gates.cx.error none drops the all entry\'s error too', () => {
    const text = BELL.replace('steps:', 'noise:\n  gates:\n    all: { error: 0.001 }\n    cx: { error: none }\nsteps:');
    const p = ok(text).profile;
    expect(p.gateEntry('cx', [1, 0]).kinds.error).toBeUndefined();
    expect(p.gateEntry('h', [0]).kinds.error?.value).toBe(0.001);
  });

  it('in an inline profile: a per-qubit none beats the all entry', () => {
    const text = BELL.replace('steps:', 'noise:\n  qubits:\n    0: { t1: none, t2: none }\nsteps:');
    const p = ok(text).profile;
    expect(p.qubits[0]!.t1).toBe(Infinity);
    expect(p.qubits[1]!.t1).toBe(50_000);
  });

  it('t1 none gives the same run as a device without t1 (derived: an absent field is no noise)', () => {
    const off = simulateLoaded(ok(BELL, { set: { 'qubits.all.t1': 'none', 'qubits.all.t2': 'none' } })).result;
    const text = BELL.replace('device: dev.yaml\n', `noise:\n  qubits: { all: { readout: 0.02 } }\n  gates: { all: { duration: 30ns }, cx: { duration: 200ns, error: 0.01 }, "cx 0 1": { error: 0.03 } }\n`);
    const plain = simulateLoaded(ok(text)).result;
    expect(off.fidelity.state).toBeCloseTo(plain.fidelity.state, 14);
    expect(off.tvd).toBeCloseTo(plain.tvd, 14);
  });
});

describe('parameters where numbers go', () => {
  it('a probability, a duration with its unit last, and a readout as expressions of params equal the literals', () => {
    const withParams = `qubits: 1
params: { p: 0.01, tau: 2 }
noise:
  qubits: { all: { t1: "10*tau us", readout: "p/2" } }
  gates: { x: { depolarizing: "3*p" } }
steps:
  - x: 0
  - idle: 0
    for: "(tau + 1) us"
`;
    const literal = withParams.replace('"10*tau us"', '20us').replace('"p/2"', '0.005').replace('"3*p"', '0.03').replace('"(tau + 1) us"', '3us');
    const a = simulateLoaded(ok(withParams)).result;
    const b = simulateLoaded(ok(literal)).result;
    expect(a.probabilities.measured).toEqual(b.probabilities.measured);
    expect(a.duration_ns).toBe(3000);
  });

  it('--set of a parameter moves every number that uses it', () => {
    const text = `qubits: 1
params: { tau: 1 }
steps:
  - idle: 0
    for: tau us
`;
    expect(simulateLoaded(ok(text, { set: { tau: '4' } })).result.duration_ns).toBe(4000);
  });

  it('an out-of-range value names the expression; a duration expression without a unit is refused', () => {
    const base = 'qubits: 1\nparams: { p: 0.8 }\nsteps:\n  - x: 0\n    noise: { depolarizing: "2*p" }\n';
    expect(load(base).errors).toEqual(["c.yaml:5:28: 'depolarizing' in 'noise' of step 1 (x) must be a probability between 0 and 1, not 1.6 (the value of '2*p')"]);
    const noUnit = 'qubits: 1\nparams: { tau: 2 }\nsteps:\n  - idle: 0\n    for: tau\n';
    expect(load(noUnit).errors[0]).toContain("c.yaml:5:10: 'for' of step 1 (idle): 'tau' has no unit; write the unit last after a space");
  });
});

describe('--layout', () => {
  it('reads the device at the physical qubits: circuit qubit 1 on device qubit 3 gets its T1', () => {
    const p = ok(BELL, { layout: [2, 3] }).profile;
    expect(p.qubits.map((q) => q.t1)).toEqual([50_000, 10_000]);
    // the device's "cx 0 1" entry is for device qubits 0 and 1, which the circuit does not use here
    expect(p.gateEntry('cx', [0, 1]).kinds.error?.value).toBe(0.01);
    expect(ok(BELL, { layout: [0, 1] }).profile.gateEntry('cx', [0, 1]).kinds.error?.value).toBe(0.03);
  });

  it('refuses a layout of the wrong length or with a repeated qubit', () => {
    expect(load(BELL, { layout: [1] }).errors[0]).toContain('(command line):1:1: --layout 1: names 1 device qubit but the circuit has 2');
    expect(load(BELL, { layout: [1, 1] }).errors[0]).toContain('names a device qubit twice');
  });
});
