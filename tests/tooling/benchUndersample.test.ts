import { describe, expect, it } from 'vitest';
import { runSet } from '../../bench/undersample';
import { graphNumber, keyOf, matrixOf, referenceMeasured } from '../core/undersample/reference';

// The bench (`npm run bench -- undersample`) times real work: the graphs it searches back are measured graphs of
// seeded random causal graphs, and the counts it adds up are the sizes of their classes. Checked here by
// exhaustive enumeration of all 2^16 causal graphs on 4 variables (the definition of Danks & Plis 2013, written
// plainly in reference.ts and checked against NetworkX in forward.test.ts), at a size the test can afford.
describe('the undersample bench', () => {
  it('search and solver report the class sizes that enumeration gives, for the same seeded graphs', () => {
    const n = 4;
    const search = runSet(n, 'search', 6, 3, false);
    const solver = runSet(n, 'solver', 6, 3, false);
    expect(search.incomplete + solver.incomplete).toBe(0);
    expect(solver.graphs.map((g) => [g.directed, g.bidirected, g.rate])).toEqual(search.graphs.map((g) => [g.directed, g.bidirected, g.rate]));
    const byRate = new Map<number, Map<string, number>>();
    for (const u of new Set(search.graphs.map((g) => g.rate))) {
      const counts = new Map<string, number>();
      for (let code = 0; code < 2 ** (n * n); code++) {
        const k = keyOf(referenceMeasured(matrixOf(graphNumber(code, n), n), u));
        counts.set(k, (counts.get(k) ?? 0) + 1);
      }
      byRate.set(u, counts);
    }
    search.graphs.forEach((g, i) => {
      const want = byRate.get(g.rate)!.get(keyOf({ directed: matrixOf(g.directed, n), bidirected: matrixOf(g.bidirected, n) })) ?? 0;
      expect(want, `graph ${i} at u = ${g.rate}`).toBeGreaterThan(0); // a measured graph of some causal graph
      expect(g.count).toBe(want);
      expect(solver.graphs[i].count).toBe(want);
    });
    expect(search.solutions).toBe(solver.solutions);
  });
});
