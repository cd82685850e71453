import { describe, expect, it } from 'vitest';
import type { Model } from '../../../src/core/model/types';
import { fromRows, toRows } from '../../../src/core/numeric/dense';
import { solveEquilibrium } from '../../../src/core/numeric/equilibrium';
import { linearize } from '../../../src/core/numeric/linearize';
import { adviseInterval, linkCurve, logGrid, sampledModel } from '../../../src/core/numeric/sampled';
import { simulate } from '../../../src/core/numeric/simulate';
import { residual } from '../../../src/core/numeric/system';
import { fastPartWarnings, timescalesOf } from '../../../src/core/numeric/timescales';
import { runPython } from '../../helpers/python';
import { close, decimals, expectClose } from '../../helpers/tolerance';
import { randomStable } from './random';

function model(partial: Partial<Model> & Pick<Model, 'variables'>): Model {
  return { format: 'loopfold-model', version: 1, name: 'test', timeUnit: 'h', links: [], ...partial };
}

// A coffee bar: customers queue, baristas serve with a saturating rate; the
// queue length sets how many walk away. Invented for this test.
const coffeeBar = model({
  variables: [
    { id: 'arrivals', kind: 'input', value: 30 },
    { id: 'capacity', kind: 'input', value: 50 },
    { id: 'queue', kind: 'state', initial: 0, timescale: 0.2, rate: 'arrivals - served - balking' },
    { id: 'served', kind: 'derived', formula: 'capacity * queue / (queue + 4)' },
    { id: 'balking', kind: 'derived', formula: '0.5 * queue' },
    { id: 'mood', kind: 'state', initial: 1, rate: '(2 - 0.1 * queue - mood) / 3' },
  ],
});

// A phone battery: charging slows as it fills, apps drain it; screen brightness is
// set implicitly by a relation with the charge. Invented for this test.
const phone = model({
  variables: [
    { id: 'plugged', kind: 'input', value: 1 },
    { id: 'charge', kind: 'state', initial: 0.2, rate: '2 * plugged * (1 - charge) - drain' },
    { id: 'drain', kind: 'derived', formula: '0.3 + 0.5 * brightness' },
    { id: 'brightness', kind: 'derived' },
  ],
  relations: [{ id: 'dimming', equation: 'brightness * (1 + brightness) = charge' }],
});

describe('equilibrium, block by block', () => {
  for (const [name, m] of [['coffee bar', coffeeBar], ['phone battery', phone]] as const) {
    it(`satisfies every equation and equals the end of a long simulation (${name})`, () => {
      const eq = solveEquilibrium(m);
      expect(eq.ok, JSON.stringify(eq.diagnostics)).toBe(true);
      for (const e of eq.system.equations) expect(Math.abs(residual(eq.system, e, eq.point)), e.id).toBeLessThan(1e-10);
      const sim = simulate(m, { until: 200, every: 50, rtol: 1e-10, atol: 1e-12 });
      expect(sim.ok, JSON.stringify(sim.diagnostics)).toBe(true);
      for (const id of Object.keys(eq.values)) {
        const end = sim.series[id][sim.series[id].length - 1];
        expect(close(end, eq.values[id], { relTol: 1e-7, absTol: 1e-8 }), `${id}: simulated ${end} vs equilibrium ${eq.values[id]}`).toBe(true);
      }
    });
  }

  it('finds the coffee-bar balance the hand calculation gives: 30 = 50q/(q+4) + q/2 (quadratic, common practice)', () => {
    // 30(q + 4) = 50 q + q(q + 4)/2 → q² + 44 q − 240 = 0 → q = −22 + √(22² + 240)
    const q = -22 + Math.sqrt(22 * 22 + 240);
    const eq = solveEquilibrium(coffeeBar);
    expectClose(eq.values.queue, q, decimals(10));
    expectClose(eq.values.mood, 2 - 0.1 * q, decimals(10));
  });

  it('names dependent equations of a conservation law and suggests the fix', () => {
    // Library books: on the shelf or on loan, with lending and returns; the total never changes.
    const library = model({
      variables: [
        { id: 'shelf', kind: 'state', initial: 80, rate: '0.1 * loaned - 0.05 * shelf' },
        { id: 'loaned', kind: 'state', initial: 20, rate: '0.05 * shelf - 0.1 * loaned' },
      ],
    });
    const eq = solveEquilibrium(library);
    const d = eq.diagnostics.find((x) => x.code === 'dependent-equations');
    expect(d, JSON.stringify(eq.diagnostics)).toBeDefined();
    expect(d!.equations).toEqual(['rate(loaned)', 'rate(shelf)']);
    expect(d!.message).toMatch(/conservation law/);
    expect(d!.message).toMatch(/replace one/);
    for (const v of Object.values(eq.values)) expect(Number.isFinite(v)).toBe(true);
  });

  it('reports a state with no equilibrium by name, never NaN', () => {
    const runaway = model({ variables: [{ id: 'rumour', kind: 'state', initial: 1, rate: '1 + rumour^2' }] });
    const eq = solveEquilibrium(runaway);
    expect(eq.ok).toBe(false);
    const d = eq.diagnostics.find((x) => x.level === 'error')!;
    expect(d.variables).toEqual(['rumour']);
    expect(d.equations).toEqual(['rate(rumour)']);
    expect(Number.isFinite(eq.values.rumour)).toBe(true);
  });

  it('a sketch becomes the linear model of its links (weights, signs, τ)', () => {
    const sketch = model({
      variables: [
        { id: 'sun', kind: 'input', value: 2 },
        { id: 'warmth', kind: 'state', timescale: '30 min' },
        { id: 'comfort', kind: 'derived' },
        { id: 'savings', kind: 'state', timescale: 10, selfRegulating: false },
      ],
      links: [
        { from: 'sun', to: 'warmth', kind: 'integrating', weight: 3 },
        { from: 'warmth', to: 'comfort', kind: 'instantaneous', sign: '-', weight: 0.5 },
        { from: 'comfort', to: 'savings', kind: 'integrating' },
      ],
    });
    // savings only accumulates comfort: settling it would force comfort = 0 as well as warmth = 3·sun,
    // so the equilibrium model is over-determined and the block is named.
    const eq = solveEquilibrium(sketch);
    expect(eq.ok).toBe(false);
    const over = eq.diagnostics.find((d) => d.code === 'equilibrium-block-not-determined')!;
    expect(over.equations).toEqual(['formula(comfort)', 'rate(savings)', 'rate(warmth)']);
    for (const v of Object.values(eq.values)) expect(Number.isFinite(v)).toBe(true);
    // Without the accumulating state, warmth = 3·sun = 6 and comfort = −0.5·6 = −3.
    const settled = solveEquilibrium({ ...sketch, variables: sketch.variables.filter((v) => v.id !== 'savings'), links: sketch.links.slice(0, 2) });
    expect(settled.ok).toBe(true);
    expectClose(settled.values.warmth, 6, decimals(12));
    expectClose(settled.values.comfort, -3, decimals(12));
    const lin = linearize(eq.system, eq.point);
    if (!lin.ok) throw new Error(lin.reason);
    // d warmth/dt = (3 sun − warmth)/0.5; d savings/dt = 0.8·comfort/10 = −0.04·warmth, 0.8 being the
    // default strength of comfort → savings, its only link (hand derivation, common practice).
    expectClose(toRows(lin.drift), [[-2, 0], [-0.04, 0]], {}, 'sketch drift');
  });
});

