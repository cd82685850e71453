/** The data worker: a thin comlink surface over the Data pane's import and fits; imports go back by transfer, not copy. */
import { expose, transfer } from 'comlink';
import { localData, panelBuffers, type DataApi } from './dataApi';

const api: DataApi = {
  ...localData,
  async importData(text, mapping, delimiter) {
    const r = await localData.importData(text, mapping, delimiter);
    return transfer(r, panelBuffers(r));
  },
  async importBlob(blob, mapping, delimiter) {
    const r = await localData.importBlob(blob, mapping, delimiter);
    return transfer(r, panelBuffers(r));
  },
};

expose(api);
