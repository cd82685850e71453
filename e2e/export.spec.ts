import { expect, test } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const MODEL_PATH = fileURLToPath(new URL('../src/examples/sleep-stress.json', import.meta.url));

/** Width and height from a PNG's IHDR chunk (PNG specification, ISO/IEC 15948 §11.2.2). */
function pngSize(buf: Buffer): { width: number; height: number } {
  expect(buf.subarray(1, 4).toString('latin1')).toBe('PNG');
  return { width: buf.readUInt32BE(16), height: buf.readUInt32BE(20) };
}

for (const view of ['ordering', 'unrolled'] as const) {
  test(`the app's ${view} export is the file \`loopfold render\` writes for the same interval`, async ({ page }, testInfo) => {
    page.on('pageerror', (e) => console.log('pageerror', e.message));
    page.on('console', (m) => { if (m.type() === 'error') console.log('console', m.text()); });
    await page.goto('/?example=sleep-stress');
    await page.getByRole('tab', { name: 'Timescales' }).click();
    const slider = page.getByRole('slider', { name: 'Sampling interval' });
    await slider.focus();
    await page.keyboard.press('Home');
    for (let i = 0; i < 6; i++) await page.keyboard.press('PageUp');
    if (view === 'unrolled') await page.getByRole('button', { name: 'Three instants' }).click();
    const interval = (await slider.getAttribute('data-interval'))!;
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
    const appFile = testInfo.outputPath(`app-${view}.svg`);
    await download.saveAs(appFile);
    const cliFile = testInfo.outputPath(`cli-${view}.svg`);
    const r = spawnSync('npm', ['run', '-s', 'loopfold', '--', 'render', MODEL_PATH, '--interval', interval, '--samples', '50', '--view', view, '--caption', '--out', cliFile], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const app = readFileSync(appFile, 'utf8');
    expect(app).toContain('data-variable="stress"');
    expect(app).toBe(readFileSync(cliFile, 'utf8'));

    const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: '2×' }).click()]);
    const pngFile = testInfo.outputPath(`app-${view}@2x.png`);
    await png.saveAs(pngFile);
    const w = Number(/width="(\d+)"/.exec(app)![1]);
    const h = Number(/height="(\d+)"/.exec(app)![1]);
    expect(pngSize(readFileSync(pngFile))).toEqual({ width: 2 * w, height: 2 * h });
  });
}

test("the app's export of the mechanism is the file `loopfold render --view mechanism` writes", async ({ page }, testInfo) => {
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await page.getByLabel('Export figure of').selectOption('mechanism');
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG' }).click()]);
  const appFile = testInfo.outputPath('app-mechanism.svg');
  await download.saveAs(appFile);
  const cliFile = testInfo.outputPath('cli-mechanism.svg');
  const r = spawnSync('npm', ['run', '-s', 'loopfold', '--', 'render', MODEL_PATH, '--view', 'mechanism', '--out', cliFile], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  const app = readFileSync(appFile, 'utf8');
  for (const id of ['workload', 'stress', 'cortisol', 'rumination', 'sleepDebt', 'mood', 'coping']) expect(app).toContain(`data-variable="${id}"`);
  expect(app).toBe(readFileSync(cliFile, 'utf8'));
});
