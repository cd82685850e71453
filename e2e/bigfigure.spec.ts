import { expect, test } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { generatedSketch } from '../tests/helpers/sketches';

const figure = 'figure[aria-label="The ordering at the interval"], [role=figure][aria-label="The ordering at the interval"]';

test('a big figure puts only the parts near the view on the page, and draws more as the view scrolls to them; its zoom buttons stay in view', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/');
  await page.waitForFunction(() => !!window.__loopfold);
  await page.evaluate((m) => window.__loopfold!.load(m), generatedSketch(300));
  await page.getByRole('tab', { name: 'Timescales' }).click();
  const fig = page.locator(figure);
  await expect(fig).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
  await page.screenshot({ path: testInfo.outputPath('big-figure-top.png') });

  // the whole figure, as the file export writes it (laid out as on screen)
  await page.getByRole('button', { name: 'Export', exact: true }).click(); // the export row under the toolbar
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
  const file = testInfo.outputPath('big-figure.svg');
  await download.saveAs(file);
  const svgText = readFileSync(file, 'utf8');
  // where each node sits in the file, in the figure's units (the file is drawn at one pixel per unit)
  const boxes = await page.evaluate((text) => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
    const holder = document.createElement('div');
    holder.style.cssText = 'position:absolute;left:0;top:0;visibility:hidden';
    holder.appendChild(document.importNode(doc.documentElement, true));
    document.body.appendChild(holder);
    const svg = holder.querySelector('svg')!;
    const o = svg.getBoundingClientRect();
    const out = [...svg.querySelectorAll('g[data-node]')].map((g) => {
      const r = g.getBoundingClientRect();
      return { id: g.getAttribute('data-node')!, x: r.left - o.left + r.width / 2, y: r.top - o.top + r.height / 2 };
    });
    holder.remove();
    return out;
  }, svgText);
  // every variable of the sketch is a node (none folded)
  expect(boxes.length).toBe(300);

  const drawn = () => fig.evaluate((f) => [...f.querySelectorAll('g[data-node]')].map((g) => g.getAttribute('data-node')!));
  const before = new Set(await drawn());
  // some of the figure is on the page, far from all of it
  expect(before.size).toBeGreaterThan(0);
  expect(before.size).toBeLessThan(boxes.length / 2);

  // the node farthest down of those not drawn: scroll the view to it
  const target = boxes.filter((b) => !before.has(b.id)).sort((a, b) => b.y - a.y)[0];
  await fig.evaluate((f, t) => {
    const svg = f.querySelector('svg')!;
    const scale = svg.getBoundingClientRect().width / Number(svg.getAttribute('viewBox')!.split(' ')[2]);
    const view = f.closest('.lf-view')!;
    const s = svg.getBoundingClientRect(), v = view.getBoundingClientRect();
    view.scrollTop += s.top + t.y * scale - v.top - v.height / 2;
    view.scrollLeft += s.left + t.x * scale - v.left - v.width / 2;
  }, target);
  await expect.poll(async () => (await drawn()).includes(target.id)).toBe(true);
  // drawn where the file has it, and in view
  const where = await fig.evaluate((f, id) => {
    const g = f.querySelector(`g[data-node="${CSS.escape(id)}"]`)!;
    const r = g.getBoundingClientRect(), v = f.closest('.lf-view')!.getBoundingClientRect();
    return r.bottom > v.top && r.top < v.bottom && r.right > v.left && r.left < v.right;
  }, target.id);
  expect(where).toBe(true);
  // what scrolled far out of view has left the page
  const after = new Set(await drawn());
  expect([...before].some((id) => !after.has(id))).toBe(true);
  // the zoom buttons stay in the view's corner however far it scrolled
  const fitButton = await page.getByRole('group', { name: 'Zoom: The ordering at the interval' }).getByRole('button', { name: 'Fit' }).boundingBox();
  const viewBox = await fig.evaluate((f) => { const r = f.closest('.lf-view')!.getBoundingClientRect(); return { x: r.x, y: r.y, width: r.width, height: r.height }; });
  expect(fitButton!.x).toBeGreaterThanOrEqual(viewBox.x);
  expect(fitButton!.y).toBeGreaterThanOrEqual(viewBox.y);
  expect(fitButton!.x + fitButton!.width).toBeLessThanOrEqual(viewBox.x + viewBox.width);
  expect(fitButton!.y + fitButton!.height).toBeLessThanOrEqual(viewBox.y + viewBox.height);
  await page.screenshot({ path: testInfo.outputPath('big-figure-scrolled.png') });
  expect(errors).toEqual([]);
});
