/** The core worker: a thin comlink surface over analyzeModel and the band host (bands.ts). */
import { expose } from 'comlink';
import { localCore } from './analyze';
import { createBandHost } from './bands';

expose({ ...localCore, ...createBandHost({ prefetch: true }) });
