/**
 * A lane runs core work off the main thread: one mechanism under every
 * client (the analysis, the band orderings, the numerics, the layout).
 * It starts a worker, falls back to the same code on the main thread when
 * the worker cannot start or fails, and gives each kind of question a
 * policy: latest wins, cancel, progress, a small cache.
 *
 * A new kind of job, in four pieces:
 *  1. Pure code that returns plain data, tested in Node (in src/core/, or an
 *     `xApi.ts` beside this file that only calls the core): `localX: XApi`,
 *     every method async, exceptions turned into a message.
 *  2. A worker file, a thin message switch importing nothing from the app:
 *     `x.worker.ts`: `import { expose } from 'comlink'; expose(localX);`
 *  3. A transport for it (guard.ts): every call through the guard, so a
 *     worker that fails rejects what is pending and the lane moves over:
 *       const w = startWorker<XApi>(() => new Worker(new URL('./x.worker.ts', import.meta.url), { type: 'module' }), 'x worker');
 *       const workerX = (): Transport<XApi> => ({ fit: (d) => w.call(() => w.remote.fit(d)), dispose: w.dispose });
 *  4. A lane and a policy per kind of question:
 *       const lane = createLane({ worker: noWorkerRequested() ? null : workerX, fallback: () => localX });
 *       const fits = lane.latest((d: Data) => lane.run((x) => x.fit(d)).then((r) => r.value));
 *       const answer = await fits.latest(data); // null when a newer fit was asked for first
 *     A long run with progress that the user can stop (a worker of its own, ended on cancel):
 *       const run = lane.cancellable('fit', (x, progress) => x.fit(d, progress), { onProgress, cancelled: () => stopped, failed: (e) => failure(e) });
 *       run.cancel(); await run.result; // the `cancelled()` answer, or null when a newer run of the kind replaced it
 *     Answers worth keeping on this side: `lru<Key, Answer>(size)`.
 * Tests drive the policies in Node with fake transports (tests/worker/).
 */

export type Where = 'worker' | 'main thread';
/** What a worker factory gives: the API, and how to stop the worker. */
export type Transport<Api> = Api & { dispose?: () => unknown };

let noWorkerFlag: boolean | undefined;
/** `?noworker` in the page address: every lane runs on the main thread (read once). */
export function noWorkerRequested(): boolean {
  noWorkerFlag ??= typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
  return noWorkerFlag;
}

export interface LaneOptions<Api> {
  /** Starts the worker (throws where none can start); null: the main thread only. */
  worker: (() => Transport<Api>) | null;
  /** The same API on the main thread; made on first use. */
  fallback: () => Api;
  /** Start the worker on the first call rather than now. */
  lazy?: boolean;
}

export interface Lane<Api> {
  /** Where calls go now. */
  where(): Where;
  /** The API calls go to now: the worker (started if need be) or the main thread. */
  api(): Api;
  /**
   * Run `f` on the worker; when the worker fails (could not load, crashed)
   * it is stopped, the lane moves to the main thread for good and `f` runs
   * again there. A failure on the main thread rejects.
   */
  run<T>(f: (api: Api) => Promise<T>): Promise<{ value: T; api: Api; where: Where }>;
  /** Stop the worker; the next call starts a fresh one (the only way to stop a job a worker is busy with). */
  restart(): Promise<void>;
  /** A worker of its own for one job (null: run it on the main thread); the caller disposes it. */
  dedicated(): Transport<Api> | null;
  /** From now on, everything runs on the main thread. */
  moveToMain(): void;
  /** A latest-wins queue for one kind of question (see `latestQueue`); `preempt` restarts this lane's worker. */
  latest<A extends unknown[], T>(call: (...args: A) => Promise<T>, policy?: LatestPolicy<A, T>): LatestQueue<A, T>;
  /**
   * A long job on a worker of its own, with progress, that `cancel` stops
   * by ending that worker. A newer job of the same `kind` cancels the older,
   * which then resolves null. A worker that fails moves the job (and the
   * lane) to the main thread.
   */
  cancellable<T, P = number>(kind: string, f: (api: Api, onProgress?: (progress: P) => void) => Promise<T>, opts: CancellableOptions<T, P>): CancellableRun<T>;
  /** Stop the worker and every job of its own. */
  dispose(): void;
}

/** `P`: what a job reports as progress (a fraction by default; a job may report a richer record). */
export interface CancellableOptions<T, P = number> {
  onProgress?: (progress: P) => void;
  /** The answer of a cancelled job. */
  cancelled: () => T;
  /** The answer when the job fails on the main thread. */
  failed: (e: unknown) => T;
}

