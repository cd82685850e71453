import { releaseProxy, wrap } from 'comlink';
/**
 * Calls to a module worker that can fail: a worker that does not load fires
 * "error" instead of throwing, so every pending call is rejected (and every
 * later one at once), which lets a client fall back to the main thread.
 */
export interface GuardedWorker {
  /** Run one remote call; it rejects when the worker fails before or while it runs. */
  call<T>(f: () => Promise<T>): Promise<T>;
  /** Reject everything pending and everything later with this message. */
  fail(message: string): void;
}

export function guardWorker(worker: Worker, name: string): GuardedWorker {
  let failure: Error | null = null;
  const pending = new Set<(e: Error) => void>();
  const fail = (message: string) => {
    failure = new Error(message);
    for (const reject of pending) reject(failure);
    pending.clear();
  };
  worker.addEventListener('error', (ev) => fail(ev.message || `the ${name} could not start`));
  worker.addEventListener('messageerror', () => fail(`the ${name} sent a message that could not be read`));
  return {
    fail,
    call<T>(f: () => Promise<T>): Promise<T> {
      if (failure) return Promise.reject(failure);
      return new Promise<T>((resolve, reject) => {
        pending.add(reject);
        f().then(resolve, reject).finally(() => pending.delete(reject));
      });
    },
  };
}

/** A module worker wrapped with comlink and guarded. */
export interface StartedWorker<Api> {
  /** The worker's API. Its answers are plain data. */
  remote: Api;
  /** Run one remote call, guarded (see GuardedWorker). */
  call: GuardedWorker['call'];
  /** Stop the worker (once): whatever is pending is rejected. */
  dispose(): void;
}

/**
 * Start a module worker: `make` constructs it (written out at the call site,
 * `new Worker(new URL('./x.worker.ts', import.meta.url), { type: 'module' })`,
 * so that the bundler finds and bundles the worker). Throws where the browser
 * has no workers, which the clients take as "use the main thread".
 */
export function startWorker<Api>(make: () => Worker, name: string): StartedWorker<Api> {
  if (typeof Worker === 'undefined') throw new Error('this browser has no Web Workers');
  const worker = make();
  const guard = guardWorker(worker, name);
  const wrapped = wrap<Api>(worker);
  let disposed = false;
  return {
    // comlink's Remote<T> widens the answers to a union TypeScript cannot narrow back; the answers are plain data.
    remote: wrapped as unknown as Api,
    call: guard.call,
    dispose() {
      if (disposed) return;
      disposed = true;
      guard.fail(`the ${name} was stopped`);
      wrapped[releaseProxy]();
      worker.terminate();
    },
  };
}
