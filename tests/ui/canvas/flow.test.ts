import { describe, expect, it } from 'vitest';
import type { NodeChange } from '@xyflow/react';
import { buildNodes, canvasLines, settledMove, type FlowNode } from '../../../src/ui/canvas/flow';
import { dashScaleAt, scaledDash } from '../../../src/ui/canvas/zoomDetail';
import { drawnBetween, signPath } from '../../../src/ui/canvas/CanvasDrawing';
import { createDocumentStore, selectModel } from '../../../src/state/document';
import { boxExit, headPath, linkPath } from '../../../src/ui/canvas/geometry';
import { collectProblems, badgesOf, nodeOfEquation } from '../../../src/ui/diagnostics/collect';
import { equationId } from '../../../src/core/ordering/types';
import { applyChange, emptyModel, withLinkIds } from '../../../src/state/changes';
import { validateModel } from '../../../src/state/validate';
import type { Model } from '../../../src/core/model/types';
import { decimals, expectClose } from '../../helpers/tolerance';

const model: Model = withLinkIds({
  ...emptyModel(),
  variables: [
    { id: 'a', kind: 'input', position: { x: 0, y: 0 } },
    { id: 'b', kind: 'state', timescale: 1, position: { x: 200, y: 0 } },
    { id: 'c', kind: 'derived', formula: 'a +', position: { x: 400, y: 0 } },
  ],
  links: [{ from: 'a', to: 'b', kind: 'integrating' }],
  relations: [{ id: 'r', equation: 'a * b = c', position: { x: 100, y: 100 } }],
});
const none = { errors: new Map<string, number>(), warnings: new Map<string, number>() };

describe('canvas nodes from the model', () => {
  it('keeps the node object (and its measured size) of every variable an edit did not touch', () => {
    const first = buildNodes(model, undefined, none, new Set(), []).map((n) => ({ ...n, measured: { width: 120, height: 46 } })) as FlowNode[];
    const edited = applyChange(model, { type: 'updateVariable', id: 'b', patch: { label: 'Level' } });
    const second = buildNodes(edited, undefined, none, new Set(), first);
    expect(second[0]).toBe(first[0]);
    expect(second[2]).toBe(first[2]);
    expect(second[1]).not.toBe(first[1]);
    expect(second[1].measured).toEqual({ width: 120, height: 46 });
    expect(second[1].ariaLabel).toBe('Level: state');
  });

  it('joins a relation to each of its variables with an undirected member line, and names both ends of a link', () => {
    const lines = canvasLines(model);
    expect(lines.links.map((l) => l.label)).toEqual(['link from a to b: integrating']);
    expect(lines.members.map((m) => m.variable).sort()).toEqual(['a', 'b', 'c']);
    expect(new Set(lines.members.map((m) => m.relation))).toEqual(new Set(['r']));
    // a name in the equation that is not a variable joins nothing
    const other = applyChange(model, { type: 'updateRelation', id: 'r', patch: { equation: 'a * k = c' } });
    expect(canvasLines(other).members.map((m) => m.variable).sort()).toEqual(['a', 'c']);
    const labelled = applyChange(model, { type: 'updateVariable', id: 'b', patch: { label: 'Level' } });
    expect(canvasLines(labelled).links[0].label).toBe('link from a to Level: integrating');
  });
});

describe('arrowheads drawn as paths', () => {
  const points = (d: string) => [...d.matchAll(/(-?[\d.]+),(-?[\d.]+)/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]) }));
  it('puts the tip where the line meets the target, the base `length` back along the line, `half` to each side', () => {
    // a line arriving from the left at (100, 50)
    expect(points(headPath({ x: 100, y: 50 }, { x: 0, y: 50 }, 10, 5))).toEqual([{ x: 90, y: 55 }, { x: 100, y: 50 }, { x: 90, y: 45 }]);
    // arriving from above, on a curve: the head follows the direction from the control point
    const a = linkPath({ x: 0, y: 0, w: 100, h: 40 }, { x: 300, y: 200, w: 100, h: 40 });
    const [p, tip, q] = points(headPath(a.tip, a.control, 11, 5.5));
    expect(tip).toEqual({ x: Math.round(a.tip.x * 100) / 100, y: Math.round(a.tip.y * 100) / 100 });
    const mid = { x: (p.x + q.x) / 2, y: (p.y + q.y) / 2 };
    expectClose(Math.hypot(tip.x - mid.x, tip.y - mid.y), 11, decimals(1));
    expectClose(Math.hypot(p.x - q.x, p.y - q.y), 11, decimals(1));
    // the base is square to the line from the control point to the tip
    const ux = a.tip.x - a.control.x, uy = a.tip.y - a.control.y;
    expect(Math.abs((p.x - q.x) * ux + (p.y - q.y) * uy) / Math.hypot(ux, uy)).toBeLessThan(0.05);
  });
});

describe('the link layer during a drag', () => {
  it('recomputes the path of a line only when one of its two boxes moved or resized', () => {
    const cache = new Map<string, ReturnType<typeof drawnBetween>>();
    let calls = 0;
    const draw = (a: { x: number; y: number; w: number; h: number }, b: { x: number; y: number; w: number; h: number }) => {
      calls++;
      return linkPath(a, b);
    };
    const a = { x: 0, y: 0, w: 120, h: 46 };
    const b = { x: 300, y: 40, w: 120, h: 46 };
    const first = drawnBetween(cache, 'l1', a, b, draw);
    // equal boxes in new objects, as the layer builds them on every pointer move
    const again = drawnBetween(cache, 'l1', { ...a }, { ...b }, draw);
    expect(again).toBe(first);
    expect(calls).toBe(1);
    const moved = drawnBetween(cache, 'l1', a, { ...b, x: 310 }, draw);
    expect(calls).toBe(2);
    expect(moved.d).not.toBe(first.d);
    expect(moved.d).toBe(linkPath(a, { ...b, x: 310 }).path);
    drawnBetween(cache, 'l1', a, { ...b, x: 310, h: 60 }, draw);
    expect(calls).toBe(3);
  });
});

