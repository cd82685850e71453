import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';

/** What the command line reports for the same example (the numbers must be the same). */
function equilibriumCli(model: string): Record<string, number> {
  const out = execFileSync('npm', ['run', '-s', 'loopfold', '--', 'equilibrium', model, '--json'], { encoding: 'utf8' });
  return (JSON.parse(out) as { values: Record<string, number> }).values;
}

test('Numbers pane on the greenhouse: balance, a simulation with the samples, cancel, CSV, one link against the interval', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  const workers: string[] = [];
  page.on('worker', (w) => workers.push(w.url()));
  await page.goto('/?example=greenhouse');
  const slider = page.getByRole('slider', { name: /sampling interval/i });
  await expect(slider).toBeVisible();
  // The numeric worker is not started before the pane is opened.
  expect(workers.some((u) => u.includes('numeric.worker'))).toBe(false);
  // An interval of about an hour: step up from the shortest.
  await slider.focus();
  await page.keyboard.press('Home');
  for (let i = 0; i < 40; i++) {
    const text = (await slider.getAttribute('aria-valuetext')) ?? '';
    if (/\b(h|day|days)\b/.test(text)) break;
    await page.keyboard.press('ArrowRight');
  }

  await page.getByRole('tab', { name: 'Numbers' }).click();
  const pane = page.locator('.lf-numbers');
  await expect(pane).toBeVisible();
  const cli = equilibriumCli('src/examples/greenhouse.json');
  const soilRow = pane.locator('.lf-num-equilibrium tr[data-variable="soilWater"] td').first();
  await expect(soilRow).toBeVisible();
  const shown = Number(((await soilRow.textContent()) ?? '').replace(/[^0-9.eE+−-]/g, '').replace('−', '-'));
  // Six significant digits are shown.
  expect(Math.abs(shown - cli.soilWater) / cli.soilWater).toBeLessThan(1e-5);
  await expect(pane.locator('.lf-num-equilibrium')).not.toContainText('NaN');
  await expect(pane.locator('.lf-num-timescales')).toContainText('derived');
  await page.screenshot({ path: testInfo.outputPath('numbers-top.png') });

  // A short simulation with the samples of the study drawn over it.
  const sim = pane.locator('[data-section="simulation"]');
  await sim.getByLabel('Simulation duration').fill('2 days');
  await sim.getByRole('button', { name: 'Simulate' }).click();
  const chart = sim.locator('svg.lf-num-chart');
  await expect(chart).toBeVisible();
  expect(await chart.locator('polyline').count()).toBeGreaterThan(0);
  expect(await chart.locator('circle.lf-chart-sample').count()).toBeGreaterThan(3);
  await sim.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('numbers-simulation.png') });

  // CSV of the run: header with the time unit, one row per output time.
  const download = page.waitForEvent('download');
  await sim.getByRole('button', { name: /CSV/ }).click();
  const file = await (await download).path();
  const csv = readFileSync(file, 'utf8');
  const lines = csv.split('\r\n').filter((l) => l !== '');
  expect(lines[0].startsWith('time (min),')).toBe(true);
  expect(lines.length).toBe(402);

  // A long run (two years written every minute) is stopped with Cancel.
  await sim.getByLabel('Simulation duration').fill('2 years');
  await sim.getByLabel('Output spacing').fill('1.1 min');
  await sim.getByRole('button', { name: 'Simulate' }).click();
  await expect(sim.getByRole('progressbar', { name: 'Simulation progress' })).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('numbers-running.png') });
  await sim.getByRole('button', { name: 'Cancel' }).click();
  await expect(sim.getByRole('status')).toContainText('stopped');
  await expect(sim.getByRole('button', { name: 'Simulate' })).toBeVisible();

  // One link against the interval, with the current interval marked.
  const curve = pane.locator('[data-section="curve"]');
  await curve.getByLabel('Link from').selectOption({ label: 'Soil water' });
  await curve.getByLabel('Link to').selectOption({ label: 'Humidity' });
  const curveChart = curve.locator('svg.lf-num-curve');
  await expect(curveChart).toHaveAttribute('aria-label', /Soil water on Humidity/);
  await expect(curveChart.locator('[data-peak]')).toHaveCount(1);
  await curve.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('numbers-curve.png') });

  const sampledSection = pane.locator('[data-section="sampled"]');
  await sampledSection.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('numbers-sampled.png') });
  // Picking a lagged link in the network shows that link against the interval.
  await sampledSection.locator('[data-edge="dust>soilWater"]').click();
  await expect(curveChart).toHaveAttribute('aria-label', /Dust on the glass on Soil water/);
  await expect(curve.getByLabel('Link from')).toHaveValue('dust');

  const adv = pane.locator('[data-section="advisor"]');
  await adv.locator('input[data-link="soilWater>humidity"]').check();
  await adv.locator('input[data-link="airTemp>humidity"]').check();
  await expect(adv.getByRole('status')).toContainText('Best single interval');
  await adv.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('numbers-advisor.png') });
  expect(errors).toEqual([]);
});

test('with a variable held, the balance shows both equilibria; the pane also works without a worker', async ({ page }, testInfo) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=greenhouse&noworker');
  await expect(page.getByRole('slider', { name: /sampling interval/i })).toBeVisible();
  await page.getByRole('tab', { name: 'Intervene' }).click();
  const holdForm = page.locator('.lf-hold');
  await holdForm.getByRole('combobox').selectOption({ label: 'Transpiration' });
  await holdForm.getByRole('textbox').fill('0.1');
  await holdForm.getByRole('button', { name: 'Hold', exact: true }).click();
  await expect(holdForm).toContainText('Transpiration = 0.1');
  await page.getByRole('tab', { name: 'Numbers' }).click();
  const table = page.locator('.lf-num-equilibrium');
  await expect(table.locator('thead')).toContainText('Without holds');
  const row = table.locator('tr[data-variable="transpiration"]');
  await expect(row).toContainText('held');
  await expect(row.locator('td').first()).toContainText('0.1');
  // Without the hold, transpiration balances the irrigation of 0.3 L/min (the example file).
  await expect(row.locator('td').nth(1)).toHaveText('0.3');
  // Holding transpiration leaves soil water with inflow and outflow fixed: it has no balance, and the row says so.
  await expect(table.locator('tr[data-variable="soilWater"]')).toContainText('not balanced');
  await expect(page.locator('.lf-num-problems')).toContainText('soilWater');
  await page.screenshot({ path: testInfo.outputPath('numbers-held.png') });
  expect(errors).toEqual([]);
});
