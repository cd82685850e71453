import { expect, test, type Page } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { parseModel } from '../src/core/model/schema';
import type { Model } from '../src/core/model/types';
import { breakpoints, orderingAt } from '../src/core/ordering/index';
import { modelAxis } from '../src/core/study/convert';
import type { Ordering } from '../src/core/ordering/types';
import { readFileSync } from 'node:fs';

const MODEL_PATH = fileURLToPath(new URL('../src/examples/sleep-stress.json', import.meta.url));
/** The app reads the example's own study (its length), as the command line does without --samples. */
const TICKS = (m: Model) => breakpoints(m, modelAxis(m)).length;
const model = (() => { const r = parseModel(JSON.parse(readFileSync(MODEL_PATH, 'utf8'))); if (!r.ok) throw new Error('bad example'); return r.model; })();

/**
 * The ordering the command line prints for an interval (`loopfold order --json`);
 * while that command is not part of the build, the same core function in Node.
 */
function expectedOrdering(m: Model, interval: number): Ordering {
  const r = spawnSync('npm', ['run', '-s', 'loopfold', '--', 'order', MODEL_PATH, '--interval', String(interval), '--json'], { encoding: 'utf8' });
  if (r.status === 0) {
    const parsed = JSON.parse(r.stdout) as Ordering | { ordering: Ordering };
    return 'ordering' in parsed ? parsed.ordering : parsed;
  }
  return orderingAt(m, { interval, ...modelAxis(m) });
}

async function openTimescales(page: Page) {
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  const slider = page.getByRole('slider', { name: 'Sampling interval' });
  await expect(slider).toBeVisible();
  await expect(page.locator('.lf-tick')).toHaveCount(TICKS(model));
  return { slider, errors };
}

/**
 * The dev server is shared with other work in progress: an edit elsewhere can reload the page.
 * Reopen the example when that happened (the control then shows another model's breakpoints).
 */
async function ensureOpen(page: Page, ticks: number) {
  if ((await page.locator('.lf-tick').count()) === ticks && (await page.locator('.lf-timescale').count()) === 1) return;
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await expect(page.locator('.lf-tick')).toHaveCount(ticks);
}

const orderingFigure = (page: Page) => page.getByRole('figure', { name: 'The ordering at the interval' });

/** Wait for the current band's ordering (it comes from the core worker) and its tuned layout, then read what is drawn. */
async function drawn(page: Page) {
  const fig = orderingFigure(page);
  const band = (await page.getByRole('slider', { name: 'Sampling interval' }).getAttribute('data-band'))!;
  await expect(page.locator('.lf-timescale')).toHaveAttribute('data-band', band);
  await expect(fig).toHaveAttribute('data-shown', band);
  await expect(fig).toHaveAttribute('data-pending', 'false');
  await expect(fig).toHaveAttribute('data-layout', 'elk');
  await page.waitForTimeout(400); // the move to the new places
  return fig.evaluate((root) => ({
    roles: Object.fromEntries([...root.querySelectorAll('g[data-variable]')].map((g) => [g.getAttribute('data-variable'), g.getAttribute('data-role')])),
    groups: [...root.querySelectorAll('g[data-group]')].map((g) => g.getAttribute('data-members')!).sort(),
    edges: [...root.querySelectorAll('g[data-edge]')].map((g) => `${g.getAttribute('data-from')}>${g.getAttribute('data-to')}:${g.getAttribute('data-kind')}`).sort(),
  }));
}

/** The ordering's edges, and inside each block every link drawn between two of its members (both directions of a loop). */
function expected(m: Model, o: Ordering) {
  const inBlock = (a: string, b: string) => o.blocks.some((k) => k.variables.length > 1 && k.variables.includes(a) && k.variables.includes(b));
  const within = m.links.filter((l) => l.from !== l.to && inBlock(l.from, l.to)).map((l) => `${l.from}>${l.to}:instantaneous`);
  return {
    roles: o.roles,
    groups: o.blocks.filter((b) => b.variables.length > 1).map((b) => b.variables.join(' ')).sort(),
    edges: [...new Set([...o.edges.map((e) => `${e.from}>${e.to}:${e.kind}`), ...within])].sort(),
  };
}

