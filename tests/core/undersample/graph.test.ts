import { describe, expect, it } from 'vitest';
import { edgeList, explainMeasured, measuredGraph, measuredSeries, type StepGraph } from '../../../src/core/undersample/index';
import { runPython } from '../../helpers/python';
import { seededRandom } from '../../../src/core/stats/random';
import { graphNumber, keyOf, matrixOf, referenceMeasured, rowsOf } from './reference';

const SCRIPT = 'tests/reference/undersample_unrolled.py';
const namesOf = (n: number) => Array.from({ length: n }, (_, i) => String(i + 1));

interface Projection { directed: [number, number][]; bidirected: [number, number][]; other: number }

function pairsOf(h: { directed: readonly number[]; bidirected: readonly number[] }, n: number) {
  const directed: [number, number][] = [];
  const bidirected: [number, number][] = [];
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if ((h.directed[i] >>> j) & 1) directed.push([i, j]);
      if (j > i && (h.bidirected[i] >>> j) & 1) bidirected.push([i, j]);
    }
  return { directed, bidirected };
}

function randomRows(n: number, density: number, rnd: () => number): number[] {
  return Array.from({ length: n }, () => {
    let r = 0;
    for (let j = 0; j < n; j++) if (rnd() < density) r |= 1 << j;
    return r >>> 0;
  });
}

describe('measured graph against the latent projection of the unrolled graph (NetworkX)', () => {
  it('every 3-variable causal-step graph at u = 1 … 4', () => {
    const cases: { n: number; rows: number[][]; u: number; code: number }[] = [];
    for (let code = 0; code < 512; code++) for (const u of [1, 2, 3, 4]) cases.push({ n: 3, rows: matrixOf(graphNumber(code, 3), 3), u, code });
    const ref = runPython<Projection[]>(SCRIPT, cases.map(({ n, rows, u }) => ({ n, rows, u })));
    let compared = 0;
    cases.forEach((c, k) => {
      const h = measuredGraph({ names: namesOf(3), directed: graphNumber(c.code, 3) }, c.u);
      expect(pairsOf(h, 3), `graph ${c.code} at u = ${c.u}`).toEqual({ directed: ref[k].directed, bidirected: ref[k].bidirected });
      expect(ref[k].other).toBe(0);
      compared++;
    });
    expect(compared).toBe(2048);
  }, 120_000);

  it('random 4- and 5-variable graphs at u = 2 … 5 (seeded)', () => {
    const rnd = seededRandom(20131).uniform;
    const cases: { n: number; rows: number[][]; u: number; masks: number[] }[] = [];
    for (const n of [4, 5])
      for (let k = 0; k < 60; k++) {
        const masks = randomRows(n, 0.15 + 0.35 * rnd(), rnd);
        cases.push({ n, rows: matrixOf(masks, n), u: 2 + (k % 4), masks });
      }
    const ref = runPython<Projection[]>(SCRIPT, cases.map(({ n, rows, u }) => ({ n, rows, u })));
    let nonEmpty = 0;
    cases.forEach((c, k) => {
      const h = measuredGraph({ names: namesOf(c.n), directed: c.masks }, c.u);
      const mine = pairsOf(h, c.n);
      expect(mine, `seed 20131, case ${k}: n = ${c.n}, u = ${c.u}, rows ${JSON.stringify(c.masks)}`).toEqual({ directed: ref[k].directed, bidirected: ref[k].bidirected });
      if (mine.bidirected.length > 0) nonEmpty++;
    });
    // the sample exercises confounded pairs, not only directed edges
    expect(nonEmpty).toBeGreaterThan(30);
  }, 120_000);

  it('the plain reference used for enumerations agrees with NetworkX on random 4-variable graphs', () => {
    const rnd = seededRandom(77).uniform;
    const cases = Array.from({ length: 40 }, (_, k) => {
      const masks = randomRows(4, 0.3, rnd);
      return { n: 4, rows: matrixOf(masks, 4), u: 2 + (k % 3) };
    });
    const ref = runPython<Projection[]>(SCRIPT, cases);
    cases.forEach((c, k) => {
      const m = referenceMeasured(c.rows, c.u);
      expect(pairsOf({ directed: rowsOf(m.directed), bidirected: rowsOf(m.bidirected) }, 4)).toEqual({ directed: ref[k].directed, bidirected: ref[k].bidirected });
    });
  }, 60_000);
});

