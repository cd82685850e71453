import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bipartiteFromLists, hopcroftKarp, type BipartiteGraph, type Matching } from '../../../src/core/ordering/matching';
import { stronglyConnected } from '../../../src/core/ordering/scc';
import { kuhnMatcher, SEED } from './generators';

function expectValidMatching(g: BipartiteGraph, m: Matching): void {
  let size = 0;
  for (let r = 0; r < g.rows; r++) {
    const c = m.rowMate[r];
    if (c < 0) continue;
    size++;
    expect(m.colMate[c]).toBe(r);
    expect(Array.from(g.colIdx.subarray(g.rowPtr[r], g.rowPtr[r + 1]))).toContain(c);
  }
  expect(size).toBe(m.size);
}

const graph = fc
  .record({ cols: fc.integer({ min: 1, max: 30 }), rows: fc.array(fc.array(fc.nat({ max: 29 }), { maxLength: 5 }), { maxLength: 30 }) })
  .map(({ cols, rows }) => bipartiteFromLists(cols, rows.map((r) => [...new Set(r.map((c) => c % cols))])));

describe('Hopcroft–Karp matching', () => {
  it('finds a valid matching of maximum size (against a plain augmenting-path matcher, Kuhn 1955)', () => {
    fc.assert(
      fc.property(graph, (g) => {
        const m = hopcroftKarp(g);
        expectValidMatching(g, m);
        const ref = kuhnMatcher((n) => Array.from({ length: n }, (_, i) => i), false)(g);
        expect(m.size).toBe(ref.size);
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('needs the augmenting phases when the greedy start is not maximum (Hopcroft & Karp 1973, fig. of a blocked greedy match)', () => {
    // rows 0:{0,1}, 1:{0}: a greedy start gives row 0 column 0; only augmenting reaches size 2 (common practice).
    const g = bipartiteFromLists(2, [[0, 1], [0]]);
    const m = hopcroftKarp(g);
    expect(m.size).toBe(2);
    expect(Array.from(m.rowMate)).toEqual([1, 0]);
    // a 4-cycle of degree-2 vertices plus a pendant: Karp–Sipser must guess; the phases repair any bad guess
    const h = bipartiteFromLists(4, [[0, 1], [1, 2], [2, 3], [3, 0], [0]]);
    expect(hopcroftKarp(h).size).toBe(4);
  });

  it('handles a long alternating chain without recursion (10^5 rows)', () => {
    // rows r: {r, r+1} except the last row {0}: the unique perfect matching needs every row to shift.
    const n = 100_000;
    const lists = Array.from({ length: n }, (_, r) => (r === n - 1 ? [0] : [r, r + 1]));
    const m = hopcroftKarp(bipartiteFromLists(n, lists));
    expect(m.size).toBe(n);
  });
});

describe('Tarjan strongly connected components (iterative)', () => {
  it('a cycle of 2·10^5 nodes is one component; a chain is all singletons, numbered sinks first', () => {
    const n = 200_000;
    const ptr = Int32Array.from({ length: n + 1 }, (_, i) => i);
    const cyc = Int32Array.from({ length: n }, (_, i) => (i + 1) % n);
    expect(stronglyConnected(n, ptr, cyc).count).toBe(1);
    const chainPtr = Int32Array.from({ length: n + 1 }, (_, i) => Math.min(i, n - 1));
    const chain = Int32Array.from({ length: n - 1 }, (_, i) => i + 1);
    const c = stronglyConnected(n, chainPtr, chain);
    expect(c.count).toBe(n);
    // node i → i+1: the sink n-1 completes first (reverse topological numbering)
    expect(c.comp[n - 1]).toBe(0);
    expect(c.comp[0]).toBe(n - 1);
  });
});