async function state(page: Page) {
  const slider = page.getByRole('slider', { name: 'Sampling interval' });
  return { band: Number(await slider.getAttribute('data-band')), interval: Number(await slider.getAttribute('data-interval')) };
}

test('keyboard: every band from Home to End matches the ordering the core prints', async ({ page }, testInfo) => {
  // a command-line run and a screenshot per band: minutes on a busy two-core machine
  test.setTimeout(240_000);
  const { slider, errors } = await openTimescales(page);
  await slider.focus();
  await page.keyboard.press('Home');
  const seen: number[] = [];
  for (let i = 0; i < 30; i++) {
    const { band, interval } = await state(page);
    if (seen.includes(band)) break;
    seen.push(band);
    await expect(page.locator('.lf-timescale')).toHaveAttribute('data-band', String(band));
    const got = await drawn(page);
    const want = expected(model, expectedOrdering(model, interval));
    expect(got.roles, `band ${band} at ${interval} h`).toEqual(want.roles);
    expect(got.groups, `band ${band}`).toEqual(want.groups);
    expect(got.edges, `band ${band}`).toEqual(want.edges);
    await expect(slider).toHaveAttribute('aria-valuetext', /^every /);
    await page.screenshot({ path: testInfo.outputPath(`keyboard-band-${String(band).padStart(2, '0')}.png`) });
    await page.keyboard.press('PageUp');
  }
  const cuts = TICKS(model);
  expect(seen).toEqual(Array.from({ length: cuts + 1 }, (_, i) => i));
  // back down with the arrows: no band is skipped
  await page.keyboard.press('End');
  let last = (await state(page)).band;
  for (let i = 0; i < 400 && last > 0; i++) {
    await page.keyboard.press('ArrowLeft');
    const b = (await state(page)).band;
    expect(last - b).toBeLessThanOrEqual(1);
    last = b;
  }
  expect(last).toBe(0);
  expect(errors).toEqual([]);
});

test('mouse drag across the whole control visits every band, each drawn as the core orders it', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const { slider, errors } = await openTimescales(page);
  const cuts = TICKS(model);
  const box = (await slider.boundingBox())!;
  const y = box.y + box.height / 2;
  await page.mouse.move(box.x + 1, y);
  await page.mouse.down();
  const bands: number[] = [];
  const steps = 160;
  for (let i = 0; i <= steps; i++) {
    await page.mouse.move(box.x + 1 + ((box.width - 2) * i) / steps, y);
    const { band } = await state(page);
    if (bands.at(-1) !== band) bands.push(band);
  }
  await page.mouse.up();
  expect(bands).toEqual(Array.from({ length: cuts + 1 }, (_, i) => i));
  // then drag back to each band's middle and compare the drawing
  const ticks = await page.locator('.lf-tick').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().left));
  const xs = [box.x, ...ticks, box.x + box.width];
  for (let i = 0; i + 1 < xs.length; i++) {
    await ensureOpen(page, cuts);
    const x = (xs[i] + xs[i + 1]) / 2;
    await page.mouse.move(x, y);
    await page.mouse.down();
    await page.mouse.move(x + 1, y);
    await page.mouse.up();
    const { band, interval } = await state(page);
    expect(band).toBe(i);
    const got = await drawn(page);
    const want = expected(model, expectedOrdering(model, interval));
    expect(got.groups, `band ${band}`).toEqual(want.groups);
    expect(got.edges, `band ${band}`).toEqual(want.edges);
    expect(got.roles, `band ${band}`).toEqual(want.roles);
    await page.screenshot({ path: testInfo.outputPath(`drag-band-${String(band).padStart(2, '0')}.png`) });
  }
  expect(errors).toEqual([]);
});

