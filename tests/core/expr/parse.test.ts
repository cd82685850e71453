import { describe, expect, it } from 'vitest';
import { parse } from 'mathjs';
import { isReservedName, parseExpression, parseRelation, splitRelation } from '../../../src/core/expr/parse';

describe('restricted formula language', () => {
  it('lists the symbols of a formula, as mathjs reads them', () => {
    const text = 'k * (a - b) + exp(-c / tau)';
    const r = parseExpression(text);
    expect(r.ok).toBe(true);
    // mathjs itself (a general-purpose library) names the same symbols.
    const viaMathjs = parse(text).filter((n) => n.type === 'SymbolNode' && !['exp'].includes((n as unknown as { name: string }).name)).map((n) => (n as unknown as { name: string }).name);
    if (r.ok) expect(r.symbols).toEqual([...new Set(viaMathjs)].sort());
  });
  it.each([
    ['f(x) = x', /may not assign or define/],
    ['a.b', /accessor/],
    ['[1, 2]', /array/],
    ['"text"', /only numbers/],
    ['import(1)', /not a function formulas can use/],
    ['a ? b : c', /conditional/],
    ['a == b', /operator "=="/],
    ['exp(a, b)', /takes 1 argument/],
    ['a +* b', /syntax error/],
  ])('refuses %s with a reason', (text, reason) => {
    const r = parseExpression(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(reason);
  });
  it('names unknown symbols', () => {
    const r = parseExpression('a + q + z', new Set(['a']));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.unknown).toEqual(['q', 'z']);
  });
  it('treats names of the object prototype as ordinary names, not functions', () => {
    expect(isReservedName('constructor')).toBe(false);
    expect(isReservedName('toString')).toBe(false);
    expect(isReservedName('exp')).toBe(true);
    const r = parseExpression('constructor + toString', new Set(['constructor', 'toString']));
    expect(r.ok).toBe(true);
    const call = parseExpression('constructor(1)');
    expect(call.ok).toBe(false);
    if (!call.ok) expect(call.error.message).toMatch(/not a function formulas can use/);
  });
  it('splits a relation at its one "=" and shifts error positions to the right side', () => {
    expect(splitRelation('a*b = c*d')).toMatchObject({ ok: true, lhs: 'a*b ', rhs: ' c*d' });
    expect(splitRelation('a <= b').ok).toBe(false);
    const r = parseRelation('a*b = c*+');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.position).toBeGreaterThan(5);
    const ok = parseRelation('deliveries * leadTime = pipeline');
    expect(ok.ok && ok.symbols).toEqual(['deliveries', 'leadTime', 'pipeline']);
  });
});
