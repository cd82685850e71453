import { expect, test, type Locator } from '@playwright/test';

/** Step the interval control with the arrow keys until it lies in [lo, hi] (model time unit). */
async function intervalInto(slider: Locator, lo: number, hi: number): Promise<number> {
  await slider.focus();
  for (let i = 0; i < 200; i++) {
    const at = Number(await slider.getAttribute('data-interval'));
    if (at >= lo && at <= hi) return at;
    await slider.press(at < lo ? 'ArrowRight' : 'ArrowLeft');
  }
  throw new Error(`the interval did not reach [${lo}, ${hi}]`);
}

test('Pictures pane on the evening-unrest example: three pictures with readings, person differences, uncertain orderings, ranges on the track', async ({ page }, testInfo) => {
  // The machine the suite runs on may be busy: the first analysis can take a while in dev mode.
  test.setTimeout(300_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  const workers: string[] = [];
  page.on('worker', (w) => workers.push(w.url()));
  await page.goto('/?example=evening-unrest');
  const slider = page.getByRole('slider', { name: /sampling interval/i });
  await expect(slider).toBeVisible({ timeout: 90_000 });
  // Worry's and strain's timescales are ranges: their breakpoints are shaded ranges on the track.
  await expect(page.locator('.lf-bp-range[data-range="worry"]').first()).toBeAttached();
  const at = await intervalInto(slider, 2, 4.5);

  await page.getByRole('tab', { name: 'Pictures' }).click();
  const pane = page.locator('.lf-pictures');
  await expect(pane.locator('.lf-pic-row[data-pictures="ready"]')).toBeVisible({ timeout: 90_000 });
  await expect(pane.locator('[data-picture]')).toHaveCount(3);
  await expect(pane.locator('[data-picture="within"] .lf-pic-reading')).toContainText('Within persons');
  await expect(pane.locator('[data-picture="long"] .lf-pic-reading')).toContainText('rank one');
  // The file's person differences (workload) and measured symptoms: across persons one factor carries the symptoms, from the workload.
  await expect(pane.locator('[data-picture="factor"] .lf-pic-reading')).toContainText(/one factor (dominates|fits)/, { timeout: 60_000 });
  await expect(pane.locator('[data-picture="factor"] .lf-pic-reading')).toContainText('Workload');
  await expect(pane.locator('[data-picture="factor"] [data-variable="worry"]')).toBeVisible();
  await expect(pane.locator('[data-picture="factor"] [data-variable="strain"]')).toHaveCount(0);
  // Without person differences the persons share one equilibrium; the pane says so.
  await pane.getByLabel('SD of Workload across persons').fill('0');
  await expect(pane.locator('.lf-pic-summary').first()).toContainText('No input differs across persons', { timeout: 60_000 });
  await pane.getByLabel('SD of Workload across persons').fill('0.8');
  await expect(pane.locator('[data-picture="factor"] .lf-pic-reading')).toContainText(/one factor (dominates|fits)/, { timeout: 60_000 });
  await expect(pane.locator('[data-picture="factor"] .lf-pic-reading')).toContainText('Workload');
  // The worker did the work.
  expect(workers.some((u) => u.includes('pictures.worker'))).toBe(true);

  // Uncertain timescales: whether worry settles depends on where its timescale lies.
  const unc = pane.locator('.lf-pic-uncertain');
  await expect(unc.locator('.lf-pic-summary')).toContainText(/worry/, { timeout: 60_000 });
  await expect(unc.locator('table tbody tr').first()).toContainText('%');
  await page.screenshot({ path: testInfo.outputPath('pictures-1440.png') });
  await pane.locator('[data-picture="factor"]').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('pictures-1440-factor.png') });

  // All three side by side, full width.
  await pane.getByRole('button', { name: 'Side by side, full width' }).click();
  const dialog = page.getByRole('dialog', { name: 'The three pictures side by side' });
  await expect(dialog).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('pictures-wide-1440.png') });
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();

  await page.setViewportSize({ width: 1024, height: 768 });
  await page.screenshot({ path: testInfo.outputPath('pictures-1024.png') });
  expect(at).toBeGreaterThan(0);
  expect(errors).toEqual([]);
});

test('a link\'s strength range is stored on Enter or leaving the field; invalid text stays with its message', async ({ page }, testInfo) => {
  await page.goto('/?example=sleep-stress');
  await page.locator('.react-flow__node[data-id="mood"]').click();
  const inspector = page.locator('.lf-inspector');
  await inspector.locator('.lf-links-of button.lf-linkish').first().click();
  const field = inspector.getByLabel('Strength range (optional)');
  await expect(field).toHaveValue('');
  // Whatever link the inspector shows: the ranges stored anywhere in the model.
  const stored = () => page.evaluate(() => window.__loopfold!.model().links.flatMap((l) => (l.strengthRange ? [l.strengthRange] : [])));
  await field.fill('0.9..0.2');
  await field.press('Enter');
  await expect(inspector.getByRole('alert')).toContainText('the low end 0.9 is above the high end 0.2');
  await field.blur();
  await expect(field).toHaveValue('0.9..0.2'); // kept, not silently reverted
  expect(await stored()).toEqual([]);
  await page.screenshot({ path: testInfo.outputPath('strength-range-invalid-1440.png') });
  await field.fill('0.2..0.9');
  await field.press('Enter');
  await expect(inspector.getByRole('alert')).toHaveCount(0);
  await expect.poll(stored).toEqual([{ low: 0.2, high: 0.9 }]);
  await field.fill('0.3..1.2');
  await field.blur();
  await expect.poll(stored).toEqual([{ low: 0.3, high: 1.2 }]);
  await page.setViewportSize({ width: 1024, height: 768 });
  await field.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('strength-range-1024.png') });
});
