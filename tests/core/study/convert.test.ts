import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TIME_UNITS, type Study, type TimeUnit } from '../../../src/core/model/types';
import { convertDuration, formatDuration } from '../../../src/core/model/units';
import { convertStudy, designOfStudy, exactDuration, intervalLabel, lengthAxis, parseInterval } from '../../../src/core/study/convert';
import { expectClose } from '../../helpers/tolerance';

const value = (text: string, unit: TimeUnit) => {
  const r = parseInterval(text, unit);
  if (!r.ok) throw new Error(r.message);
  return r.value;
};

describe('typed intervals', () => {
  // 1 day = 24 h, 1 week = 7 days, 1 h = 60 min (SI-accepted units; common practice)
  it.each([
    ['3h', 'h', 3], ['90 min', 'h', 1.5], ['every 3 h', 'h', 3], ['Every 3 hours', 'day', 0.125], ['daily', 'h', 24], ['weekly', 'day', 7],
    ['hourly', 'min', 60], ['every day', 'h', 24], ['every week', 'h', 168], ['5 a day', 'h', 4.8], ['5 times a day', 'min', 288],
    ['twice a day', 'h', 12], ['once a week', 'day', 7], ['3 per day', 'h', 8], ['2.5', 'h', 2.5], ['every 1.5 days', 'h', 36],
  ] as const)('%s in %s is %d', (text, unit, expected) => expectClose(value(text, unit), expected));
  it('explains what it cannot read', () => {
    const r = parseInterval('every now and then', 'h');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/"every now and then" is not an interval: write a duration such as "3h", "90 min", "every 3 h", "daily" or "weekly"/);
    expect(parseInterval('5 a fortnight', 'h').ok).toBe(false);
    expect(parseInterval('', 'h').ok).toBe(false);
    expect(parseInterval('-3h', 'h').ok).toBe(false);
  });
  it('every label the app shows reads back to the same label (property, every time unit)', () => {
    fc.assert(
      fc.property(fc.double({ min: -6, max: 6, noNaN: true }), fc.constantFrom(...TIME_UNITS), (logv, unit) => {
        const v = Math.exp(logv * 2);
        fc.pre(convertDuration(v, unit, 's') >= 0.1); // the interval control stops at a tenth of a second
        const label = intervalLabel(v, unit);
        const back = value(label, unit);
        expect(intervalLabel(back, unit)).toBe(label);
        expect(value(formatDuration(v, unit), unit)).toBe(back);
        // the exact form reads back to the same number
        expectClose(value(exactDuration(v, unit), unit), v, { relTol: 1e-13 });
      }),
      { numRuns: 400, seed: 41 },
    );
  });
  it('writes whole amounts in the unit that reads best', () => {
    expect(exactDuration(0.125, 'day')).toBe('3 h');
    expect(exactDuration(1, 'day')).toBe('1 day');
    expect(exactDuration(1.5, 'h')).toBe('90 min');
    expect(exactDuration(7, 'day')).toBe('1 week');
  });
});

describe('a study in another time unit means the same real times', () => {
  const study: Study = { interval: 1, length: '14 days', schedule: { kind: 'daily' }, holds: { x: 1 } };
  it('a daily interval stays one day (not "3.43 weeks")', () => {
    const w = convertStudy(study, 'day', 'week');
    expectClose(value(String(w.interval), 'week'), 1 / 7);
    expect(formatDuration(value(String(w.interval), 'week'), 'week')).toBe('1 day');
    expect(w.length).toBe('14 days');
    expect(w.holds).toEqual({ x: 1 });
  });
  it('a bare number in text is in the model unit and is converted; a count of samples stays a count', () => {
    const w = convertStudy({ interval: '2', length: '3', schedule: { kind: 'fixed' } }, 'h', 'min');
    expect(w.interval).toBe(120);
    expect(w.length).toBe('180');
    expect(convertStudy({ interval: 2, length: 50, schedule: { kind: 'fixed' } }, 'h', 'day').length).toBe(50);
  });
  it('the design the ordering reads is the same in real time after any change of unit (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...TIME_UNITS), fc.constantFrom(...TIME_UNITS), fc.double({ min: 0.01, max: 100, noNaN: true }), fc.boolean(), (from, to, iv, byWindow) => {
        const s: Study = { interval: iv, length: byWindow ? `${iv * 30}` : 30, schedule: { kind: 'fixed' } };
        const a = designOfStudy(s, from);
        const b = designOfStudy(convertStudy(s, from, to), to);
        expectClose(b.interval!, convertDuration(a.interval!, from, to), { relTol: 1e-12 });
        if (byWindow) expectClose(b.window!, convertDuration(a.window!, from, to), { relTol: 1e-12 });
        else expect(b.samples).toBe(a.samples);
      }),
      { numRuns: 200, seed: 3 },
    );
  });
  it('reads the length as samples or a window', () => {
    expect(lengthAxis(50, 'h')).toEqual({ ok: true, samples: 50 });
    expect(lengthAxis('2 weeks', 'day')).toEqual({ ok: true, window: 14 });
    expect(lengthAxis(1.5, 'h').ok).toBe(false);
  });
});
