import { describe, expect, it } from 'vitest';
import type { Study } from '../../../src/core/model/types';
import { convertStudy } from '../../../src/core/study/convert';
import { lengthFieldText, lengthOther, switchedLength, typedLength } from '../../../src/ui/interval/length';
import { EXAMPLES } from '../../../src/examples/index';

const sleep = (EXAMPLES.find((e) => e.id === 'sleep-stress')!.model as { study: Study }).study;
const daily24: Study = { interval: '1 day', length: '24 days', schedule: { kind: 'fixed' } };

describe('the study length under the interval control reads the study', () => {
  it('shows the study’s own length, exactly as stored, in every time unit', () => {
    expect(lengthFieldText(sleep)).toBe('14 days');
    // 24 days in weeks is 3.428…: the field keeps "24 days", never a rounded "3.43 weeks"
    for (const [from, to] of [['day', 'week'], ['h', 'day'], ['day', 'min'], ['week', 'h']] as const) {
      const moved = convertStudy(daily24, from, to);
      expect(lengthFieldText(moved)).toBe('24 days');
      expect(lengthOther(moved, to)).toBe('24 prompts planned');
    }
    expect(lengthFieldText({ ...daily24, length: 70 })).toBe('70');
  });
  it('switching to samples counts the prompts the schedule plans, not an assumed 50', () => {
    // 5 prompts a day for 14 days: 70 (counted by hand); a daily study of 24 days: 24
    expect(switchedLength(sleep, 'h', 'samples')).toBe(70);
    expect(switchedLength(daily24, 'week', 'samples')).toBe(24);
    // one prompt a second for 30 days plans more prompts than are laid out one by one: the window over the interval
    expect(switchedLength({ interval: '1 s', length: '30 days', schedule: { kind: 'fixed' } }, 's', 'samples')).toBe(30 * 86400);
  });
  it('switching to a duration gives the time the prompts take, exact in any unit', () => {
    // 24 daily samples take 24 days: written "24 day", which reads back to the same time in any unit
    for (const unit of ['h', 'day', 'week'] as const) expect(switchedLength({ ...daily24, length: 24 }, unit, 'duration')).toBe('24 day');
    // 50 samples every 3 h: 150 h = 6.25 days
    expect(switchedLength({ interval: '3 h', length: 50, schedule: { kind: 'fixed' } }, 'day', 'duration')).toBe('150 h');
    expect(lengthOther({ interval: '3 h', length: 50, schedule: { kind: 'fixed' } }, 'day')).toBe('lasts 6.25 days');
    expect(switchedLength({ ...sleep, length: 70 }, 'h', 'duration')).toBe('14 day');
  });
  it('a typed length is kept as typed; a bad one names the field', () => {
    expect(typedLength(' 14 days ', 'duration', 'h')).toEqual({ ok: true, length: '14 days' });
    expect(typedLength('70', 'samples', 'h')).toEqual({ ok: true, length: 70 });
    expect(typedLength('1', 'samples', 'h')).toEqual({ ok: false, message: 'Study length: give a whole number of samples, 2 or more' });
    const bad = typedLength('a fortnight or so', 'duration', 'h');
    expect(bad.ok).toBe(false);
    expect(!bad.ok && bad.message).toMatch(/^Study length: /);
  });
});
