/** The integer-step mode's inverse search off the main thread: one job per worker; Cancel ends the worker. */
import { inverseJob, type InverseRequest } from './undersampleApi';

self.onmessage = (ev: MessageEvent<InverseRequest>) => {
  const answer = inverseJob(ev.data, (p) => self.postMessage({ type: 'progress', progress: p }));
  self.postMessage({ type: 'done', answer });
};
