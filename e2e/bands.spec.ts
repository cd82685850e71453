import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { parseModel } from '../src/core/model/schema';
import { breakpoints, orderingAt } from '../src/core/ordering/index';
import { modelAxis } from '../src/core/study/convert';
import { intervalRange } from '../src/core/view/interval';

const model = (() => {
  const r = parseModel(JSON.parse(readFileSync(new URL('../src/examples/sleep-stress.json', import.meta.url), 'utf8')));
  if (!r.ok) throw new Error('bad example');
  return r.model;
})();

const pane = (page: Page) => page.locator('.lf-timescale');
const figure = (page: Page) => page.getByRole('figure', { name: 'The ordering at the interval' });
const slider = (page: Page) => page.getByRole('slider', { name: 'Sampling interval' });

async function open(page: Page, query = '') {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  await page.goto(`/?example=sleep-stress${query}`);
  await page.getByRole('tab', { name: 'Timescales' }).click();
  await expect(pane(page)).toHaveAttribute('data-band', /\d+/);
  return errors;
}

/** Wait until the figure shows the slider's band, then read its roles. */
async function rolesShown(page: Page) {
  const band = (await slider(page).getAttribute('data-band'))!;
  await expect(pane(page)).toHaveAttribute('data-band', band);
  await expect(figure(page)).toHaveAttribute('data-shown', band);
  return figure(page).evaluate((root) => Object.fromEntries([...root.querySelectorAll('g[data-variable]')].map((g) => [g.getAttribute('data-variable'), g.getAttribute('data-role')])));
}

test('a band change keeps a figure on screen, and the pane names the band it draws, at every frame', async ({ page }) => {
  const errors = await open(page);
  await slider(page).focus();
  await page.keyboard.press('Home');
  await rolesShown(page);
  // sample the pane at every animation frame while the keys move from band to band
  await page.evaluate(`(() => {
    window.__samples = [];
    window.__sampling = true;
    const tick = () => {
      const p = document.querySelector('.lf-timescale');
      const f = document.querySelector('[aria-label="The ordering at the interval"]');
      window.__samples.push({ band: p && p.getAttribute('data-band'), shown: f && f.getAttribute('data-shown'), nodes: f ? f.querySelectorAll('g[data-variable]').length : 0, waiting: !!p && p.textContent.includes('Finding the model') });
      if (window.__sampling) requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
  })()`);
  for (let i = 0; i < 8; i++) await page.keyboard.press('PageUp');
  await rolesShown(page);
  const samples = await page.evaluate<{ band: string | null; shown: string | null; nodes: number; waiting: boolean }[]>(`(() => { window.__sampling = false; return window.__samples; })()`);
  expect(samples.length).toBeGreaterThan(2);
  for (const s of samples) {
    expect(s.waiting).toBe(false);
    expect(s.nodes).toBe(model.variables.length);
    expect(s.shown).toBe(s.band);
  }
  // more than one band was drawn along the way, in order
  const drawn = [...new Set(samples.map((s) => Number(s.band)))];
  expect(drawn.length).toBeGreaterThan(1);
  expect(drawn).toEqual([...drawn].sort((a, b) => a - b));
  // the ordering came from the core worker, which says how long it took
  await expect(pane(page)).toHaveAttribute('data-computed-in', 'worker');
  expect(Number(await pane(page).getAttribute('data-compute-ms'))).toBeGreaterThanOrEqual(0);
  expect(errors).toEqual([]);
});

test('a hold and a new study length open a new band set: the figure and the ticks follow', async ({ page }) => {
  const errors = await open(page);
  await slider(page).focus();
  await page.keyboard.press('End');
  const interval = Number(await slider(page).getAttribute('data-interval'));
  expect(await rolesShown(page)).toEqual(orderingAt(model, { interval, ...modelAxis(model) }).roles);

  await page.getByRole('tab', { name: 'Intervene' }).click();
  const hold = page.locator('.lf-hold');
  await hold.getByRole('combobox').selectOption({ label: 'Stress' });
  await hold.getByRole('textbox').fill('2');
  await hold.getByRole('button', { name: 'Hold', exact: true }).click();
  await page.getByRole('tab', { name: 'Timescales' }).click();
  const held = orderingAt(model, { interval, ...modelAxis(model), hold: { stress: 2 } }).roles;
  expect(held.stress).toBe('held');
  await expect.poll(() => rolesShown(page)).toEqual(held);

  // 20 samples: the breakpoints move, and the control shows the new ones
  await page.getByLabel('Study length given as').selectOption('samples');
  await page.getByLabel('Number of samples').fill('20');
  const bps20 = breakpoints(model, { samples: 20 });
  const range = intervalRange(model, bps20);
  const inside = bps20.filter((b) => b.interval > range.min && b.interval < range.max).map((b) => b.interval).sort((a, b) => a - b);
  expect(inside).not.toEqual(breakpoints(model, modelAxis(model)).map((b) => b.interval).sort((a, b) => a - b));
  await expect.poll(() => page.locator('.lf-tick').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-breakpoint'))).sort((a, b) => a - b))).toEqual(inside);
  const now = Number(await slider(page).getAttribute('data-interval'));
  await expect.poll(() => rolesShown(page)).toEqual(orderingAt(model, { interval: now, samples: 20, hold: { stress: 2 } }).roles);
  expect(errors).toEqual([]);
});

test('without a worker (?noworker) the same orderings are computed on the main thread', async ({ page }) => {
  const errors = await open(page, '&noworker');
  await slider(page).focus();
  await page.keyboard.press('Home');
  for (let i = 0; i < 4; i++) await page.keyboard.press('PageUp');
  const interval = Number(await slider(page).getAttribute('data-interval'));
  expect(await rolesShown(page)).toEqual(orderingAt(model, { interval, ...modelAxis(model) }).roles);
  await expect(pane(page)).toHaveAttribute('data-computed-in', 'main thread');
  expect(errors).toEqual([]);
});
