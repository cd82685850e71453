// One part of the power benchmark's replications, in a worker thread (as the app splits a run over web workers).
import { parentPort, workerData } from 'node:worker_threads';
import { runReplications } from '../src/core/rehearse/montecarlo';
import { benchSetup } from './power';

const { from, to } = workerData as { from: number; to: number };
const t0 = performance.now();
const tally = runReplications(benchSetup(), from, to);
parentPort!.postMessage({ tally, ms: performance.now() - t0 });
