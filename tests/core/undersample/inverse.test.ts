import { describe, expect, it } from 'vitest';
import { causalGraphsFor, nearestMeasuredGraphs, type MeasuredGraph } from '../../../src/core/undersample/index';
import { seededRandom } from '../../../src/core/stats/random';
import { graphNumber, keyOf, matrixOf, referenceMeasured, rowsOf } from './reference';

const namesOf = (n: number) => Array.from({ length: n }, (_, i) => String(i + 1));

/** Every causal-step graph on n variables grouped by its measured graph at rate u (plain reference, no solver). */
function classesOf(n: number, u: number): Map<string, { measured: MeasuredGraph; graphs: string[] }> {
  const out = new Map<string, { measured: MeasuredGraph; graphs: string[] }>();
  for (let code = 0; code < 2 ** (n * n); code++) {
    const rows = graphNumber(code, n);
    const m = referenceMeasured(matrixOf(rows, n), u);
    const key = keyOf(m);
    let c = out.get(key);
    if (!c) out.set(key, (c = { measured: { names: namesOf(n), directed: rowsOf(m.directed), bidirected: rowsOf(m.bidirected) }, graphs: [] }));
    c.graphs.push(rows.join(','));
  }
  return out;
}

const sizeHistogram = (sizes: number[]) => {
  const h = new Map<number, number>();
  for (const s of sizes) h.set(s, (h.get(s) ?? 0) + 1);
  return [...h.entries()].sort((a, b) => a[0] - b[0]);
};

