import { describe, expect, it } from 'vitest';
import { createDocumentStore, selectCanRedo, selectCanUndo, selectDirty, selectModel } from '../../src/state/document';
import { HISTORY_LIMIT } from '../../src/state/history';
import { emptyModel } from '../../src/state/changes';

// Expected behaviour is common practice for editors: each edit one step, redo cleared by a new edit,
// one gesture (typing in a field, one drag) one step.
describe('undo and redo', () => {
  it('undoes and redoes 200 separate edits exactly', () => {
    const doc = createDocumentStore(emptyModel());
    const snapshots = [JSON.stringify(selectModel(doc.getState()))];
    for (let i = 0; i < 200; i++) {
      doc.getState().apply({ type: 'addVariable', variable: { id: `v${i}`, kind: 'derived', position: { x: i, y: 0 } } });
      snapshots.push(JSON.stringify(selectModel(doc.getState())));
    }
    expect(selectModel(doc.getState()).variables).toHaveLength(200);
    for (let i = 199; i >= 0; i--) {
      doc.getState().undo();
      expect(JSON.stringify(selectModel(doc.getState()))).toBe(snapshots[i]);
    }
    expect(selectCanUndo(doc.getState())).toBe(false);
    for (let i = 1; i <= 200; i++) {
      doc.getState().redo();
      expect(JSON.stringify(selectModel(doc.getState()))).toBe(snapshots[i]);
    }
    expect(selectCanRedo(doc.getState())).toBe(false);
  });

  it('keeps at most HISTORY_LIMIT steps, dropping the oldest', () => {
    const doc = createDocumentStore(emptyModel());
    for (let i = 0; i < HISTORY_LIMIT + 30; i++) doc.getState().apply({ type: 'addVariable', variable: { id: `v${i}`, kind: 'input' } });
    let n = 0;
    while (selectCanUndo(doc.getState())) {
      doc.getState().undo();
      n++;
    }
    expect(n).toBe(HISTORY_LIMIT);
    expect(selectModel(doc.getState()).variables).toHaveLength(30);
  });

  it('squashes one gesture into one step, and a history stop splits gestures', () => {
    const doc = createDocumentStore(emptyModel());
    doc.getState().apply({ type: 'addVariable', variable: { id: 'x', kind: 'derived' } });
    for (const t of ['a', 'a*', 'a*2']) doc.getState().apply({ type: 'updateVariable', id: 'x', patch: { formula: t } }, { squash: 'x:formula' });
    doc.getState().stopGesture();
    doc.getState().apply({ type: 'updateVariable', id: 'x', patch: { formula: 'a*3' } }, { squash: 'x:formula' });
    expect(selectModel(doc.getState()).variables[0].formula).toBe('a*3');
    doc.getState().undo();
    expect(selectModel(doc.getState()).variables[0].formula).toBe('a*2');
    doc.getState().undo();
    expect(selectModel(doc.getState()).variables[0].formula).toBeUndefined();
  });

  it('a new edit clears redo; an edit that changes nothing is not a step', () => {
    const doc = createDocumentStore(emptyModel());
    doc.getState().apply({ type: 'addVariable', variable: { id: 'x', kind: 'derived' } });
    doc.getState().undo();
    expect(selectCanRedo(doc.getState())).toBe(true);
    doc.getState().apply({ type: 'addVariable', variable: { id: 'y', kind: 'derived' } });
    expect(selectCanRedo(doc.getState())).toBe(false);
    const before = doc.getState().history;
    doc.getState().apply({ type: 'remove', variables: ['nothing'] });
    expect(doc.getState().history).toBe(before);
  });

  it('dirty compares with the model as saved, so undoing back to it is clean', () => {
    const doc = createDocumentStore(emptyModel());
    expect(selectDirty(doc.getState())).toBe(false);
    doc.getState().apply({ type: 'setMeta', patch: { name: 'changed' } });
    expect(selectDirty(doc.getState())).toBe(true);
    doc.getState().undo();
    expect(selectDirty(doc.getState())).toBe(false);
    doc.getState().redo();
    doc.getState().markSaved('m.loopfold.json');
    expect(selectDirty(doc.getState())).toBe(false);
    expect(doc.getState().fileName).toBe('m.loopfold.json');
  });
});
