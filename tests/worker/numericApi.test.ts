import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/core/model/schema';
import { sampledOf } from '../../src/core/numeric/answers';
import { studyDesign } from '../../src/core/study/report';
import { EXAMPLES } from '../../src/examples/index';
import { localNumeric } from '../../src/worker/numericApi';

const r = parseModel(EXAMPLES.find((e) => e.id === 'sleep-stress')!.model);
if (!r.ok) throw new Error('example');
const model = r.model;

describe('the numeric lane’s study questions', () => {
  it('design answers what the core reports for the study (the panel and `loopfold design` read the same numbers)', async () => {
    const a = await localNumeric.design(model, model.study);
    const b = studyDesign(model, model.study);
    expect(a).toEqual(b);
    if (!a.ok) throw new Error(a.reason);
    // 5 stratified prompts a day: most consecutive pairs are one part (2.4 h) apart, the night gap is 12 h + 2.4 h = 14.4 h
    expect(Math.abs(a.report.gaps[0].gap - a.report.interval)).toBeLessThan(1e-9);
    expect(a.report.gaps.some((g) => Math.abs(g.gap - 14.4) < 1e-9 && g.sameDayShare === 0)).toBe(true);
  });
  it('design fails with a reason, never throws, when the model has no states', async () => {
    const none = parseModel({ format: 'loopfold-model', version: 2, name: 'n', timeUnit: 'h', variables: [{ id: 'x', kind: 'input' }], links: [] });
    if (!none.ok) throw new Error('model');
    expect(await localNumeric.design(none.model, { interval: '3h', length: 10, schedule: { kind: 'fixed' } })).toEqual({ ok: false, reason: 'the model has no states: there is no lagged effect to estimate' });
  });
  it('sampledAt answers each interval as one sampled question would', async () => {
    const a = await localNumeric.sampledAt(model, [2.4, 24, 168]);
    expect(a.answers).toEqual([2.4, 24, 168].map((i) => sampledOf(model, i)));
  });
});