export interface CancellableRun<T> {
  /** The answer; `cancelled()` after cancel; null when a newer job of the kind replaced this one. */
  result: Promise<T | null>;
  cancel(): void;
}

export function createLane<Api>(options: LaneOptions<Api>): Lane<Api> {
  const factory = options.worker;
  let onMain = factory === null;
  let fb: Api | null = null;
  const main = () => (fb ??= options.fallback());
  const start = (): Transport<Api> | null => {
    if (onMain || !factory) return null;
    try {
      return factory();
    } catch {
      onMain = true;
      return null;
    }
  };
  let worker: Transport<Api> | null = null;
  let started = false;
  const ensure = () => {
    if (!started) {
      started = true;
      worker = start();
    }
    return worker;
  };
  if (!options.lazy) ensure();
  const api = (): Api => {
    const w = ensure();
    return onMain || !w ? main() : w;
  };
  const moveToMain = () => {
    onMain = true;
    void worker?.dispose?.();
  };
  const restart = async () => {
    const w = worker;
    worker = null;
    started = false;
    await w?.dispose?.();
  };
  const jobs = new Map<string, { seq: number; cancel: () => void }>();

  const lane: Lane<Api> = {
    where: () => (onMain || (started && !worker) ? 'main thread' : 'worker'),
    api,
    async run(f) {
      const a = api();
      if (a !== fb) {
        try {
          return { value: await f(a), api: a, where: 'worker' };
        } catch {
          moveToMain();
        }
      }
      const m = main();
      return { value: await f(m), api: m, where: 'main thread' };
    },
    restart,
    dedicated: start,
    moveToMain,
    latest(call, policy = {}) {
      return latestQueue(call, policy.mode === 'preempt' ? { ...policy, preempt: policy.preempt ?? restart } : policy);
    },
    cancellable<T, P = number>(kind: string, f: (api: Api, onProgress?: (progress: P) => void) => Promise<T>, opts: CancellableOptions<T, P>) {
      const older = jobs.get(kind);
      const seq = (older?.seq ?? 0) + 1;
      jobs.set(kind, { seq, cancel: () => {} });
      older?.cancel(); // it resolves null: a newer job of its kind is under way
      const transport = start();
      let done = false;
      let settle: (a: ReturnType<typeof opts.cancelled> | null) => void = () => {};
      const result = new Promise<ReturnType<typeof opts.cancelled> | null>((resolve) => {
        settle = (a) => {
          if (done) return;
          done = true;
          resolve(jobs.get(kind)?.seq === seq || a === null ? a : null);
        };
      });
      const cancel = () => {
        if (done) return;
        // A worker busy with a long job reads no messages: ending it is the only way to stop it.
        void transport?.dispose?.();
        settle(opts.cancelled());
      };
      jobs.get(kind)!.cancel = cancel;
      const progress = opts.onProgress ? (x: P) => { if (!done) opts.onProgress!(x); } : undefined;
      const onMainThread = () => f(main(), progress).then(settle, (e: unknown) => settle(opts.failed(e)));
      if (!transport) void onMainThread();
      else
        f(transport, progress).then(
          (a) => {
            settle(a);
            void transport.dispose?.();
          },
          () => {
            if (done) return;
            onMain = true;
            void transport.dispose?.();
            void onMainThread();
          },
        );
      return { result, cancel };
    },
    dispose() {
      for (const j of jobs.values()) j.cancel();
      void worker?.dispose?.();
    },
  };
  return lane;
}

export interface LatestPolicy<A extends unknown[], T> {
  /**
   * - 'serial' (default): at most one call with the core; a newer one waits
   *   and replaces an older one still waiting (which resolves null, never sent).
   * - 'parallel': every call goes at once; a stale answer resolves null.
   * - 'preempt': one call at a time; a newer call stops the running one
   *   (`preempt`, by default the lane's restart) instead of waiting for it.
   */
  mode?: 'serial' | 'parallel' | 'preempt';
  /** Serial and preempt: turn a failure into an answer (else the promise rejects). */
  failed?: (e: unknown, ...args: A) => T;
  /** Preempt: stops the running call. */
  preempt?: () => Promise<void>;
  /** Preempt: awaited before a call starts (e.g. the worker's start), then the call is dropped if a newer one came. */
  ready?: () => Promise<unknown>;
}

