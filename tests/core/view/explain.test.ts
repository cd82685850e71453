import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { orderingAt, breakpoints } from '../../../src/core/ordering/index';
import { explainOrdering, listWords } from '../../../src/core/view/explain';
import { EXAMPLES } from '../../../src/examples/index';
import { decimals, expectClose } from '../../helpers/tolerance';

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error('bad example');
  return r.model;
}

describe('explanation text', () => {
  const m = example('sleep-stress');
  // The rule of the model file (types.ts, settings.separation): settle when k·τ ≤ Δ, freeze when τ ≥ k·W; k = 5 here.
  it('names a settled state with its timescale against interval/k', () => {
    const design = { interval: 4, samples: 50 }; // 4 h ≥ 5 × 40 min = 3.33 h: stress settles; cortisol (5 × 90 min = 7.5 h) does not
    const lines = explainOrdering(m, orderingAt(m, design), design);
    const settled = lines.filter((l) => l.topic === 'settled');
    expect(settled.map((l) => l.variables[0])).toEqual(['stress']);
    expect(settled[0].text).toMatch(/^Stress settles \(timescale 40 min ≤ interval\/5 = 48 min\)/);
    expect(settled[0].text).toMatch(/from .*Workload/);
  });
  it('names a frozen state with the study length and a simultaneous block with its members', () => {
    const design = { interval: 24, window: 14 * 24 }; // a 2-week study: coping (4 months ≥ 5 × 2 weeks = 10 weeks) is frozen
    const o = orderingAt(m, design);
    const lines = explainOrdering(m, o, design);
    const frozen = lines.filter((l) => l.topic === 'frozen');
    expect(frozen.map((l) => l.variables[0])).toEqual(['coping']);
    expect(frozen[0].text).toContain('held constant over the 2 weeks of the study');
    // 5 × 14 days = 70 days = 2.3 months of 30.44 days (units.ts: month = 1/12 Julian year, common practice)
    expect(frozen[0].text).toContain('timescale 4 months ≥ 5 × study = 2.3 months');
    const blocks = o.blocks.filter((b) => b.variables.length > 1);
    expect(lines.filter((l) => l.topic === 'block').map((l) => l.variables)).toEqual(blocks.map((b) => b.variables));
    for (const l of lines.filter((x) => x.topic === 'block')) expect(l.text).toMatch(/form one simultaneous block/);
  });
  it('says when nothing differs from the mechanism, and names the nearest changes', () => {
    const design = { interval: 1, window: 24 }; // 1 h, one day: no state settles (5 × 40 min > 1 h), none frozen (5 × 1 day > 4 months? no: 4 months ≥ 5 days → coping frozen)
    const o = orderingAt(m, design);
    const lines = explainOrdering(m, o, design, breakpoints(m, { window: 24 }));
    expect(lines[0].topic).toBe('summary');
    expect(lines[0].text).toMatch(/^Every 1 h, over a study of 1 day \(24 samples\)/);
    const near = lines.filter((l) => l.topic === 'nearby');
    expect(near.at(-1)!.text).toBe('From 3.33 h on: Stress settles.');
  });
  it('at an exclusive breakpoint itself the old role still holds, and the text says the change comes above it', () => {
    const bps = breakpoints(m, { samples: 50 });
    const thaw = bps.find((b) => b.exclusive && b.changes.some((c) => c.variable === 'stress'))!;
    // τ/(k·N) = (40 min)/(5 × 50) = 9.6 s (the rule of settings.separation in the model file)
    expectClose(thaw.interval * 3600, 9.6, decimals(9));
    const design = { interval: thaw.interval, samples: 50 };
    const o = orderingAt(m, design);
    expect(o.roles.stress).toBe('frozen');
    const near = explainOrdering(m, o, design, bps).filter((l) => l.topic === 'nearby');
    expect(near.map((l) => l.text)).toContain('Above 9.6 s: Stress becomes dynamic.');
  });

  it('lists words the English way (common practice)', () => {
    expect(listWords(['a'])).toBe('a');
    expect(listWords(['a', 'b'])).toBe('a and b');
    expect(listWords(['a', 'b', 'c'])).toBe('a, b and c');
  });
  it('every state the ordering settles or freezes is explained, for each example at several intervals', () => {
    for (const e of EXAMPLES) {
      const mm = example(e.id);
      for (const interval of [0.05, 2, 48, 2000]) {
        const design = { interval, samples: 50 };
        const o = orderingAt(mm, design);
        const lines = explainOrdering(mm, o, design);
        for (const [v, r] of Object.entries(o.roles)) {
          if (r === 'settled' || r === 'frozen') expect(lines.some((l) => l.topic === r && l.variables.includes(v)), `${e.id} ${v} at ${interval}`).toBe(true);
        }
      }
    }
  });
});
