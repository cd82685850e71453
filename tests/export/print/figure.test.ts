/**
 * Figures for print: the smallest text at each column preset for every
 * example figure (measured from the written SVG by Python's XML parser),
 * palettes (greyscale keeps settled and dynamic states apart by their fill),
 * the PNG's resolution chunk (read by Python), the PDF's embedded fonts (read
 * by poppler's pdffonts), and the figure options as the command line takes them.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { bands } from '../../../src/core/ordering/index';
import { EXAMPLES } from '../../../src/examples/index';
import { printView } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, parseWidth, WIDTH_PRESETS, type PrintOptions } from '../../../src/export/print/options';
import { printMultiples } from '../../../src/export/print/multiples';
import { svgDocument } from '../../../src/export/svg';
import { figureToPdf } from '../../../src/cli/output/pdf';
import { svgToPng } from '../../../src/cli/output/raster';
import { bandInterval } from '../../../src/report/html';
import { luminance, PALETTE_TOKENS } from '../../../src/theme/palettes';
import { decimals, expectClose } from '../../helpers/tolerance';
import { runPython } from '../../helpers/python';
import { cachedLayouts } from '../../helpers/examples';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const PHYS = fileURLToPath(new URL('./png_phys.py', import.meta.url));

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(id);
  return r.model;
}

const layoutOf = cachedLayouts();

describe('figures at print size', () => {
  it('every example figure (ordering in every band, three instants, mechanism) keeps its text at 7 pt or more at each column preset, or says it does not fit', async () => {
    const cases: { name: string; svg: string; notes: string[]; preset: string; view: string }[] = [];
    for (const ex of EXAMPLES) {
      const model = example(ex.id);
      const intervals = bands(model).map(bandInterval);
      for (const [preset, mm] of Object.entries(WIDTH_PRESETS)) {
        const opts: PrintOptions = { width: { mm }, caption: undefined };
        for (const interval of intervals) {
          const f = await printView({ model, view: 'ordering', design: { interval }, caption: true }, opts, layoutOf);
          cases.push({ name: `${ex.id} ordering ${interval} ${preset}`, svg: svgDocument(f.root), notes: f.notes, preset, view: 'ordering' });
        }
        for (const interval of [intervals[0], intervals[intervals.length - 1]]) {
          const f = await printView({ model, view: 'unrolled', design: { interval } }, opts, layoutOf);
          cases.push({ name: `${ex.id} unrolled ${interval} ${preset}`, svg: svgDocument(f.root), notes: f.notes, preset, view: 'unrolled' });
        }
      }
    }
    const measured = runPython<{ widthPt: number; smallestPt: number }[]>(MEASURE, cases.map((c) => c.svg));
    const failures: string[] = [];
    cases.forEach((c, i) => {
      const m = measured[i];
      // the printed width is the preset's (8.5, 11.4, 17.8 cm)
      expectClose(m.widthPt, (WIDTH_PRESETS[c.preset as keyof typeof WIDTH_PRESETS] * 72) / 25.4, decimals(1), c.name);
      const says = c.notes.some((n) => /does not fit .* legibly/.test(n));
      // a figure under 7 pt must say so; one that says so must be under 7 pt
      expect(says, `${c.name}: ${m.smallestPt.toFixed(2)} pt, notes ${c.notes.join('; ')}`).toBe(m.smallestPt < MIN_TEXT_PT - 1e-6);
      if (m.smallestPt < MIN_TEXT_PT - 1e-6) failures.push(`${c.name} ${m.smallestPt.toFixed(2)}`);
    });
    // the orderings at two columns are all legible
    const twoColumnOrderings = cases.filter((c) => c.preset === 'two-columns' && c.view === 'ordering');
    expect(failures.filter((f) => twoColumnOrderings.some((c) => f.startsWith(c.name)))).toEqual([]);
    // and most figures at every preset are (the rest say so): at most a quarter over all
    expect(failures.length, failures.join('\n')).toBeLessThanOrEqual(Math.floor(cases.length / 4));
  }, 900_000);

  it('small multiples of four intervals at two columns keep every text at 7 pt or more', async () => {
    const model = example('sleep-stress');
    // 10 min, 3 h, 1 day, 4 weeks in hours (the example's time unit)
    const f = await printMultiples({ model, intervals: [10 / 60, 3, 24, 28 * 24], design: {} }, { width: { mm: WIDTH_PRESETS['two-columns'] } }, layoutOf);
    const [m] = runPython<{ smallestPt: number; widthPt: number }[]>(MEASURE, [svgDocument(f.root)]);
    expect(m.smallestPt).toBeGreaterThanOrEqual(MIN_TEXT_PT);
    const svg = svgDocument(f.root);
    // four panels, one legend, one title
    expect(svg.match(/data-panel=/g)).toHaveLength(4);
    expect(svg.match(/data-part="legend"/g)).toHaveLength(1);
    expect(svg).toContain('Δ = 10 min');
    expect(svg).toContain('Δ = 4 weeks');
  }, 300_000);
});

describe('palettes', () => {
  it('greyscale tells settled from dynamic states by a fill at least 0.25 apart in relative luminance (WCAG 2.1 definition), frozen by its dashes', () => {
    const g = PALETTE_TOKENS.greyscale;
    expect(Math.abs(luminance(g.settledFill) - luminance(g.stateFill))).toBeGreaterThanOrEqual(0.25);
    // greys only: r = g = b
    for (const v of Object.values(g)) expect(v, v).toMatch(/^#([0-9a-f]{2})\1\1$/i);
    // WCAG 2.1 relative luminance of white and black (definition: 1 and 0)
    expectClose(luminance('#ffffff'), 1, decimals(12));
    expect(luminance('#000000')).toBe(0);
  });

  it('every palette names every token with a colour', () => {
    const names = Object.keys(PALETTE_TOKENS.default);
    for (const p of Object.values(PALETTE_TOKENS)) {
      expect(Object.keys(p).sort()).toEqual([...names].sort());
      for (const v of Object.values(p)) expect(v).toMatch(/^#[0-9a-f]{6}$/i);
    }
  });

  it('recolours a figure: a greyscale figure has no colour left in fills and strokes', async () => {
    const f = await printView({ model: example('sleep-stress'), view: 'ordering', design: { interval: 24 } }, { palette: 'greyscale', background: 'white' }, layoutOf);
    const colours = [...svgDocument(f.root).matchAll(/(?:fill|stroke)="(#[0-9a-f]{6})"/gi)].map((m) => m[1].toLowerCase());
    expect(colours.length).toBeGreaterThan(10);
    expect(colours.filter((c) => !/^#([0-9a-f]{2})\1\1$/.test(c))).toEqual([]);
  }, 120_000);
});

describe('files', () => {
  it('PNG: the resolution asked for is in the pHYs chunk (read by Python, CRCs checked), the size is width × dpi', async () => {
    const f = await printView({ model: example('lake'), view: 'ordering', design: { interval: 24 } }, { width: { mm: 85 } }, layoutOf);
    const png = svgToPng(svgDocument(f.root), Math.round((85 / 25.4) * 600), 600);
    const [r] = runPython<{ width: number; dpiX: number; dpiY: number; unit: number; crcOk: boolean; chunks: string[] }[]>(PHYS, [Buffer.from(png).toString('base64')]);
    expect(r.crcOk).toBe(true);
    expect(r.chunks[0]).toBe('IHDR');
    expect(r.chunks[1]).toBe('pHYs');
    expect(r.chunks.filter((c) => c === 'pHYs')).toHaveLength(1);
    expect(r.unit).toBe(1);
    // 600 dpi = 23622 px/m (rounded), read back as 599.99 dpi
    expectClose(r.dpiX, 600, decimals(1));
    expectClose(r.dpiY, 600, decimals(1));
    // 8.5 cm at 600 dpi: 85 / 25.4 × 600 = 2007.9 → 2008 pixels
    expect(r.width).toBe(2008);
  }, 120_000);

  it('PDF: every font is embedded (poppler\'s pdffonts), DejaVu Sans, and the page is the figure\'s width', async () => {
    const f = await printView({ model: example('greenhouse'), view: 'ordering', design: { interval: 1 } }, { width: { mm: 178 } }, layoutOf);
    const pdf = await figureToPdf(f.root, (178 * 72) / 25.4, 'test');
    const dir = mkdtempSync(join(tmpdir(), 'lf-pdf-'));
    const file = join(dir, 'f.pdf');
    writeFileSync(file, pdf);
    const fonts = spawnSync('pdffonts', [file], { encoding: 'utf8' });
    expect(fonts.status, fonts.stderr).toBe(0);
    const rows = fonts.stdout.trim().split('\n').slice(2);
    expect(rows.length).toBeGreaterThanOrEqual(2);
    for (const row of rows) {
      // columns: name, type, encoding, emb, sub, uni, object ID
      const cols = row.trim().split(/\s+/);
      expect(cols[0]).toMatch(/^[A-Z]{6}\+DejaVuSans(-Bold)?$/);
      expect(cols[cols.length - 5], row).toBe('yes');
    }
    const info = spawnSync('pdfinfo', [file], { encoding: 'utf8' });
    // 178 mm = 504.57 pt
    expect(info.stdout).toMatch(/Page size:\s+504\.5\d* x /);
  }, 120_000);

  it('widths parse as presets and lengths; nonsense is refused naming the option', () => {
    expect(parseWidth('column')).toEqual({ ok: true, value: { mm: 85, preset: 'column' } });
    expect(parseWidth('1.5-column')).toEqual({ ok: true, value: { mm: 114, preset: 'column-and-half' } });
    expect(parseWidth('two-columns')).toEqual({ ok: true, value: { mm: 178, preset: 'two-columns' } });
    expect(parseWidth('11.4cm')).toEqual({ ok: true, value: { mm: 114 } });
    expect(parseWidth('800px')).toEqual({ ok: true, value: { px: 800 } });
    const bad = parseWidth('wide');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.message).toMatch(/^--width: "wide" is not a width/);
  });
});
