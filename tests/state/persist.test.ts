import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { createStore, loadSnapshot, saveSnapshot, clearSnapshot } from '../../src/state/persist';
import { EXAMPLES } from '../../src/examples/index';
import { parseModel } from '../../src/core/model/schema';
import { withLinkIds } from '../../src/state/changes';
import { set } from 'idb-keyval';

const example = () => {
  const r = parseModel(EXAMPLES[0].model);
  if (!r.ok) throw new Error('example does not parse');
  return withLinkIds(r.model);
};

// fake-indexeddb implements the W3C IndexedDB API in Node; the round trip must restore the model exactly.
describe('autosave to IndexedDB', () => {
  it('restores the last saved state exactly', async () => {
    const store = createStore('t1', 'autosave');
    const model = example();
    await saveSnapshot({ model, fileName: 'sleep.loopfold.json', dirty: true }, store);
    const snap = await loadSnapshot(store);
    expect(snap).not.toBeNull();
    expect(snap!.model).toEqual(model);
    expect(snap!.fileName).toBe('sleep.loopfold.json');
    expect(snap!.dirty).toBe(true);
  });

  it('a later save replaces the earlier one; clearing leaves nothing', async () => {
    const store = createStore('t2', 'autosave');
    const model = example();
    await saveSnapshot({ model, dirty: false }, store);
    const renamed = { ...model, name: 'second' };
    await saveSnapshot({ model: renamed, dirty: false }, store);
    expect((await loadSnapshot(store))!.model.name).toBe('second');
    await clearSnapshot(store);
    expect(await loadSnapshot(store)).toBeNull();
  });

  it('ignores a stored snapshot that no longer validates or has another version', async () => {
    const store = createStore('t3', 'autosave');
    await set('current', { version: 1, model: { format: 'loopfold-model', version: 1, name: 'x', timeUnit: 'fortnight', variables: [], links: [] }, dirty: false, savedAt: 1 }, store);
    expect(await loadSnapshot(store)).toBeNull();
    await set('current', { version: 99, model: example(), dirty: false, savedAt: 1 }, store);
    expect(await loadSnapshot(store)).toBeNull();
  });
});
