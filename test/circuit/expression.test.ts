import { describe, it, expect } from 'vitest';
import { IMAGINARY_TOLERANCE, MAX_EXPRESSION_DEPTH, evaluateComplex, evaluateReal, type ExpressionError } from '../../src/circuit/expression.js';

/** The real value of src, failing the test on an error. */
function real(src: string, env: Record<string, number> = {}): number {
  const r = evaluateReal(src, env);
  if ('error' in r) throw new Error(`${src}: ${r.error.message} at ${r.error.offset}`);
  return r.value;
}

/** The complex value of src as [re, im], failing the test on an error. */
function cplx(src: string, env: Record<string, number> = {}): [number, number] {
  const r = evaluateComplex(src, env);
  if ('error' in r) throw new Error(`${src}: ${r.error.message} at ${r.error.offset}`);
  return r.value;
}

/** The error of a real evaluation, failing the test when there is none. */
function realError(src: string, env: Record<string, number> = {}): ExpressionError {
  const r = evaluateReal(src, env);
  if (!('error' in r)) throw new Error(`${src}: expected an error, got ${r.value}`);
  return r.error;
}

function complexError(src: string, env: Record<string, number> = {}): ExpressionError {
  const r = evaluateComplex(src, env);
  if (!('error' in r)) throw new Error(`${src}: expected an error, got ${r.value}`);
  return r.error;
}

describe('numbers', () => {
  it('reads integer, decimal, leading-dot and exponent forms', () => {
    expect(real('42')).toBe(42);
    expect(real('.5')).toBe(0.5);
    expect(real('2.')).toBe(2);
    expect(real('1e-3')).toBe(0.001);
    expect(real('1.5E2')).toBe(150);
    expect(real('2e+1')).toBe(20);
    expect(real('  3 \t')).toBe(3);
  });

  it('deg suffix multiplies by π/180, only directly after a number literal', () => {
    expect(real('90deg')).toBeCloseTo(Math.PI / 2, 15);
    expect(real('180deg')).toBe(Math.PI);
    expect(real('45deg*2')).toBeCloseTo(Math.PI / 2, 15);
    expect(real('-1.5e1deg')).toBeCloseTo(-Math.PI / 12, 15);
    expect(realError('90 deg').offset).toBe(3);
    expect(realError('x deg', { x: 1 }).offset).toBe(2);
  });

  it('refuses a name glued to a number, with a hint', () => {
    const e = realError('2pi');
    expect(e.offset).toBe(1);
    expect(e.message).toBe("unexpected 'pi' directly after the number '2' (write '2*pi' to multiply)");
  });

  it('refuses a literal that overflows', () => {
    expect(realError('1 + 1e999')).toEqual({ message: "the number '1e999' is too large", offset: 4 });
  });
});

describe('operators (precedence and associativity as in ordinary algebra, common practice)', () => {
  it('* and / bind tighter than + and −; parentheses override', () => {
    expect(real('1 + 2 * 3')).toBe(7);
    expect(real('(1 + 2) * 3')).toBe(9);
    expect(real('7 - 6 / 3')).toBe(5);
  });

  it('+ − * / are left-associative', () => {
    expect(real('1 - 2 - 3')).toBe(-4);
    expect(real('8 / 4 / 2')).toBe(1);
  });

  it('^ is right-associative and binds tighter than a unary minus on its left', () => {
    expect(real('2^3^2')).toBe(512);
    expect(real('(2^3)^2')).toBe(64);
    expect(real('-2^2')).toBe(-4);
    expect(real('(-2)^2')).toBe(4);
    expect(real('2^-1')).toBe(0.5);
    expect(real('2*3^2')).toBe(18);
  });

  it('unary minus and plus, repeated and after an operator', () => {
    expect(real('-3')).toBe(-3);
    expect(real('+3')).toBe(3);
    expect(real('--2')).toBe(2);
    expect(real('2*-3')).toBe(-6);
    expect(real('-0')).toBe(0);
    expect(Object.is(real('-0'), -0)).toBe(false);
  });
});

