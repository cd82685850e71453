/**
 * The unit labels under the interval track never overlap: for every example at 1024 × 768 and
 * 1440 × 900, the boxes of the labels shown are at least 6 px apart and inside the control.
 */
import { expect, test } from '@playwright/test';

const EXAMPLES = ['sleep-stress', 'lake', 'greenhouse', 'warehouse', 'evening-unrest'];
const SIZES = [{ width: 1024, height: 768 }, { width: 1440, height: 900 }];
/** Two labels closer than about one character (11 px text) read as one phrase ("1 week 1 month"). */
const MIN_GAP_PX = 6;

for (const size of SIZES) {
  test.describe(`${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    test('no two unit labels of the interval track overlap, for every example', async ({ page }, testInfo) => {
      const found: Record<string, string[]> = {};
      for (const id of EXAMPLES) {
        await page.goto(`/?example=${id}`);
        await expect(page.locator('.lf-interval-scale')).toBeVisible({ timeout: 30_000 });
        await page.waitForTimeout(300);
        const res = await page.locator('.lf-interval-scale').evaluate((scale, GAP) => {
          // every element that carries text of its own (a label), whatever the markup
          const labels = [...scale.querySelectorAll('*')].filter((el) => [...el.childNodes].some((n) => n.nodeType === 3 && n.textContent!.trim() !== ''));
          const boxes = labels.map((el) => ({ text: el.textContent!.trim(), r: el.getBoundingClientRect() }));
          const control = scale.closest('.lf-interval')!.getBoundingClientRect();
          const bad: string[] = [];
          for (let i = 0; i < boxes.length; i++) {
            const a = boxes[i];
            if (a.r.left < control.left || a.r.right > control.right) bad.push(`"${a.text}" runs past the control`);
            for (let j = i + 1; j < boxes.length; j++) {
              const b = boxes[j];
              if (a.r.left < b.r.right + GAP && b.r.left < a.r.right + GAP && a.r.top < b.r.bottom && b.r.top < a.r.bottom) bad.push(`"${a.text}" [${a.r.left.toFixed(1)}–${a.r.right.toFixed(1)}] overlaps or touches "${b.text}" [${b.r.left.toFixed(1)}–${b.r.right.toFixed(1)}]`);
            }
          }
          return { bad, shown: boxes.map((b) => b.text) };
        }, MIN_GAP_PX);
        expect(res.shown.length, `${id}: some unit label is shown`).toBeGreaterThan(0);
        if (res.bad.length) found[id] = res.bad;
        await page.locator('.lf-interval').screenshot({ path: testInfo.outputPath(`scale-${size.width}-${id}.png`) });
      }
      expect(found).toEqual({});
    });
  });
}