describe('dragging a variable', () => {
  // Common practice for editors: one drag, one undo step; the canvas reports every pointer move.
  it('edits the document once, when the drag ends: one undo step, the final position', () => {
    const doc = createDocumentStore(model);
    const stream: NodeChange[][] = [];
    for (let i = 1; i <= 40; i++) stream.push([{ type: 'position', id: 'b', position: { x: 200 + 3 * i, y: 2 * i }, dragging: true }]);
    stream.push([{ type: 'position', id: 'b', position: { x: 320.4, y: 80.6 }, dragging: false }]);
    let edits = 0;
    for (const changes of stream) {
      const move = settledMove(changes);
      if (!move) continue;
      edits++;
      doc.getState().apply(move.change, { squash: move.squash });
    }
    expect(edits).toBe(1);
    expect(doc.getState().history.past).toHaveLength(1);
    expect(selectModel(doc.getState()).variables[1].position).toEqual({ x: 320, y: 81 });
    doc.getState().undo();
    expect(selectModel(doc.getState())).toBe(model);
  });

  it('ignores selection and size changes, and an arrow-key step is an edit', () => {
    expect(settledMove([{ type: 'select', id: 'b', selected: true }, { type: 'dimensions', id: 'b', dimensions: { width: 120, height: 46 } }])).toBeNull();
    expect(settledMove([{ type: 'position', id: 'a', position: { x: 5, y: 0 } }])).toBeNull();
    expect(settledMove([{ type: 'position', id: 'a', position: { x: 5, y: 0 }, dragging: false }, { type: 'position', id: 'c', position: { x: 1, y: 2 }, dragging: false }])).toEqual({
      change: { type: 'move', positions: { a: { x: 5, y: 0 }, c: { x: 1, y: 2 } } },
      squash: 'move:a,c',
    });
  });
});

describe('link geometry', () => {
  // Common practice: the exit point of a ray from a rectangle's centre lies on its boundary, in the ray's direction.
  it('meets the box outline in the direction of the target', () => {
    const box = { x: 0, y: 0, w: 100, h: 40 };
    for (const [tx, ty] of [[500, 20], [50, 300], [-200, -200], [51, 21]]) {
      const p = boxExit(box, tx, ty);
      const onEdge = Math.abs(p.x - 0) < 1e-9 || Math.abs(p.x - 100) < 1e-9 || Math.abs(p.y - 0) < 1e-9 || Math.abs(p.y - 40) < 1e-9;
      expect(onEdge).toBe(true);
      const cross = (p.x - 50) * (ty - 20) - (p.y - 20) * (tx - 50);
      expect(Math.abs(cross)).toBeLessThan(1e-6);
    }
  });

  it('bows a→b and b→a to opposite sides, so the two links never overlap', () => {
    const a = { x: 0, y: 0, w: 100, h: 40 };
    const b = { x: 400, y: 0, w: 100, h: 40 };
    expect(linkPath(a, b).mid.y).toBeLessThan(20);
    expect(linkPath(b, a).mid.y).toBeGreaterThan(20);
  });
});

describe('links when the canvas is zoomed out', () => {
  it('lengthens the dash pattern in steps of two below 70 %, so on screen it stays within 0.7 to 1.4 times its size', () => {
    expect(dashScaleAt(1.2)).toBe(1);
    expect(dashScaleAt(0.7)).toBe(1);
    expect(dashScaleAt(0.69)).toBe(2);
    expect(dashScaleAt(0.35)).toBe(2);
    expect(dashScaleAt(0.16)).toBe(8);
    for (let zoom = 0.1; zoom < 0.7; zoom += 0.01) {
      const onScreen = zoom * dashScaleAt(zoom);
      expect(onScreen).toBeGreaterThanOrEqual(0.7 - 1e-9);
      expect(onScreen).toBeLessThan(1.4);
    }
    expect(scaledDash('7 4')).toBe('calc(7px * var(--lf-dash-scale, 1)) calc(4px * var(--lf-dash-scale, 1))');
  });

  it('draws the sign glyph in the link\'s own coordinates', () => {
    expect(signPath('-', 10, 20)).toBe('M5.5,20 H14.5');
    expect(signPath('+', 10, 20)).toBe('M5.5,20 H14.5 M10,15.5 V24.5');
  });
});

describe('problems on the canvas', () => {
  it('maps every equation id of the ordering contract back to its node', () => {
    expect(nodeOfEquation(equationId.formula('soil'))).toBe('soil');
    expect(nodeOfEquation(equationId.rate('stock'))).toBe('stock');
    expect(nodeOfEquation(equationId.hold('x'))).toBe('x');
    expect(nodeOfEquation('transit')).toBe('transit');
  });

  it('badges the variables a formula error or a core diagnostic names', () => {
    const problems = collectProblems(model, validateModel(model), [{ level: 'warning', code: 'x', message: 'check b', variables: [], equations: [equationId.rate('b')] }]);
    const badges = badgesOf(problems);
    expect(badges.errors.get('c')).toBe(1);
    expect(badges.warnings.get('b')).toBe(1);
    expect(badges.errors.get('a')).toBeUndefined();
  });
});
