/** Ask the numeric worker a question whenever its inputs change; only the latest answer is kept. */
import { useEffect, useState } from 'react';
import { appNumericClient, type NumericClient } from '../../worker/numericClient';
import type { Failed } from '../../worker/numericApi';

export type Asked<T> = { status: 'idle' } | { status: 'running' } | { status: 'done'; answer: T | Failed };

/**
 * `useNumeric(c => c.ask('sampled', model, 6), [model])`: the question runs
 * when a dependency changes; a stale answer (a newer question was asked) is
 * never shown. `ask` returning null means "nothing to ask".
 */
export function useNumeric<T>(ask: ((c: NumericClient) => Promise<T | Failed | null>) | null, deps: unknown[]): Asked<T> {
  const [state, setState] = useState<Asked<T>>({ status: 'idle' });
  useEffect(() => {
    if (!ask) { setState({ status: 'idle' }); return; }
    let live = true;
    setState((s) => (s.status === 'done' ? s : { status: 'running' }));
    void appNumericClient()
      .then((c) => ask(c))
      .then(
        (a) => { if (live && a !== null) setState({ status: 'done', answer: a }); },
        (e: unknown) => { if (live) setState({ status: 'done', answer: { ok: false, reason: (e as Error).message } }); },
      );
    return () => { live = false; };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, deps);
  return state;
}

export function isFailed<T>(a: T | Failed): a is Failed {
  return (a as { ok: unknown }).ok === false && typeof (a as Failed).reason === 'string';
}
