import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EXAMPLES } from '../../../src/examples';
import { parseModel } from '../../../src/core/model/schema';
import { FIT_MARGIN, MIN_FIT_ZOOM, fitViewport, reservedSides, viewScore, type Box } from '../../../src/ui/canvas/fit';

// The canvas pane at 1024 × 768 and 1440 × 900 (measured in e2e/canvasOverlays.spec.ts), with the
// overlays as they sit there: the notation key across the top (open) or its button, the zoom
// buttons bottom left, the overview map bottom right, the measured-graph toggle bottom centre.
const PANES = [
  { name: '1024×768, key open', pane: { width: 593, height: 555 }, overlays: [{ x: 8, y: 8, width: 577, height: 102 }, { x: 15, y: 461, width: 30, height: 86 }, { x: 428, y: 442, width: 150, height: 96 }, { x: 187, y: 516, width: 219, height: 22 }] },
  { name: '1024×768, key folded', pane: { width: 593, height: 555 }, overlays: [{ x: 8, y: 8, width: 86, height: 24 }, { x: 15, y: 461, width: 30, height: 86 }, { x: 428, y: 442, width: 150, height: 96 }, { x: 187, y: 516, width: 219, height: 22 }] },
  { name: '1440×900', pane: { width: 1010, height: 670 }, overlays: [{ x: 8, y: 8, width: 994, height: 64 }, { x: 15, y: 576, width: 30, height: 86 }, { x: 844, y: 566, width: 150, height: 96 }, { x: 395, y: 640, width: 219, height: 22 }] },
];

/** Node boxes of an example: its stored positions, each variable a 160 × 46 box (the widest drawn), each relation 24 × 24. */
function boxesOf(json: unknown): Box[] {
  const r = parseModel(json);
  if (!r.ok) throw new Error('example does not parse');
  const out: Box[] = [];
  for (const v of r.model.variables) out.push({ x: v.position?.x ?? 0, y: v.position?.y ?? 0, width: 160, height: 46 });
  for (const q of r.model.relations ?? []) out.push({ x: q.position?.x ?? 0, y: q.position?.y ?? 0, width: 24, height: 24 });
  return out;
}

describe('Fit keeps every node clear of the canvas overlays', () => {
  it('charges each overlay to the side of the pane where it costs least', () => {
    const s = reservedSides({ width: 600, height: 500 }, [{ x: 8, y: 8, width: 580, height: 100 }, { x: 10, y: 400, width: 30, height: 90 }]);
    // the key spans the width: it costs its depth from the top; the narrow button column costs its depth from the left
    expect(s).toEqual({ top: 108, bottom: 0, left: 40, right: 0 });
  });

  for (const { name, pane, overlays } of PANES) {
    it(`no overlay covers a node of any example (${name})`, () => {
      for (const ex of EXAMPLES) {
        const nodes = boxesOf(ex.model);
        const vp = fitViewport(nodes, pane, overlays);
        expect({ id: ex.id, covered: viewScore(nodes, overlays, pane, vp).covered }).toEqual({ id: ex.id, covered: 0 });
        expect(vp.zoom).toBeGreaterThanOrEqual(MIN_FIT_ZOOM);
      }
    });
  }

  it('a drawing that fits is centred in the free space, wholly inside it', () => {
    const pane = { width: 800, height: 600 };
    const overlays = [{ x: 8, y: 8, width: 784, height: 60 }];
    const nodes = [{ x: 0, y: 0, width: 100, height: 40 }, { x: 300, y: 200, width: 100, height: 40 }];
    const vp = fitViewport(nodes, pane, overlays);
    const top = nodes[0].y * vp.zoom + vp.y;
    expect(top).toBeGreaterThanOrEqual(68 + FIT_MARGIN - 1e-9);
    expect(viewScore(nodes, overlays, pane, vp)).toEqual({ covered: 0, cut: 0 });
  });

  it('random drawings at the legibility floor: no node covered whenever some shift of the view allows it', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ x: fc.integer({ min: 0, max: 700 }), y: fc.integer({ min: 0, max: 500 }) }), { minLength: 1, maxLength: 12 }), (pts) => {
        const { pane, overlays } = PANES[1];
        const nodes = pts.map((p) => ({ ...p, width: 140, height: 46 }));
        const vp = fitViewport(nodes, pane, overlays);
        // a shift that clears every overlay exists when the drawing fits in the pane below the key's button
        const w = Math.max(...nodes.map((b) => b.x + b.width)) - Math.min(...nodes.map((b) => b.x));
        const h = Math.max(...nodes.map((b) => b.y + b.height)) - Math.min(...nodes.map((b) => b.y));
        if (w * vp.zoom <= pane.width - 2 * FIT_MARGIN && h * vp.zoom <= 442 - 32 - 2 * FIT_MARGIN) expect(viewScore(nodes, overlays, pane, vp).covered).toBe(0);
      }),
      { numRuns: 60, seed: 25 },
    );
  });
});