describe('linearization and timescales', () => {
  it('eliminates algebraic variables: A = G_x − G_z R_z⁻¹ R_x (phone battery, hand derivative)', () => {
    const eq = solveEquilibrium(phone);
    const lin = linearize(eq.system, eq.point);
    if (!lin.ok) throw new Error(lin.reason);
    // b(1+b) = c → db/dc = 1/(1+2b); d charge/dt = 2(1−c) − 0.3 − 0.5 b → A = −2 − 0.5/(1+2b).
    const b = eq.values.brightness;
    expectClose(lin.drift.data[0], -2 - 0.5 / (1 + 2 * b), decimals(12));
  });

  it('participation factors match NumPy (random 6-state drift) and are 1 on the diagonal of a triangular drift', () => {
    const a = randomStable(6, 77);
    const ref = runPython<{ eig_re: number[]; eig_im: number[]; participation: number[][] }>('tests/reference/numeric_sampled.py', { a, interval: 1, noise: [1, 1, 1, 1, 1, 1] });
    const states = ['s1', 's2', 's3', 's4', 's5', 's6'];
    const t = timescalesOf(fromRows(a), states);
    for (let m = 0; m < 6; m++) {
      // match the mode by eigenvalue
      let best = 0;
      for (let r = 1; r < 6; r++) if (Math.hypot(ref.eig_re[r] - t.modes[m].re, ref.eig_im[r] - t.modes[m].im) < Math.hypot(ref.eig_re[best] - t.modes[m].re, ref.eig_im[best] - t.modes[m].im)) best = r;
      for (let k = 0; k < 6; k++) expect(close(t.modes[m].participation[k], ref.participation[k][best], { relTol: 1e-8, absTol: 1e-10 }), `mode ${m} state ${k}`).toBe(true);
    }
    const tri = timescalesOf(fromRows([[-1, 5, 2], [0, -0.1, 3], [0, 0, -10]]), ['a', 'b', 'c'], { a: { value: 2, given: true } });
    expect(tri.perState.map((p) => p.derived)).toEqual([1, 10, 0.1]);
    expect(tri.perState.map((p) => p.share)).toEqual([1, 1, 1]);
    expect(tri.perState[0].given).toBe(2);
    expect(tri.perState[1].given).toBeUndefined();
  });

  it('warns when the settled (fast) part is unstable although the whole system is stable', () => {
    // A = [[0.5, −2], [1, −1]]: trace −0.5 < 0 and det 1.5 > 0, so the system is stable (Routh–Hurwitz for 2×2,
    // common practice), but with the second state held the first one grows (A_FF = 0.5).
    const A = fromRows([[0.5, -2], [1, -1]]);
    expect(timescalesOf(A, ['craving', 'restraint']).warnings).toEqual([]);
    const w = fastPartWarnings(A, ['craving', 'restraint'], ['craving']);
    expect(w.length).toBe(1);
    expect(w[0]).toMatch(/craving/);
    expect(w[0]).toMatch(/not valid/);
    expect(fastPartWarnings(A, ['craving', 'restraint'], ['restraint'])).toEqual([]);
  });

  it('warns when a mode does not decay', () => {
    const t = timescalesOf(fromRows([[0.2, 0], [1, -1]]), ['gossip', 'calm']);
    expect(t.warnings.length).toBe(1);
    expect(t.warnings[0]).toMatch(/unstable/);
    expect(t.warnings[0]).toMatch(/gossip/);
  });
});

