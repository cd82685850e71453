/** The rehearsal of a study off the main thread: a thin comlink surface; one Monte Carlo part per worker (Cancel ends it). */
import { expose } from 'comlink';
import { localRehearse } from './rehearseApi';

expose(localRehearse);
