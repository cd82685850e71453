/**
 * Main-thread client of the numeric worker. Each kind of question (equilibrium,
 * sampled model, link curve, …) carries its own sequence number and only the
 * answer to the latest question of that kind is delivered; older answers are
 * dropped (latest wins). Simulations run in a worker of their own so that a
 * long run never holds up the quick questions, and Cancel ends that worker.
 * When a worker cannot start, the same code runs on the main thread.
 * Transports are injected, so the logic is tested in Node with fakes.
 */
import { proxy } from 'comlink';
import type { Model, VariableId } from '../core/model/types';
import { createLane, noWorkerRequested, type LatestQueue } from './lane';
import type { NumericApi, SimulationAnswer, Failed } from './numericApi';
import { startWorker } from './guard';

export type NumericTransport = NumericApi & { dispose?: () => void };
type Quick = Exclude<keyof NumericApi, 'simulate'>;
type Answer<K extends Quick> = Awaited<ReturnType<NumericApi[K]>>;

export interface SimulationRun {
  /** The answer; a cancelled run resolves with `cancelled: true` (or null when a newer run replaced it). */
  result: Promise<SimulationAnswer | Failed | null>;
  cancel(): void;
}

export interface NumericClient {
  /** Resolves with the answer, or null when a newer question of the same kind overtook it. */
  ask<K extends Quick>(kind: K, ...args: Parameters<NumericApi[K]>): Promise<Answer<K> | null>;
  /**
   * The same, in a queue of its own named `slot`: views that show several answers of one kind side by side
   * (one per compared design) each keep their latest answer instead of overtaking one another.
   */
  askIn<K extends Quick>(slot: string, kind: K, ...args: Parameters<NumericApi[K]>): Promise<Answer<K> | null>;
  simulate(model: Model, options: { until: number; every?: number; hold?: Record<VariableId, number> }, onProgress?: (fraction: number) => void): SimulationRun;
  readonly where: () => 'worker' | 'main thread';
  dispose(): void;
}

const cancelledAnswer = (): SimulationAnswer => ({
  ok: false,
  times: [],
  series: {},
  cancelled: true,
  diagnostics: [{ level: 'warning', code: 'simulation-cancelled', message: 'the simulation was stopped', variables: [], equations: [] }],
});

export function createNumericClient(primary: (() => NumericTransport) | null, fallback: () => NumericApi): NumericClient {
  const lane = createLane({ worker: primary, fallback, lazy: true });
  const queues = new Map<string, LatestQueue<unknown[], unknown>>();
  const queue = (kind: Quick, slot = '') => {
    const key = `${kind}\u0000${slot}`;
    let q = queues.get(key);
    if (!q) {
      q = lane.latest((...args: unknown[]) => lane.run((api) => (api[kind] as (...a: unknown[]) => Promise<unknown>)(...args)).then((r) => r.value), { mode: 'parallel' });
      queues.set(key, q);
    }
    return q;
  };
  return {
    ask: (kind, ...args) => queue(kind).latest(...(args as unknown[])) as never,
    askIn: (slot, kind, ...args) => queue(kind, slot).latest(...(args as unknown[])) as never,
    simulate: (model, options, onProgress) =>
      lane.cancellable('simulate', (api, progress) => api.simulate(model, options, progress), {
        onProgress,
        cancelled: cancelledAnswer,
        failed: (e): Failed => ({ ok: false, reason: (e as Error).message }),
      }),
    where: lane.where,
    dispose() {
      for (const q of queues.values()) q.supersede();
      lane.dispose();
    },
  };
}

/** A module worker hosting the numerics; a worker that fails to load rejects every pending call. */
export function workerNumeric(): NumericTransport {
  const w = startWorker<NumericApi>(() => new Worker(new URL('./numeric.worker.ts', import.meta.url), { type: 'module' }), 'numeric worker');
  const { remote, call } = w;
  return {
    equilibrium: (m, h) => call(() => remote.equilibrium(m, h)),
    simulate: (m, o, p) => call(() => remote.simulate(m, o, p ? proxy(p) : undefined)),
    sampled: (m, i) => call(() => remote.sampled(m, i)),
    timescales: (m, i) => call(() => remote.timescales(m, i)),
    curve: (m, f, t) => call(() => remote.curve(m, f, t)),
    advise: (m, l, f) => call(() => remote.advise(m, l, f)),
    design: (m, st) => call(() => remote.design(m, st)),
    sampledAt: (m, xs) => call(() => remote.sampledAt(m, xs)),
    dispose: w.dispose,
  };
}

let appClient: Promise<NumericClient> | null = null;
/**
 * The app's numeric client, created on first use (the worker and the numerics
 * load only when the Numbers pane opens). `?noworker` runs it on the main thread.
 * One shared promise: callers get the client in the order they asked, so the
 * sequence numbers follow the order of the questions.
 */
export function appNumericClient(): Promise<NumericClient> {
  appClient ??= import('./numericApi').then(({ localNumeric }) => {
    return createNumericClient(noWorkerRequested() ? null : workerNumeric, () => localNumeric);
  });
  return appClient;
}
