/**
 * Band orderings in the core worker, in headless Chromium on a production
 * build. For generated sketch models of 50, 200, 500 and 2,000 variables:
 * the time per recompute of a band's ordering measured inside the worker
 * (the pane's data-compute-ms; median and p95 over up to 40 bands spread over
 * the control, each asked for once), beside the same bands computed in Node
 * in this process (the machine's pace), and the time from the pointer to the
 * band's figure on screen. At 500 and 2,000 variables: the main thread's longest task
 * (PerformanceObserver 'longtask', which reports tasks of 50 ms and more) and
 * its longest gap between animation frames while the control is dragged across
 * many bands, and the longest task while the last band is then drawn; at
 * 2,000 variables then the same drags with the sketch canvas hidden, and on the Edit tab (no
 * timescale pane), to tell which part of the page holds the frames back.
 * Run alone: `npx tsx bench/bands.ts` (`--sizes 500` for one model).
 */
import { buildApp, CHROMIUM, serveBuild, ms, sizesFromArgs, stats, verdict } from './common';
import { existsSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from '@playwright/test';
import { generatedSketch } from '../tests/helpers/sketches';
import { orderingAt } from '../src/core/ordering/index';
import type { Model } from '../src/core/model/types';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const PORT = 5531;
const BANDS = 40;
const DRAGS = 3;
const SIZES = sizesFromArgs();
/** The same bands computed in this process (warm, median of three runs per band): the machine's pace, for comparison. */
function inNode(model: Model, intervals: number[]): { median: number; p95: number } {
  for (const x of intervals.slice(0, 4)) orderingAt(model, { samples: 50, interval: x });
  const runs = [0, 1, 2].map(() => intervals.map((x) => { const t0 = performance.now(); orderingAt(model, { samples: 50, interval: x }); return performance.now() - t0; }));
  return stats(intervals.map((_, i) => runs.map((r) => r[i]).sort((a, b) => a - b)[1]));
}
const load = () => loadavg().map((x) => x.toFixed(2)).join(' ');

/** Press and release the pointer on the control at a fraction of its width; resolves with the band the figure then shows. */
async function visit(page: Page, fraction: number): Promise<{ band: number; interval: number; computeMs: number; where: string; toScreenMs: number }> {
  const box = (await page.locator('[role=slider]').boundingBox())!;
  const x = box.x + 2 + (box.width - 4) * fraction;
  const y = box.y + box.height / 2;
  await page.evaluate(`window.__t0 = performance.now()`);
  await page.mouse.move(x, y);
  await page.mouse.down();
  await page.mouse.up();
  // as text: the bundler of this script would wrap a function's inner functions in a helper the page lacks
  return page.evaluate(`new Promise((resolve) => {
    const check = () => {
      const want = document.querySelector('[role=slider]').getAttribute('data-band');
      const pane = document.querySelector('.lf-timescale');
      const fig = document.querySelector('.lf-view-ordering [data-shown]');
      if (pane && pane.getAttribute('data-band') === want && fig && fig.getAttribute('data-shown') === want) {
        resolve({ band: Number(want), interval: Number(document.querySelector('[role=slider]').getAttribute('data-interval')), computeMs: Number(pane.getAttribute('data-compute-ms')), where: pane.getAttribute('data-computed-in'), toScreenMs: performance.now() - window.__t0 });
      } else requestAnimationFrame(check);
    };
    check();
  })`);
}

/**
 * Drag the control from one end to the other: the pointer goes down for real, then moves one step
 * every animation frame (dispatched in the page, so the steps keep the frame rate however slow this
 * script's messages are), then lets go. The main thread's long tasks and longest gap between frames
 * meanwhile; then the long tasks while the band where the pointer let go is drawn.
 */
async function drag(page: Page, forward: boolean, steps = 120) {
  const box = (await page.locator('[role=slider]').boundingBox())!;
  const y = box.y + box.height / 2;
  const at = (f: number) => box.x + 2 + (box.width - 4) * (forward ? f : 1 - f);
  await page.mouse.move(at(0), y);
  // the steps start on the first frame after the pointer went down (a pause would count as a rest,
  // and the figure would follow the thumb there)
  await page.evaluate(`(() => {
    window.__long = [];
    window.__obs = new PerformanceObserver((list) => { for (const e of list.getEntries()) window.__long.push(e.duration); });
    window.__obs.observe({ type: 'longtask' });
    const slider = document.querySelector('[role=slider]');
    window.__drag = new Promise((resolve) => {
      let i = 0, gap = 0, last = 0, from = null;
      const step = (t) => {
        if (!slider.hasPointerCapture(1)) { requestAnimationFrame(step); return; }
        if (from === null) { from = Number(slider.getAttribute('data-band')); last = t; }
        gap = Math.max(gap, t - last);
        last = t;
        const f = i / ${steps};
        const x = ${box.x + 2} + ${box.width - 4} * (${forward} ? f : 1 - f);
        slider.dispatchEvent(new PointerEvent('pointermove', { pointerId: 1, pointerType: 'mouse', isPrimary: true, clientX: x, clientY: ${y}, bubbles: true }));
        // long tasks are reported after they end: one more frame before reading them
        if (++i <= ${steps}) requestAnimationFrame(step);
        else requestAnimationFrame(() => resolve({ long: [...window.__long], gap, from, to: Number(slider.getAttribute('data-band')) }));
      };
      requestAnimationFrame(step);
    });
  })()`);
  await page.mouse.down();
  const during = await page.evaluate<{ long: number[]; gap: number; from: number; to: number }>(`window.__drag`);
  await page.evaluate(`window.__long = []`);
  await page.mouse.move(at(1), y);
  await page.mouse.up();
  // the band where the pointer let go is drawn now
  await page.waitForFunction(`(() => { const p = document.querySelector('.lf-timescale'); return !p || p.getAttribute('data-band') === document.querySelector('[role=slider]').getAttribute('data-band'); })()`, undefined, { timeout: 120_000 });
  await page.waitForTimeout(2000);
  const after = await page.evaluate<number[]>(`(() => { window.__obs.disconnect(); return window.__long; })()`);
  return { bands: Math.abs(during.to - during.from), steps, long: during.long, gap: during.gap, after };
}

/** Wait until the figure's tuned layout is in (no layout worker busy beside the core), at most a few seconds. */
async function settle(page: Page): Promise<void> {
  await page.waitForFunction(`document.querySelector('.lf-view-ordering [data-pending]')?.getAttribute('data-pending') === 'false'`, undefined, { timeout: 4000 }).catch(() => undefined);
}

export async function benchBands(): Promise<void> {
  console.log(`load average ${load()} (2 shared cores: figures vary with other work)`);
  if (!existsSync('/usr/bin/chromium')) { console.log('no /usr/bin/chromium: browser figures skipped'); return; }
  const out = join(tmpdir(), 'loopfold-bench-bands-dist');
  if (!buildApp(ROOT, out)) return;
  const stopServer = await serveBuild(ROOT, out, PORT);
  const { chromium } = await import('@playwright/test');
  const browser = await chromium.launch(CHROMIUM);
  try {
    console.log(`recompute of a band's ordering inside the core worker (up to ${BANDS} bands spread over the control, each asked for once)`);
    for (const n of SIZES) {
      const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
      await page.goto(`http://127.0.0.1:${PORT}/`);
      await page.waitForFunction(() => !!window.__loopfold);
      const model = generatedSketch(n);
      await page.evaluate((m) => window.__loopfold!.load(m), model);
      await page.getByRole('tab', { name: 'Timescales' }).click();
      await page.locator('.lf-timescale[data-band]').waitFor({ timeout: 120_000 });
      const cuts = await page.locator('.lf-tick').count();
      const seen = new Set<number>([Number(await page.locator('.lf-timescale').getAttribute('data-band'))]);
      // warm up (the worker's code is compiled on the first bands); these bands are not measured
      for (let k = 0; k < 4; k++) { seen.add((await visit(page, (k + 0.25) / 4)).band); await settle(page); }
      const compute: number[] = [];
      const intervals: number[] = [];
      const toScreen: number[] = [];
      const where = new Set<string>();
      for (let k = 0; k < BANDS; k++) {
        const v = await visit(page, (k + 0.5) / BANDS);
        if (seen.has(v.band)) continue; // a band asked for before comes from the cache
        seen.add(v.band);
        compute.push(v.computeMs);
        intervals.push(v.interval);
        toScreen.push(v.toScreenMs);
        where.add(v.where);
        await settle(page);
      }
      const c = stats(compute), s = stats(toScreen), node = inNode(model, intervals);
      console.log(`  ${String(n).padStart(5)} variables (${cuts + 1} bands, ${compute.length} measured, in the ${[...where].join(' / ')}): median ${ms(c.median)}, p95 ${ms(c.p95)}${n === 500 ? `  (goal p95 ≤ 8 ms: ${verdict(c.p95 <= 8)})` : ''}; pointer to figure on screen median ${ms(s.median)}, p95 ${ms(s.p95)}`);
      console.log(`         the same bands in Node (this process, warm, median of 3 runs): median ${ms(node.median)}, p95 ${ms(node.p95)}; worker/Node p95 ${(c.p95 / node.p95).toFixed(1)}×`);
      if (n === 500 || n === 2000) {
        const drags = async (title: string) => {
          console.log(title);
          const longest: number[] = [];
          const gaps: number[] = [];
          for (let d = 0; d < DRAGS; d++) {
            const r = await drag(page, d % 2 === 0);
            const top = r.long.length ? Math.max(...r.long) : 0;
            longest.push(top);
            gaps.push(r.gap);
            console.log(`    drag ${d + 1}: ${r.bands} bands crossed in ${r.steps} frames; long tasks ${r.long.length}${r.long.length ? `, longest ${ms(top)}` : ' (none of 50 ms or more)'}; longest gap between frames ${ms(r.gap)}; drawing the band where the pointer let go: longest task ${r.after.length ? ms(Math.max(...r.after)) : 'under 50 ms'}`);
          }
          console.log(`    median of the drags: longest task ${longest.every((x) => x === 0) ? 'none of 50 ms or more' : ms(stats(longest).median)}, longest gap between frames ${ms(stats(gaps).median)} (a frame: 16.7 ms)`);
        };
        await drags(`  main thread while the control is dragged end to end (one step a frame), ${DRAGS} drags at ${n.toLocaleString('en')} variables:`);
        if (n === 500) { await page.close(); continue; }
        // which part of that is the page drawing the sketch canvas (2,000 nodes) again for every move of the thumb
        await page.addStyleTag({ content: '.react-flow { display: none; }' });
        await page.waitForTimeout(1000);
        await drags('  the same with the sketch canvas hidden (the strip, the timescale pane and its figure):');
        // the strip and the band sets alone: no timescale pane
        await page.getByRole('tab', { name: 'Edit' }).click();
        await page.waitForTimeout(1000);
        await drags('  the same on the Edit tab, sketch canvas hidden (the strip alone; the pane, its figure and its band requests are gone):');
      }
      await page.close();
    }
  } finally {
    await browser.close();
    stopServer();
    console.log(`load average ${load()} at the end`);
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await benchBands();
