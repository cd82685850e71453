import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { compileExpression, compileExpressionClosure } from '../../../src/core/expr/compile';
import { partials } from '../../../src/core/expr/derivative';
import { parseExpression } from '../../../src/core/expr/parse';
import { close, decimals, expectClose } from '../../helpers/tolerance';
import { seededRandom } from '../../../src/core/stats/random';

const FORMULAS = [
  'k*(a - b)',
  'a^2 + 3*b - c/4',
  'exp(-a) * sin(b) + cos(c)^2',
  'sqrt(a^2 + b^2) - log(1 + c^2)',
  'tanh(a*b) + atan2(b, c) + abs(a - c)',
  'max(a, b, c) - min(a, 2*b) + sign(c)',
  'pow(a, 2) * log10(1 + b^2) + log2(2 + c^2) + cbrt(a)',
  '-a + +b - (c) * pi / e',
  'sinh(a/3) + cosh(b/4) + atan(c) + asin(a/10) + acos(b/10) + tan(c/5)',
  '2a + 3 b c',
];

function slotsFor(names: string[]): Map<string, number> {
  return new Map(names.map((n, i) => [n, i]));
}

describe('compiled formulas', () => {
  it('agree with mathjs evaluate on random points (mathjs is the reference evaluator)', () => {
    const rand = seededRandom(42).uniform;
    const names = ['a', 'b', 'c', 'k'];
    const slots = slotsFor(names);
    for (const f of FORMULAS) {
      const p = parseExpression(f, new Set(names));
      if (!p.ok) throw new Error(p.error.message);
      const gen = compileExpression(p.node, slots);
      const clo = compileExpressionClosure(p.node, slots);
      for (let t = 0; t < 20; t++) {
        const v = Float64Array.from(names, () => 8 * rand() - 4);
        const scope = Object.fromEntries(names.map((n, i) => [n, v[i]]));
        const ref = evaluate(f, scope) as number;
        expect(close(gen(v), ref, { relTol: 1e-13, absTol: 1e-13 }), `${f} at ${[...v]}: ${gen(v)} vs ${ref}`).toBe(true);
        expect(close(clo(v), ref, { relTol: 1e-13, absTol: 1e-13 }), `${f} (closure)`).toBe(true);
      }
    }
  });

  it('never puts a model name into the generated code', () => {
    const names = ['globalThis', '__proto__x', 'alert', 'process'];
    const p = parseExpression('globalThis + __proto__x * alert - process');
    if (!p.ok) throw new Error(p.error.message);
    const fn = compileExpression(p.node, slotsFor(names));
    const src = fn.toString();
    for (const n of names) expect(src).not.toContain(n);
    expect(fn(Float64Array.of(1, 2, 3, 4))).toBe(1 + 2 * 3 - 4);
  });

  it('refuses a symbol that is not a variable of the model', () => {
    const p = parseExpression('a + zeta');
    if (!p.ok) throw new Error(p.error.message);
    expect(() => compileExpression(p.node, slotsFor(['a']))).toThrow(/zeta/);
  });
});

describe('partial derivatives', () => {
  it('symbolic derivatives match central differences of mathjs evaluate', () => {
    const rand = seededRandom(7).uniform;
    const names = ['a', 'b', 'c', 'k'];
    const slots = slotsFor(names);
    for (const f of FORMULAS) {
      const p = parseExpression(f, new Set(names));
      if (!p.ok) throw new Error(p.error.message);
      const ds = partials(p.node, p.symbols, slots);
      for (let t = 0; t < 5; t++) {
        const v = Float64Array.from(names, () => 3 * rand() + 0.5);
        for (const d of ds) {
          const h = 1e-5;
          const up = Object.fromEntries(names.map((n, i) => [n, v[i] + (n === d.symbol ? h : 0)]));
          const dn = Object.fromEntries(names.map((n, i) => [n, v[i] - (n === d.symbol ? h : 0)]));
          const ref = ((evaluate(f, up) as number) - (evaluate(f, dn) as number)) / (2 * h);
          expect(close(d.at(v), ref, { relTol: 1e-6, absTol: 1e-6 }), `∂(${f})/∂${d.symbol}: ${d.at(v)} vs ${ref}`).toBe(true);
        }
      }
    }
  });

  it('falls back to differences where the symbolic form is undefined (|x| at 0 has one-sided slopes ±1, common practice)', () => {
    const p = parseExpression('abs(x) + x^2');
    if (!p.ok) throw new Error(p.error.message);
    const [d] = partials(p.node, p.symbols, slotsFor(['x']));
    expect(d.symbolic).toBe(true);
    expect(Number.isFinite(d.at(Float64Array.of(0)))).toBe(true);
    expectClose(d.at(Float64Array.of(2)), 5, decimals(12));
  });
});
