/**
 * The network figures of the sampled model (lagged and same-interval; the
 * Numbers pane, its SVG/PNG export and `sampled --svg` all draw this tree):
 * checked geometrically on the element tree for every example at several
 * intervals and for random networks of up to 30 states.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { drawnLinks, laggedNetwork, networkDiagram, sameIntervalNetwork } from '../../src/export/charts';
import type { El } from '../../src/export/scene';
import { EXAMPLES } from '../../src/examples/index';
import { sampledOf } from '../../src/core/numeric/answers';
import { problems, readFigure } from '../helpers/figureGeometry';
import { seededRandom } from '../../src/core/stats/random';

const RULES = { nodeGap: 24, minVisible: 24, marksOffLines: true };

function load(json: unknown): Model {
  const r = parseModel(json);
  if (!r.ok) throw new Error('bad model');
  return r.model;
}

/** A model holding only the names of n states (the network figure reads names from it). */
function namesModel(ids: readonly string[]): Model {
  return load({ format: 'loopfold-model', version: 1, name: 'random network', timeUnit: 'h', variables: ids.map((id) => ({ id, kind: 'state', label: `State ${id}`, timescale: '1 h' })), links: [] });
}

/** A random matrix: each entry non-zero with probability `density`, sizes spread over three decades. */
function randomMatrix(n: number, r: () => number, density: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 0.5 : r() < density ? (r() < 0.5 ? -1 : 1) * Math.pow(10, -3 * r()) : 0)));
}

const check = (fig: El) => problems(readFigure(fig), RULES);

/** A seeded random network of 2 to 30 states, sparse or (every third seed) dense. */
function randomNetwork(seed: number): { n: number; ids: string[]; matrix: number[][] } {
  const r = seededRandom(seed).uniform;
  const n = 2 + Math.floor(r() * 29);
  const ids = Array.from({ length: n }, (_, i) => `s${String(i).padStart(2, '0')}`);
  return { n, ids, matrix: randomMatrix(n, r, seed % 3 === 0 ? 0.9 : 0.25) };
}

/** The upper triangle mirrored: an undirected network's weights. */
const symmetric = (m: number[][]): number[][] => m.map((row, i) => row.map((_, j) => m[Math.min(i, j)][Math.max(i, j)]));

