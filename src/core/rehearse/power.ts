/**
 * Power of a rehearsed study for each link of interest, analytic or by Monte Carlo.
 *
 * Analytic: the pooled VAR(1) limit over the schedule's gaps (`scheduleGaps`, stratified-random
 * gaps averaged over their spread), the sandwich variance per pair (`pooledVarMoments`), the
 * expected answered pairs per person, and the between-person SD of the effect from each varying
 * link strength to first order (∂B/∂w · SD). Optimistic for short series (below about 100
 * occasions per person, `note` says so); the small-T bias of person-mean centring is given per link
 * beside the effect (`centringBias`, `expectedEstimate`).
 */
import type { Mat } from '../numeric/dense';
import { axpby, inverse, mul, scale } from '../numeric/dense';
import { diagonalNoise, expm } from '../numeric/expm';
import { lyapunov } from '../numeric/lyapunov';
import { phiOverGap, scheduleGaps } from '../study/index';
import { centredMoments, pooledStandardError, pooledVarMoments, powerOfTest } from './analytic';
import { seededRandom } from '../stats/random';
import { runReplications, summarizeTally, type Tally, emptyTally, mergeTallies } from './montecarlo';
import type { Rehearsal } from './setup';

/** Below this many answered occasions per person the analytic figure overstates power. */
export const ANALYTIC_OCCASIONS = 100;

/** Which power figure to trust at this many answered occasions per person (the CLI and the app say it alike). */
export function trustSentence(answered: number): string {
  return answered < ANALYTIC_OCCASIONS
    ? `Which to trust: with about ${Math.round(answered)} answered occasions per person (below about ${ANALYTIC_OCCASIONS}) the analytic figure overstates power; trust the Monte Carlo figure.`
    : `Which to trust: with about ${Math.round(answered)} answered occasions per person (about ${ANALYTIC_OCCASIONS} or more) the analytic and Monte Carlo figures should agree; the Monte Carlo figure remains the check.`;
}

export interface LinkPower {
  from: string;
  to: string;
  /** The lagged effect the analysis estimates (analytic: its limit; Monte Carlo: the mean estimate). */
  effect: number;
  se: number;
  power: number;
  /** Monte Carlo standard error of the power. */
  mcError?: number;
  /**
   * Analytic only: the first-order bias of the person-mean-centred estimate at this many
   * occasions per person (Nickell's −(1+φ)/(T−1) for an autoregression), and the estimate the
   * analysis is expected to give, effect + bias.
   */
  centringBias?: number;
  expectedEstimate?: number;
}

export interface PowerResult {
  method: 'analytic' | 'montecarlo';
  /** Monte Carlo: how each simulated study was analysed ('ct': effects are drift entries). */
  analysis?: 'var' | 'ct';
  links: LinkPower[];
  replications?: number;
  failed?: number;
  note?: string;
}

function pooledCoefficients(r: Rehearsal, drift: Mat): { b: Mat; v: Mat } {
  const n = drift.rows;
  const ly = lyapunov(drift, diagonalNoise(Array.from(r.process.base.noise, (x) => Math.sqrt(x))));
  if (!ly.ok) throw new Error(`the mechanism has no steady state: ${ly.reason}`);
  const sigma = ly.sigma;
  const measured = axpby(1, sigma, 0, sigma);
  for (let i = 0; i < n; i++) measured.data[i * n + i] += r.errorVariance[i];
  const gaps = scheduleGaps(r.study, r.timeUnit);
  const lag = gaps.map((g) => mul(phiOverGap(drift, g.gap, g.spread), sigma));
  const m = pooledVarMoments(measured, gaps, lag);
  return { b: m.coefficients, v: m.variancePerPair };
}

/** Persons of one draw of the schedule whose occasions `expectedWithinEstimate` averages over. */
const CENTRING_PERSONS = 8;

/**
 * The estimate the person-mean-centred analysis is expected to give over many persons of this
 * study (`centredMoments` over the answered occasions of a few persons of one draw of the
 * schedule, base person): the pooled limit plus the small-T bias of centring.
 */
