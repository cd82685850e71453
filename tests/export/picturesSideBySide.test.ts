import { describe, expect, it } from 'vitest';
import { picturesAt } from '../../src/core/pictures/index';
import { factorFigure, laggedMatrixFigure, withinNetworkFigure } from '../../src/export/pictures';
import { sideBySideFigure } from '../../src/export/picturesSideBySide';
import { svgDocument } from '../../src/export/svg';
import type { El } from '../../src/export/scene';
import { chainModel, SYMPTOMS } from '../core/pictures/fixtures';

function all(el: El, pred: (e: El) => boolean, out: El[] = []): El[] {
  if (pred(el)) out.push(el);
  for (const c of el.children ?? []) if (typeof c !== 'string') all(c, pred, out);
  return out;
}
const n = (x: unknown) => Number(x);

// Layout rules (common practice for composite figures): every panel whole, none overlapping, the readings kept.
describe('the three pictures side by side in one figure', () => {
  const model = chainModel(0.8, 1);
  const r = picturesAt(model, { interval: 3, samples: 70, persons: 150, observed: SYMPTOMS });
  if (!r.ok) throw new Error(r.reason);
  const P = r.pictures;
  const panels = [
    { key: 'within', title: 'Within persons', reading: P.within.reading, figure: withinNetworkFigure(model, P.within) },
    { key: 'factor', title: 'Factor picture across persons', reading: P.byLevel.between.reading, figure: factorFigure(model, P.levels.observed, P.byLevel.between) },
    { key: 'long', title: 'Lagged matrix at a long interval', reading: P.longReading, figure: laggedMatrixFigure(model, P.rankLong) },
  ];
  const f = sideBySideFigure('Chain: three pictures at 3 h', panels, { heading: true, caption: 'Model-based, not a finding.' });

  it('holds each panel\'s own figure unchanged, side by side without overlap, inside the figure', () => {
    const placed = all(f, (e) => e.attrs['data-panel'] !== undefined);
    expect(placed.map((p) => p.attrs['data-panel'])).toEqual(['within', 'factor', 'long']);
    const xs = placed.map((p) => Number(/translate\(([\d.]+),/.exec(String(p.attrs.transform))![1]));
    const inner = placed.map((p) => (p.children ?? []).find((c): c is El => typeof c !== 'string' && c.tag === 'svg')!);
    expect(inner.map((s) => s.attrs['data-chart'])).toEqual(panels.map((p) => p.figure!.attrs['data-chart']));
    inner.forEach((s, i) => {
      expect(s.children).toBe(panels[i].figure!.children); // the very figure the pane shows
      expect(n(s.attrs.width)).toBe(n(panels[i].figure!.attrs.width));
      if (i > 0) expect(xs[i]).toBeGreaterThanOrEqual(xs[i - 1] + n(inner[i - 1].attrs.width));
    });
    const last = xs[2] + n(inner[2].attrs.width);
    expect(n(f.attrs.width)).toBeGreaterThanOrEqual(last);
    inner.forEach((s) => expect(n(f.attrs.height)).toBeGreaterThan(n(s.attrs.y) + n(s.attrs.height)));
  });

  it('writes each panel\'s title and reading, the heading and the caption', () => {
    const svg = svgDocument(f);
    expect(svg).toContain('Chain: three pictures at 3 h');
    expect(svg).toContain('Model-based, not a finding.');
    for (const p of panels) {
      expect(svg).toContain(p.title);
      // the reading is wrapped into lines: every word is there, in order
      const words = p.reading.split(/\s+/).filter(Boolean).map((w) => w.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;'));
      let at = 0;
      for (const w of words) { const k = svg.indexOf(w, at); expect(k, w).toBeGreaterThanOrEqual(0); at = k + w.length; }
    }
    expect(svg.match(/<svg /g)).toHaveLength(4);
  });
});
