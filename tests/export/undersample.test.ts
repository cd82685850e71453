import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseModelText } from '../../src/core/model/schema';
import { edgeList, explainMeasured, measuredGraph, stepGraphOfModel } from '../../src/core/undersample/index';
import { measuredGraphFigure, measuredLabel, ordinal } from '../../src/export/undersample';
import { svgDocument } from '../../src/export/svg';
import type { El } from '../../src/export/scene';
import { runPython } from '../helpers/python';

const XML = fileURLToPath(new URL('./xmlcheck.py', import.meta.url));

function groups(e: El, out: El[] = []): El[] {
  if (e.attrs['data-edge'] !== undefined) out.push(e);
  for (const c of e.children ?? []) if (typeof c !== 'string') groups(c, out);
  return out;
}

describe('measured-graph figure', () => {
  it('draws every edge of the measured graph once, with its reason, as well-formed SVG (Python xml.etree)', () => {
    const m = parseModelText(readFileSync('src/examples/lake.json', 'utf8'));
    if (!m.ok) throw new Error('example does not load');
    const { graph } = stepGraphOfModel(m.model);
    const causal = { names: graph.names, directed: graph.directed };
    const svgs: string[] = [];
    for (const u of [1, 2, 3, 4]) {
      const reasons = explainMeasured(causal, u);
      const fig = measuredGraphFigure({ causal, rate: u, reasons }, { heading: true, caption: 'caption' });
      const edges = edgeList(measuredGraph(causal, u));
      const drawn = groups(fig).map((g) => g.attrs['data-edge']).sort();
      expect(drawn).toEqual([...edges.directed.map(([a, b]) => `${a}>${b}`), ...edges.bidirected.map(([a, b]) => `${a}<>${b}`)].sort());
      for (const g of groups(fig)) {
        const title = (g.children?.[0] as El).children?.[0];
        expect(reasons.map((r) => r.text)).toContain(title);
        // a line and one head per end it points at
        const paths = (g.children ?? []).filter((c) => typeof c !== 'string' && c.tag === 'path');
        expect(paths.length).toBe(g.attrs['data-kind'] === 'bidirected' ? 3 : 2);
      }
      svgs.push(svgDocument(fig));
    }
    const parsed = runPython<{ ok: boolean; variables: string[] }[]>(XML, svgs);
    for (const p of parsed) {
      expect(p.ok).toBe(true);
      expect(p.variables).toEqual([...graph.names].sort());
    }
  });

  it('words the rate', () => {
    expect([1, 2, 3, 4, 11, 12, 13, 21, 22, 23, 101].map(ordinal)).toEqual(['1st', '2nd', '3rd', '4th', '11th', '12th', '13th', '21st', '22nd', '23rd', '101st']);
    expect(measuredLabel(3)).toBe('Measured every 3rd step (u = 3)');
  });
});
