import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import { studyDesign } from '../../../src/core/study/report';
import { designText, designWith, sameDesign, startingDesigns } from '../../../src/ui/study/compare';
import { EXAMPLES } from '../../../src/examples/index';

const r = parseModel(EXAMPLES.find((e) => e.id === 'sleep-stress')!.model);
if (!r.ok) throw new Error('example');
const model = r.model;
const study = model.study!;

describe('compare designs: whole schedules over the same study', () => {
  it('opens with the study, prompts every interval day and night, and daily, over the same weeks, persons and missed prompts', () => {
    const d = startingDesigns(study, 'h');
    expect(d.map((x) => designText(x, 'h'))).toEqual(['5 a day 09:00–21:00, stratified random', 'every 2.4 h, day and night', 'daily']);
    expect(d.map((x) => x.interval)).toEqual(['2.4 h', '2.4 h', '1 day']);
    for (const x of d) expect(x).toMatchObject({ length: '14 days', persons: 40, missedPrompts: 0.2 });
    expect(sameDesign(d[0], study, 'h')).toBe(true);
    expect(sameDesign(d[1], study, 'h')).toBe(false);
  });
  it('a study given in prompts is compared over the weeks those prompts take (70 prompts at 5 a day: 14 days)', () => {
    const d = startingDesigns({ ...study, length: 70 }, 'h');
    for (const x of d) expect(x.length).toBe('14 day');
  });
  it('a new schedule brings the interval it gives; a fixed one keeps the typed interval', () => {
    const base = startingDesigns(study, 'h')[0];
    // evenly spaced 4 prompts 09:00–21:00: 12 h / 3 = 4 h (common practice)
    expect(designWith(base, 'h', { kind: 'daily-window', promptsPerDay: 4, from: '09:00', to: '21:00', timing: 'fixed' }).interval).toBe('4 h');
    expect(designWith(base, 'h', { kind: 'fixed' }, '3 h').interval).toBe('3 h');
    expect(designWith(base, 'h', { kind: 'weekly' }).interval).toBe('1 week');
    const fixed = designWith(base, 'h', { kind: 'fixed' }, '3 h');
    expect(designText(fixed, 'h')).toBe('every 3 h, day and night');
  });
  it('each design estimates something else: night gaps shrink the autoregressions of the window, not of prompts day and night', () => {
    const [window, fixed] = startingDesigns({ ...study, missedPrompts: undefined }, 'h');
    const a = studyDesign(model, window);
    const b = studyDesign(model, fixed);
    if (!a.ok || !b.ok) throw new Error('design');
    const i = a.report.states.indexOf('sleepDebt');
    // prompts every 2.4 h day and night: one gap, so the VAR limit is Φ at the interval itself
    expect(b.report.gaps.length).toBe(1);
    expect(b.report.pooled[i][i]).toBe(b.report.nominal[i][i]);
    // the daily window's nights pull the pooled autoregression below Φ at 2.4 h
    expect(a.report.pooled[i][i]).toBeLessThan(a.report.nominal[i][i] - 0.01);
    expect(a.report.shrinkage.length).toBeGreaterThan(0);
    expect(b.report.shrinkage).toEqual([]);
  });
  it('prompts day and night with missed prompts: the longer gaps are named as missed prompts, never as nights', () => {
    const [, fixed] = startingDesigns({ ...study, missedPrompts: 0.2 }, 'h');
    const b = studyDesign(model, fixed);
    if (!b.ok) throw new Error('design');
    expect(b.report.shrinkage[0]).toMatch(/longer gaps after missed prompts/);
    expect(b.report.shrinkage[0]).not.toMatch(/night/);
  });
});