describe('worked examples', () => {
  const g = (n: number, edges: [number, number][]): StepGraph => {
    const rows = new Array<number>(n).fill(0);
    for (const [i, j] of edges) rows[i - 1] |= 1 << (j - 1);
    return { names: namesOf(n), directed: rows };
  };

  it('a chain 1 → 2 → 3 seen every second step shows 1 → 3 only, and nothing at u = 3', () => {
    // Worked by hand from the definition of G^u in Danks & Plis (2013): one path of length 2 (1 → 2 → 3),
    // no node with two children, no path of length 3.
    const chain = g(3, [[1, 2], [2, 3]]);
    expect(edgeList(measuredGraph(chain, 2))).toEqual({ directed: [['1', '3']], bidirected: [] });
    expect(edgeList(measuredGraph(chain, 3))).toEqual({ directed: [], bidirected: [] });
    expect(explainMeasured(chain, 2).map((r) => r.text)).toEqual(['1 → 3 appears at u = 2 through 2']);
  });

  it('a common cause 2 ← 1 → 3 becomes a bidirected edge 2 ↔ 3 from u = 2 on', () => {
    // Danks & Plis (2013), definition of G^u (from memory): i ↔ j when a common cause reaches both by paths of equal length l < u.
    const fork = g(3, [[1, 2], [1, 3]]);
    for (const u of [2, 3, 5]) expect(edgeList(measuredGraph(fork, u))).toEqual({ directed: [], bidirected: [['2', '3']] });
    expect(explainMeasured(fork, 2)[0].text).toBe('2 ↔ 3 appears at u = 2: 1 reaches both in 1 step, between two measurements');
  });

  it('a two-cycle without self-loops alternates: self-loops at even u, the cycle at odd u, never a bidirected edge', () => {
    // Hand-worked from the definition (Danks & Plis 2013): each variable has a single child, so no pair shares a cause.
    const two = g(2, [[1, 2], [2, 1]]);
    const series = measuredSeries(two, 6);
    series.forEach((h, k) => {
      const u = k + 1;
      expect(edgeList(h).directed).toEqual(u % 2 === 0 ? [['1', '1'], ['2', '2']] : [['1', '2'], ['2', '1']]);
      expect(edgeList(h).bidirected).toEqual([]);
    });
  });

  it("Wielandt's graph fills every directed edge exactly from u = (n − 1)² + 1 (Wielandt 1950)", () => {
    // Wielandt (1950), also Horn & Johnson, Matrix Analysis, 2nd ed., §8.5 (from memory): a primitive n × n
    // 0/1 matrix has A^k > 0 for all k ≥ (n − 1)² + 1, and the cycle 1 → … → n → 1 with the chord n → 2
    // (cycles of lengths n and n − 1) needs exactly that many steps.
    for (const n of [3, 4, 5, 6]) {
      const edges: [number, number][] = [];
      for (let i = 1; i < n; i++) edges.push([i, i + 1]);
      edges.push([n, 1], [n, 2]);
      const w = g(n, edges);
      const e = (n - 1) ** 2 + 1;
      const full = (1 << n) - 1;
      const series = measuredSeries(w, e + 2);
      expect(series[e - 2].directed.every((r) => r === full), `n = ${n}, u = ${e - 1}`).toBe(false);
      for (const u of [e, e + 1, e + 2]) expect(series[u - 1].directed.every((r) => r === full), `n = ${n}, u = ${u}`).toBe(true);
      // Plis, Danks, Freeman & Calhoun (2015), from memory: a strongly connected graph whose cycle lengths have
      // greatest common divisor 1 reaches the "superclique" (every directed and every bidirected edge) at some finite u.
      expect(series[e + 1].bidirected.every((r, i) => r === (full & ~(1 << i)))).toBe(true);
    }
  });

  it('the series equals the rate-by-rate graph, and the plain reference, on random graphs', () => {
    const rnd = seededRandom(5).uniform;
    for (let k = 0; k < 50; k++) {
      const n = 2 + (k % 6);
      const rows = randomRows(n, 0.3, rnd);
      const series = measuredSeries({ names: namesOf(n), directed: rows }, 6);
      series.forEach((h, i) => {
        expect(h).toEqual(measuredGraph({ names: namesOf(n), directed: rows }, i + 1));
        const r = referenceMeasured(matrixOf(rows, n), i + 1);
        expect(keyOf({ directed: matrixOf(h.directed, n), bidirected: matrixOf(h.bidirected, n) })).toBe(keyOf(r));
      });
    }
  });

  it('every edge has one reason, and its witness path is a path of the causal graph of exactly u steps', () => {
    const rnd = seededRandom(11).uniform;
    for (let k = 0; k < 30; k++) {
      const n = 3 + (k % 4);
      const rows = randomRows(n, 0.35, rnd);
      const graph = { names: namesOf(n), directed: rows };
      for (const u of [1, 2, 3, 4]) {
        const h = measuredGraph(graph, u);
        const reasons = explainMeasured(graph, u);
        const { directed, bidirected } = pairsOf(h, n);
        expect(reasons.filter((r) => r.kind === 'directed').length).toBe(directed.length);
        expect(reasons.filter((r) => r.kind === 'bidirected').length).toBe(bidirected.length);
        for (const r of reasons) {
          if (r.kind === 'directed') {
            expect(r.path.length).toBe(u + 1);
            for (let s = 0; s < u; s++) expect((rows[r.path[s]] >>> r.path[s + 1]) & 1).toBe(1);
            expect(r.paths).toBeGreaterThanOrEqual(1);
          } else {
            expect(r.steps).toBeLessThan(u);
            expect(r.causes.length).toBeGreaterThan(0);
          }
        }
      }
    }
  });

  it('refuses a rate below 1 and graphs above 30 variables, with a reason', () => {
    expect(() => measuredGraph(g(2, []), 0)).toThrow(/whole number ≥ 1/);
    expect(() => measuredGraph({ names: namesOf(31), directed: new Array<number>(31).fill(0) }, 2)).toThrow(/at most 30/);
  });
});