describe('causal graphs behind a measured graph, against exhaustive enumeration', () => {
  for (const u of [2, 3]) {
    it(`every 3-variable measured graph at u = ${u}: the same set of causal graphs, by search and by solver`, () => {
      const classes = classesOf(3, u);
      for (const { measured, graphs } of classes.values()) {
        const want = [...graphs].sort();
        for (const method of ['search', 'solver'] as const) {
          const r = causalGraphsFor(measured, [u], { method, maxSolutions: 1000 });
          expect(r.complete).toBe(true);
          expect(r.count).toBe(graphs.length);
          expect(r.solutions.map((s) => s.directed.join(',')).sort(), `${method} at u = ${u}`).toEqual(want);
        }
      }
    }, 60_000);
  }

  it('counts of distinct measured graphs and class sizes for n = 3 and 4 at u = 2 and 3, enumerated and solved', () => {
    // Both sides are computed here: the enumeration groups all 2^(n²) causal-step graphs by their measured
    // graph (plain reference, checked against NetworkX in forward.test.ts); the solver counts each class.
    for (const n of [3, 4])
      for (const u of [2, 3]) {
        const classes = classesOf(n, u);
        const total = [...classes.values()].reduce((a, c) => a + c.graphs.length, 0);
        expect(total).toBe(2 ** (n * n));
        const enumerated: number[] = [];
        const solved: number[] = [];
        for (const { measured, graphs } of classes.values()) {
          enumerated.push(graphs.length);
          const r = causalGraphsFor(measured, [u], { maxSolutions: 0 });
          expect(r.complete).toBe(true);
          solved.push(r.count);
        }
        expect(solved).toEqual(enumerated);
        expect(sizeHistogram(solved)).toEqual(sizeHistogram(enumerated));
        // u = 1 would give 2^(n²) classes of one graph each; undersampling merges graphs.
        expect(classes.size).toBeLessThan(2 ** (n * n));
      }
  }, 300_000);

  it('random 4-variable graphs: listed solutions equal the enumerated class, search and solver, one rate and any rate ≤ 3', () => {
    const byRate = new Map([2, 3].map((u) => [u, classesOf(4, u)]));
    const rnd = seededRandom(2016).uniform;
    for (let k = 0; k < 25; k++) {
      const code = Math.floor(rnd() * 2 ** 16);
      const u = k % 2 === 0 ? 2 : 3;
      const m = referenceMeasured(matrixOf(graphNumber(code, 4), 4), u);
      const key = keyOf(m);
      const measured: MeasuredGraph = { names: namesOf(4), directed: rowsOf(m.directed), bidirected: rowsOf(m.bidirected) };
      const want = [...byRate.get(u)!.get(key)!.graphs].sort();
      for (const method of ['search', 'solver'] as const) {
        const r = causalGraphsFor(measured, [u], { method, maxSolutions: 100_000 });
        expect(r.solutions.map((s) => s.directed.join(',')).sort(), `seed 2016, case ${k}, graph ${code}, ${method}`).toEqual(want);
      }
      // any rate up to 3: u = 1 gives the measured graph itself when it has no bidirected edge
      const any = causalGraphsFor(measured, [1, 2, 3], { maxSolutions: 100_000 });
      const noBi = measured.bidirected.every((r) => r === 0) ? 1 : 0;
      const others = [2, 3].map((v) => byRate.get(v)!.get(key)?.graphs.length ?? 0);
      expect(any.count).toBe(noBi + others[0] + others[1]);
      expect(any.byRate.map((r) => r.count)).toEqual([noBi, ...others]);
    }
  }, 300_000);

  it('edges in every and in some solution agree with the listed solutions', () => {
    const rnd = seededRandom(9).uniform;
    for (let k = 0; k < 20; k++) {
      const rows = graphNumber(Math.floor(rnd() * 2 ** 16), 4);
      const m = referenceMeasured(matrixOf(rows, 4), 2);
      const h: MeasuredGraph = { names: namesOf(4), directed: rowsOf(m.directed), bidirected: rowsOf(m.bidirected) };
      const r = causalGraphsFor(h, [2], { maxSolutions: 100_000 });
      const and = [0, 1, 2, 3].map((i) => r.solutions.reduce((a, s) => a & s.directed[i], 15));
      const or = [0, 1, 2, 3].map((i) => r.solutions.reduce((a, s) => a | s.directed[i], 0));
      expect(r.byRate[0].always).toEqual(and);
      expect(r.byRate[0].sometimes).toEqual(or);
    }
  });

  it('a measured graph no causal graph gives: count 0, and the nearest consistent graphs by edges changed', () => {
    // Nearest by brute force: every measured graph some 3-variable causal graph gives at u = 2 or 3, by distance.
    const reachable = [2, 3].flatMap((u) => [...classesOf(3, u).values()].map((c) => ({ u, m: c.measured })));
    const dist = (a: MeasuredGraph, b: MeasuredGraph) => {
      let d = 0;
      for (let i = 0; i < 3; i++)
        for (let j = 0; j < 3; j++) {
          d += ((a.directed[i] ^ b.directed[i]) >>> j) & 1;
          if (j > i) d += ((a.bidirected[i] ^ b.bidirected[i]) >>> j) & 1;
        }
      return d;
    };
    const rnd = seededRandom(404).uniform;
    let inconsistent = 0;
    for (let k = 0; k < 400 && inconsistent < 60; k++) {
      const d = [0, 1, 2].map(() => Math.floor(rnd() * 8));
      const b = [0, 0, 0];
      for (const [i, j] of [[0, 1], [0, 2], [1, 2]]) if (rnd() < 0.5) { b[i] |= 1 << j; b[j] |= 1 << i; }
      const h: MeasuredGraph = { names: namesOf(3), directed: d, bidirected: b };
      const r = causalGraphsFor(h, [2, 3]);
      const best = Math.min(...reachable.map((x) => dist(x.m, h)));
      if (best > 0) {
        inconsistent++;
        expect(r.count).toBe(0);
        const near = nearestMeasuredGraphs(h, [2, 3], { maxResults: 50 });
        expect(near.complete).toBe(true);
        expect(near.distance, `seed 404, case ${k}`).toBe(best);
        const want = new Set(reachable.filter((x) => dist(x.m, h) === best).map((x) => `${x.u}|${x.m.directed}|${x.m.bidirected}`));
        const got = new Set(near.graphs.flatMap((g) => g.rates.map((u) => `${u}|${g.measured.directed}|${g.measured.bidirected}`)));
        expect(got).toEqual(want);
        for (const g of near.graphs) {
          const check = referenceMeasured(matrixOf(g.example, 3), g.rate);
          expect(rowsOf(check.directed)).toEqual(g.measured.directed);
          expect(g.added.directed.length + g.added.bidirected.length + g.removed.directed.length + g.removed.bidirected.length).toBe(best);
        }
      } else expect(r.count).toBeGreaterThan(0);
    }
    expect(inconsistent).toBeGreaterThan(20);
  }, 120_000);

  it('stops when asked, reports progress, and says the answer is incomplete', () => {
    const h: MeasuredGraph = { names: namesOf(5), directed: [31, 31, 31, 31, 31], bidirected: [30, 29, 27, 23, 15] };
    const seen: number[] = [];
    let asked = 0;
    const r = causalGraphsFor(h, [2], { progressEvery: 10, onProgress: (p) => seen.push(p.fraction), shouldStop: () => ++asked > 1 });
    expect(r.stopped).toBe(true);
    expect(r.complete).toBe(false);
    expect(seen.length).toBeGreaterThan(0);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
  });

  it('names its limits', () => {
    const big: MeasuredGraph = { names: namesOf(11), directed: new Array<number>(11).fill(0), bidirected: new Array<number>(11).fill(0) };
    expect(() => causalGraphsFor(big, [2])).toThrow(/up to 10 variables/);
    const six: MeasuredGraph = { names: namesOf(6), directed: new Array<number>(6).fill(0), bidirected: new Array<number>(6).fill(0) };
    expect(() => causalGraphsFor(six, [2], { method: 'search' })).toThrow(/up to 5 variables/);
    expect(causalGraphsFor(six, [2]).byRate[0].method).toBe('solver');
  });
});
