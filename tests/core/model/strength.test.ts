import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import { parseStrengthRangeText, strengthRangeText } from '../../../src/core/model/strength';

describe('a strength range typed in the inspector', () => {
  it('reads low..high, and what it writes reads back and passes the file validator', () => {
    const r = parseStrengthRangeText(' 0.2 .. 0.9 ');
    expect(r).toEqual({ ok: true, value: { low: 0.2, high: 0.9 } });
    expect(parseStrengthRangeText('')).toEqual({ ok: true, value: undefined });
    if (!r.ok || !r.value) throw new Error('not read');
    expect(parseStrengthRangeText(strengthRangeText(r.value))).toEqual(r);
    const file = { format: 'loopfold-model', version: 2, name: 'x', timeUnit: 'h', variables: [{ id: 'a', kind: 'state' }, { id: 'b', kind: 'state' }], links: [{ from: 'a', to: 'b', kind: 'integrating', strengthRange: r.value }] };
    expect(parseModel(file).ok).toBe(true);
  });
  it('refuses with a message saying what is wrong', () => {
    const msg = (t: string) => { const r = parseStrengthRangeText(t); return r.ok ? 'accepted' : r.message; };
    expect(msg('0.5')).toBe('"0.5" is not a range: write low..high, such as 0.2..0.9');
    expect(msg('a..1')).toBe('the low end "a" is not a number');
    expect(msg('0.1..')).toBe('the high end "" is not a number');
    expect(msg('0.9..0.2')).toBe('the low end 0.9 is above the high end 0.2');
    expect(msg('-1..2')).toMatch(/both ends must be 0 or more/);
  });
});