describe('constants, functions and parameters', () => {
  it('pi and e', () => {
    expect(real('pi')).toBe(Math.PI);
    expect(real('e')).toBe(Math.E);
    expect(real('pi/2')).toBe(Math.PI / 2);
  });

  it('sqrt sin cos tan exp ln', () => {
    expect(real('sqrt(2)')).toBe(Math.SQRT2);
    expect(real('sin(pi/2)')).toBe(1);
    expect(real('cos(0)')).toBe(1);
    expect(real('tan(pi/4)')).toBeCloseTo(1, 15);
    expect(real('exp(1)')).toBe(Math.E);
    expect(real('ln(e)')).toBe(1);
    expect(real('sqrt(sqrt(16))')).toBe(2);
  });

  it('parameters come from the environment', () => {
    const env = { theta: 0.25, phi_2: 3 };
    expect(real('2*theta + phi_2', env)).toBe(3.5);
    expect(real('-theta/2', env)).toBe(-0.125);
  });

  it('pi and e are reserved: the environment does not override them', () => {
    expect(real('pi', { pi: 3 })).toBe(Math.PI);
  });
});

describe('errors: message and offset', () => {
  it('"2 * * 3" fails at offset 4, saying what was expected', () => {
    expect(realError('2 * * 3')).toEqual({ message: "expected a number, name or '(' but found '*'", offset: 4 });
  });

  it('missing and unmatched parentheses', () => {
    expect(realError('(1 + 2')).toEqual({ message: "missing ')'", offset: 6 });
    expect(realError('sqrt(2')).toEqual({ message: "missing ')'", offset: 6 });
    expect(realError('(1 2)')).toEqual({ message: "expected an operator or ')' but found '2'", offset: 3 });
    expect(realError('1 + 2)')).toEqual({ message: "unmatched ')'", offset: 5 });
  });

  it('trailing input and empty input', () => {
    expect(realError('2 x', { x: 1 })).toEqual({ message: "unexpected 'x' after the end of the expression", offset: 2 });
    expect(realError('')).toEqual({ message: "expected a number, name or '(' but found the end of the expression", offset: 0 });
    expect(realError('1 +')).toEqual({ message: "expected a number, name or '(' but found the end of the expression", offset: 3 });
  });

  it('bad characters and bad function use', () => {
    expect(realError('1 $ 2')).toEqual({ message: "unexpected character '$'", offset: 2 });
    expect(realError('2 ** 3').offset).toBe(3);
    expect(realError('sqrt 2').offset).toBe(5);
    expect(realError('sqrt()')).toEqual({ message: "'sqrt' takes one argument", offset: 5 });
    expect(realError('sin(1, 2)')).toEqual({ message: "'sin' takes one argument", offset: 5 });
    const e = realError('1 + sqr(2)');
    expect(e.offset).toBe(4);
    expect(e.message).toMatch(/^unknown function 'sqr'; did you mean 'sqrt'\?/);
  });

  it('division by zero and non-finite results', () => {
    expect(realError('1 / (2 - 2)')).toEqual({ message: 'division by zero', offset: 2 });
    expect(realError('ln(0)')).toEqual({ message: "the result of 'ln' is not a finite number", offset: 0 });
    expect(realError('2 * exp(1000)').offset).toBe(4);
    expect(realError('0^-1').offset).toBe(1);
    expect(realError('10^400').message).toBe("the result of '^' is not a finite number");
  });

  it('a real expression must have a real result (imaginary part above IMAGINARY_TOLERANCE)', () => {
    expect(realError('sqrt(-1)')).toEqual({ message: 'expected a real value but the result has imaginary part 1', offset: 0 });
    expect(realError('ln(-1)').message).toMatch(/imaginary part 3\.14159/);
    expect(IMAGINARY_TOLERANCE).toBeLessThan(1e-9);
    // sqrt(-1)^2 goes through complex values but ends real: allowed.
    expect(real('sqrt(-4)^2')).toBe(-4);
  });

  it('refuses absurd nesting instead of overflowing the stack', () => {
    const deep = '('.repeat(MAX_EXPRESSION_DEPTH + 5) + '1' + ')'.repeat(MAX_EXPRESSION_DEPTH + 5);
    expect(realError(deep).message).toMatch(/nested too deeply/);
    expect(realError('-'.repeat(10 * MAX_EXPRESSION_DEPTH) + '1').message).toMatch(/nested too deeply/);
    expect(realError(Array(10 * MAX_EXPRESSION_DEPTH).fill('1').join('+')).message).toMatch(/too long/);
    expect(real('((((1))))')).toBe(1);
  });
});