export function expectedWithinEstimate(r: Rehearsal): Mat {
  const drift = r.process.base.drift;
  const n = drift.rows;
  const ly = lyapunov(drift, diagonalNoise(Array.from(r.process.base.noise, (x) => Math.sqrt(x))));
  if (!ly.ok) throw new Error(`the mechanism has no steady state: ${ly.reason}`);
  const cache = new Map<number, Mat>();
  const phiOf = (gap: number) => {
    let p = cache.get(gap);
    if (!p) {
      p = expm(scale(drift, gap));
      if (cache.size < 4096) cache.set(gap, p);
    }
    return p;
  };
  const num = axpby(0, ly.sigma, 0, ly.sigma), den = axpby(0, ly.sigma, 0, ly.sigma);
  const persons = r.prompts(seededRandom(r.seed).fork(0)).slice(0, CENTRING_PERSONS);
  for (const p of persons) {
    const m = centredMoments(phiOf, ly.sigma, r.errorVariance, p.times);
    for (let x = 0; x < n * n; x++) {
      num.data[x] += m.num.data[x];
      den.data[x] += m.den.data[x];
    }
  }
  return mul(num, inverse(den));
}

/**
 * Example: `analyticPower(rehearsalOf(model, { persons: 50, links }))`. `withCentring: false`
 * leaves out the expected within-person estimate (the design advisor's grids do not need it).
 */
export function analyticPower(r: Rehearsal, { withCentring = true }: { withCentring?: boolean } = {}): PowerResult {
  const n = r.process.states.length;
  const states = r.process.states;
  const { b, v } = pooledCoefficients(r, r.process.base.drift);
  const pairs = Math.max(0, r.answeredPerPerson - 1);
  const expected = withCentring ? expectedWithinEstimate(r) : null;
  const links = r.links.map((l) => {
    const i = states.indexOf(l.to), j = states.indexOf(l.from);
    let tau2 = 0;
    for (const pl of r.process.links) {
      const h = 1e-4;
      const up = pooledCoefficients(r, axpby(1, r.process.base.drift, h, pl.driftPerUnit)).b;
      const down = pooledCoefficients(r, axpby(1, r.process.base.drift, -h, pl.driftPerUnit)).b;
      tau2 += (((up.data[i * n + j] - down.data[i * n + j]) / (2 * h)) * pl.sd) ** 2;
    }
    const effect = b.data[i * n + j];
    const se = pooledStandardError(v.data[i * n + j], pairs, r.persons, Math.sqrt(tau2));
    const base = { from: l.from, to: l.to, effect, se, power: powerOfTest(effect, se, r.alpha) };
    if (!expected) return base;
    const e = expected.data[i * n + j];
    return { ...base, centringBias: e - effect, expectedEstimate: e };
  });
  const note = r.answeredPerPerson < ANALYTIC_OCCASIONS
    ? `analytic figures are optimistic here: about ${Math.round(r.answeredPerPerson)} answered occasions per person (below about ${ANALYTIC_OCCASIONS}), where the asymptotic formula understates the standard error and leaves out the bias of person-mean centring (centringBias, about −(1+φ)/(T−1) for an autoregression; the analysis is expected to give expectedEstimate); trust the Monte Carlo figure (--method montecarlo)`
    : undefined;
  return { method: 'analytic', links, ...(note ? { note } : {}) };
}

/**
 * Monte Carlo power over `replications` simulated studies (replication k from stream k of the
 * seed), in parts of `chunk` so a caller can report progress and stop.
 */
export function monteCarloPower(r: Rehearsal, replications: number, hooks: { shouldStop?: () => boolean; onProgress?: (done: number) => void } = {}): PowerResult {
  if (!Number.isInteger(replications) || replications < 1) throw new Error(`replications: a whole number ≥ 1 is needed, not ${replications}`);
  let tally: Tally = emptyTally(r.links.length);
  const chunk = 25;
  for (let from = 0; from < replications; from += chunk) {
    if (hooks.shouldStop?.()) break;
    tally = mergeTallies(tally, runReplications(r, from, Math.min(replications, from + chunk)));
    hooks.onProgress?.(tally.replications);
  }
  const s = summarizeTally(r, tally);
  return {
    method: 'montecarlo',
    analysis: r.method ?? 'var',
    replications: s.replications,
    failed: s.failed,
    links: s.links.map((l) => ({ from: l.from, to: l.to, effect: l.effect, se: l.se, power: l.power, mcError: l.mcError })),
    ...(s.failure ? { note: `${s.failed} of ${s.replications} analyses failed (counted as not detecting): ${s.failure}` } : {}),
  };
}
