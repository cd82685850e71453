import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
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
  // The side-by-side view exports as one figure: the three pictures, each with its reading.
  const download = page.waitForEvent('download');
  await dialog.getByRole('button', { name: 'Export the three pictures side by side as SVG' }).click();
  const svgText = readFileSync((await (await download).path())!, 'utf8');
  expect(svgText).toContain('data-chart="pictures-side-by-side"');
  for (const key of ['within', 'factor', 'long']) expect(svgText).toContain(`data-panel="${key}"`);
  expect(svgText.match(/<svg /g)?.length).toBe(4);
  expect(svgText).toContain('Illustrative model only'); // the example's caution travels with the figure
  const look = await page.context().newPage();
  await look.setContent(`<body style="margin:0;background:#fff">${svgText.replace(/^<\?xml[^>]*>/, '')}</body>`);
  await look.screenshot({ path: testInfo.outputPath('pictures-side-by-side-export.png'), fullPage: true });
  await look.close();
  await dialog.getByRole('button', { name: 'Close' }).focus();
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

test('under strength ranges the interval advisor shows the same numbers as `loopfold advise --uncertain`; the person SD field of a link', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  // The evening-unrest example with two strengths only roughly known.
  const model = JSON.parse(readFileSync('src/examples/evening-unrest.json', 'utf8')) as { links: { from: string; to: string; strengthRange?: { low: number; high: number } }[] };
  for (const l of model.links) {
    if (l.from === 'worry' && l.to === 'tension') l.strengthRange = { low: 0.2, high: 1.4 };
    if (l.from === 'tension' && l.to === 'irritable') l.strengthRange = { low: 0.3, high: 0.9 };
  }
  const file = join(testInfo.outputDir, 'ranged.json');
  mkdirSync(testInfo.outputDir, { recursive: true });
  writeFileSync(file, JSON.stringify(model));
  const want = (JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'advise', file, '--links', 'worry>tension,tension>irritable', '--uncertain', '--draws', '60', '--seed', '7', '--json'], { encoding: 'utf8' })) as {
    uncertain: { holds: number; noAdvice: number; best: { q10: number; median: number; q90: number } | null; links: { from: string; to: string; inRange: number }[]; ranged: { from: string; to: string; decides: number }[]; readings: string[] };
  }).uncertain;

  await page.goto('/?example=evening-unrest');
  await expect(page.getByRole('slider', { name: /sampling interval/i })).toBeVisible({ timeout: 90_000 });
  await page.evaluate((m) => window.__loopfold!.load(m as never), model);
  await page.getByRole('tab', { name: 'Numbers' }).click();
  const adv = page.locator('.lf-numbers [data-section="advisor"]');
  await adv.locator('input[data-link="worry>tension"]').check();
  await adv.locator('input[data-link="tension>irritable"]').check();
  const ranged = adv.locator('[data-section="ranged-advice"]');
  await expect(ranged).toBeVisible({ timeout: 60_000 });
  await ranged.getByLabel('Draws').fill('60');
  await ranged.getByLabel('Seed').fill('7');
  const ready = ranged.locator('[data-ranged="ready"][data-draws="60"][data-seed="7"]');
  await expect(ready).toBeVisible({ timeout: 90_000 });
  // The same draws give the same numbers, to the last digit.
  expect(Number(await ready.getAttribute('data-holds'))).toBe(want.holds);
  expect(Number(await ready.getAttribute('data-no-advice'))).toBe(want.noAdvice);
  expect(await ready.getAttribute('data-best')).toBe(want.best ? [want.best.q10, want.best.median, want.best.q90].join(' ') : '');
  for (const l of want.links) expect(Number(await ready.locator(`[data-link="${l.from}>${l.to}"]`).getAttribute('data-in-range'))).toBe(l.inRange);
  for (const r of want.ranged) expect(Number(await ready.locator(`[data-ranged-link="${r.from}>${r.to}"]`).getAttribute('data-decides'))).toBe(r.decides);
  for (const r of want.readings) await expect(ready.locator('.lf-pic-summary')).toContainText(r);
  await ranged.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('ranged-advice-1440.png') });
  await page.setViewportSize({ width: 1024, height: 768 });
  await ranged.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('ranged-advice-1024.png') });

  // A link's person SD of strength: bad text stays with a message naming the field; Enter stores; undo removes it.
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.getByRole('tab', { name: 'Edit' }).click();
  await page.locator('.react-flow__node[data-id="worry"]').click();
  const inspector = page.locator('.lf-inspector');
  await inspector.locator('.lf-links-of button.lf-linkish').first().click();
  const field = inspector.getByLabel('Person SD of strength (optional)');
  const sds = () => page.evaluate(() => window.__loopfold!.model().links.flatMap((l) => (l.personSD !== undefined ? [l.personSD] : [])));
  await field.fill('lots');
  await field.press('Enter');
  await expect(inspector.getByRole('alert')).toContainText('Person SD of strength: "lots" is not a number');
  await field.blur();
  await expect(field).toHaveValue('lots');
  expect(await sds()).toEqual([]);
  await field.screenshot({ path: testInfo.outputPath('person-sd-invalid.png') });
  await field.fill('0.2');
  await field.press('Enter');
  await expect.poll(sds).toEqual([0.2]);
  await page.screenshot({ path: testInfo.outputPath('person-sd-1440.png') });
  await page.locator('.react-flow__pane').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Control+z');
  await expect.poll(sds).toEqual([]);
  expect(errors).toEqual([]);
});

