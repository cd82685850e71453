/**
 * Presentation mode on a 1024 × 768 projector: the ordering figure, the
 * interval and the explanation large; the keys step the band; Escape leaves;
 * no WCAG 2.1 AA violations (axe-core, injected as the other specs do).
 */
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');
type AxeResult = { violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] };
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  }) as AxeResult;
  return r.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

test.use({ viewport: { width: 1024, height: 768 } });

test('presentation mode shows the ordering, the interval and the explanation large; keys step the band; Escape leaves', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  await page.goto('/?example=sleep-stress');
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await page.getByRole('button', { name: 'Present' }).click();
  const present = page.getByRole('dialog', { name: 'Presentation' });
  await expect(present).toBeVisible();
  const host = present.locator('.lf-view-canvas');
  await expect(host).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
  await page.waitForTimeout(500);
  // large: the interval at least 24 px, the figure drawn bigger than in the side pane, whole in the window
  const value = present.locator('.lf-present-value');
  expect(parseFloat(await value.evaluate((e) => getComputedStyle(e).fontSize))).toBeGreaterThanOrEqual(24);
  expect(parseFloat(await present.locator('.lf-explain').evaluate((e) => getComputedStyle(e).fontSize))).toBeGreaterThanOrEqual(16);
  const fig = await host.evaluate((h) => { const s = h.querySelector('svg')!.getBoundingClientRect(); return { scale: Number(h.getAttribute('data-scale')), bottom: s.bottom, right: s.right }; });
  expect(fig.scale).toBeGreaterThanOrEqual(0.6);
  expect(fig.right).toBeLessThanOrEqual(1024);
  await page.screenshot({ path: testInfo.outputPath('present-1024.png') });

  // the band keys
  const band = () => value.getAttribute('data-band').then(Number);
  const bands = Number((await present.locator('.lf-present-band').textContent())!.match(/of (\d+)/)![1]);
  await page.keyboard.press('Home');
  await expect.poll(band).toBe(0);
  await page.keyboard.press('ArrowRight');
  await expect.poll(band).toBe(1);
  await page.keyboard.press('PageUp');
  await expect.poll(band).toBe(2);
  await page.keyboard.press('PageDown');
  await expect.poll(band).toBe(1);
  await page.keyboard.press('ArrowLeft');
  await expect.poll(band).toBe(0);
  await page.keyboard.press('End');
  await expect.poll(band).toBe(bands - 1);
  // the figure follows the band
  await expect(present.locator('.lf-timescale')).toHaveAttribute('data-band', String(bands - 1), { timeout: 60_000 });
  await expect(host).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
  await page.waitForTimeout(500);
  await page.screenshot({ path: testInfo.outputPath('present-1024-longest.png') });
  expect(await axeViolations(page)).toEqual([]);

  // the editor's shortcuts do not act behind it (Delete with a variable picked)
  await page.keyboard.press('Escape');
  await expect(present).toBeHidden();
  await page.locator('.react-flow__node[data-id="mood"]').click();
  await page.keyboard.press('p');
  await expect(present).toBeVisible();
  await page.keyboard.press('Delete');
  await page.keyboard.press('Escape');
  await expect(present).toBeHidden();
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  expect(await page.evaluate(() => document.fullscreenElement)).toBeNull();
});
