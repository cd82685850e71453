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
import { latestWins } from './client';
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
  let onMain = primary === null;
  let fb: NumericApi | null = null;
  const main = () => (fb ??= fallback());
  const start = (): NumericTransport | null => {
    if (onMain || !primary) return null;
    try {
      return primary();
    } catch {
      onMain = true;
      return null;
    }
  };
  let quick: NumericTransport | null = null;
  let quickStarted = false;
  const quickApi = (): NumericApi => {
    if (!quickStarted) { quickStarted = true; quick = start(); }
    return onMain || !quick ? main() : quick;
  };
  const callQuick = async (kind: Quick, args: unknown[]): Promise<unknown> => {
    const api = quickApi();
    try {
      return await (api[kind] as (...a: unknown[]) => Promise<unknown>)(...args);
    } catch (e) {
      if (api === main()) throw e;
      // The worker failed (could not load, crashed): answer here from now on.
      onMain = true;
      quick?.dispose?.();
      return (main()[kind] as (...a: unknown[]) => Promise<unknown>)(...args);
    }
  };
  const lanes = new Map<Quick, ReturnType<typeof latestWins<unknown[], unknown>>>();
  const lane = (kind: Quick) => {
    let l = lanes.get(kind);
    if (!l) { l = latestWins((...args: unknown[]) => callQuick(kind, args)); lanes.set(kind, l); }
    return l;
  };
  let simSeq = 0;
  let current: { transport: NumericTransport | null; cancel: () => void } | null = null;
  return {
    async ask(kind, ...args) {
      const d = await lane(kind).call(...(args as unknown[]));
      return d.stale ? null : (d.value as never);
    },
    simulate(model, options, onProgress) {
      // A newer run replaces the older one: the older is stopped and delivers null.
      const seq = ++simSeq;
      current?.cancel();
      const transport = start();
      let settle: (a: SimulationAnswer | Failed | null) => void = () => {};
      let done = false;
      const result = new Promise<SimulationAnswer | Failed | null>((resolve) => {
        settle = (a) => { if (!done) { done = true; resolve(seq === simSeq || a === null ? a : null); } };
      });
      const run = { transport, cancel: () => {
        if (done) return;
        // A worker busy with an integration reads no messages: ending it is the only way to stop it.
        transport?.dispose?.();
        settle(cancelledAnswer());
      } };
      current = run;
      const progress = onProgress ? (f: number) => { if (!done) onProgress(f); } : undefined;
      const onMainThread = () => main().simulate(model, options, progress).then(settle, (e: unknown) => settle({ ok: false, reason: (e as Error).message }));
      if (!transport) void onMainThread();
      else
        transport.simulate(model, options, progress).then(
          (a) => { settle(a); transport.dispose?.(); },
          () => {
            if (done) return;
            onMain = true;
            transport.dispose?.();
            void onMainThread();
          },
        );
      return { result, cancel: run.cancel };
    },
    where: () => (onMain ? 'main thread' : 'worker'),
    dispose() {
      current?.cancel();
      for (const l of lanes.values()) l.invalidate();
      quick?.dispose?.();
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
    const noWorker = typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
    return createNumericClient(noWorker ? null : workerNumeric, () => localNumeric);
  });
  return appClient;
}
