import { execFileSync } from 'node:child_process';
import { holdFromPane } from './helpers/steps';
import { expect, test } from '@playwright/test';

/** What the command line says about the same intervention at the same interval. */
function commuteCli(model: string, hold: string, interval: string): { agree: boolean; differences: { kind: string }[] } {
  const out = execFileSync('npx', ['tsx', 'src/cli/main.ts', 'commute', model, '--hold', hold, '--interval', interval, '--json'], { encoding: 'utf8' });
  return JSON.parse(out);
}

test('holding a variable at a long interval: the commutation verdict matches the command line', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=greenhouse');
  const slider = page.getByRole('slider', { name: /sampling interval/i });
  await expect(slider).toBeVisible();
  await slider.focus();
  await page.keyboard.press('End');
  const valueText = (await slider.getAttribute('aria-valuetext')) ?? '';
  const interval = valueText.replace(/^every\s+/, '');
  // the longest interval the example's study allows (its 30 days of readings): weeks, not minutes
  expect(interval).toMatch(/week|month|year/);

  const holdForm = await holdFromPane(page, 'Transpiration', '0.1');

  const verdict = page.locator('.lf-commute-verdict');
  await expect(verdict).toBeVisible();
  const cli = commuteCli('src/examples/greenhouse.json', 'transpiration=0.1', interval);
  await expect(verdict).toHaveAttribute('data-agree', String(cli.agree));
  // Holding transpiration cuts the feedback through which soil water settles (its balance is
  // irrigation − transpiration): the two orders cannot agree.
  expect(cli.agree).toBe(false);
  await expect(page.locator('.lf-intervene')).toContainText('soilWater');
  await page.screenshot({ path: testInfo.outputPath('intervene-greenhouse.png') });

  await holdForm.getByRole('button', { name: 'Release' }).click();
  await expect(holdForm).toContainText('Nothing is held');
  expect(errors).toEqual([]);
});
