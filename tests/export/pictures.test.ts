import { describe, expect, it } from 'vitest';
import { picturesAt } from '../../src/core/pictures/index';
import { factorFigure, laggedMatrixFigure, rankCurveFigure, withinNetworkFigure } from '../../src/export/pictures';
import { svgDocument } from '../../src/export/svg';
import type { El } from '../../src/export/scene';
import { decimals, expectClose } from '../helpers/tolerance';
import { chainModel, SYMPTOMS } from '../core/pictures/fixtures';

function all(el: El, pred: (e: El) => boolean, out: El[] = []): El[] {
  if (pred(el)) out.push(el);
  for (const c of el.children ?? []) if (typeof c !== 'string') all(c, pred, out);
  return out;
}

describe('figures of the pictures', () => {
  const r = picturesAt(chainModel(0.8, 1), { interval: 3, samples: 70, persons: 150, observed: SYMPTOMS });
  if (!r.ok) throw new Error(r.reason);
  const P = r.pictures;
  const model = chainModel(0.8, 1);

  it('the factor figure draws one bar per variable with its loading, and the fit', () => {
    const f = factorFigure(model, P.levels.observed, P.byLevel.between, { heading: true, caption: 'model-based' });
    const bars = all(f, (e) => e.attrs['data-loading'] !== undefined);
    expect(bars.map((b) => b.attrs['data-variable'])).toEqual(SYMPTOMS);
    bars.forEach((b, i) => expectClose(Number(b.attrs['data-loading']), P.byLevel.between.oneFactor!.loadings[i][0], decimals(4)));
    const svg = svgDocument(f);
    expect(svg).toContain('RMSEA');
    expect(svg).toContain('model-based');
  });

  it('the lagged matrix figure shows every cell and every singular value', () => {
    const f = laggedMatrixFigure(model, P.rankLong);
    expect(all(f, (e) => e.attrs['data-cell'] !== undefined)).toHaveLength(16);
    expect(all(f, (e) => e.attrs['data-singular'] !== undefined)).toHaveLength(4);
  });

  it('the rank curve marks the study interval, and the within network shows its links', () => {
    const f = rankCurveFigure(model, P);
    expect(all(f, (e) => e.attrs['data-series'] !== undefined)).toHaveLength(2);
    expect(all(f, (e) => e.attrs['data-mark'] === "the study's interval")).toHaveLength(1);
    const n = withinNetworkFigure(model, P.within)!;
    expect(all(n, (e) => e.attrs['data-edge'] !== undefined).length).toBeGreaterThan(3);
  });
});
