import { execFileSync } from 'node:child_process';
import { expect, test } from '@playwright/test';

type Role = string;
type CliCt = {
  drift: number[][];
  ordering: {
    interval: number;
    window: number;
    sketch: { roles: Record<string, Role> };
    fitted: { roles: Record<string, Role> };
    links: { from: string; to: string; estimate: number }[];
  };
};

// The continuous-time fit of the demo diary in the app: progress while it runs, then the sketch's whole
// causal ordering at the data's interval beside the fitted model's, equal to `loopfold fit --method ct --json`.
test('Data tab: the continuous-time fit of the demo diary finishes with progress, and the fitted ordering stands beside the sketch\'s as the command line gives it', async ({ page }, testInfo) => {
  test.setTimeout(480_000);
  const cli = JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'fit', 'src/examples/sleep-stress.json', '--data', 'public/demo/sleep-stress-diary.csv', '--method', 'ct', '--json'], { encoding: 'utf8', maxBuffer: 1 << 26 })) as CliCt;
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Data' }).click();
  await page.getByRole('button', { name: 'Demo diary' }).click();
  const mapper = page.getByTestId('column-mapper');
  await expect(mapper).toContainText('Columns of sleep-stress-diary.csv', { timeout: 30_000 });
  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByTestId('import-counts')).toContainText('30 persons', { timeout: 30_000 });

  // Before the continuous-time fit the VAR shows the sketch's ordering alone.
  await page.getByRole('button', { name: 'Fit the VAR' }).click();
  const table = page.getByTestId('data-roles');
  await expect(table).toBeVisible({ timeout: 30_000 });
  for (const [v, role] of Object.entries(cli.ordering.sketch.roles)) await expect(table.locator(`tr[data-state="${v}"] td[data-side="sketch"] [data-role]`)).toHaveAttribute('data-role', role);
  await expect(table.locator('tr[data-state="mood"] td[data-side="fitted"]')).toHaveText('not fitted yet');

  const t0 = Date.now();
  await page.getByRole('button', { name: 'Fit the continuous-time model (slow)' }).click();
  const bar = page.getByRole('progressbar', { name: 'Progress of the fit' });
  await expect(bar).toBeVisible();
  // Progress moves while the fit runs.
  await expect.poll(async () => Number(await bar.getAttribute('value')), { timeout: 120_000 }).toBeGreaterThan(0);
  await expect(page.getByTestId('ct-result')).toBeVisible({ timeout: 420_000 });
  const seconds = (Date.now() - t0) / 1000;
  testInfo.annotations.push({ type: 'ct-fit-seconds', description: seconds.toFixed(1) });
  console.log(`continuous-time fit of the demo diary in the app (open and the sketch's): ${seconds.toFixed(1)} s`);

  const ordering = page.getByTestId('data-ordering');
  await expect(ordering).toContainText(`${Number(cli.ordering.interval.toPrecision(3))} h`);
  for (const [v, role] of Object.entries(cli.ordering.sketch.roles)) await expect(table.locator(`tr[data-state="${v}"] td[data-side="sketch"] [data-role]`)).toHaveAttribute('data-role', role);
  for (const [v, role] of Object.entries(cli.ordering.fitted.roles)) await expect(table.locator(`tr[data-state="${v}"] td[data-side="fitted"] > [data-role]`)).toHaveAttribute('data-role', role);
  // Unmeasured and derived variables of the sketch have no place in the fitted model.
  await expect(table.locator('tr[data-state="cortisol"] td[data-side="fitted"]')).toHaveText('not in the data');
  await expect(table.locator('tr[data-state="rumination"] td[data-side="fitted"]')).toHaveText('not in the data');
  // Every link of the fitted model (a drift entry whose 95 % interval excludes zero) acts on its state in the fitted column.
  const label: Record<string, string> = { stress: 'Stress', sleepDebt: 'Sleep debt', mood: 'Mood' };
  for (const l of cli.ordering.links.filter((x) => x.from !== x.to)) await expect(table.locator(`tr[data-state="${l.to}"] td[data-side="fitted"]`)).toContainText(label[l.from]);
  await expect(page.getByTestId('ordering-differences')).toBeVisible();
  await ordering.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-ordering-1440.png') });
  await page.setViewportSize({ width: 1024, height: 768 });
  await ordering.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-ordering-1024.png') });
  const fits = await table.evaluate((t) => t.getBoundingClientRect().right <= (t.closest('.lf-data') as HTMLElement).getBoundingClientRect().right + 1);
  expect(fits).toBe(true);
  expect(errors).toEqual([]);
});
