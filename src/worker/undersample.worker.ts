/** The integer-step mode's inverse search off the main thread: a thin comlink surface; one job per worker (Cancel ends it). */
import { expose } from 'comlink';
import { localUndersample } from './undersampleApi';

expose(localUndersample);
