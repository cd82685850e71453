import { describe, expect, it } from 'vitest';
import { parseModel, parseModelText, studyIssues } from '../../../src/core/model/schema';
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

describe('studyIssues: a study as the modeller edits it', () => {
  const r = parseModel({ ...base, version: 2, variables: [{ id: 'x', kind: 'state', timescale: 1 }] });
  if (!r.ok) throw new Error('base model');
  const model = r.model;
  const window = { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'stratified-random' };
  it('accepts a sound daily-window study, with a warning when the interval is not the window spacing', () => {
    // 5 stratified prompts in 12 h: one part is 12 h / 5 = 2.4 h (the spacing the schedule gives)
    expect(studyIssues({ interval: '2.4 h', length: '14 days', schedule: window, persons: 40, missedPrompts: 0.2 }, model)).toEqual({ issues: [], warnings: [] });
    const w = studyIssues({ interval: '3 h', length: '14 days', schedule: window }, model);
    expect(w.issues).toEqual([]);
    expect(w.warnings.map((i) => i.path)).toEqual(['study.interval']);
  });
  it('names the field of each problem of form', () => {
    const paths = (study: unknown) => studyIssues(study, model).issues.map((i) => i.path);
    expect(paths({ interval: '3h', length: 20, schedule: { ...window, promptsPerDay: 0 } })).toEqual(['study.schedule.promptsPerDay']);
    expect(paths({ interval: '3h', length: 20, schedule: { ...window, from: '9 am' } })).toEqual(['study.schedule.from']);
    expect(paths({ interval: '3h', length: 20, schedule: { kind: 'fixed' }, persons: 0 })).toEqual(['study.persons']);
    expect(paths({ interval: '3h', length: 20, schedule: { kind: 'fixed' }, missedPrompts: 1 })).toEqual(['study.missedPrompts']);
    expect(paths({ interval: '3h', length: 20, schedule: { kind: 'fortnightly' } })).toEqual(['study.schedule.kind']);
  });
  it('checks the study against the model: readable interval and length, window order, a length that fits two prompts', () => {
    const one = (study: unknown) => studyIssues(study, model).issues;
    expect(one({ interval: 'now and then', length: 20, schedule: { kind: 'fixed' } })[0]).toMatchObject({ path: 'study.interval', message: expect.stringContaining('is not an interval') });
    expect(one({ interval: '3h', length: 1, schedule: { kind: 'fixed' } })).toEqual([{ path: 'study.length', message: 'a study length in samples must be a whole number of at least 2, not 1' }]);
    expect(one({ interval: '3h', length: 20, schedule: { ...window, from: '21:00', to: '09:00' } }).map((i) => i.path)).toEqual(['study.schedule.to']);
    expect(one({ interval: '1 day', length: '12 h', schedule: { kind: 'fixed' } }).map((i) => i.path)).toEqual(['study.length']);
    expect(one({ interval: '3h', length: 20, schedule: { kind: 'fixed' }, holds: { nobody: 1 } }).map((i) => i.path)).toEqual(['study.holds.nobody']);
  });
});
