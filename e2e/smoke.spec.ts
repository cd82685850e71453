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
  await expect(page.getByText('Results are hypotheses')).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('app.png') });
  expect(errors).toEqual([]);
});
