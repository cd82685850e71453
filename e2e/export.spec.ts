import { expect, test, type Page } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const MODEL_PATH = fileURLToPath(new URL('../src/examples/sleep-stress.json', import.meta.url));

/** Width and height from a PNG's IHDR chunk (PNG specification, ISO/IEC 15948 §11.2.2). */
function pngSize(buf: Buffer): { width: number; height: number } {
  expect(buf.subarray(1, 4).toString('latin1')).toBe('PNG');
  return { width: buf.readUInt32BE(16), height: buf.readUInt32BE(20) };
}

/** The sleep–stress example's timescale view at its seventh band (a simultaneous block, lagged links and a frozen variable). */
async function openBandWithBlock(page: Page, view: 'ordering' | 'unrolled') {
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  const slider = page.getByRole('slider', { name: 'Sampling interval' });
  await slider.focus();
  await page.keyboard.press('Home');
  for (let i = 0; i < 6; i++) await page.keyboard.press('PageUp');
  if (view === 'unrolled') await page.getByRole('button', { name: 'Three instants' }).click();
  await page.getByRole('button', { name: 'Export', exact: true }).click(); // the export row under the toolbar
  return slider;
}

for (const view of ['ordering', 'unrolled'] as const) {
  test(`the app's ${view} export is the file \`loopfold render\` writes for the same interval`, async ({ page }, testInfo) => {
    page.on('pageerror', (e) => console.log('pageerror', e.message));
    page.on('console', (m) => { if (m.type() === 'error') console.log('console', m.text()); });
    const slider = await openBandWithBlock(page, view);
    const interval = (await slider.getAttribute('data-interval'))!;
    await page.getByLabel('laid out').selectOption('fresh');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
    const appFile = testInfo.outputPath(`app-${view}.svg`);
    await download.saveAs(appFile);
    const cliFile = testInfo.outputPath(`cli-${view}.svg`);
    const r = spawnSync('npm', ['run', '-s', 'loopfold', '--', 'render', MODEL_PATH, '--interval', interval, '--view', view, '--caption', '--out', cliFile], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const app = readFileSync(appFile, 'utf8');
    expect(app).toContain('data-variable="stress"');
    expect(app).toBe(readFileSync(cliFile, 'utf8'));

    const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: '2×' }).click()]);
    const pngFile = testInfo.outputPath(`app-${view}@2x.png`);
    await png.saveAs(pngFile);
    const w = Number(/width="(\d+)"/.exec(app)![1]);
    const h = Number(/height="(\d+)"/.exec(app)![1]);
    expect(pngSize(readFileSync(pngFile))).toEqual({ width: 2 * w, height: 2 * h });
  });
}

