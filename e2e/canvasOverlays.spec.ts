/**
 * The canvas's overlays (the notation key, the zoom and fit buttons, the overview map) never cover
 * a node after Fit: for every example at 1024 × 768 (a projector) and 1440 × 900, once on load and
 * once after the fit button, no variable's or relation's box intersects an overlay's box.
 */
import { expect, test, type Page } from '@playwright/test';

const EXAMPLES = ['sleep-stress', 'lake', 'greenhouse', 'warehouse', 'evening-unrest'];
const SIZES = [{ width: 1024, height: 768 }, { width: 1440, height: 900 }];

/** Pairs "node × overlay" whose boxes intersect, with their boxes, for the report. */
async function covered(page: Page): Promise<string[]> {
  return page.locator('.lf-canvas').evaluate((canvas) => {
    const box = (el: Element) => el.getBoundingClientRect();
    const overlays = [...canvas.querySelectorAll('.react-flow__panel')]
      .map((el) => ({ name: el.getAttribute('aria-label') ?? el.className, r: box(el) }))
      .filter((o) => o.r.width > 0 && o.r.height > 0);
    const pane = box(canvas);
    const out: string[] = [];
    for (const n of canvas.querySelectorAll('.react-flow__node')) {
      const r = box(n);
      // a node entirely outside the pane is reached by panning (a drawing fitted at the legibility floor)
      if (r.right <= pane.left || r.left >= pane.right || r.bottom <= pane.top || r.top >= pane.bottom) continue;
      for (const o of overlays) {
        if (r.left < o.r.right && o.r.left < r.right && r.top < o.r.bottom && o.r.top < r.bottom) {
          const f = (q: DOMRect) => `${q.left.toFixed(0)},${q.top.toFixed(0)}–${q.right.toFixed(0)},${q.bottom.toFixed(0)}`;
          out.push(`"${n.getAttribute('aria-label') ?? n.getAttribute('data-id')}" [${f(r)}] under ${o.name} [${f(o.r)}]`);
        }
      }
    }
    return out;
  });
}

for (const size of SIZES) {
  test.describe(`${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    test('no overlay covers a node after Fit, for every example', async ({ page }, testInfo) => {
      test.setTimeout(240_000);
      const found: Record<string, string[]> = {};
      for (const id of EXAMPLES) {
        await page.goto(`/?example=${id}`);
        await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
        await page.waitForTimeout(900);
        const onLoad = await covered(page);
        await page.locator('.lf-canvas').getByRole('button', { name: /fit/i }).first().click();
        await page.waitForTimeout(600);
        const afterFit = await covered(page);
        await page.screenshot({ path: testInfo.outputPath(`overlays-${size.width}-${id}.png`) });
        if (onLoad.length) found[`${id} on load`] = onLoad;
        if (afterFit.length) found[`${id} after Fit`] = afterFit;
      }
      expect(found).toEqual({});
    });
  });
}
