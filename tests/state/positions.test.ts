import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { applyChange, emptyModel, withLinkIds } from '../../src/state/changes';
import { movedValidation, onlyPositionsDiffer } from '../../src/state/positions';
import { validateModel } from '../../src/state/validate';
import { createDocumentStore, selectModel, validationOf } from '../../src/state/document';
import type { Model } from '../../src/core/model/types';

const model: Model = withLinkIds({
  ...emptyModel(),
  variables: [
    { id: 'a', kind: 'input', value: 1, position: { x: 0, y: 0 } },
    { id: 'b', kind: 'state', timescale: 2, rate: 'a - b', position: { x: 200, y: 0 } },
    { id: 'c', kind: 'derived', formula: 'a + ', position: { x: 400, y: 0 } },
    { id: 'd', kind: 'derived' },
  ],
  links: [{ from: 'a', to: 'b', kind: 'integrating' }],
  relations: [{ id: 'r', equation: 'a * b = c', position: { x: 100, y: 100 } }],
});

describe('edits that only move things', () => {
  it('tells a move (and its undo) from edits that change the equations or the file', () => {
    const moved = applyChange(model, { type: 'move', positions: { b: { x: 10, y: 20 }, r: { x: 5, y: 5 }, d: { x: 1, y: 1 } } });
    expect(moved).not.toBe(model);
    expect(onlyPositionsDiffer(model, moved)).toBe(true);
    expect(onlyPositionsDiffer(moved, model)).toBe(true);
    expect(onlyPositionsDiffer(model, applyChange(model, { type: 'updateVariable', id: 'b', patch: { label: 'Level' } }))).toBe(false);
    expect(onlyPositionsDiffer(model, applyChange(model, { type: 'updateVariable', id: 'c', patch: { formula: 'a + 1' } }))).toBe(false);
    expect(onlyPositionsDiffer(model, applyChange(model, { type: 'setMeta', patch: { name: 'other' } }))).toBe(false);
    expect(onlyPositionsDiffer(model, applyChange(model, { type: 'addVariable', variable: { id: 'e', kind: 'input' } }))).toBe(false);
    // the same content rebuilt (a file opened again) is not a move of this model
    expect(onlyPositionsDiffer(model, JSON.parse(JSON.stringify(model)) as Model)).toBe(false);
  });

  it('carries the checks over a move exactly as a full check would find them', () => {
    const ids = ['a', 'b', 'c', 'd', 'r'];
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.constantFrom(...ids), fc.integer({ min: -5000, max: 5000 }), fc.integer({ min: -5000, max: 5000 })), { minLength: 1, maxLength: 6 }), (moves) => {
        const next = applyChange(model, { type: 'move', positions: Object.fromEntries(moves.map(([id, x, y]) => [id, { x, y }])) });
        const carried = movedValidation(model, validateModel(model), next);
        // the same, down to the order of the fields (files and links are written from it)
        expect(JSON.stringify(carried)).toBe(JSON.stringify(validateModel(next)));
      }),
    );
    // a valid model too: its validated copy takes the new positions
    const valid = applyChange(model, { type: 'updateVariable', id: 'c', patch: { formula: 'a + 1' } });
    const next = applyChange(valid, { type: 'move', positions: { c: { x: -7, y: 9 } } });
    const carried = movedValidation(valid, validateModel(valid), next)!;
    expect(carried.model).not.toBeNull();
    expect(carried.model!.variables[2].position).toEqual({ x: -7, y: 9 });
    expect(JSON.stringify(carried)).toBe(JSON.stringify(validateModel(next)));
    // a variable drawn for the first time
    const placed = applyChange(valid, { type: 'move', positions: { d: { x: 3, y: 4 } } });
    expect(JSON.stringify(movedValidation(valid, validateModel(valid), placed))).toBe(JSON.stringify(validateModel(placed)));
  });

  it('leaves checks that concern a position to a full check', () => {
    const checked = validateModel(model);
    const withIssue = { ...checked, issues: [{ path: 'variables[1].position.x', message: 'must be a finite number' }] };
    expect(movedValidation(model, withIssue, applyChange(model, { type: 'move', positions: { b: { x: 1, y: 1 } } }))).toBeNull();
  });

  it('checks a dragged model once, when the drag ends, without parsing it again', () => {
    const doc = createDocumentStore(model);
    const before = validationOf(selectModel(doc.getState()));
    doc.getState().apply({ type: 'move', positions: { b: { x: 300, y: 40 } } }, { squash: 'move:b' });
    const after = validationOf(selectModel(doc.getState()));
    // same problems (the same objects: nothing was parsed again), the validated model moved
    expect(after.problems).toBe(before.problems);
    expect(after.issues).toBe(before.issues);
    expect(after).toEqual(validateModel(selectModel(doc.getState())));
  });
});
