/**
 * The rehearsal of a study as lane jobs (lane.ts): analytic power, the design advisor over the
 * interval, persons and prompts per day, a part of a Monte Carlo run (replications [from, to),
 * whose tallies add up across workers), and one simulated study as CSV. Plain data in and out;
 * runs in `rehearse.worker.ts`, or on the main thread when no worker can start.
 */
import type { Model, Study } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { planPersons, planPromptsPerDay, planStudy, type AxisPlan, type Budget, type PlanResult } from '../core/rehearse/plan';
import { analyticPower, type PowerResult } from '../core/rehearse/power';
import { mergeTallies, runReplications, type LinkOfInterest, type Tally } from '../core/rehearse/montecarlo';
import { rehearsalOf, simulateStudy, type Rehearsal } from '../core/rehearse/setup';
import { simulatorText } from '../core/rehearse/nonlinear';
import { studyCsv } from '../present/index';

export interface RehearseRequest {
  model: Model;
  /** The session's study (written whole, so a model without one rehearses the default study). */
  study: Study;
  links: LinkOfInterest[];
  seed?: number;
  /** How Monte Carlo analyses each simulated study: the VAR (default) or the continuous-time fit. */
  method?: 'var' | 'ct';
}

export type Failed = { ok: false; reason: string };
export type Ok<T> = { ok: true } & T;

export interface AnalyticAnswer {
  power: PowerResult;
  persons: number;
  plannedPerPerson: number;
  answeredPerPerson: number;
}

export interface AdvisorAnswer {
  interval: PlanResult;
  persons: AxisPlan;
  /** Null when the schedule has no daily window. */
  promptsPerDay: AxisPlan | null;
}

function rehearsal(req: RehearseRequest): Rehearsal {
  return rehearsalOf({ ...req.model, study: req.study }, { links: req.links, ...(req.seed !== undefined ? { seed: req.seed } : {}), ...(req.method ? { method: req.method } : {}) });
}

function guarded<T extends object>(f: () => T): Ok<T> | Failed {
  try {
    return { ok: true, ...f() };
  } catch (e) {
    return { ok: false, reason: e instanceof Error ? e.message : String(e) };
  }
}

export function analyticJob(req: RehearseRequest): Ok<AnalyticAnswer> | Failed {
  return guarded(() => {
    const r = rehearsal(req);
    return { power: analyticPower(r), persons: r.persons, plannedPerPerson: r.plannedPerPerson, answeredPerPerson: r.answeredPerPerson };
  });
}

export function advisorJob(req: RehearseRequest, budget: Budget): Ok<AdvisorAnswer> | Failed {
  return guarded(() => {
    const r = rehearsal(req);
    const fmt = (x: number) => formatDuration(x, r.timeUnit);
    return {
      interval: planStudy(r, budget, { format: fmt }),
      persons: planPersons(r, { format: fmt }),
      promptsPerDay: r.study.schedule.kind === 'daily-window' ? planPromptsPerDay(r, { format: fmt }) : null,
    };
  });
}

export interface CsvAnswer {
  csv: string;
  persons: number;
  rows: number;
  /** How the study was simulated (exact discrete model, or Euler–Maruyama and its step). */
  simulator: string;
}

/** One simulated study as CSV; `onProgress` gets the persons simulated so far. */
export function csvJob(req: RehearseRequest, onProgress?: (persons: number) => void): Ok<CsvAnswer> | Failed {
  return guarded(() => {
    const r = rehearsal(req);
    const panel = simulateStudy(r, onProgress);
    return { csv: studyCsv(panel), persons: panel.persons.length, rows: panel.persons.reduce((a, p) => a + p.time.length, 0), simulator: simulatorText(r.integrator, (x) => formatDuration(x, r.timeUnit)) };
  });
}

export interface RehearseApi {
  analytic(req: RehearseRequest): Promise<Ok<AnalyticAnswer> | Failed>;
  advisor(req: RehearseRequest, budget: Budget): Promise<Ok<AdvisorAnswer> | Failed>;
  /** Progress: persons simulated so far (of the study's persons). */
  csv(req: RehearseRequest, onProgress?: (persons: number) => void): Promise<Ok<CsvAnswer> | Failed>;
  /** Replications [from, to) of the seed's streams; progress: replications done in this part. */
  replications(req: RehearseRequest, from: number, to: number, onProgress?: (done: number) => void): Promise<Ok<{ tally: Tally }> | Failed>;
}

const pause = () => new Promise((r) => setTimeout(r, 0));

export const localRehearse: RehearseApi = {
  async analytic(req) {
    return analyticJob(req);
  },
  async advisor(req, budget) {
    return advisorJob(req, budget);
  },
  async csv(req, onProgress) {
    return csvJob(req, onProgress);
  },
  async replications(req, from, to, onProgress) {
    let r: Rehearsal;
    try {
      r = rehearsal(req);
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
    // In steps of a few replications, yielding between them: progress reaches the page, and on
    // the main thread (no worker) the page stays responsive.
    let tally: Tally | null = null;
    try {
      for (let a = from; a < to; a += 4) {
        const part = runReplications(r, a, Math.min(to, a + 4));
        tally = tally ? mergeTallies(tally, part) : part;
        onProgress?.(tally.replications);
        await pause();
      }
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
    return { ok: true, tally: tally ?? { replications: 0, failed: 0, links: r.links.map(() => ({ sum: 0, sumSq: 0, sumSE: 0, rejections: 0 })) } };
  },
};
