import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';

async function shot(page: Page, path: string): Promise<void> {
  await page.waitForTimeout(150);
  await page.screenshot({ path });
}

const nodes = (page: Page) => page.locator('.react-flow__node-variable');

test.describe('files and share links', () => {
  test('save to a file, open it again; a malformed file is reported and the model stays', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(nodes(page)).toHaveCount(7);
    const model = await page.evaluate(() => window.__loopfold!.model());

    // save as: without a usable native picker the file is downloaded
    const downloading = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Save as…' }).click();
    const download = await downloading;
    expect(download.suggestedFilename()).toBe('sleep-stress-and-mood-illustrative.loopfold.json');
    const path = testInfo.outputPath(download.suggestedFilename());
    await download.saveAs(path);
    const saved = JSON.parse(readFileSync(path, 'utf8'));
    expect(saved).toEqual(model);

    // a new, empty model, then open the file again
    await page.getByRole('button', { name: 'New' }).click();
    await expect(nodes(page)).toHaveCount(0);
    await page.getByTestId('open-file-input').setInputFiles(path);
    await expect(nodes(page)).toHaveCount(7);
    expect(await page.evaluate(() => window.__loopfold!.model())).toEqual(model);
    await expect(page.locator('.lf-docname')).toHaveAttribute('title', 'sleep-stress-and-mood-illustrative.loopfold.json');
    await shot(page, testInfo.outputPath('01-reopened.png'));

    // broken JSON: a clear message, nothing changed
    await page.getByTestId('open-file-input').setInputFiles({ name: 'broken.loopfold.json', mimeType: 'application/json', buffer: Buffer.from('{"format": "loopfold-model", "version": 1, ') });
    const notice = page.getByRole('dialog', { name: /could not be opened/ });
    await expect(notice).toBeVisible();
    await expect(notice).toContainText('"broken.loopfold.json" could not be opened; your current model is unchanged');
    await expect(notice).toContainText('(file): is not valid JSON');
    await shot(page, testInfo.outputPath('02-broken-json.png'));
    await notice.getByRole('button', { name: 'Close' }).click();
    await expect(nodes(page)).toHaveCount(7);

    // valid JSON that is not a valid model: every problem with its JSON path
    const bad = { ...model, variables: [{ id: 'x', kind: 'flow' }, { id: '2bad', kind: 'state', timescale: 'later' }], links: [{ from: 'x', to: 'nowhere', kind: 'instantaneous' }] };
    await page.getByTestId('open-file-input').setInputFiles({ name: 'bad.loopfold.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await expect(notice).toContainText('variables[0].kind: must be "input", "state" or "derived"');
    await expect(notice).toContainText('variables[1].id');
    await shot(page, testInfo.outputPath('03-bad-model.png'));
    await page.keyboard.press('Escape');
    await expect(notice).toBeHidden();
    expect(await page.evaluate(() => window.__loopfold!.model())).toEqual(model);
  });

  test('a file dropped onto the canvas opens', async ({ page }, testInfo) => {
    await page.goto('/');
    await expect(nodes(page)).toHaveCount(0);
    const text = JSON.stringify({ format: 'loopfold-model', version: 1, name: 'Dropped', timeUnit: 'day', variables: [{ id: 'stock', kind: 'state', timescale: 3, position: { x: 0, y: 0 } }, { id: 'orders', kind: 'input', position: { x: -250, y: 0 } }], links: [{ from: 'orders', to: 'stock', kind: 'integrating', sign: '+' }] });
    const dt = await page.evaluateHandle((t) => {
      const d = new DataTransfer();
      d.items.add(new File([t], 'dropped.loopfold.json', { type: 'application/json' }));
      return d;
    }, text);
    await page.dispatchEvent('.lf-canvas', 'dragover', { dataTransfer: dt });
    await page.dispatchEvent('.lf-canvas', 'drop', { dataTransfer: dt });
    await expect(nodes(page)).toHaveCount(2);
    await expect(page.locator('.lf-docname')).toContainText('Dropped');
    await shot(page, testInfo.outputPath('dropped.png'));
  });

  test('a share link carries the model; a damaged link is reported', async ({ page, context }, testInfo) => {
    await context.grantPermissions(['clipboard-read', 'clipboard-write']);
    await page.goto('/?example=sleep-stress');
    await expect(nodes(page)).toHaveCount(7);
    const model = await page.evaluate(() => window.__loopfold!.model());
    await page.getByRole('button', { name: 'Share link' }).click();
    await expect(page.locator('.lf-toast')).toContainText('Share link copied');
    const link = await page.evaluate(() => navigator.clipboard.readText());
    expect(link).toMatch(/#m=/);

    const other = await context.newPage();
    await other.goto(link);
    await expect(other.locator('.react-flow__node-variable')).toHaveCount(7);
    expect(await other.evaluate(() => window.__loopfold!.model())).toEqual(model);
    expect(other.url()).not.toContain('#m=');
    await other.close();

    const damaged = await context.newPage();
    await damaged.goto(link.slice(0, link.length - 40));
    await expect(damaged.getByRole('dialog', { name: /share link could not be opened/i })).toBeVisible();
    await shot(damaged, testInfo.outputPath('damaged-link.png'));
  });

  test('unsaved changes to a file ask before the page is left', async ({ page }, testInfo) => {
    await page.goto('/');
    const text = JSON.stringify({ format: 'loopfold-model', version: 1, name: 'Shop', timeUnit: 'day', variables: [{ id: 'stock', kind: 'state', timescale: 3, position: { x: 0, y: 0 } }], links: [] });
    await page.getByTestId('open-file-input').setInputFiles({ name: 'shop.loopfold.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await expect(nodes(page)).toHaveCount(1);
    await page.locator('.react-flow__node[data-id="stock"]').click();
    await page.locator('.lf-inspector').getByLabel('Label', { exact: true }).fill('Stock on hand');
    await page.locator('.lf-inspector').getByLabel('Label', { exact: true }).press('Enter');
    await expect(page.locator('.lf-dirty')).toBeVisible();
    await shot(page, testInfo.outputPath('unsaved.png'));
    const asked = new Promise<string>((resolve) => page.once('dialog', (d) => { resolve(d.type()); void d.accept(); }));
    await page.close({ runBeforeUnload: true });
    expect(await asked).toBe('beforeunload');
  });

  test('without a worker the core runs on the main thread', async ({ page }, testInfo) => {
    await page.goto('/?noworker&example=sleep-stress');
    await expect(page.locator('.lf-status')).toContainText('core: main thread');
    await expect(page.locator('.lf-diagnostics')).toContainText('no problems found');
    await page.getByRole('tab', { name: 'Equations' }).click();
    await expect(page.locator('.lf-grid')).toBeVisible();
    await shot(page, testInfo.outputPath('main-thread.png'));
  });
});
