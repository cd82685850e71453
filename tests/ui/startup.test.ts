// @vitest-environment happy-dom
import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { openInitialDocument } from '../../src/ui/startup';
import { documentStore, selectModel } from '../../src/state/document';
import { shareFragment } from '../../src/state/files';
import { saveSnapshot } from '../../src/state/persist';
import { uiStore } from '../../src/state/ui';
import { emptyModel, withLinkIds } from '../../src/state/changes';

const shop = withLinkIds({ ...emptyModel('Shop'), timeUnit: 'day', variables: [{ id: 'stock', kind: 'state', timescale: 3 }, { id: 'orders', kind: 'input' }], links: [{ from: 'orders', to: 'stock', kind: 'integrating' }] });

// Start-up order (common practice for documents in the URL): link, then example, then the autosave.
describe('what the editor opens with', () => {
  it('a share link wins over the autosave and is removed from the address afterwards', async () => {
    await saveSnapshot({ model: { ...emptyModel('Autosaved') }, dirty: false });
    history.replaceState(null, '', `/${shareFragment(shop)}`);
    await openInitialDocument();
    expect(selectModel(documentStore.getState())).toEqual(shop);
    expect(location.hash).toBe('');
  });

  it('?example=ID opens the example; an unknown id says which ones exist and falls back to the autosave', async () => {
    history.replaceState(null, '', '/?example=sleep-stress');
    await openInitialDocument();
    expect(selectModel(documentStore.getState()).caution).toMatch(/no clinical advice/);
    expect(location.search).toBe('');

    await saveSnapshot({ model: shop, fileName: 'shop.loopfold.json', dirty: true });
    history.replaceState(null, '', '/?example=nothing-like-this');
    await openInitialDocument();
    expect(uiStore.getState().notice?.lines[0]).toMatch(/^Known examples: .*sleep-stress/);
    expect(selectModel(documentStore.getState())).toEqual(shop);
    expect(documentStore.getState().fileName).toBe('shop.loopfold.json');
    uiStore.getState().set({ notice: null });
  });

  it('a damaged link is reported and the autosave is restored instead', async () => {
    await saveSnapshot({ model: shop, dirty: false });
    history.replaceState(null, '', '/#m=garbage');
    await openInitialDocument();
    expect(uiStore.getState().notice?.title).toMatch(/share link could not be opened/i);
    expect(selectModel(documentStore.getState())).toEqual(shop);
  });
});
