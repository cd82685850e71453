/**
 * Every example's figures against a normalised snapshot, so a restyle is
 * seen and approved rather than unnoticed. Normalised: ids (and the
 * references to them) re-indexed in order of appearance, numbers with more
 * than one decimal rounded to one. A changed figure is written beside its snapshot as
 * `<name>.actual.svg`; after looking at it, approve every change with
 *   LOOPFOLD_APPROVE=1 npx vitest run tests/export/svg.snapshots.test.ts
 * and commit tests/export/snapshots/.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseModel } from '../../src/core/model/schema';
import { renderFigure } from '../../src/cli/commands/render';
import { EXAMPLES } from '../../src/examples/index';

const DIR = fileURLToPath(new URL('./snapshots/', import.meta.url));
const APPROVE = process.env.LOOPFOLD_APPROVE === '1';

/** Ids re-indexed in order of first appearance, numbers of two or more decimals rounded to 0.1: what is left is the figure's structure and style. */
export function normaliseSvg(svg: string): string {
  const ids = new Map<string, string>();
  const idOf = (id: string) => {
    if (!ids.has(id)) ids.set(id, `id${ids.size}`);
    return ids.get(id)!;
  };
  return svg
    .replace(/\bid="([^"]+)"/g, (_m, id: string) => `id="${idOf(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_m, id: string) => `url(#${idOf(id)})`)
    .replace(/href="#([^"]+)"/g, (_m, id: string) => `href="#${idOf(id)}"`)
    .replace(/-?\d+\.\d{2,}(e[+-]?\d+)?/g, (x) => {
      const r = Math.round(Number(x) * 10) / 10;
      return String(Object.is(r, -0) ? 0 : r);
    })
    .replace(/>\s*</g, '>\n<');
}

describe('figures of the examples against their snapshots', () => {
  // the views a modeller exports most: the mechanism, and the ordering at a daily interval over two weeks
  const cases = EXAMPLES.flatMap((e) => [
    { name: `${e.id}-mechanism`, id: e.id, view: 'mechanism' as const, design: {} },
    { name: `${e.id}-ordering-daily`, id: e.id, view: 'ordering' as const, design: { samples: 14 } },
  ]);
  it.each(cases)('$name', async ({ name, id, view, design }) => {
    const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
    if (!r.ok) throw new Error(`the example ${id} does not load`);
    const unit = r.model.timeUnit;
    const perDay: Record<string, number> = { s: 86400, min: 1440, h: 24, day: 1, week: 1 / 7, month: 12 / 365.25, year: 1 / 365.25 };
    const d = view === 'ordering' ? { ...design, interval: perDay[unit] } : design;
    const actual = normaliseSvg(await renderFigure({ model: r.model, view, design: d, caption: true }));
    const expectedPath = `${DIR}${name}.svg`;
    const actualPath = `${DIR}${name}.actual.svg`;
    if (APPROVE || !existsSync(expectedPath)) {
      writeFileSync(expectedPath, actual);
      rmSync(actualPath, { force: true });
      return;
    }
    const expected = readFileSync(expectedPath, 'utf8');
    if (actual === expected) rmSync(actualPath, { force: true });
    else writeFileSync(actualPath, actual);
    expect(actual === expected, `${name}: the figure changed; compare ${actualPath} with ${expectedPath}, and approve with LOOPFOLD_APPROVE=1 if it is meant`).toBe(true);
  });

  it('normalising keeps structure and drops only ids and sub-decimal noise', () => {
    const a = normaliseSvg('<svg><marker id="lf-head-7"/><path d="M1.2345,2 L3.06,4" marker-end="url(#lf-head-7)"/></svg>');
    expect(a).toBe('<svg>\n<marker id="id0"/>\n<path d="M1.2,2 L3.1,4" marker-end="url(#id0)"/>\n</svg>');
  });
});
