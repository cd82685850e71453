import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';

test('the app loads the sleep–stress example without console errors', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=sleep-stress');
  await expect(page.getByRole('heading', { name: 'Loopfold' })).toBeVisible();
  // seven variables of the example, drawn as canvas nodes with accessible names
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText('no clinical advice');
  await expect(page.getByText('Results are model-based hypotheses')).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('app.png') });
  expect(errors).toEqual([]);
});

test('the gallery lists every example; opening one replaces the canvas and shows its caution only when it has one', async ({ page }, testInfo) => {
  await page.goto('/');
  await page.getByRole('button', { name: 'Examples' }).click();
  const gallery = page.getByRole('dialog', { name: 'Examples' });
  await expect(gallery).toBeVisible();
  // the registry's titles and ids, read from its source (the JSON models need a bundler to import)
  const source = readFileSync(new URL('../src/examples/index.ts', import.meta.url), 'utf8');
  const EXAMPLES = [...source.matchAll(/id: '([^']+)',\s*title: '([^']+)'/g)].map((m) => ({ id: m[1], title: m[2] }));
  expect(EXAMPLES.length).toBeGreaterThan(0);
  await expect(gallery.locator('.lf-gallery li')).toHaveCount(EXAMPLES.length);
  for (const e of EXAMPLES) await expect(gallery.getByRole('heading', { name: e.title })).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('gallery.png') });
  const other = EXAMPLES.find((e) => e.id !== 'sleep-stress');
  if (other) {
    await gallery.getByRole('button', { name: `Open the example ${other.title}` }).click();
    await expect(gallery).toBeHidden();
    await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
    const hasCaution = await page.evaluate(() => window.__loopfold!.model().caution !== undefined);
    await expect(page.getByRole('note', { name: 'Caution' })).toHaveCount(hasCaution ? 1 : 0);
    await page.screenshot({ path: testInfo.outputPath(`${other.id}.png`) });
  }
  await page.getByRole('button', { name: 'Examples' }).click();
  await gallery.getByRole('button', { name: 'Open the example Sleep, stress and mood' }).click();
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText('no clinical advice');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await page.screenshot({ path: testInfo.outputPath('timescales-tab.png') });
});
