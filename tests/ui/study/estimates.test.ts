import { describe, expect, it } from 'vitest';
import type { Model, Study } from '../../../src/core/model/types';
import { toRows } from '../../../src/core/numeric/dense';
import { driftAtEquilibrium } from '../../../src/core/numeric/index';
import { studyDesign } from '../../../src/core/study/report';
import { effectTable } from '../../../src/ui/study/estimates';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

// A loop of our own (a kettle's water and element temperatures, in hours) and a gauge on a shelf that nothing moves.
const kettle: Model = {
  format: 'loopfold-model', version: 2, name: 'kettle', timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input', value: 0 },
    { id: 'x', kind: 'state', label: 'Water', timescale: 3, noise: 1 },
    { id: 'y', kind: 'state', label: 'Element', timescale: 5, noise: 0.5 },
    { id: 'z', kind: 'state', label: 'Gauge', timescale: 2, noise: 1 },
  ],
  links: [
    { from: 'u', to: 'x', kind: 'integrating', sign: '+' },
    { from: 'x', to: 'y', kind: 'integrating', sign: '+', weight: 0.8 },
    { from: 'y', to: 'x', kind: 'integrating', sign: '-', weight: 0.5 },
  ],
};
// 5 prompts 09:00–21:00 at fixed times: gaps of 3 h within the day and 12 h overnight
const study: Study = { interval: '3 h', length: '14 days', schedule: { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'fixed' } };

describe('what this schedule estimates, entry by entry', () => {
  const r = studyDesign(kettle, study);
  if (!r.ok) throw new Error(r.reason);
  const report = r.report;
  const d = driftAtEquilibrium(kettle);
  if (!d.ok) throw new Error(d.reason);

  it('shows the cross-lagged entries of Φ for each gap, equal to SciPy’s expm(A·gap)', () => {
    const t = effectTable(kettle, report);
    expect(t.gaps.map((g) => g.gap)).toEqual([3, 12]);
    const ref = runPython<{ phi: number[][][]; pooled: number[][] }>('tests/reference/study_pooled.py', { a: toRows(d.drift), gaps: report.gaps.map((g) => [g.gap, g.share]) });
    const idx = (id: string) => report.states.indexOf(id);
    const water = t.groups.find((g) => g.label === 'Water')!;
    const fromElement = water.rows.find((row) => row.label === 'from Element')!;
    expect(fromElement.perGap.length).toBe(2);
    ref.phi.forEach((phi, k) => expectClose(fromElement.perGap[k], phi[idx('x')][idx('y')], { absTol: 1e-9 }, `element → water over gap ${k}`));
    expectClose(fromElement.pooled, ref.pooled[idx('x')][idx('y')], { absTol: 1e-9 });
    const element = t.groups.find((g) => g.label === 'Element')!;
    const fromWater = element.rows.find((row) => row.label === 'from Water')!;
    ref.phi.forEach((phi, k) => expectClose(fromWater.perGap[k], phi[idx('y')][idx('x')], { absTol: 1e-9 }, `water → element over gap ${k}`));
    // the overnight gap shrinks the lagged effect of a loop with timescales of hours
    expect(Math.abs(fromWater.perGap[1] - fromWater.perGap[0])).toBeGreaterThan(0.01);
  });
  it('each variable is a group with its autoregression first; effects that stay zero are counted, not listed', () => {
    const t = effectTable(kettle, report);
    expect(t.groups.map((g) => g.label)).toEqual(report.states.map((s) => kettle.variables.find((v) => v.id === s)!.label));
    for (const g of t.groups) expect(g.rows[0].label).toBe('itself');
    // nothing moves the gauge and it moves nothing: 4 cross-lagged entries stay 0
    expect(t.hidden).toBe(4);
    expect(t.groups.find((g) => g.label === 'Gauge')!.rows.map((row) => row.label)).toEqual(['itself']);
    const all = effectTable(kettle, report, { all: true });
    expect(all.hidden).toBe(0);
    expect(all.groups.reduce((s, g) => s + g.rows.length, 0)).toBe(9);
    const onWater = effectTable(kettle, report, { on: 'x' });
    expect(onWater.groups.map((g) => g.label)).toEqual(['Water']);
    expect(onWater.groups[0].rows.map((row) => row.label)).toEqual(['itself', 'from Element']);
  });
});
