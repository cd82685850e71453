import { expect, test } from '@playwright/test';

test('the app loads without console errors', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/');
  await expect(page.getByRole('heading', { name: 'Loopfold' })).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('app.png') });
  expect(errors).toEqual([]);
});
