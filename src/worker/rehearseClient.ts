/**
 * Main-thread client of the rehearsal, on a lane (lane.ts): analytic power, the design advisor and
 * the simulated CSV on the lane's worker; a Monte Carlo run split into parts over parallel
 * workers (as many as the machine reports cores, never more), each a cancellable job of its own
 * with progress. Replication r draws from stream r of the seed, so the parts add up to the run
 * one worker would make. Without workers (`?noworker`, or none can start) the parts run on the
 * main thread in small steps.
 */
import { proxy } from 'comlink';
import { emptyTally, mergeTallies, summarizeTally, type MonteCarloLink, type Tally } from '../core/rehearse/montecarlo';
import type { Budget } from '../core/rehearse/plan';
import { startWorker } from './guard';
import { createLane, noWorkerRequested, type Transport, type Where } from './lane';
import type { RehearseApi, RehearseRequest } from './rehearseApi';

export interface McSummary {
  replications: number;
  failed: number;
  failure?: string;
  links: MonteCarloLink[];
  workers: number;
}

export type McOutcome = { status: 'done'; summary: McSummary; where: Where } | { status: 'cancelled'; summary: McSummary | null } | { status: 'failed'; reason: string };

export interface McRun {
  result: Promise<McOutcome>;
  cancel(): void;
}

/** The most parallel workers a Monte Carlo run starts, whatever the machine reports (memory: each holds the model and its own copy of the core). */
export const MAX_WORKERS = 8;

/**
 * How many workers a Monte Carlo run uses: as many as the machine reports cores
 * (`navigator.hardwareConcurrency`), at least 1 and at most `MAX_WORKERS`; 1 when the browser
 * does not say. Example: `workerCount(navigator.hardwareConcurrency)`.
 */
export function workerCount(reported: number | undefined | null): number {
  const n = Math.floor(Number(reported));
  return Number.isFinite(n) && n >= 1 ? Math.min(n, MAX_WORKERS) : 1;
}

/** Parts of a run of K replications over at most `cores` workers: [from, to) each, none empty. */
export function splitReplications(k: number, cores: number): [number, number][] {
  const w = Math.max(1, Math.min(Math.floor(cores) || 1, k));
  const parts: [number, number][] = [];
  for (let i = 0; i < w; i++) {
    const from = Math.floor((i * k) / w), to = Math.floor(((i + 1) * k) / w);
    if (to > from) parts.push([from, to]);
  }
  return parts;
}

export type CsvOutcome = Awaited<ReturnType<RehearseApi['csv']>> | { ok: false; cancelled: true; reason: string };

export interface CsvRun {
  result: Promise<CsvOutcome>;
  cancel(): void;
}

export interface RehearseClient {
  analytic: RehearseApi['analytic'];
  advisor(req: RehearseRequest, budget: Budget): ReturnType<RehearseApi['advisor']>;
  /** One simulated study on a worker of its own, with progress (persons) and Cancel. */
  csv(req: RehearseRequest, onProgress?: (persons: number) => void): CsvRun;
  monteCarlo(req: RehearseRequest, replications: number, cores: number, onProgress?: (done: number) => void): McRun;
  where(): Where;
  dispose(): void;
}

export function createRehearseClient(worker: (() => Transport<RehearseApi>) | null, fallback: () => RehearseApi): RehearseClient {
  const lane = createLane<RehearseApi>({ worker, fallback, lazy: true });
  let runSeq = 0;
  return {
    analytic: (req) => lane.run((a) => a.analytic(req)).then((r) => r.value),
    advisor: (req, budget) => lane.run((a) => a.advisor(req, budget)).then((r) => r.value),
    csv(req, onProgress) {
      const run = lane.cancellable<CsvOutcome, number>('csv', (api, progress) => api.csv(req, progress), {
        onProgress,
        cancelled: () => ({ ok: false, cancelled: true, reason: 'cancelled' }),
        failed: (e) => ({ ok: false, reason: e instanceof Error ? e.message : String(e) }),
      });
      // A newer simulated study replaced this one: it reads as cancelled.
      return { result: run.result.then((a) => a ?? { ok: false, cancelled: true, reason: 'replaced by a newer run' }), cancel: run.cancel };
    },
    monteCarlo(req, replications, cores, onProgress) {
      const seq = ++runSeq;
      const parts = splitReplications(replications, cores);
      const done = parts.map(() => 0);
      type Part = { tally: Tally } | 'cancelled' | { reason: string };
      const runs = parts.map(([from, to], i) =>
        lane.cancellable<Part, number>(`mc-${seq}-${i}`, (api, progress) => api.replications(req, from, to, progress).then((a) => (a.ok ? { tally: a.tally } : { reason: a.reason })), {
          onProgress: (n) => {
            done[i] = n;
            onProgress?.(done.reduce((a, b) => a + b, 0));
          },
          cancelled: () => 'cancelled',
          failed: (e) => ({ reason: e instanceof Error ? e.message : String(e) }),
        }),
      );
      let cancelled = false;
      const summary = (tallies: Tally[]): McSummary | null => {
        if (tallies.length === 0) return null;
        const t = tallies.reduce(mergeTallies, emptyTally(req.links.length));
        return { ...summarizeTally(req, t), workers: parts.length };
      };
      const result = Promise.all(runs.map((r) => r.result)).then((answers): McOutcome => {
        const failure = answers.find((a): a is { reason: string } => typeof a === 'object' && a !== null && 'reason' in a);
        if (failure && !cancelled) return { status: 'failed', reason: failure.reason };
        const tallies = answers.filter((a): a is { tally: Tally } => typeof a === 'object' && a !== null && 'tally' in a).map((a) => a.tally);
        if (cancelled) return { status: 'cancelled', summary: summary(tallies) };
        return { status: 'done', summary: summary(tallies)!, where: lane.where() };
      });
      return {
        result,
        cancel() {
          cancelled = true;
          for (const r of runs) r.cancel();
        },
      };
    },
    where: () => lane.where(),
    dispose: () => lane.dispose(),
  };
}

function workerRehearse(): Transport<RehearseApi> {
  const w = startWorker<RehearseApi>(() => new Worker(new URL('./rehearse.worker.ts', import.meta.url), { type: 'module' }), 'rehearse worker');
  return {
    analytic: (req) => w.call(() => w.remote.analytic(req)),
    advisor: (req, b) => w.call(() => w.remote.advisor(req, b)),
    csv: (req, p) => w.call(() => w.remote.csv(req, p ? proxy(p) : undefined)),
    replications: (req, from, to, p) => w.call(() => w.remote.replications(req, from, to, p ? proxy(p) : undefined)),
    dispose: w.dispose,
  };
}

let appClient: Promise<RehearseClient> | null = null;
/** The app's rehearsal client, created on first use (the Rehearse tab). */
export function appRehearseClient(): Promise<RehearseClient> {
  appClient ??= import('./rehearseApi').then(({ localRehearse }) => createRehearseClient(noWorkerRequested() ? null : workerRehearse, () => localRehearse));
  return appClient;
}
