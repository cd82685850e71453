import { describe, expect, it } from 'vitest';
import { parseTimescaleText, readTimescale, timescaleText } from '../../../src/core/model/timescale';
import { parseModel } from '../../../src/core/model/schema';
import { rolesAt } from '../../../src/core/ordering/index';
import { decimals, expectClose } from '../../helpers/tolerance';
import type { Model } from '../../../src/core/model/types';

describe('timescales known as a range', () => {
  it('reads a range into the model unit with its geometric mean as the point value', () => {
    const r = readTimescale({ low: '30 min', high: '3 h' }, 'h');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expectClose(r.low, 0.5, decimals(12));
    expectClose(r.high, 3, decimals(12));
    // √(0.5 · 3) = √1.5 (arithmetic)
    expectClose(r.point, Math.sqrt(1.5), decimals(12));
    expect(r.uncertain).toBe(true);
    expect(r.text).toBe('30 min..3 h');
  });

  it('turns typed text into a range and back, and names a bad end', () => {
    expect(parseTimescaleText(' 30 min .. 3 h ', 'h')).toEqual({ ok: true, value: { low: '30 min', high: '3 h' } });
    expect(parseTimescaleText('2 days', 'h')).toEqual({ ok: true, value: '2 days' });
    expect(timescaleText({ low: '30 min', high: '3 h' })).toBe('30 min..3 h');
    const bad = parseTimescaleText('3 h..30 min', 'h');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.message).toMatch(/high end/);
    const empty = parseTimescaleText('..3 h', 'h');
    expect(empty.ok).toBe(false);
  });

  it('the file schema accepts { low, high } and locates a bad end', () => {
    const base: Model = { format: 'loopfold-model', version: 1, name: 'r', timeUnit: 'h', variables: [{ id: 'worry', kind: 'state', timescale: { low: '30 min', high: '3 h' } }], links: [] };
    expect(parseModel(base).ok).toBe(true);
    const bad = parseModel({ ...base, variables: [{ id: 'worry', kind: 'state', timescale: { low: '30 min', high: 'soon' } }] });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0].path).toBe('variables[0].timescale.high');
  });

  it('the ordering at an interval uses the geometric mean of a range', () => {
    // τ = √(0.5·3) h ≈ 1.22 h; settled once 5·τ ≤ Δ (separation 5), so at 6.2 h but not at 6.0 h
    const m: Model = { format: 'loopfold-model', version: 1, name: 'r', timeUnit: 'h', variables: [{ id: 'worry', kind: 'state', timescale: { low: 0.5, high: 3 } }], links: [] };
    expect(rolesAt(m, { interval: 6.2, samples: 50 }).roles.worry).toBe('settled');
    expect(rolesAt(m, { interval: 6.0, samples: 50 }).roles.worry).toBe('state');
  });
});