export interface LatestQueue<A extends unknown[], T> {
  /** Latest wins: the answer, or null when a newer `latest` call (or `supersede`) came before it. */
  latest(...args: A): Promise<T | null>;
  /** Always answered, served before waiting `latest` calls and never replaced (an export, say). Serial mode. */
  must(...args: A): Promise<T>;
  /** Make every answer in flight stale; the waiting call resolves null now. */
  supersede(): void;
  /** A call is with the core. */
  busy(): boolean;
  /** Sequence number of the latest `latest` call. */
  readonly stamp: number;
}

export type Delivered<T> = { stale: false; seq: number; value: T } | { stale: true; seq: number };

/**
 * Stamp each call of an async function; its answer is marked stale when a
 * newer call was made (or `invalidate`) before it arrived.
 */
export function latestWins<A extends unknown[], T>(call: (...args: A) => Promise<T>) {
  let latest = 0;
  return {
    async call(...args: A): Promise<Delivered<T>> {
      const seq = ++latest;
      const value = await call(...args);
      return seq === latest ? { stale: false, seq, value } : { stale: true, seq };
    },
    /** Make every answer still in flight stale (e.g. the document was replaced). */
    invalidate() {
      latest++;
    },
    get latest() {
      return latest;
    },
  };
}

/** Latest wins over any async call (see LatestPolicy for the modes). */
export function latestQueue<A extends unknown[], T>(call: (...args: A) => Promise<T>, policy: LatestPolicy<A, T> = {}): LatestQueue<A, T> {
  const mode = policy.mode ?? 'serial';
  let stamp = 0;
  let running = 0;
  type Job = { stamp: number; args: A; droppable: boolean; resolve: (r: T | null) => void; reject: (e: unknown) => void };
  let waiting: Job | null = null;
  const musts: Job[] = [];
  let busy = false;
  const stamped = latestWins(call);
  const settle = (job: Job, p: Promise<T>) =>
    p.then(
      (r) => job.resolve(job.droppable && job.stamp !== stamp ? null : r),
      (e: unknown) => {
        if (job.droppable && job.stamp !== stamp) job.resolve(null);
        else if (policy.failed) job.resolve(policy.failed(e, ...job.args));
        else job.reject(e);
      },
    );
  const pump = () => {
    if (busy) return;
    const job = musts.shift() ?? waiting;
    if (!job) return;
    if (job === waiting) waiting = null;
    busy = true;
    void settle(job, call(...job.args)).finally(() => {
      busy = false;
      pump();
    });
  };
  const preempting = async (args: A): Promise<T | null> => {
    const mine = ++stamp;
    if (running) {
      running = 0;
      await policy.preempt?.();
    }
    await policy.ready?.();
    if (mine !== stamp) return null;
    running = mine;
    try {
      const value = await call(...args);
      return mine === stamp ? value : null;
    } catch (e) {
      if (mine !== stamp) return null;
      if (policy.failed) return policy.failed(e, ...args);
      throw e;
    } finally {
      if (running === mine) running = 0;
    }
  };
  return {
    latest(...args) {
      if (mode === 'preempt') return preempting(args);
      if (mode === 'parallel') {
        stamp++;
        return stamped.call(...args).then((d) => (d.stale ? null : d.value));
      }
      const s = ++stamp;
      waiting?.resolve(null);
      return new Promise<T | null>((resolve, reject) => {
        waiting = { stamp: s, args, droppable: true, resolve, reject };
        pump();
      });
    },
    must(...args) {
      return new Promise<T>((resolve, reject) => {
        musts.push({ stamp, args, droppable: false, resolve: (r) => resolve(r as T), reject });
        pump();
      });
    },
    supersede() {
      stamp++;
      stamped.invalidate();
      waiting?.resolve(null);
      waiting = null;
    },
    busy: () => busy || running !== 0,
    get stamp() {
      return stamp;
    },
  };
}

/** A map that keeps the `size` entries used last (a read counts as a use); `evicted` hears of each one dropped. */
export function lru<K, V>(size: number, evicted?: (key: K, value: V) => void) {
  const m = new Map<K, V>();
  return {
    get(key: K): V | undefined {
      const v = m.get(key);
      if (v !== undefined) {
        m.delete(key);
        m.set(key, v);
      }
      return v;
    },
    has: (key: K) => m.has(key),
    set(key: K, value: V) {
      m.delete(key);
      m.set(key, value);
      while (m.size > size) {
        const [k, v] = m.entries().next().value!;
        m.delete(k);
        evicted?.(k, v);
      }
    },
    delete: (key: K) => m.delete(key),
    clear: () => m.clear(),
    get size() {
      return m.size;
    },
  };
}
