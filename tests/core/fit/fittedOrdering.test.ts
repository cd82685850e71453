import { describe, expect, it } from 'vitest';
import { fittedOrdering, modelFromDrift, orderingRows, sketchOrderingRows } from '../../../src/core/fit/fittedOrdering';
import type { Model } from '../../../src/core/model/types';

// A sketch of two states: x fast (30 min), y slow (1 day), x drives y; the sketch also has y → x.
const sketch: Model = {
  format: 'loopfold-model', version: 2, name: 'two tanks', timeUnit: 'h',
  variables: [
    { id: 'x', label: 'Inflow', kind: 'state', timescale: 0.5, initial: 0 },
    { id: 'y', label: 'Store', kind: 'state', timescale: 24, initial: 0 },
  ],
  links: [
    { from: 'x', to: 'y', kind: 'integrating', sign: '+', weight: 0.5 },
    { from: 'y', to: 'x', kind: 'integrating', sign: '-', weight: 0.2 },
  ],
};

// A fitted drift with its standard errors: x → y 0.5 ± 1.96·0.1 excludes zero; y → x 0.1 ± 1.96·0.3 does not.
// 1.959964 = the 97.5 % normal quantile (scipy.stats.norm.ppf(0.975) = 1.959963984540054).
const fit = {
  states: ['x', 'y'],
  drift: [[-2, 0.1], [0.5, -0.05]],
  se: { drift: [[0.1, 0.3], [0.1, 0.01]] },
};

describe('fittedOrdering', () => {
  it('builds the fitted model from the links whose 95 % interval excludes zero, with timescales 1/|A_ii|', () => {
    const { model, links } = modelFromDrift(sketch, fit);
    expect(model.variables.map((v) => [v.id, v.label, v.selfRegulating, v.timescale])).toEqual([['x', 'Inflow', true, 0.5], ['y', 'Store', true, 20]]);
    expect(model.links).toEqual([{ from: 'x', to: 'y', kind: 'integrating', sign: '+', weight: 0.5 }]);
    expect(links.map((l) => `${l.from}→${l.to}`)).toEqual(['x→x', 'y→y', 'x→y']);
    const xy = links.find((l) => l.from === 'x' && l.to === 'y')!;
    expect(Math.abs(xy.low - (0.5 - 1.959963984540054 * 0.1))).toBeLessThan(1e-15);
  });

  it('a state whose own entry cannot be told from zero does not self-regulate and has no timescale', () => {
    const { model } = modelFromDrift(sketch, { ...fit, drift: [[-2, 0.1], [0.5, -0.005]] });
    expect(model.variables[1]).toMatchObject({ id: 'y', selfRegulating: false });
    expect(model.variables[1].timescale).toBeUndefined();
  });

  it('orders both models at the data’s interval: x settles (Δ = 3 h ≥ 5 τ = 2.5 h), y stays dynamic (5 τ = 100 h > Δ, τ < 5 W)', () => {
    // The separation rule with the default factor k = 5 (settled when Δ ≥ kτ, frozen when τ ≥ kW): common practice for timescale separation.
    const o = fittedOrdering(sketch, fit, { interval: 3, window: 300 });
    expect(o.fitted.roles).toEqual({ x: 'settled', y: 'state' });
    // The sketch's τ_y = 24 h gives the same roles here.
    expect(o.sketch.roles).toEqual({ x: 'settled', y: 'state' });
    // The sketch has y → x, the fitted model does not: in the sketch x's balance involves y, in the fit it does not.
    const into = (ord: typeof o.fitted, to: string) => ord.edges.filter((e) => e.to === to).map((e) => e.from).sort();
    expect(into(o.sketch, 'x')).toContain('y');
    expect(into(o.fitted, 'x')).not.toContain('y');
    // At a 5-minute interval nothing settles in the fitted model.
    expect(fittedOrdering(sketch, fit, { interval: 1 / 12, window: 300 }).fitted.roles).toEqual({ x: 'state', y: 'state' });
  });

  it('refuses a design without a positive interval, naming both numbers', () => {
    expect(() => fittedOrdering(sketch, fit, { interval: 0, window: 300 })).toThrow(/0 and 300/);
  });

  it('sets the two whole orderings side by side, row by row, and names what they disagree on', () => {
    const rows = orderingRows(sketch, fittedOrdering(sketch, fit, { interval: 3, window: 300 }));
    expect(rows.map((r) => r.variable)).toEqual(['y', 'x']);
    const x = rows.find((r) => r.variable === 'x')!, y = rows.find((r) => r.variable === 'y')!;
    // x settles in both: its balance reads y in the sketch (a link within the instant), nothing in the fit.
    expect(x.sketch).toMatchObject({ role: 'settled', from: [{ id: 'y', kind: 'instantaneous' }] });
    expect(x.fitted).toMatchObject({ role: 'settled', from: [] });
    expect(x.sketch!.level).toBeGreaterThan(y.sketch!.level);
    expect([x.roleDiffers, x.onlySketch, x.onlyFitted]).toEqual([false, ['y'], []]);
    expect([y.roleDiffers, y.onlySketch, y.onlyFitted]).toEqual([false, [], []]);
    // At 5 minutes both are dynamic in the fit and in the sketch; x reads y across time in the sketch only.
    const fine = orderingRows(sketch, fittedOrdering(sketch, fit, { interval: 1 / 12, window: 300 }));
    expect(fine.find((r) => r.variable === 'x')).toMatchObject({ sketch: { role: 'state', from: [{ id: 'y', kind: 'integrating' }] }, fitted: { role: 'state', from: [] }, onlySketch: ['y'] });
  });

  it('reads the sketch through its derived variables when it compares what acts on a fitted state', () => {
    // x drives y through a derived d (x → d within the instant, d → y across time); the fit sees x → y directly.
    const withDerived: Model = {
      ...sketch,
      variables: [...sketch.variables, { id: 'd', label: 'Pressure', kind: 'derived' }],
      links: [
        { from: 'x', to: 'd', kind: 'instantaneous', sign: '+', weight: 1 },
        { from: 'd', to: 'y', kind: 'integrating', sign: '+', weight: 0.5 },
      ],
    };
    const rows = orderingRows(withDerived, fittedOrdering(withDerived, fit, { interval: 1 / 12, window: 300 }));
    const y = rows.find((r) => r.variable === 'y')!;
    expect(y.sketch!.from.map((f) => f.id)).toEqual(['d']);
    expect(y.fitted!.from.map((f) => f.id)).toEqual(['x']);
    expect([y.onlySketch, y.onlyFitted]).toEqual([[], []]);
    expect(rows.find((r) => r.variable === 'd')).toMatchObject({ sketch: { role: 'derived' }, fitted: null });
    // Before a fit: the sketch's rows alone.
    const alone = sketchOrderingRows(withDerived, { interval: 3, window: 300 });
    expect(alone.every((r) => r.fitted === null)).toBe(true);
    expect(alone.find((r) => r.variable === 'x')!.sketch!.role).toBe('settled');
  });
});
