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
