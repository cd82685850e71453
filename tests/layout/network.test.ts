/**
 * Node placement of the network figures does not depend on the order of the
 * variables in the file: a property test (fast-check, seeded) over random
 * networks of 2–14 states with random ids, each drawn from the file's order
 * and from a random permutation of it, through the same steps as the figure
 * (`drawnLinks` chooses the links, `placeNetwork` places nodes, lines and
 * weights); every position is compared by id.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { drawnLinks } from '../../src/export/charts';
import { weightText } from '../../src/present/index';
import { placeNetwork, type NetworkPlacement } from '../../src/layout/network';

const r2 = (x: number) => Math.round(x * 100) / 100;
const pt = (p: { x: number; y: number }) => [r2(p.x), r2(p.y)];

/** Everything placed, keyed by state ids (an undirected link by its two ids in id order, its line as an unordered pair of ends). */
function byId(ids: readonly string[], matrix: number[][], directed: boolean): Record<string, unknown> {
  const chosen = drawnLinks(ids, matrix, directed);
  const p: NetworkPlacement = placeNetwork(ids, chosen.links.map((e) => ({ ...e, label: weightText(e.weight) })), directed);
  const out: Record<string, unknown> = { size: [r2(p.width), r2(p.height)], threshold: chosen.threshold, left: chosen.left };
  ids.forEach((id, i) => { out[`node ${id}`] = pt(p.centers[i]); });
  for (const l of p.links) {
    const a = ids[l.link.from], b = ids[l.link.to];
    const ends = [pt(l.start), pt(l.end)];
    const key = directed ? `${a}>${b}` : [a, b].sort().join('—');
    out[`link ${key}`] = { ends: directed ? ends : ends.sort((u, v) => u[0] - v[0] || u[1] - v[1]), control: pt(l.control), label: pt(l.label), weight: l.link.weight };
  }
  return out;
}

const networks = fc
  .record({
    n: fc.integer({ min: 2, max: 14 }),
    names: fc.uniqueArray(fc.stringMatching(/^[a-z][a-z0-9_]{0,7}$/), { minLength: 14, maxLength: 14 }),
    cells: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 196, maxLength: 196 }),
    density: fc.double({ min: 0.1, max: 1, noNaN: true }),
    keys: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 14, maxLength: 14 }),
  })
  .map(({ n, names, cells, density, keys }) => {
    const ids = names.slice(0, n);
    // an entry is kept when |cell| < density; sizes spread over three decades (weights of a sampled model)
    const raw = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => {
      const c = cells[i * 14 + j];
      return Math.abs(c) < density ? Math.sign(c) * 10 ** (-3 * (1 - Math.abs(c) / density)) : 0;
    }));
    const symmetric = raw.map((row, i) => row.map((_, j) => raw[Math.min(i, j)][Math.max(i, j)]));
    // a permutation of the file's order: the states sorted by random keys
    const perm = ids.map((_, i) => i).sort((a, b) => keys[a] - keys[b] || a - b);
    return { ids, raw, symmetric, perm };
  });

const permuted = (ids: readonly string[], m: number[][], perm: number[]) => ({ ids: perm.map((k) => ids[k]), matrix: perm.map((i) => perm.map((j) => m[i][j])) });

describe('network placement and the order of variables in the file', () => {
  it('directed (lagged) networks: nodes, lines and weights at the same places by id in any order', () => {
    fc.assert(
      fc.property(networks, ({ ids, raw, perm }) => {
        const q = permuted(ids, raw, perm);
        expect(byId(q.ids, q.matrix, true)).toEqual(byId(ids, raw, true));
      }),
      { seed: 515, numRuns: 60 },
    );
  });

  it('undirected (same-interval) networks: the same, each line compared as an unordered pair of ends', () => {
    fc.assert(
      fc.property(networks, ({ ids, symmetric, perm }) => {
        const q = permuted(ids, symmetric, perm);
        expect(byId(q.ids, q.matrix, false)).toEqual(byId(ids, symmetric, false));
      }),
      { seed: 1515, numRuns: 60 },
    );
  });

  it('a permutation that changes nothing else moves no node (a fixed case the property must include)', () => {
    const ids = ['mood', 'sleep', 'stress'];
    const m = [[0.5, 0.2, -0.1], [0.05, 0.6, 0], [0.3, 0, 0.4]];
    const a = byId(ids, m, true);
    const b = byId(...(Object.values(permuted(ids, m, [2, 0, 1])) as [string[], number[][]]), true);
    expect(b).toEqual(a);
    // and the placement does depend on the ids themselves (the order is by id): renaming moves nodes
    const renamed = byId(['zeta', 'sleep', 'stress'], m, true);
    expect(renamed['node zeta']).not.toEqual(a['node mood']);
  });
});
