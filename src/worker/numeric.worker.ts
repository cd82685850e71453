/** The numeric worker: a thin comlink surface over the Numbers pane's numeric questions. */
import { expose } from 'comlink';
import { localNumeric } from './numericApi';

expose(localNumeric);