describe('network figures: every link visible, no node or weight covered', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.id}: lagged and same-interval networks at 1/10, 1 and 10 times the shortest timescale and at a long interval`, () => {
      const m = load(ex.model);
      const taus = m.variables.filter((v) => v.kind === 'state' && typeof v.timescale === 'number').map((v) => v.timescale as number);
      const tau = Math.min(...taus, 1);
      let drawnAny = 0;
      for (const interval of [tau / 10, tau, 10 * tau, 100 * tau]) {
        const s = sampledOf(m, interval);
        if (!s.ok) continue;
        for (const fig of [laggedNetwork(m, s, false), s.phiStandardized ? laggedNetwork(m, s, true) : null, sameIntervalNetwork(m, s)]) {
          if (!fig) continue;
          drawnAny++;
          expect(check(fig), `${ex.id} at ${interval}`).toEqual([]);
        }
      }
      expect(drawnAny).toBeGreaterThan(0);
    });
  }

  it('random networks of 2 to 30 states, sparse and dense, directed and not (seeded)', () => {
    for (let seed = 1; seed <= 24; seed++) {
      const { n, ids, matrix } = randomNetwork(seed);
      for (const directed of [true, false]) {
        const sym = directed ? matrix : symmetric(matrix);
        const fig = networkDiagram({ model: namesModel(ids), states: ids, matrix: sym, directed, label: 'random' });
        expect(check(fig), `seed ${seed}, ${n} states, ${directed ? 'directed' : 'undirected'}`).toEqual([]);
      }
    }
  });

  it('drawn compact for a print width (8.5 and 11.4 cm): every example at four intervals keeps every rule and the width', () => {
    // the widths of one column and one and a half columns in points (85 and 114 mm at 72/25.4 pt per mm)
    let compact = 0;
    for (const ex of EXAMPLES) {
      const m = load(ex.model);
      for (const interval of [0.1, 1, 10, 100]) {
        const s = sampledOf(m, interval);
        if (!s.ok) continue;
        for (const widthPt of [(85 * 72) / 25.4, (114 * 72) / 25.4]) {
          const opts = { heading: true, fitTo: { widthPt } };
          for (const fig of [laggedNetwork(m, s, false, opts), s.phiStandardized ? laggedNetwork(m, s, true, opts) : null, sameIntervalNetwork(m, s, opts)]) {
            if (!fig) continue;
            expect(check(fig), `${ex.id} at ${interval}, ${widthPt} pt`).toEqual([]);
            if (fig.attrs['data-adapted']) {
              compact++;
              // the drawing's width is the room that keeps its names at 9 pt: 10.5 units × width / 9 pt
              expect(Number(fig.attrs.width), `${ex.id} at ${interval}`).toBeLessThanOrEqual(Math.floor((widthPt * 10.5) / 9));
            }
          }
        }
      }
    }
    expect(compact).toBeGreaterThan(0);
  });

  it('random networks of 2 to 30 states drawn for one column keep every rule; up to 7 states they are compact (seeded)', () => {
    let compact = 0;
    for (let seed = 1; seed <= 24; seed++) {
      const { n, ids, matrix } = randomNetwork(seed);
      for (const directed of [true, false]) {
        const sym = directed ? matrix : symmetric(matrix);
        const fig = networkDiagram({ model: namesModel(ids), states: ids, matrix: sym, directed, label: 'random' }, { fitTo: { widthPt: (85 * 72) / 25.4 } });
        const name = `seed ${seed}, ${n} states, ${directed ? 'directed' : 'undirected'}`;
        if (fig.attrs['data-adapted']) compact++;
        // up to 7 states the compact drawing always fits; larger ones may keep the wide drawing (and say so in print)
        else expect(n, name).toBeGreaterThan(7);
        expect(check(fig), name).toEqual([]);
      }
    }
    expect(compact).toBeGreaterThan(3);
  });

  it('the placement does not depend on the order of the states in the file', () => {
    const r = seededRandom(99).uniform;
    const n = 9;
    const ids = Array.from({ length: n }, (_, i) => `v${i}`);
    const matrix = randomMatrix(n, r, 0.5);
    const a = networkDiagram({ model: namesModel(ids), states: ids, matrix, directed: true, label: 'order' });
    const perm = [4, 8, 0, 6, 2, 7, 1, 5, 3];
    const b = networkDiagram({ model: namesModel(perm.map((k) => ids[k])), states: perm.map((k) => ids[k]), matrix: perm.map((i) => perm.map((j) => matrix[i][j])), directed: true, label: 'order' });
    const da = readFigure(a), db = readFigure(b);
    for (const id of ids) expect(db.nodes.get(id), id).toEqual(da.nodes.get(id));
    const lines = (d: ReturnType<typeof readFigure>) => Object.fromEntries(d.edges.map((e) => [e.id, e.points]));
    expect(lines(db)).toEqual(lines(da));
  });

  it('a legend gives the line styles and widths and states the size below which links are left out', () => {
    // invented: one strong link, one at 1 % of it (below the 2 % share), one at 10 %
    const ids = ['a', 'b', 'c'];
    const matrix = [[0.9, 0.8, 0], [0.008, 0.9, 0], [0, -0.08, 0.9]];
    const fig = networkDiagram({ model: namesModel(ids), states: ids, matrix, directed: true, label: 'legend' });
    const legend = JSON.stringify(findPart(fig, 'legend'));
    expect(legend).toContain('positive');
    expect(legend).toContain('negative');
    expect(legend).toContain('Not drawn: 1 link with |lagged effect| below 0.016');
    expect(readFigure(fig).edges.map((e) => e.id).sort()).toEqual(['b>a', 'b>c']);
    // at most three links per state: the weakest are left out and the threshold says where the cut lies
    const n = 12;
    const dense = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 0.5 : 0.01 * (1 + i * n + j))));
    const names = Array.from({ length: n }, (_, i) => `x${i}`);
    const cut = drawnLinks(names, dense, true);
    expect(cut.links).toHaveLength(3 * n);
    expect(cut.left).toBe(n * (n - 1) - 3 * n);
    const weakestKept = Math.min(...cut.links.map((e) => Math.abs(e.weight)));
    expect(cut.threshold).toBeGreaterThan(0);
    expect(cut.threshold).toBeLessThanOrEqual(weakestKept);
  });
});

function findPart(e: El, name: string): El | undefined {
  if (e.attrs['data-part'] === name) return e;
  for (const c of e.children ?? []) if (typeof c !== 'string') { const f = findPart(c, name); if (f) return f; }
  return undefined;
}
