import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');

/** WCAG 2.1 A and AA rules of axe-core over the page as it is now. */
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = (await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  })) as { violations: { id: string; help: string; nodes: { target: string[] }[] }[] };
  return r.violations.map((v) => `${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

/** Every #rrggbb colour of a file is a grey (red = green = blue). */
function colours(svg: string): string[] {
  return [...new Set([...svg.matchAll(/#[0-9a-fA-F]{6}\b/g)].map((m) => m[0].toLowerCase()))];
}
const isGrey = (c: string) => c.slice(1, 3) === c.slice(3, 5) && c.slice(3, 5) === c.slice(5, 7);

/** The pHYs chunk's pixels per metre (PNG specification, ISO/IEC 15948 §11.3.5.3), or null. */
function pixelsPerMetre(buf: Buffer): number | null {
  const i = buf.indexOf('pHYs', 8, 'latin1');
  return i < 0 ? null : buf.readUInt32BE(i + 4);
}

test('the export dialog of the ordering: one column in greyscale is 8.5 cm wide and grey; no axe violations', async ({ page }, testInfo) => {
  for (const size of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
    await page.setViewportSize(size);
    await page.goto('/?example=sleep-stress');
    await page.getByRole('tab', { name: 'Timescales' }).click();
    await page.getByRole('button', { name: 'Export', exact: true }).click(); // the export row under the toolbar
    await page.getByRole('button', { name: 'Print options…' }).click();
    const dialog = page.getByRole('dialog', { name: /Export the ordering for print/ });
    await expect(dialog).toBeVisible();
    await page.screenshot({ path: testInfo.outputPath(`dialog-${size.width}.png`) });
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
  }
  await page.getByRole('button', { name: 'Print options…' }).click();
  const dialog = page.getByRole('dialog', { name: /Export the ordering for print/ });
  expect(await axeViolations(page)).toEqual([]);
  await dialog.getByLabel('Width', { exact: true }).selectOption('column');
  await dialog.getByLabel('Palette').selectOption('greyscale');
  const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('button', { name: 'Download SVG' }).click()]);
  const file = testInfo.outputPath('ordering-column-grey.svg');
  await download.saveAs(file);
  const svg = readFileSync(file, 'utf8');
  expect(svg).toMatch(/<svg[^>]* width="85mm"/);
  expect(svg).toContain('data-variable="');
  expect(svg).toContain('Coping skill');
  const cs = colours(svg);
  expect(cs.length).toBeGreaterThan(2);
  expect(cs.filter((c) => !isGrey(c))).toEqual([]);
  // the figure says how it was made to fit the column
  await expect(dialog.getByRole('status')).toContainText('smallest text');
  // at one column its smallest text is at least 7 pt (folded or wrapped to fit when it has to be)
  const status = (await dialog.getByRole('status').textContent()) ?? '';
  expect(Number(/smallest text is ([\d.]+) pt/.exec(status)![1])).toBeGreaterThanOrEqual(7);

  // a bad width names the field and offers no download
  await dialog.getByLabel('Width', { exact: true }).selectOption('length');
  await dialog.getByLabel('Width as a length').fill('12 furlongs');
  await expect(dialog.getByRole('alert')).toContainText('Width:');
  await expect(dialog.getByRole('button', { name: 'Download SVG' })).toBeDisabled();

  // PDF: the command line to copy, with the options chosen
  await dialog.getByLabel('Width as a length').fill('120mm');
  await dialog.getByRole('radio', { name: 'PDF' }).check();
  const command = dialog.getByLabel('Command line for the PDF');
  await expect(command).toHaveValue(/^npm run -s loopfold -- render \S+\.json --interval \S+ (?:--samples \d+|--window \S+) --caption --width 120mm --palette greyscale --out \S+-ordering\.pdf$/);
  expect(await axeViolations(page)).toEqual([]);
  await page.screenshot({ path: testInfo.outputPath('dialog-pdf.png') });
});

test('the export dialog of a Numbers pane chart: a PNG at 150 DPI carries its DPI', async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Numbers' }).click();
  await expect(page.locator('.lf-net-edge').first()).toBeVisible({ timeout: 90_000 });
  await page.getByRole('button', { name: 'Export the lagged network with print options' }).click();
  const dialog = page.getByRole('dialog', { name: /Export the lagged network for print/ });
  await expect(dialog).toBeVisible();
  expect(await axeViolations(page)).toEqual([]);
  await dialog.getByLabel('Width', { exact: true }).selectOption('1.5-column');
  await dialog.getByRole('radio', { name: 'PNG' }).check();
  await dialog.getByLabel('PNG resolution (DPI)').fill('150');
  const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('button', { name: 'Download PNG' }).click()]);
  const file = testInfo.outputPath('network.png');
  await download.saveAs(file);
  const png = readFileSync(file);
  // 114 mm at 150 DPI = 673 pixels; 150 DPI = 5906 pixels per metre (150 / 0.0254)
  expect(png.readUInt32BE(16)).toBe(673);
  expect(pixelsPerMetre(png)).toBe(5906);
  // at this width the network is drawn compact, and the dialog says so after the file
  await expect(dialog).toContainText('the network is drawn compact');
  await page.screenshot({ path: testInfo.outputPath('numbers-dialog.png') });
});

test("the rank curve of the Pictures pane has the same print options; its PDF command line is `rank --out`", async ({ page }, testInfo) => {
  test.setTimeout(300_000);
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Pictures' }).click();
  const button = page.getByRole('button', { name: 'Export the singular value ratios with print options' });
  await expect(button).toBeVisible({ timeout: 150_000 });
  for (const size of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
    await page.setViewportSize(size);
    await button.scrollIntoViewIfNeeded();
    await page.screenshot({ path: testInfo.outputPath(`rank-curve-${size.width}.png`) });
  }
  await button.click();
  const dialog = page.getByRole('dialog', { name: /Export the singular value ratios for print/ });
  await expect(dialog).toBeVisible();
  expect(await axeViolations(page)).toEqual([]);
  await dialog.getByLabel('Width', { exact: true }).selectOption('column');
  await dialog.getByLabel('Palette').selectOption('greyscale');
  const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('button', { name: 'Download SVG' }).click()]);
  const file = testInfo.outputPath('rank-curve-column-grey.svg');
  await download.saveAs(file);
  const svg = readFileSync(file, 'utf8');
  expect(svg).toMatch(/<svg[^>]* width="85mm"/);
  expect(svg).toContain('data-chart="rank-curve"');
  expect(colours(svg).filter((c) => !isGrey(c))).toEqual([]);
  // the caption says what the marks are, in the modeller's labels
  expect(svg).toContain('Model-based, not a finding: how close');
  const status = (await dialog.getByRole('status').textContent()) ?? '';
  expect(Number(/smallest text is ([\d.]+) pt/.exec(status)![1])).toBeGreaterThanOrEqual(7);
  await dialog.getByRole('radio', { name: 'PDF' }).check();
  await expect(dialog.getByLabel('Command line for the PDF')).toHaveValue(/^npm run -s loopfold -- rank \S+\.json --interval \S+ --observed \S+ --caption --width column --palette greyscale --out \S+-rank-curve\.pdf$/);
  await page.screenshot({ path: testInfo.outputPath('rank-curve-dialog.png') });
});