describe('unknown names', () => {
  it('suggests the nearest known name and lists the known names', () => {
    const e = realError('2 * thta', { theta: 1, phi: 2 });
    expect(e.offset).toBe(4);
    expect(e.message).toBe("unknown name 'thta'; did you mean 'theta'? (known names: theta, phi, pi, e)");
  });

  it('without a close match it only lists the known names', () => {
    expect(realError('alpha', { theta: 1 }).message).toBe("unknown name 'alpha' (known names: theta, pi, e)");
  });

  it('JS globals and prototype members are unknown names', () => {
    for (const name of ['constructor', '__proto__', 'process', 'toString', 'hasOwnProperty', 'globalThis', 'Math', 'eval']) {
      const e = realError(name, { theta: 1 });
      expect(e.message, name).toMatch(new RegExp(`^unknown name '${name}'`));
      expect(e.offset).toBe(0);
    }
    expect(realError('constructor(1)').message).toMatch(/^unknown function 'constructor'/);
  });

  it('i is not the imaginary unit in a real expression', () => {
    expect(realError('i').message).toMatch(/^unknown name 'i': the imaginary unit is allowed only in matrix entries/);
    expect(realError('2i')).toEqual({ message: "unexpected 'i' after the number '2': only a real value is allowed here", offset: 1 });
    expect(real('2*i', { i: 3 })).toBe(6); // a parameter may be called i in angle expressions
  });

  it('a non-finite parameter value is reported where it is used', () => {
    expect(realError('1 + t', { t: NaN })).toEqual({ message: "the value of 't' is not a finite number", offset: 4 });
  });
});

describe('complex entries', () => {
  it('reads the usual forms of matrix entries', () => {
    expect(cplx('0.5-0.5i')).toEqual([0.5, -0.5]);
    expect(cplx('i')).toEqual([0, 1]);
    expect(cplx('-i')).toEqual([0, -1]);
    expect(cplx('2i')).toEqual([0, 2]);
    expect(cplx('1/sqrt(2)')).toEqual([1 / Math.sqrt(2), 0]); // IEEE 1/√2, one ulp below Math.SQRT1_2
    expect(cplx('(1+i)/2')).toEqual([0.5, 0.5]);
    expect(cplx('0')).toEqual([0, 0]);
    expect(cplx('-0')).toEqual([0, 0]);
  });

  it('exp(iπ/4) = (1 + i)/√2 and e^(iπ) = −1 (Euler formula, common practice)', () => {
    const [a, b] = cplx('exp(i*pi/4)');
    expect(a).toBeCloseTo(Math.SQRT1_2, 15);
    expect(b).toBeCloseTo(Math.SQRT1_2, 15);
    const [c, d] = cplx('e^(i*pi)');
    expect(c).toBeCloseTo(-1, 15);
    expect(d).toBeCloseTo(0, 15);
  });

  it('integer powers of complex numbers are exact; principal roots otherwise', () => {
    expect(cplx('i^2')).toEqual([-1, 0]);
    expect(cplx('(1+i)^-2')).toEqual([0, -0.5]);
    const [a, b] = cplx('sqrt(-4)');
    expect([a, b]).toEqual([0, 2]);
  });

  it('parameters work in entries too; i is reserved there', () => {
    expect(cplx('cos(t) - i*sin(t)', { t: 0 })).toEqual([1, 0]);
    expect(cplx('i', { i: 5 })).toEqual([0, 1]);
  });

  it('errors carry offsets', () => {
    expect(complexError('1/(i-i)')).toEqual({ message: 'division by zero', offset: 1 });
    expect(complexError('0.5 - 0.5j').offset).toBe(9);
    expect(complexError('2 ii').offset).toBe(2);
    expect(complexError('ii').message).toMatch(/^unknown name 'ii'.*\(known names: pi, e, i\)$/);
  });
});