test('the probability of each ordering under uncertain timescales is the one `loopfold order --uncertain` gives for the same study, draws and seed', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  // The example's own study: every 3 h, 70 prompts; the pane's default draws (2000) and seed (1).
  const want = JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'order', 'src/examples/evening-unrest.json', '--interval', '3h', '--samples', '70', '--uncertain', '--draws', '2000', '--seed', '1', '--json'], { encoding: 'utf8' })) as {
    probabilities: { share: number }[];
    uncertainty: { readings: string[] };
  };
  await page.goto('/?example=evening-unrest');
  const slider = page.getByRole('slider', { name: /sampling interval/i });
  await expect(slider).toBeVisible({ timeout: 90_000 });
  await expect(slider).toHaveAttribute('data-interval', '3');
  await page.getByRole('tab', { name: 'Pictures' }).click();
  const unc = page.locator('.lf-pic-uncertain');
  await expect(unc.locator('.lf-pic-summary')).toHaveAttribute('data-probabilities', String(want.probabilities.length), { timeout: 90_000 });
  expect(await unc.locator('.lf-pic-summary li').allTextContents()).toEqual(want.uncertainty.readings);
  const shares = await unc.locator('table tbody tr td:first-child').allTextContents();
  expect(shares).toEqual(want.probabilities.map((p) => `${(p.share * 100).toFixed(1)} %`));
  await unc.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('uncertain-orderings-1440.png') });
});

test('the Pictures tab reads the study\'s prompts and persons as `loopfold factor` does (a daily window: 70 prompts, not 14 days / 2.4 h)', async ({ page }, testInfo) => {
  test.setTimeout(300_000);
  const cli = (level: string) => JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'factor', 'src/examples/sleep-stress.json', '--level', level, '--json'], { encoding: 'utf8' })) as { samples: number; persons: number; n: number; chi2: number; rmsea: number };
  const within = cli('within');
  const between = cli('between');
  // the example's study: 5 prompts a day 09:00–21:00 for 14 days, 40 persons (counted by hand: 70 prompts)
  expect([within.samples, within.persons, within.n, between.n]).toEqual([70, 40, 40 * 69, 40]);
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/?example=sleep-stress');
  await expect(page.getByRole('slider', { name: /sampling interval/i })).toBeVisible({ timeout: 90_000 });
  await page.getByRole('tab', { name: 'Pictures' }).click();
  const pane = page.locator('.lf-pictures');
  await expect(pane.locator('.lf-pic-row[data-pictures="ready"]')).toBeVisible({ timeout: 90_000 });
  await expect(pane.locator('.lf-pic-controls').first()).toContainText('70 prompts each, every 2.4 h');
  await expect(pane.getByLabel('Persons', { exact: true })).toHaveValue('40');
  const fits = pane.getByRole('table', { name: 'Factor fits by level' });
  for (const [level, want] of [['within', within], ['between', between]] as const) {
    const cells = fits.locator(`tr[data-level="${level}"] td`);
    await expect(cells.nth(1)).toHaveText(String(want.n));
    await expect(cells.nth(2)).toHaveText(want.chi2.toFixed(1));
    await expect(cells.nth(4)).toHaveText(want.rmsea.toFixed(3));
  }
  await page.screenshot({ path: testInfo.outputPath('pictures-study-prompts-1440.png') });
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.screenshot({ path: testInfo.outputPath('pictures-study-prompts-1024.png') });
});
