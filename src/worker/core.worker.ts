/** The core worker: a thin comlink surface over analyzeModel. */
import { expose } from 'comlink';
import { localCore } from './analyze';

expose(localCore);
