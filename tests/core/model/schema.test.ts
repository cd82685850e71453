import { describe, expect, it } from 'vitest';
import { parseModel, parseModelText } from '../../../src/core/model/schema';
import { parseDuration, formatDuration } from '../../../src/core/model/units';

const base = { format: 'loopfold-model', version: 1, name: 'm', timeUnit: 'h', variables: [], links: [] };

describe('model file validation', () => {
  it('accepts a minimal model', () => {
    expect(parseModel(base).ok).toBe(true);
  });
  it('names the JSON path and the problem', () => {
    const r = parseModel({ ...base, variables: [{ id: 'a', kind: 'stock' }] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues).toContainEqual({ path: 'variables[0].kind', message: 'must be "input", "state" or "derived"' });
  });
  it('reports links to missing variables and duplicate ids', () => {
    const r = parseModel({ ...base, variables: [{ id: 'a', kind: 'input' }, { id: 'a', kind: 'derived' }], links: [{ from: 'a', to: 'zz', kind: 'instantaneous' }] });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.issues.map((i) => i.path)).toEqual(['variables[1].id', 'links[0].to']);
      expect(r.issues[1].message).toContain('"zz"');
    }
  });
  it('refuses fields that do not belong to the kind', () => {
    const r = parseModel({ ...base, variables: [{ id: 'u', kind: 'input', rate: 'u' }] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].path).toBe('variables[0].rate');
  });
  it('reports broken JSON without throwing', () => {
    const r = parseModelText('{"format": ');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toMatch(/not valid JSON/);
  });
  it('rejects unknown fields (a file from elsewhere is not half-loaded)', () => {
    const r = parseModel({ ...base, extra: 1 });
    expect(r.ok).toBe(false);
  });
});

describe('durations', () => {
  it('converts units (1 day = 24 h, 1 h = 60 min: SI-accepted units, common practice)', () => {
    expect(parseDuration('90 min', 'h')).toEqual({ ok: true, value: 1.5 });
    expect(parseDuration('2 days', 'h')).toEqual({ ok: true, value: 48 });
    expect(parseDuration('3h', 'day')).toEqual({ ok: true, value: 0.125 });
    expect(parseDuration(4, 'week')).toEqual({ ok: true, value: 4 });
  });
  it('explains a bad duration', () => {
    const r = parseDuration('3 parsecs', 'h');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('parsecs');
  });
  it('formats in the unit a reader expects', () => {
    expect(formatDuration(0.125, 'day')).toBe('3 h');
    expect(formatDuration(48, 'h')).toBe('2 days');
    expect(formatDuration(0.5, 'min')).toBe('30 s');
  });
});