test("the app's export of the mechanism is the file `loopfold render --view mechanism` writes", async ({ page }, testInfo) => {
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await page.getByRole('button', { name: 'Export', exact: true }).click(); // the export row under the toolbar
  await page.getByLabel('Export figure of').selectOption('mechanism');
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
  const appFile = testInfo.outputPath('app-mechanism.svg');
  await download.saveAs(appFile);
  const cliFile = testInfo.outputPath('cli-mechanism.svg');
  const r = spawnSync('npm', ['run', '-s', 'loopfold', '--', 'render', MODEL_PATH, '--view', 'mechanism', '--out', cliFile], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  const app = readFileSync(appFile, 'utf8');
  for (const id of ['workload', 'stress', 'cortisol', 'rumination', 'sleepDebt', 'mood', 'coping']) expect(app).toContain(`data-variable="${id}"`);
  expect(app).toBe(readFileSync(cliFile, 'utf8'));
});

/**
 * Share of pixels that differ by more than `tol` (0–255) in any channel
 * between two PNG images of the same size, counted in the page with a
 * canvas (no image library needed); null when the sizes differ.
 */
async function pixelDifference(page: Page, a: Buffer, b: Buffer, tol = 48): Promise<{ share: number; width: number; height: number } | null> {
  return page.evaluate(async ([a64, b64, t]) => {
    const load = async (d: string) => { const i = new Image(); i.src = `data:image/png;base64,${d}`; await i.decode(); return i; };
    const [ia, ib] = await Promise.all([load(a64), load(b64)]);
    if (ia.width !== ib.width || ia.height !== ib.height) return null;
    const px = (i: HTMLImageElement) => { const c = document.createElement('canvas'); c.width = i.width; c.height = i.height; const g = c.getContext('2d')!; g.drawImage(i, 0, 0); return g.getImageData(0, 0, i.width, i.height).data; };
    const pa = px(ia), pb = px(ib);
    let diff = 0;
    for (let k = 0; k < pa.length; k += 4) {
      if (Math.abs(pa[k] - pb[k]) > t || Math.abs(pa[k + 1] - pb[k + 1]) > t || Math.abs(pa[k + 2] - pb[k + 2]) > t) diff++;
    }
    return { share: diff / (ia.width * ia.height), width: ia.width, height: ia.height };
  }, [a.toString('base64'), b.toString('base64'), tol] as const);
}

test.describe('the exported figure is the picture on screen', () => {
  // room for the figure at its natural size (zoom 1:1), so no part is scrolled out of the pane
  test.use({ viewport: { width: 4200, height: 1600 } });
  for (const view of ['ordering', 'unrolled'] as const) {
    test(`${view}: a screenshot of the exported SVG matches a screenshot of the figure in the app`, async ({ page, context }, testInfo) => {
      // tall enough for the whole figure at 1:1 inside the side pane (a clipped figure is not the picture)
      await page.setViewportSize({ width: 3000, height: 1400 });
      await openBandWithBlock(page, view);
      const figure = page.getByRole('figure', { name: view === 'unrolled' ? 'The ordering over three instants' : 'The ordering at the interval' });
      await expect(figure).toHaveAttribute('data-layout', 'elk');
      await expect(figure).toHaveAttribute('data-pending', 'false');
      // 1:1, the exported file's own size (Fit scales the figure to the pane)
      await page.getByRole('group', { name: /^Zoom: / }).getByRole('button', { name: /actual size/ }).click();
      await expect(figure).toHaveAttribute('data-scale', '1.000');
      // the zoom buttons float over the figure's corner: not part of the figure
      // and the box shows the whole figure at 1:1 instead of scrolling it
      await page.addStyleTag({ content: '.lf-zoom { visibility: hidden; } .lf-view { max-height: none !important; overflow: visible !important; contain: none !important; }' });
      // the tuned layout animates in: wait until the drawing stands still
      let before = '';
      await expect.poll(async () => { const now = await figure.innerHTML(); const still = now === before; before = now; return still; }, { intervals: [400] }).toBe(true);

      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
      const file = testInfo.outputPath(`exported-${view}.svg`);
      await download.saveAs(file);
      const svg = readFileSync(file, 'utf8').replace(/^<\?xml[^>]*>\s*/, '');
      expect(svg).toContain('data-part="figure"');

      // the exported file in a page of its own, at its natural size and the on-screen sub-pixel offset
      const shown = await figure.locator('svg').first().evaluate((e) => { const r = e.getBoundingClientRect(); return { x: r.x, y: r.y, width: r.width }; });
      expect(shown.width).toBe(Number(/width="(\d+)"/.exec(svg)![1]));
      const other = await context.newPage();
      await other.setContent(`<!doctype html><body style="margin:0;padding:${(shown.y % 1).toFixed(3)}px 0 0 ${(shown.x % 1).toFixed(3)}px;background:#fff">${svg}</body>`);
      await other.locator('svg').first().evaluate((e) => { (e as SVGElement).style.display = 'block'; });
      const onScreen = await figure.locator('[data-part="figure"]').screenshot({ path: testInfo.outputPath(`screen-${view}.png`) });
      const exported = await other.locator('[data-part="figure"]').screenshot({ path: testInfo.outputPath(`export-${view}.png`) });
      const d = await pixelDifference(other, onScreen, exported);
      expect(d, 'the two pictures have different sizes').not.toBeNull();
      expect(d!.width * d!.height).toBeGreaterThan(40_000);
      // anti-aliasing may differ on a few edge pixels; a moved node or link changes thousands
      expect(d!.share).toBeLessThan(0.003);
      await other.close();
    });
  }
});
