/**
 * Monte Carlo power: simulate the planned study many times, analyse each synthetic data set
 * exactly as the real data will be analysed (the first-order VAR of the Data pane), and count
 * how often each link of interest is detected (two-sided Wald test at level α).
 *
 * Replication r always draws from the stream seeded by (seed, r), so a run split across
 * workers gives the same tallies as one run, and adding replications keeps the first ones.
 */
import type { TimeUnit, VariableId } from '../model/types';
import { fitVar, type VarOptions } from '../fit/var';
import { fitCt } from '../fit/ct';
import { seededRandom, type Random } from '../stats/random';
import { normalQuantile } from '../stats/normal';
import { simulatePanel, type PersonPrompts } from './simulate';
import { drawPerson, type StudyProcess } from './process';

export interface LinkOfInterest {
  from: VariableId;
  to: VariableId;
}

export interface RehearsalSetup {
  process: StudyProcess;
  /** One study's prompts for every person (random timing and missed prompts drawn from `rng`). */
  prompts: (rng: Random) => PersonPrompts[];
  /** Measurement error variance per state (in `process.states` order). */
  errorVariance: ArrayLike<number>;
  timeUnit: TimeUnit;
  links: LinkOfInterest[];
  analysis: VarOptions;
  /**
   * How each simulated study is analysed, as the Data pane would: 'var' (default) the lagged
   * effect of the first-order VAR; 'ct' the drift entry (effect on the rate) of the
   * continuous-time fit by maximum likelihood, with its standard error.
   */
  method?: 'var' | 'ct';
  alpha: number;
  seed: number;
}

/** Sums over replications; tallies of parts of a run add up (`mergeTallies`). */
export interface Tally {
  replications: number;
  /** Replications whose analysis failed (too few pairs, a singular design), with one reason. */
  failed: number;
  failure?: string;
  links: { sum: number; sumSq: number; sumSE: number; rejections: number }[];
}

export function emptyTally(links: number): Tally {
  return { replications: 0, failed: 0, links: Array.from({ length: links }, () => ({ sum: 0, sumSq: 0, sumSE: 0, rejections: 0 })) };
}

export function mergeTallies(a: Tally, b: Tally): Tally {
  return {
    replications: a.replications + b.replications,
    failed: a.failed + b.failed,
    ...(a.failure ?? b.failure ? { failure: a.failure ?? b.failure } : {}),
    links: a.links.map((x, i) => ({ sum: x.sum + b.links[i].sum, sumSq: x.sumSq + b.links[i].sumSq, sumSE: x.sumSE + b.links[i].sumSE, rejections: x.rejections + b.links[i].rejections })),
  };
}

/** The random stream of replication r. */
export function replicationStream(seed: number, r: number): Random {
  return seededRandom(seed).fork(r);
}

/**
 * Run replications [from, to). `shouldStop` is asked between replications; `onProgress` gets the count done.
 * Example: `runReplications(setup, 0, 200)` then `summarizeTally(setup, tally)`.
 */
export function runReplications(setup: RehearsalSetup, from: number, to: number, hooks: { shouldStop?: () => boolean; onProgress?: (done: number) => void } = {}): Tally {
  const tally = emptyTally(setup.links.length);
  const states = setup.process.states;
  const idx = setup.links.map((l) => {
    const i = states.indexOf(l.to), j = states.indexOf(l.from);
    if (i < 0 || j < 0) throw new Error(`${i < 0 ? l.to : l.from} is not a state of the model: only links between states have a lagged effect to detect`);
    return [i, j] as const;
  });
  const z = normalQuantile(1 - setup.alpha / 2);
  for (let r = from; r < to; r++) {
    if (hooks.shouldStop?.()) break;
    const rng = replicationStream(setup.seed, r);
    const prompts = setup.prompts(rng.fork(0));
    const people = rng.fork(1);
    const persons = prompts.map(() => drawPerson(setup.process, people));
    const panel = simulatePanel((p) => persons[p], prompts, { states, errorVariance: setup.errorVariance, timeUnit: setup.timeUnit }, rng.fork(2));
    tally.replications++;
    let est: number[][], se: number[][];
    try {
      if (setup.method === 'ct') {
        const fit = fitCt(panel, { states });
        est = fit.drift;
        se = fit.se.drift;
      } else {
        const fit = fitVar(panel, setup.analysis);
        est = fit.phi;
        se = fit.se.phiCluster ?? fit.se.phi;
      }
    } catch (e) {
      tally.failed++;
      tally.failure ??= e instanceof Error ? e.message : String(e);
      continue;
    }
    idx.forEach(([i, j], k) => {
      const b = est[i][j], s = se[i][j];
      const t = tally.links[k];
      t.sum += b;
      t.sumSq += b * b;
      t.sumSE += s;
      if (Math.abs(b) > z * s) t.rejections++;
    });
    hooks.onProgress?.(r - from + 1);
  }
  return tally;
}

export interface MonteCarloLink extends LinkOfInterest {
  /** Mean estimate over the replications. */
  effect: number;
  /** Standard deviation of the estimates (the true standard error of the analysis). */
  se: number;
  /** Mean of the standard errors the analysis reported. */
  reportedSE: number;
  power: number;
  /** Monte Carlo standard error of the power, √(p(1−p)/K). */
  mcError: number;
}

export function summarizeTally(setup: Pick<RehearsalSetup, 'links'>, tally: Tally): { replications: number; failed: number; failure?: string; links: MonteCarloLink[] } {
  const k = tally.replications - tally.failed;
  return {
    replications: tally.replications,
    failed: tally.failed,
    ...(tally.failure ? { failure: tally.failure } : {}),
    links: setup.links.map((l, i) => {
      const t = tally.links[i];
      const mean = k > 0 ? t.sum / k : NaN;
      const variance = k > 1 ? (t.sumSq - k * mean * mean) / (k - 1) : NaN;
      // Failed analyses count as non-detections: the study would not have found the link.
      const power = tally.replications > 0 ? t.rejections / tally.replications : NaN;
      return { ...l, effect: mean, se: Math.sqrt(Math.max(0, variance)), reportedSE: k > 0 ? t.sumSE / k : NaN, power, mcError: Math.sqrt((power * (1 - power)) / Math.max(1, tally.replications)) };
    }),
  };
}
