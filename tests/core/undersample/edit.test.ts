import { describe, expect, it } from 'vitest';
import { editMeasuredGraph, graphFileText, measuredGraph, parseGraphText, type MeasuredGraph } from '../../../src/core/undersample/index';

const empty: MeasuredGraph = { names: ['rain', 'soil', 'crop'], directed: [0, 0, 0], bidirected: [0, 0, 0] };

describe('editing a measured graph by hand', () => {
  it('adding the edges of a measured graph one by one gives that graph (chain 1 → 2 → 3 with self-loops at u = 2, computed by measuredGraph)', () => {
    const target = measuredGraph({ names: empty.names, directed: [0b011, 0b110, 0b100] }, 2);
    let g = empty;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        if ((target.directed[i] >> j) & 1) { const r = editMeasuredGraph(g, { op: 'add', kind: 'directed', from: i, to: j }); if (!r.ok) throw new Error(r.message); g = r.graph; }
        if (j > i && (target.bidirected[i] >> j) & 1) { const r = editMeasuredGraph(g, { op: 'add', kind: 'bidirected', from: j, to: i }); if (!r.ok) throw new Error(r.message); g = r.graph; }
      }
    expect(g.directed).toEqual(target.directed);
    expect(g.bidirected).toEqual(target.bidirected);
    // The file written from the edited graph reads back as the same graph.
    const back = parseGraphText(graphFileText(g, { rate: 2 }));
    expect(back.ok && back.file.graph.directed).toEqual(target.directed);
    expect(back.ok && back.file.graph.bidirected).toEqual(target.bidirected);
  });

  it('removing an edge leaves the rest; a bidirected edge is removed from both rows', () => {
    const g: MeasuredGraph = { names: empty.names, directed: [0b101, 0, 0], bidirected: [0b010, 0b001, 0] };
    const r = editMeasuredGraph(g, { op: 'remove', kind: 'bidirected', from: 1, to: 0 });
    expect(r.ok && [r.graph.directed, r.graph.bidirected]).toEqual([[0b101, 0, 0], [0, 0, 0]]);
    const s = editMeasuredGraph(g, { op: 'remove', kind: 'directed', from: 0, to: 0 });
    expect(s.ok && s.graph.directed).toEqual([0b100, 0, 0]);
    // The original is not changed (the user's graph is never lost by an edit).
    expect(g.directed).toEqual([0b101, 0, 0]);
  });

  it('refuses with a message naming the edge and the variables', () => {
    const msg = (r: ReturnType<typeof editMeasuredGraph>) => (r.ok ? 'accepted' : r.message);
    expect(msg(editMeasuredGraph(empty, { op: 'add', kind: 'bidirected', from: 1, to: 1 }))).toBe('soil ↔ soil: a bidirected edge joins two different variables');
    const once = editMeasuredGraph(empty, { op: 'add', kind: 'directed', from: 0, to: 2 });
    expect(once.ok && msg(editMeasuredGraph(once.graph, { op: 'add', kind: 'directed', from: 0, to: 2 }))).toBe('rain → crop is already in the graph');
    expect(msg(editMeasuredGraph(empty, { op: 'remove', kind: 'directed', from: 2, to: 0 }))).toBe('crop → rain is not in the graph');
    expect(msg(editMeasuredGraph(empty, { op: 'add', kind: 'directed', from: 0, to: 5 }))).toBe('rain → variable 6: no variable at the to end (the variables are rain, soil, crop)');
  });
});
