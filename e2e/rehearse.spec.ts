import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');
type AxeResult = { violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] };

/** WCAG 2.1 A and AA rules of axe-core over the page as it is now (as in data.spec.ts). */
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  }) as AxeResult;
  return r.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

test('Rehearse tab: analytic power as the command line gives it, Monte Carlo runs and stops on Cancel, no axe violations', async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  const cli = JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'power', 'src/examples/sleep-stress.json', '--link', 'coping->stress', '--json'], { encoding: 'utf8' })) as { links: { from: string; to: string; effect: number; se: number; power: number; centringBias: number; expectedEstimate: number }[] };
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Rehearse' }).click();
  await expect(page.getByRole('note').filter({ hasText: 'no clinical advice' }).first()).toBeVisible();
  const table = page.getByTestId('rehearse-analytic');
  await expect(table).toBeVisible({ timeout: 60_000 });
  const row = table.locator('tr[data-link="coping>stress"]');
  for (const [attr, k] of [['effect', 'effect'], ['se', 'se'], ['power', 'power'], ['bias', 'centringBias'], ['expected', 'expectedEstimate']] as const) {
    const app = Number(await row.getAttribute(`data-${attr}`));
    expect(Math.abs(app - cli.links[0][k])).toBeLessThan(1e-12 + 1e-9 * Math.abs(cli.links[0][k]));
  }
  await expect(table).toContainText('Bias of centring');
  await expect(page.getByTestId('rehearse-short')).toContainText('Short series');
  await expect(page.getByTestId('rehearse-statement')).toContainText(/Recommended|No affordable design/);
  await expect(page.locator('svg[data-chart="power-curve"]').first()).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('rehearse-1440.png') });

  await page.getByLabel('Replications').fill('24');
  await page.getByRole('button', { name: 'Run Monte Carlo' }).click();
  const mc = page.getByTestId('rehearse-mc');
  await expect(mc).toBeVisible({ timeout: 120_000 });
  await expect(mc).toContainText('24 simulated studies');
  await expect(mc).toContainText('Expected (analytic)');
  await expect(page.getByTestId('rehearse-mc-trust')).toContainText('Which to trust');
  await expect(page.getByLabel('Analysis of each simulated study')).toHaveValue('var');
  const p = Number(await mc.locator('tr[data-link="coping>stress"]').getAttribute('data-power'));
  expect(p).toBeGreaterThanOrEqual(0);
  expect(p).toBeLessThanOrEqual(1);
  await mc.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('rehearse-mc-1440.png') });

  await page.getByLabel('Replications').fill('5000');
  await page.getByRole('button', { name: 'Run Monte Carlo' }).click();
  await expect(page.getByRole('progressbar', { name: 'Progress of the Monte Carlo run' })).toBeVisible();
  await page.getByRole('button', { name: 'Cancel' }).click();
  await expect(page.getByTestId('rehearse-mc-cancelled')).toBeVisible({ timeout: 15_000 });

  const download = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Download a simulated study (CSV)' }).click();
  await download;
  await expect(page.getByTestId('rehearse-csv-message')).toContainText('exact discrete model');

  expect(await axeViolations(page)).toEqual([]);
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.getByTestId('rehearse-plan-interval').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('rehearse-1024.png') });
  expect(errors).toEqual([]);
});

test('Rehearse tab: a nonlinear model\'s simulated study is integrated by Euler–Maruyama and says so', async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/?example=warehouse');
  await page.getByRole('tab', { name: 'Rehearse' }).click();
  const download = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Download a simulated study (CSV)' }).click();
  await download;
  await expect(page.getByTestId('rehearse-csv-message')).toContainText(/Euler–Maruyama on the model's own nonlinear rates, with steps of at most/, { timeout: 60_000 });
});
