import { describe, expect, it } from 'vitest';
import { fromRows, inverse, mul, toRows } from '../../../src/core/numeric/dense';
import { centredMoments, pooledVarMoments, powerOfTest, pooledStandardError } from '../../../src/core/rehearse/analytic';
import { runReplications, summarizeTally, type RehearsalSetup } from '../../../src/core/rehearse/montecarlo';
import { simulatePerson, type PersonPrompts } from '../../../src/core/rehearse/simulate';
import type { StudyProcess } from '../../../src/core/rehearse/process';
import { seededRandom } from '../../../src/core/stats/random';
import { fitVar } from '../../../src/core/fit/var';
import { normalQuantile } from '../../../src/core/stats/normal';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

const REF = 'tests/reference/rehearse_power.py';

/** Persons prompted at 0, 1, …, T (one interval apart). */
const regular = (persons: number, occasions: number, gap = 1) => (): PersonPrompts[] =>
  Array.from({ length: persons }, (_, p) => ({ id: `p${p}`, times: Float64Array.from({ length: occasions }, (_, k) => k * gap) }));

function processOf(drift: number[][], diffusion: number[][]): StudyProcess {
  // The simulator takes the diagonal of G Gᵀ; a full diffusion is turned into an equivalent one by whitening below.
  const n = drift.length;
  return { states: Array.from({ length: n }, (_, i) => `x${i}`), base: { drift: fromRows(drift), noise: diffusion.map((r, i) => r[i]), mean: new Float64Array(n) }, inputs: [], links: [], warnings: [] };
}