test('dragging the control past its ends, over the canvas and the figure, selects no text on the page', async ({ page }) => {
  const { slider, errors } = await openTimescales(page);
  const box = (await slider.boundingBox())!;
  const y = box.y + box.height / 2;
  await page.mouse.move(box.x + box.width * 0.3, y);
  await page.mouse.down();
  // up over the canvas's labels, across to the figure's, and back along the control
  for (let i = 1; i <= 12; i++) await page.mouse.move(box.x + box.width * (0.3 - 0.02 * i), y - 30 * i);
  for (let i = 1; i <= 12; i++) await page.mouse.move(box.x + box.width * (0.06 + 0.1 * i), y - 360 + 20 * i);
  await page.mouse.move(box.x + box.width * 0.5, y);
  await page.mouse.up();
  // no range at all: the browser keeps a range it extends at every pointer move otherwise (invisible
  // where the page forbids selecting, and costly: the page's frames dropped by half at 500 variables)
  const sel = await page.evaluate(() => ({ type: window.getSelection()!.type, text: String(window.getSelection()) }));
  expect(sel).toEqual({ type: expect.not.stringMatching(/^Range$/), text: '' });
  // the drag still moved the control: its thumb follows the pointer's x
  await expect(slider).toHaveAttribute('aria-valuenow', /^(4\d\d|5\d\d)$/);
  expect(errors).toEqual([]);
});

test('a simultaneous block folds into one node with its count and unfolds again; the three-instant view', async ({ page }, testInfo) => {
  test.setTimeout(180_000); // a tuned layout per band on the way, slow on a busy machine
  const reloads: string[] = [];
  page.on('framenavigated', (f) => { if (f === page.mainFrame()) reloads.push(f.url()); });
  const { slider } = await openTimescales(page);
  await slider.focus();
  await page.keyboard.press('Home');
  // step to the first band with a block, checking each key press moves one band on
  let found = false;
  for (let i = 0; i < 20 && !found; i++) {
    const before = Number(await slider.getAttribute('data-band'));
    await page.keyboard.press('PageUp');
    await expect(slider, `Page Up from band ${before} (page loads so far: ${reloads.join(', ')})`).toHaveAttribute('data-band', String(before + 1));
    found = (await drawn(page)).groups.length > 0;
  }
  expect(found, 'a band with a simultaneous block').toBe(true);
  const group = orderingFigure(page).locator('g[data-group]').first();
  const members = (await group.getAttribute('data-members'))!.split(' ');
  await orderingFigure(page).locator(`.lf-toggle[data-block="${(await group.getAttribute('data-block'))!}"]`).click();
  const folded = orderingFigure(page).locator('g[data-folded="true"]');
  await expect(folded).toHaveCount(1);
  await expect(folded.locator('text').first()).toHaveText(String(members.length));
  for (const v of members) await expect(orderingFigure(page).locator(`g[data-variable="${v}"]`)).toHaveCount(0);
  await drawn(page);
  await page.screenshot({ path: testInfo.outputPath('folded.png') });
  await folded.click();
  await expect(orderingFigure(page).locator('g[data-group]')).toHaveCount(1);
  await expect(page.getByRole('region', { name: 'What changes at this interval' }).or(page.locator('.lf-explain'))).toContainText('form one simultaneous block');

  await page.getByRole('button', { name: 'Three instants' }).click();
  const unrolled = page.getByRole('figure', { name: 'The ordering over three instants' });
  await expect(unrolled).toHaveAttribute('data-layout', 'elk');
  for (const s of ['-1', '0', '1']) await expect(unrolled.locator(`g[data-slice="${s}"]`)).toHaveCount(model.variables.length);
  const lagged = await unrolled.locator('g[data-edge][data-kind="integrating"]').evaluateAll((els) => els.map((e) => [e.getAttribute('data-from')!, e.getAttribute('data-to')!]));
  for (const [a, b] of lagged) expect(Number(b.split('@')[1]) - Number(a.split('@')[1])).toBe(1);
  const within = await unrolled.locator('g[data-edge][data-kind="instantaneous"]').evaluateAll((els) => els.map((e) => [e.getAttribute('data-from')!, e.getAttribute('data-to')!]));
  for (const [a, b] of within) expect(a.split('@')[1]).toBe(b.split('@')[1]);
  await page.waitForTimeout(400);
  await page.screenshot({ path: testInfo.outputPath('three-instants.png') });
});
