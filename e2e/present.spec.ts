/**
 * Presentation mode at 1440×900 and 1024×768: it goes full screen (headless Chromium grants it to a
 * click or a key press), shows the ordering whole inside the window, and Escape leaves it and leaves full
 * screen, the focus back on the control that opened it. Screenshots are kept in the test output.
 */
import { expect, test } from '@playwright/test';

for (const size of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  test.describe(`${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    test('presentation mode goes full screen, shows the figure whole, and Escape leaves both', async ({ page }, testInfo) => {
      test.setTimeout(180_000);
      await page.goto('/?example=lake');
      await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
      await page.getByRole('tab', { name: 'Timescales' }).click();
      const opener = page.getByRole('button', { name: 'Present' });
      await opener.click();
      const present = page.getByRole('dialog', { name: 'Presentation' });
      await expect(present).toBeVisible();
      await expect.poll(() => page.evaluate(() => document.fullscreenElement?.className ?? null)).toBe('lf-present');
      const host = present.locator('.lf-view-canvas');
      await expect(host).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
      await page.waitForTimeout(600);
      // the figure whole inside the window, the interval and the explanation large
      const box = await host.evaluate((h) => { const s = h.querySelector('svg')!.getBoundingClientRect(); return { left: s.left, right: s.right, top: s.top, bottom: s.bottom, scale: Number(h.getAttribute('data-scale')) }; });
      expect(box.left).toBeGreaterThanOrEqual(0);
      expect(box.right).toBeLessThanOrEqual(size.width);
      expect(box.scale).toBeGreaterThanOrEqual(0.6);
      expect(parseFloat(await present.locator('.lf-present-value').evaluate((e) => getComputedStyle(e).fontSize))).toBeGreaterThanOrEqual(24);
      await page.screenshot({ path: testInfo.outputPath(`present-${size.width}.png`) });
      await page.keyboard.press('End');
      await expect(present.locator('.lf-timescale')).toHaveAttribute('data-band', /\d+/);
      await expect(host).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
      await page.waitForTimeout(600);
      await page.screenshot({ path: testInfo.outputPath(`present-${size.width}-longest.png`) });
      await page.locator('.lf-present .lf-view-canvas svg').first().screenshot({ path: testInfo.outputPath(`present-${size.width}-longest-figure.png`) });
      // nodes at least 4 px apart on the page (a block's members included)
      const close = await host.evaluate((h) => {
        const rs = [...h.querySelectorAll('g[data-node]')].map((g) => ({ id: g.getAttribute('data-node'), r: g.getBoundingClientRect() }));
        const out: string[] = [];
        for (let i = 0; i < rs.length; i++) for (let j = i + 1; j < rs.length; j++) {
          const a = rs[i].r, b = rs[j].r;
          const gap = Math.max(b.left - a.right, a.left - b.right, b.top - a.bottom, a.top - b.bottom);
          if (gap < 4) out.push(`${rs[i].id}/${rs[j].id} ${gap.toFixed(1)} px`);
        }
        return out;
      });
      expect(close).toEqual([]);
      // Escape leaves the presentation and full screen; the focus goes back to Present
      await page.keyboard.press('Escape');
      await expect(present).toBeHidden();
      await expect.poll(() => page.evaluate(() => document.fullscreenElement)).toBeNull();
      await expect(opener).toBeFocused();
      // the P key opens it again (full screen too), and Escape leaves both again
      await page.locator('.react-flow__pane').click({ position: { x: 20, y: 200 } });
      await page.keyboard.press('p');
      await expect(present).toBeVisible();
      await expect.poll(() => page.evaluate(() => document.fullscreenElement?.className ?? null)).toBe('lf-present');
      await page.keyboard.press('Escape');
      await expect(present).toBeHidden();
      await expect.poll(() => page.evaluate(() => document.fullscreenElement)).toBeNull();
    });
  });
}
