import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { createStore, set } from 'idb-keyval';
import { clearDataset, loadDataset, saveDataset } from '../../src/state/dataset';
import { importText, type ColumnMapping } from '../../src/core/data/import';

const CSV = 'pid,hours,stress\na,0,1\na,3,NA\nb,0,2\nb,3,4\n';
const mapping: ColumnMapping = { format: 'long', person: 'pid', time: 'hours', timeFormat: 'number', timeUnit: 'h', variables: [{ column: 'stress', variable: 'stress' }] };

// fake-indexeddb implements the W3C IndexedDB API in Node: the round trip must give back the panel's typed arrays exactly (structured clone).
describe('the data set kept in this browser', () => {
  it('restores the text, the mapping and the imported panel exactly', async () => {
    const store = createStore('d1', 'datasets');
    const result = importText(CSV, mapping);
    await saveDataset({ fileName: 'diary.csv', text: CSV, mapping, result, modelName: 'Sleep', importedAt: 1 }, store);
    const back = await loadDataset(store);
    expect(back).not.toBeNull();
    expect(back!.result.panel!.persons[0].time).toBeInstanceOf(Float64Array);
    expect(back!.result).toEqual(result);
    expect(Number.isNaN(back!.result.panel!.persons[0].values[1])).toBe(true);
    expect(back!.text).toBe(CSV);
    await clearDataset(store);
    expect(await loadDataset(store)).toBeNull();
  });

  it('keeps the file itself (a Blob, as the pane hands it to the worker) and gives it back whole', async () => {
    const store = createStore('d3', 'datasets');
    const result = importText(CSV, mapping);
    await saveDataset({ fileName: 'diary.csv', text: new Blob([CSV], { type: 'text/csv' }), mapping, result, modelName: 'Sleep', importedAt: 2 }, store);
    const back = await loadDataset(store);
    expect(back!.text).toBeInstanceOf(Blob);
    expect(await (back!.text as Blob).text()).toBe(CSV);
  });

  it('another version or a broken record is not read back', async () => {
    const store = createStore('d2', 'datasets');
    await set('current', { version: 99, text: CSV }, store);
    expect(await loadDataset(store)).toBeNull();
    await set('current', { version: 1, text: 3 }, store);
    expect(await loadDataset(store)).toBeNull();
  });

});
