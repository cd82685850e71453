import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { boxesClash, freeSpot, type Box } from '../../src/ui/canvas/geometry';
import { addVariable, addRelation, canvasBoxes } from '../../src/ui/actions';
import { documentStore, selectModel } from '../../src/state/document';
import { EXAMPLES } from '../../src/examples/index';
import { parseModel } from '../../src/core/model/schema';

// Placement of new items: an editor puts a new item where it is asked for, or as near as
// it can without covering what is there (common practice for diagram editors).
describe('where a new item goes', () => {
  const box = fc.record({ x: fc.integer({ min: -400, max: 400 }), y: fc.integer({ min: -300, max: 300 }), w: fc.integer({ min: 20, max: 280 }), h: fc.integer({ min: 20, max: 60 }) });

  it('keeps the asked-for place when it is free', () => {
    const taken: Box[] = [{ x: 0, y: 0, w: 100, h: 40 }];
    expect(freeSpot(taken, { x: 300, y: 0 }, 120, 46)).toEqual({ x: 300, y: 0 });
  });

  it('never covers an existing box when there is room within its rings, and stays near', () => {
    fc.assert(
      fc.property(fc.array(box, { maxLength: 25 }), fc.record({ x: fc.integer({ min: -200, max: 200 }), y: fc.integer({ min: -200, max: 200 }) }), (taken, want) => {
        const p = freeSpot(taken, want, 120, 46, 16, 24, 40);
        const placed = { x: p.x, y: p.y, w: 120, h: 46 };
        // 25 boxes of at most 280 × 60 cannot fill 40 rings of 24 px around the point
        for (const b of taken) expect(boxesClash(placed, b, 16)).toBe(false);
        // no free grid point lies on a nearer ring than the one chosen
        const ring = Math.max(Math.abs(p.x - want.x), Math.abs(p.y - want.y)) / 24;
        expect(Number.isInteger(ring)).toBe(true);
        for (let r = 0; r < ring; r++) {
          for (let i = -r; i <= r; i++) {
            for (const [dx, dy] of [[i, -r], [i, r], [-r, i], [r, i]]) {
              const c = { x: want.x + dx * 24, y: want.y + dy * 24, w: 120, h: 46 };
              expect(taken.some((b) => boxesClash(c, b, 16))).toBe(true);
            }
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('gives the asked-for place back on a canvas with no room nearby', () => {
    const wall: Box[] = [{ x: -5000, y: -5000, w: 10000, h: 10000 }];
    expect(freeSpot(wall, { x: 10, y: 20 }, 120, 46)).toEqual({ x: 10, y: 20 });
  });

  it('a variable added at the view centre of an example, or several in a row, covers nothing', () => {
    const ex = EXAMPLES.find((e) => e.id === 'sleep-stress')!;
    const parsed = parseModel(ex.model);
    if (!parsed.ok) throw new Error('example does not parse');
    documentStore.getState().load(parsed.model);
    const m0 = selectModel(documentStore.getState());
    // the middle of the drawing, where the example has a variable
    const boxes0 = canvasBoxes(m0);
    const mid = { x: boxes0[3].x + boxes0[3].w / 2, y: boxes0[3].y + 23 };
    for (let k = 0; k < 4; k++) addVariable('derived', mid);
    addRelation(mid);
    const boxes = canvasBoxes(selectModel(documentStore.getState()));
    expect(boxes).toHaveLength(boxes0.length + 5);
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) if (i >= boxes0.length || j >= boxes0.length) expect(boxesClash(boxes[i], boxes[j])).toBe(false);
  });
});
