/** The data worker: a thin comlink surface over the Data pane's import and fits. */
import { expose } from 'comlink';
import { localData } from './dataApi';

expose(localData);