describe('analytic power of a VAR(1) analysis', () => {
  // A bivariate VAR(1) with Φ = [[.4, .2], [.1, .3]], Σu = [[1, .3], [.3, 1]] and T = 200 pairs:
  // the textbook asymptotic SE of φ12 is √(Σu,11 (Γ0⁻¹)22 / T) (Lütkepohl 2005, Prop. 3.1),
  // about .072, and power at α = .05 about .79 (values computed by SciPy in the reference script).
  const phi = [[0.4, 0.2], [0.1, 0.3]], sigmaU = [[1, 0.3], [0.3, 1]];
  const ref = runPython<{ drift: number[][]; diffusion: number[][]; gamma0: number[][]; se: number; power: number }>(REF, { case: 'discrete', phi, sigma_u: sigmaU, T: 200, target: 0, source: 1, alpha: 0.05 });

  it('with one gap and no measurement error reduces to the textbook formula (SciPy)', () => {
    const g0 = fromRows(ref.gamma0);
    const m = pooledVarMoments(g0, [{ gap: 1, share: 1 }], [mul(fromRows(phi), g0)]);
    expectClose(toRows(m.coefficients), phi, { relTol: 1e-9, absTol: 1e-12 }, 'B');
    const se = pooledStandardError(m.variancePerPair.data[1], 200, 1);
    expectClose(se, ref.se, { relTol: 1e-9 }, 'se');
    expectClose(powerOfTest(0.2, se), ref.power, { relTol: 1e-9 }, 'power');
    expect(se).toBeGreaterThan(0.07);
    expect(se).toBeLessThan(0.074);
  });

  it('Monte Carlo over 2,000 simulated studies agrees with it at T = 200, and shows a larger SE below T = 100', () => {
    // The continuous process whose exact discrete model at Δ = 1 is this VAR (drift logm(Φ), diffusion from Q(1) = Σu; SciPy).
    // The simulator takes a diagonal diffusion, so the test works in coordinates where it is diagonal: W = L Lᵀ, x = L z.
    const W = ref.diffusion;
    const l11 = Math.sqrt(W[0][0]), l21 = W[1][0] / l11, l22 = Math.sqrt(W[1][1] - l21 * l21);
    // z = L⁻¹ x has drift L⁻¹ A L and identity diffusion; a VAR on x is recovered from one on z exactly (x = L z is linear),
    // so simulate z and transform the panel back to x before the analysis.
    const A = ref.drift;
    const L = [[l11, 0], [l21, l22]], Li = [[1 / l11, 0], [-l21 / (l11 * l22), 1 / l22]];
    const mm = (a: number[][], b: number[][]) => a.map((r) => b[0].map((_, j) => r.reduce((s, x, k) => s + x * b[k][j], 0)));
    const driftZ = mm(mm(Li, A), L);
    const proc = processOf(driftZ, [[1, 0], [0, 1]]);
    const toX = (T: number): RehearsalSetup['prompts'] => regular(1, T + 1);
    const run = (T: number, K: number) => {
      const setup: RehearsalSetup = { process: proc, prompts: toX(T), errorVariance: [0, 0], timeUnit: 'day', links: [{ from: 'x1', to: 'x0' }], analysis: { centre: 'fixed-effects' }, alpha: 0.05, seed: 11 };
      // Monte Carlo on x: simulate z, map to x, fit — done by hand here since the mapping is the test's own device.
      const rng = seededRandom(5);
      const est: number[] = [];
      let rej = 0;
      for (let r = 0; r < K; r++) {
        const person = simulatePerson(proc.base, regular(1, T + 1)()[0], { states: proc.states, errorVariance: [0, 0], timeUnit: 'day' }, rng.fork(r));
        const v = person.values;
        for (let k = 0; k < v.length / 2; k++) { const z0 = v[2 * k], z1 = v[2 * k + 1]; v[2 * k] = L[0][0] * z0; v[2 * k + 1] = L[1][0] * z0 + L[1][1] * z1; }
        const tally = analyse(setup, person);
        est.push(tally.b);
        if (tally.reject) rej++;
      }
      const mean = est.reduce((s, x) => s + x, 0) / K;
      const sd = Math.sqrt(est.reduce((s, x) => s + (x - mean) ** 2, 0) / (K - 1));
      return { sd, power: rej / K };
    };
    const K = 2000;
    const at200 = run(200, K);
    // Monte Carlo error of a standard deviation from K draws is about sd/√(2K) (common practice, normal theory); allow 3 of them
    // plus the O(1/T) small-sample difference of the estimator (about 1 % here).
    expect(Math.abs(at200.sd - ref.se)).toBeLessThan(3 * ref.se / Math.sqrt(2 * K) + 0.01 * ref.se);
    const mcErr = Math.sqrt((ref.power * (1 - ref.power)) / K);
    expect(Math.abs(at200.power - ref.power)).toBeLessThan(3 * mcErr + 0.02);
    // Short series: T = 40 — the Monte Carlo SE exceeds the asymptotic one for 40 pairs.
    const at40 = run(40, K);
    const se40 = ref.se * Math.sqrt(200 / 40);
    expect(at40.sd).toBeGreaterThan(se40 * (1 + 2 / Math.sqrt(2 * K)));
  });
});

/** One analysis of one simulated person with the rehearsal's analysis options. */
function analyse(setup: RehearsalSetup, person: ReturnType<typeof simulatePerson>): { b: number; reject: boolean } {
  const fit = fitVar({ variables: setup.process.states, timeUnit: 'day', persons: [person] }, setup.analysis);
  const b = fit.phi[0][1], s = fit.se.phi[0][1];
  return { b, reject: Math.abs(b) > normalQuantile(1 - setup.alpha / 2) * s };
}

