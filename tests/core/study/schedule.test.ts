import { describe, expect, it } from 'vitest';
import type { Study } from '../../../src/core/model/types';
import { seededRandom } from '../../../src/core/stats/random';
import { answeredOccasions, nominalSpacing, plannedSlots, promptPlan, studyPrompts } from '../../../src/core/study/schedule';
import { decimals, expectClose } from '../../helpers/tolerance';

const esm = (timing: 'fixed' | 'stratified-random', extra: Partial<Study> = {}): Study => ({
  interval: '3h', length: '14 days', schedule: { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing }, ...extra,
});

describe('planned prompts', () => {
  it('5 evenly spaced prompts 09:00–21:00: 9, 12, 15, 18, 21 h on each day', () => {
    const s = plannedSlots(esm('fixed', { length: '2 days' }), 'h');
    expect(Array.from(s.base)).toEqual([9, 12, 15, 18, 21, 33, 36, 39, 42, 45]);
    expect(Array.from(s.day)).toEqual([0, 0, 0, 0, 0, 1, 1, 1, 1, 1]);
    expect(Array.from(s.prompt)).toEqual([0, 1, 2, 3, 4, 0, 1, 2, 3, 4]);
    expect(nominalSpacing(esm('fixed').schedule, 'h')).toBe(3);
  });
  it('stratified-random: one prompt in each 2.4 h part of the window, the same parts every day', () => {
    const plan = promptPlan(esm('stratified-random', { persons: 4, seed: 9 }), 'h');
    for (const p of plan.persons)
      for (let k = 0; k < p.time.length; k++) {
        const start = p.day[k] * 24 + 9 + p.prompt[k] * 2.4;
        expect(p.time[k]).toBeGreaterThanOrEqual(start);
        expect(p.time[k]).toBeLessThan(start + 2.4 + 1e-12);
      }
    expectClose(nominalSpacing(esm('stratified-random').schedule, 'h'), 2.4, decimals(12));
  });
  it('a fixed schedule of 50 samples every 90 min; a window holds the prompts before its end', () => {
    expect(plannedSlots({ interval: '90 min', length: 50, schedule: { kind: 'fixed' } }, 'h').base.length).toBe(50);
    const w = plannedSlots({ interval: '90 min', length: '1 day', schedule: { kind: 'fixed' } }, 'h');
    expect(w.base.length).toBe(16);
    expect(w.base[15]).toBe(22.5);
    expect(Array.from(w.day)).toEqual(Array(16).fill(0));
  });
  it('daily and weekly schedules', () => {
    expect(Array.from(plannedSlots({ interval: 'daily', length: '1 week', schedule: { kind: 'daily' } }, 'day').base)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(Array.from(plannedSlots({ interval: 'weekly', length: 3, schedule: { kind: 'weekly' } }, 'day').base)).toEqual([0, 7, 14]);
  });
  it('refuses a study of more than a million prompts per person with a message', () => {
    expect(() => plannedSlots({ interval: '1 s', length: '1 year', schedule: { kind: 'fixed' } }, 'h')).toThrow(/more than 1,000,000 prompts/);
  });
});

describe('prompts per person a study plans (studyPrompts: the one length-to-prompts conversion)', () => {
  // Counts by hand (common practice: prompts per day × days; one prompt per interval over a window).
  it('a daily window of 5 prompts for 14 days plans 70 prompts, whatever its nominal interval (not 14 days / 2.4 h = 140)', () => {
    expect(studyPrompts(esm('stratified-random', { interval: '2.4 h' }), 'h')).toBe(70);
    expect(studyPrompts(esm('fixed'), 'h')).toBe(70);
    // the same study in minutes: the same prompts
    expect(studyPrompts(esm('fixed'), 'min')).toBe(70);
  });
  it('at another interval the study is read as a prompt every interval over its length', () => {
    // 14 days = 336 h; one prompt every 3 h starting at 0 → 112 prompts
    expect(studyPrompts(esm('stratified-random', { interval: '2.4 h' }), 'h', 3)).toBe(112);
    // 10 h at 3 h: prompts at 0, 3, 6, 9 h → 4
    expect(studyPrompts({ interval: '3h', length: '10 h', schedule: { kind: 'fixed' } }, 'h', 3)).toBe(4);
    expect(studyPrompts({ interval: '1h', length: '10 h', schedule: { kind: 'fixed' } }, 'h', 3)).toBe(4);
  });
  it('a count of samples stays that count at every interval; daily and weekly schedules count days and weeks', () => {
    expect(studyPrompts({ interval: '90 min', length: 50, schedule: { kind: 'fixed' } }, 'h')).toBe(50);
    expect(studyPrompts({ interval: '90 min', length: 50, schedule: { kind: 'fixed' } }, 'h', 7)).toBe(50);
    expect(studyPrompts({ interval: 'daily', length: '26 weeks', schedule: { kind: 'daily' } }, 'day')).toBe(182);
    expect(studyPrompts({ interval: 'weekly', length: '2 years', schedule: { kind: 'weekly' } }, 'week')).toBe(Math.ceil((2 * 365.25) / 7));
    expect(() => studyPrompts(esm('fixed'), 'h', -1)).toThrow(/positive duration/);
  });
});

describe('missed prompts and persons, seeded', () => {
  it('the same seed gives the same study; another seed another one; adding persons keeps the first', () => {
    const a = promptPlan(esm('stratified-random', { persons: 3, missedPrompts: 0.2, seed: 4 }), 'h');
    const b = promptPlan(esm('stratified-random', { persons: 3, missedPrompts: 0.2, seed: 4 }), 'h');
    const c = promptPlan(esm('stratified-random', { persons: 3, missedPrompts: 0.2, seed: 5 }), 'h');
    const d = promptPlan(esm('stratified-random', { persons: 5, missedPrompts: 0.2, seed: 4 }), 'h');
    expect(a).toEqual(b);
    expect(Array.from(c.persons[0].time)).not.toEqual(Array.from(a.persons[0].time));
    expect(d.persons.slice(0, 3)).toEqual(a.persons);
  });
  it('misses about the share asked for: within 4 binomial standard errors (binomial sd √(np(1−p)); common practice)', () => {
    const plan = promptPlan(esm('fixed', { length: '200 days', persons: 20, missedPrompts: 0.2, seed: 2 }), 'h');
    let missed = 0;
    let n = 0;
    for (const p of plan.persons) for (const x of p.answered) { n++; missed += 1 - x; }
    expect(Math.abs(missed - 0.2 * n)).toBeLessThan(4 * Math.sqrt(n * 0.2 * 0.8));
    const o = answeredOccasions(plan.persons[0]);
    expect(o.time.length).toBe(Array.from(plan.persons[0].answered).filter(Boolean).length);
  });
});

describe('the seeded generator', () => {
  it('gives uniforms with mean 1/2 and variance 1/12, normals with mean 0 and variance 1 (within 5 standard errors)', () => {
    const r = seededRandom(123);
    const n = 200_000;
    let s = 0, s2 = 0, z = 0, z2 = 0;
    for (let i = 0; i < n; i++) { const u = r.uniform(); s += u; s2 += u * u; const g = r.normal(); z += g; z2 += g * g; }
    // uniform: mean 1/2, variance 1/12; standard normal: mean 0, variance 1 (textbook moments)
    expect(Math.abs(s / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expectClose(s2 / n - (s / n) ** 2, 1 / 12, { relTol: 0.01 });
    expect(Math.abs(z / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(z2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });
  it('is reproducible and forks independent streams', () => {
    expect(Array.from({ length: 5 }, seededRandom(1).uniform)).toEqual(Array.from({ length: 5 }, seededRandom(1).uniform));
    const f = seededRandom(1);
    const a = f.fork(0).uniform();
    expect(f.fork(0).uniform()).toBe(a);
    expect(f.fork(1).uniform()).not.toBe(a);
  });
});