describe('exact sampled model', () => {
  // Voelkle, Oud, Davidov & Schmidt (2012), Psychological Methods 17(2): lagged coefficients at Δ = 1,
  // Φ(1) = [[.64, .18], [.03, .89]] (as reproduced in the documentation of the R package LAM, clpm_to_ctm,
  // which cites Kuiper & Ryan 2018). The drift is its matrix logarithm (scipy.linalg.logm). The interval at
  // which the cross-lagged effect peaks is checked against SciPy, not against a figure in the papers (not verified here).
  const ref = runPython<{ drift: number[][]; phi: number[][]; q: number[][]; sigma: number[][]; partial: number[][]; peak: [number, number] }>(
    'tests/reference/numeric_sampled.py',
    { phi1: [[0.64, 0.18], [0.03, 0.89]], interval: 1, noise: [1, 1], link: [0, 1], bounds: [0.01, 30] },
  );
  const A = fromRows(ref.drift);
  const states = ['authoritarianism', 'anomia'];

  it('reproduces the published Φ(1) from the drift, and Q, Σ, partial correlations of SciPy', () => {
    const s = sampledModel(A, states, 1, [1, 1]);
    expectClose(toRows(s.phi), [[0.64, 0.18], [0.03, 0.89]], { relTol: 1e-10, absTol: 1e-12 }, 'published Φ(1)');
    expectClose(toRows(s.innovation), ref.q, { relTol: 1e-10 }, 'Q(1)');
    expectClose(toRows(s.stationary!), ref.sigma, { relTol: 1e-10 }, 'Σ');
    expectClose(toRows(s.innovationPartial!), ref.partial, { relTol: 1e-9 }, 'partial correlations');
    const sd = [Math.sqrt(ref.sigma[0][0]), Math.sqrt(ref.sigma[1][1])];
    expectClose(s.phiStandardized!.data[1], (0.18 * sd[1]) / sd[0], decimals(10));
    expect(s.aliasing).toEqual([]);
  });

  it('finds the interval where the cross-lagged effect peaks (against scipy.optimize.minimize_scalar)', () => {
    const c = linkCurve(A, states, 'anomia', 'authoritarianism', logGrid(0.01, 30, 200));
    expect(c.peaks.length).toBe(1);
    expectClose(c.peaks[0].interval, ref.peak[0], decimals(6));
    expectClose(c.peaks[0].effect, ref.peak[1], decimals(10));
    const adv = adviseInterval(A, states, [{ from: 'anomia', to: 'authoritarianism' }], logGrid(0.01, 30, 200), 0.5, 'years');
    expect(adv.best!).toBeGreaterThan(ref.peak[0] * 0.9);
    expect(adv.best!).toBeLessThan(ref.peak[0] * 1.1);
    expect(adv.links[0].range![0]).toBeLessThan(ref.peak[0]);
    expect(adv.links[0].range![1]).toBeGreaterThan(ref.peak[0]);
    expect(adv.explanation).toMatch(/peaks at/);
  });

  it('flags intervals longer than π/|Im λ| for an oscillating drift', () => {
    const s = sampledModel(fromRows([[-0.1, 1], [-1, -0.1]]), ['hunger', 'snacking'], 4, [1, 1]);
    expect(s.aliasing.length).toBe(1);
    expectClose(s.aliasing[0].limit, Math.PI, decimals(12));
    expect(s.warnings.join(' ')).toMatch(/aliasing/);
  });

  it('reports an unstable drift: no stationary covariance', () => {
    const s = sampledModel(fromRows([[0.1, 0], [0, -1]]), ['a', 'b'], 1, [1, 1]);
    expect(s.stationary).toBeNull();
    expect(s.stationaryReason).toMatch(/not stable/);
  });
});

describe('equilibrium under an intervention', () => {
  it('holding a derived variable fixes it and the rest settles around it (coffee bar with serving held, hand solution)', () => {
    // served held at 20: 30 = 20 + q/2 → q = 20; mood = 2 − 0.1·20 = 0 (common practice: substitute and solve).
    const eq = solveEquilibrium(coffeeBar, { hold: { served: 20 } });
    expect(eq.ok, JSON.stringify(eq.diagnostics)).toBe(true);
    expect(eq.values.served).toBe(20);
    expectClose(eq.values.queue, 20, decimals(10));
    expectClose(eq.values.mood, 0, decimals(10));
  });
});
