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
import { nameLines, nameWidth, placeNetwork, placeNetworkCompact, type NetworkPlacement } from '../../src/layout/network';

const r2 = (x: number) => Math.round(x * 100) / 100;
const pt = (p: { x: number; y: number }) => [r2(p.x), r2(p.y)];

/** Everything placed, keyed by state ids (an undirected link by its two ids in id order, its line as an unordered pair of ends). */
function byId(ids: readonly string[], matrix: number[][], directed: boolean, compact = false): Record<string, unknown> {
  const chosen = drawnLinks(ids, matrix, directed);
  const links = chosen.links.map((e) => ({ ...e, label: weightText(e.weight) }));
  // compact: the ladder for one column (281 units: 8.5 cm with names at 9 pt), nodes of 80 × 44
  const p: NetworkPlacement | null = compact ? placeNetworkCompact(ids, links, directed, { width: 80, height: 44 }, 281) : placeNetwork(ids, links, directed);
  if (!p) return { compact: 'none' };
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

  it('compact (one column) networks: the same by id in any order, or no compact placement in either order', () => {
    fc.assert(
      fc.property(networks, fc.boolean(), ({ ids, raw, symmetric, perm }, directed) => {
        const m = directed ? raw : symmetric;
        const q = permuted(ids, m, perm);
        expect(byId(q.ids, q.matrix, directed, true)).toEqual(byId(ids, m, directed, true));
      }),
      { seed: 2515, numRuns: 40 },
    );
  });

  it('names on two lines break between words and end in an ellipsis only when a line cannot hold them', () => {
    // "Goods in transit" is 7.94 em in DejaVu Sans (83.4 units at 10.5; the font's advances, checked below)
    expect(nameLines('Dissolved phosphorus', 92, 10.5)).toEqual(['Dissolved', 'phosphorus']);
    expect(nameLines('Mood', 92, 10.5)).toEqual(['Mood']);
    expect(nameLines('Goods in transit', 92, 10.5)).toEqual(['Goods in transit']);
    expect(nameLines('Goods in transit', 80, 10.5)).toEqual(['Goods in', 'transit']);
    expect(nameLines('Goods in transit', 83, 10.5)).toEqual(['Goods in', 'transit']);
    expect(nameLines('Goods in transit', 83.5, 10.5)).toEqual(['Goods in transit']);
    const long = nameLines('Very long name of a variable with many words', 80, 10.5);
    expect(long).toHaveLength(2);
    expect(long[1].endsWith('…')).toBe(true);
    for (const line of long) expect(nameWidth(line, 10.5)).toBeLessThanOrEqual(80);
    const word = nameLines('Supercalifragilistic', 60, 10.5);
    expect(word[0].endsWith('…')).toBe(true);
    expect(nameWidth(word[0], 10.5)).toBeLessThanOrEqual(60);
  });

  it('name widths are the advances of DejaVu Sans as fontkit reads them from the font file', async () => {
    const fontkit = (await import('fontkit')) as unknown as { openSync(p: string): { unitsPerEm: number; glyphForCodePoint(c: number): { advanceWidth: number } } };
    const font = fontkit.openSync(`${process.cwd()}/node_modules/dejavu-fonts-ttf/ttf/DejaVuSans.ttf`);
    for (const name of ['Dissolved phosphorus', 'Planktivorous fish', 'Goods in transit', 'Sleep debt', 'Air temperature', 'Irritability', 'A-Z a-z 0-9 (x/y) %']) {
      let units = 0;
      for (const ch of name) units += font.glyphForCodePoint(ch.codePointAt(0)!).advanceWidth;
      expect(nameWidth(name, 10), name).toBeGreaterThanOrEqual((units / font.unitsPerEm) * 10 - 0.01 * name.length);
      expect(nameWidth(name, 10), name).toBeLessThanOrEqual((units / font.unitsPerEm) * 10 + 0.01 * name.length);
    }
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
