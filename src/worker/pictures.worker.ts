/** The pictures worker: a thin comlink surface over the pictures pane's questions. */
import { expose } from 'comlink';
import { localPictures } from './picturesApi';

expose(localPictures);