describe('synthetic studies', () => {
  const drift = [[-0.5, 0.2], [0.15, -0.4]], noise = [1, 0.5];
  const gaps = [1, 6];
  const ref = runPython<{ sigma: number[][]; phi: number[][][] }>(REF, { case: 'continuous', drift, noise, gaps });

  it('the lag covariance of a long simulated series is Φ(Δ)Σ (SciPy), within the Monte Carlo error the test estimates', () => {
    const proc = processOf(drift, [[1, 0], [0, 0.5]]);
    proc.base = { ...proc.base, noise };
    const T = 200_000;
    const person = simulatePerson(proc.base, { id: 'a', times: Float64Array.from({ length: T }, (_, k) => k) }, { states: proc.states, errorVariance: [0, 0], timeUnit: 'h' }, seededRandom(3));
    const v = person.values;
    const expected = toRows(mul(fromRows(ref.phi[0]), fromRows(ref.sigma)));
    // Batch means: 100 batches of the products x_{t+1,i} x_{t,j}; their spread gives the Monte Carlo error.
    const B = 100, len = Math.floor((T - 1) / B);
    for (let i = 0; i < 2; i++)
      for (let j = 0; j < 2; j++) {
        const batch: number[] = [];
        for (let b = 0; b < B; b++) {
          let s = 0;
          for (let t = b * len; t < (b + 1) * len; t++) s += v[(t + 1) * 2 + i] * v[t * 2 + j];
          batch.push(s / len);
        }
        const mean = batch.reduce((s, x) => s + x, 0) / B;
        const se = Math.sqrt(batch.reduce((s, x) => s + (x - mean) ** 2, 0) / (B - 1) / B);
        expect(Math.abs(mean - expected[i][j])).toBeLessThan(4 * se);
      }
  });

  it('with night gaps and measurement error, the analytic pooled limit and SE agree with Monte Carlo', () => {
    // Four prompts an hour apart, then a gap of six hours (the night), repeated; reliability .8 on both states.
    const sigma = fromRows(ref.sigma);
    const theta = [0.25 * ref.sigma[0][0], 0.25 * ref.sigma[1][1]];
    const S = fromRows([[ref.sigma[0][0] + theta[0], ref.sigma[0][1]], [ref.sigma[1][0], ref.sigma[1][1] + theta[1]]]);
    const lag = ref.phi.map((p) => mul(fromRows(p), sigma));
    const m = pooledVarMoments(S, [{ gap: 1, share: 0.8 }, { gap: 6, share: 0.2 }], lag);
    const days = 30, persons = 20;
    const times = Float64Array.from({ length: days * 5 }, (_, k) => Math.floor(k / 5) * 10 + (k % 5));
    const setup: RehearsalSetup = {
      process: { ...processOf(drift, [[1, 0], [0, 0.5]]), base: { drift: fromRows(drift), noise, mean: new Float64Array(2) } },
      prompts: () => Array.from({ length: persons }, (_, p) => ({ id: `p${p}`, times })),
      errorVariance: theta, timeUnit: 'h', links: [{ from: 'x1', to: 'x0' }, { from: 'x0', to: 'x1' }], analysis: {}, alpha: 0.05, seed: 9,
    };
    const K = 400;
    const res = summarizeTally(setup, runReplications(setup, 0, K));
    const pairs = days * 5 - 1;
    res.links.forEach((l, k) => {
      const [i, j] = k === 0 ? [0, 1] : [1, 0];
      const b = m.coefficients.data[i * 2 + j];
      const se = pooledStandardError(m.variancePerPair.data[i * 2 + j], pairs, persons);
      // The mean estimate: the pooled limit, less person-mean centring's O(1/T) bias; allow 3 Monte Carlo errors + 0.01.
      expect(Math.abs(l.effect - b)).toBeLessThan(3 * (l.se / Math.sqrt(K)) + 0.01);
      // The spread: within 15 % (a sandwich that treats pairs as independent; Monte Carlo error of an SD is sd/√(2K) ≈ 3.5 %).
      expect(Math.abs(l.se / se - 1)).toBeLessThan(0.15);
    });
  });

  it("person-mean centring biases the autoregression by about −(1+φ)/(T−1) (Nickell 1981)", () => {
    const phi = 0.5, T = 30, persons = 400;
    const A = [[Math.log(phi)]];
    const setup: RehearsalSetup = {
      process: { states: ['x0'], base: { drift: fromRows(A), noise: [1], mean: new Float64Array(1) }, inputs: [], links: [], warnings: [] },
      prompts: regular(persons, T), errorVariance: [0], timeUnit: 'day', links: [{ from: 'x0', to: 'x0' }], analysis: {}, alpha: 0.05, seed: 21,
    };
    const res = summarizeTally(setup, runReplications(setup, 0, 40));
    const expected = phi - (1 + phi) / (T - 1);
    // First-order approximation for N → ∞; the O(1/T²) remainder is below 0.01 here (common practice).
    expect(Math.abs(res.links[0].effect - expected)).toBeLessThan(0.01);
    expect(res.links[0].effect).toBeLessThan(phi - 0.03);
  });

  it('the expected within-person estimate (pooled limit + centring bias) matches Monte Carlo means of the VAR fit computed here, and for one variable the bias approaches −(1+φ)/(T−1)', () => {
    const expm1 = (phi: number) => (gap: number) => fromRows([[phi ** gap]]);
    // One variable, φ = .5, Σ = 1: the exact bias at T occasions against Nickell's large-T form (Nickell 1981; common result).
    for (const T of [50, 200]) {
      const m = centredMoments(expm1(0.5), fromRows([[1]]), [0], Float64Array.from({ length: T }, (_, k) => k));
      const bias = m.num.data[0] / m.den.data[0] - 0.5;
      // The O(1/T²) remainder: below 10 % of the bias at T = 50, below 3 % at T = 200.
      expect(Math.abs(bias / (-1.5 / (T - 1)) - 1)).toBeLessThan(T === 50 ? 0.1 : 0.03);
    }
    // Two variables (Φ(1) and Σ by SciPy), prompted once an hour, then a study with night gaps and
    // measurement error: every link's mean estimate over K studies of 300 persons against the expected estimate.
    const sigma = fromRows(ref.sigma);
    const phiOf = (gap: number) => fromRows(gap === 1 ? ref.phi[0] : ref.phi[1]);
    const links = [{ from: 'x0', to: 'x0' }, { from: 'x1', to: 'x0' }, { from: 'x0', to: 'x1' }, { from: 'x1', to: 'x1' }];
    const cases = [
      { name: 'T = 15', times: Float64Array.from({ length: 15 }, (_, k) => k), error: [0, 0] },
      { name: 'T = 40', times: Float64Array.from({ length: 40 }, (_, k) => k), error: [0, 0] },
      { name: 'nights, reliability .8, T = 20', times: Float64Array.from({ length: 20 }, (_, k) => Math.floor(k / 5) * 10 + (k % 5)), error: [0.25 * ref.sigma[0][0], 0.25 * ref.sigma[1][1]] },
    ];
    for (const c of cases) {
      const m = centredMoments(phiOf, sigma, c.error, c.times);
      const expected = mul(m.num, inverse(m.den));
      const setup: RehearsalSetup = {
        process: { ...processOf(drift, [[1, 0], [0, 0.5]]), base: { drift: fromRows(drift), noise, mean: new Float64Array(2) } },
        prompts: () => Array.from({ length: 300 }, (_, p) => ({ id: `p${p}`, times: c.times })), errorVariance: c.error, timeUnit: 'h', links, analysis: {}, alpha: 0.05, seed: 31 + c.times.length,
      };
      const K = 40;
      const res = summarizeTally(setup, runReplications(setup, 0, K));
      res.links.forEach((l, k) => {
        const i = links[k].to === 'x0' ? 0 : 1, j = links[k].from === 'x0' ? 0 : 1;
        const e = expected.data[i * 2 + j];
        const mcSE = l.se / Math.sqrt(K);
        expect(Math.abs(l.effect - e), `${c.name}, ${l.from}->${l.to}: mean ${l.effect}, expected ${e}`).toBeLessThan(3.5 * mcSE);
      });
      // The diagonal carries a bias many Monte Carlo errors wide: without it the check above would fail.
      const b0 = c.error[0] === 0 ? ref.phi[0][0][0] : NaN;
      if (Number.isFinite(b0)) expect(Math.abs(res.links[0].effect - b0)).toBeGreaterThan(6 * (res.links[0].se / Math.sqrt(K)));
    }
  });
});
