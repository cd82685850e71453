/**
 * Canvas frame times on a large model: opens the editor in headless
 * Chromium, loads a generated 500-variable / 1,000-link model, scripts a pan
 * and a node drag, and measures frame intervals with requestAnimationFrame.
 * The reference is the same script on a 50-variable / 100-link model in the
 * same run.
 *
 * By default it measures a production build (what modellers get): `vite
 * build` into a temporary folder, served by `vite preview` on a free port in
 * 5400–5499. `--dev` measures the dev server instead (React's development
 * build, several times slower, and edits elsewhere in the checkout reach the
 * page as hot updates).
 *
 * Output, per model size and gesture (idle = one second untouched, pan = the
 * background dragged in a loop, drag = the variable nearest the centre dragged
 * in a loop, 120 pointer moves each, sent as fast as the page takes them;
 * drag60 = the same drag with a move every 1/60 s, as a 60 Hz mouse sends
 * them, so that every frame has work):
 *   `median M ms, p95 P ms, max X ms, F fps (N frames)` — frame intervals,
 *   F = frames per second over the whole gesture.
 * `--runs K` measures each size K times (a fresh page each) and adds a line
 * with the median of each figure over the runs. `--trace` also records a
 * Chromium trace of one 500-variable drag and prints where the time goes per
 * thread (script, style and layout, paint, layerizing, hit tests, raster).
 * `--trace-only` records just that trace; `--dist DIR` measures a build made
 * before (`vite build --outDir DIR`) instead of building one.
 * Run alone: `npx tsx bench/canvas.ts [--runs K] [--trace | --trace-only] [--dist DIR] [--dev]`.
 */
import { createServer as createNetServer } from 'node:net';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from 'playwright-core';
import { CHROMIUM, traceOf } from './common';
import { build, createServer, preview } from 'vite';
import type { Model, Variable, Link } from '../src/core/model/types';

const ROOT = fileURLToPath(new URL('..', import.meta.url));

function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = createNetServer();
    s.once('error', () => resolve(false));
    s.listen(port, '127.0.0.1', () => s.close(() => resolve(true)));
  });
}

/** The first free port in 5400–5499 (the range kept for benchmark servers). */
async function benchPort(): Promise<number> {
  for (let p = 5400; p < 5500; p++) if (await portIsFree(p)) return p;
  throw new Error('no free port in 5400–5499');
}

/** A seeded model of n variables and m links (Park–Miller generator: deterministic, common practice). */
export function generatedModel(n: number, m: number, seed = 12345): Model {
  let s = seed;
  const rnd = () => (s = (s * 48271) % 2147483647) / 2147483647;
  const cols = Math.ceil(Math.sqrt(n * 2));
  const kinds = ['input', 'state', 'derived'] as const;
  const variables: Variable[] = [];
  for (let i = 0; i < n; i++) {
    const kind = i < n / 20 ? 'input' : kinds[1 + Math.floor(rnd() * 2)];
    const v: Variable = { id: `x${i}`, label: `Quantity ${i}`, kind, position: { x: (i % cols) * 210, y: Math.floor(i / cols) * 110 } };
    if (kind === 'state') v.timescale = 1 + Math.floor(rnd() * 100);
    variables.push(v);
  }
  const links: Link[] = [];
  const seen = new Set<string>();
  while (links.length < m) {
    const a = Math.floor(rnd() * n);
    // mostly local links, as in a drawn model
    const b = Math.min(n - 1, Math.max(0, a + Math.floor((rnd() - 0.5) * cols * 3)));
    const key = `${a}-${b}`;
    if (a === b || seen.has(key) || variables[b].kind === 'input') continue;
    seen.add(key);
    links.push({ id: `l${links.length}`, from: `x${a}`, to: `x${b}`, kind: variables[b].kind === 'state' ? 'integrating' : 'instantaneous', sign: rnd() < 0.5 ? '+' : '-' });
  }
  return { format: 'loopfold-model', version: 1, name: `Generated ${n}/${m}`, timeUnit: 'h', variables, links };
}

export interface FrameStats {
  median: number;
  p95: number;
  max: number;
  fps: number;
  frames: number;
}

export function frameStats(deltas: number[]): FrameStats {
  const d = [...deltas].sort((a, b) => a - b);
  const q = (p: number) => d[Math.min(d.length - 1, Math.floor(p * (d.length - 1)))];
  const total = deltas.reduce((a, b) => a + b, 0);
  return { median: q(0.5), p95: q(0.95), max: d[d.length - 1], fps: (1000 * deltas.length) / total, frames: deltas.length };
}

const medianOf = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

async function recordFrames(page: Page, action: () => Promise<void>): Promise<FrameStats> {
  // passed as text: the TypeScript runner would otherwise wrap named functions in a helper the page lacks
  await page.evaluate(`(() => {
    window.__frames = [];
    window.__recording = true;
    let last = performance.now();
    function tick(t) {
      window.__frames.push(t - last);
      last = t;
      if (window.__recording) requestAnimationFrame(tick);
    }
    requestAnimationFrame((t) => { last = t; requestAnimationFrame(tick); });
  })()`);
  await action();
  const frames = (await page.evaluate('(() => { window.__recording = false; return window.__frames; })()')) as number[];
  return frameStats(frames.slice(1));
}

interface Run {
  pan: FrameStats;
  drag: FrameStats;
  drag60: FrameStats;
  idle: FrameStats;
  loadMs: number;
}

async function open(page: Page, base: string, model: Model): Promise<{ cx: number; cy: number; loadMs: number }> {
  await page.goto(`${base}/`);
  await page.waitForSelector('.react-flow__pane');
  await page.waitForFunction(() => !!window.__loopfold);
  const t0 = Date.now();
  await page.evaluate((m) => window.__loopfold!.load(m), model);
  await page.waitForFunction((n) => document.querySelectorAll('.react-flow__node-variable').length >= n, Math.min(model.variables.length, 50));
  await page.waitForFunction(() => document.querySelectorAll('.lf-link path').length > 0);
  const loadMs = Date.now() - t0;
  await page.waitForTimeout(1500);
  const pane = (await page.locator('.react-flow__pane').boundingBox())!;
  return { cx: pane.x + pane.width / 2, cy: pane.y + pane.height / 2, loadMs };
}

/** The variable nearest the centre of the view: its id and where it is on screen. */
async function centreNode(page: Page, cx: number, cy: number): Promise<{ id: string; x: number; y: number }> {
  const node = (await page.evaluate(`(() => {
    let best = null;
    for (const el of document.querySelectorAll('.react-flow__node-variable')) {
      const r = el.getBoundingClientRect();
      const nx = r.x + r.width / 2, ny = r.y + r.height / 2;
      const d = Math.hypot(nx - ${cx}, ny - ${cy});
      if (!best || d < best.d) best = { id: el.getAttribute('data-id') || '', d, x: nx, y: ny };
    }
    return best;
  })()`)) as { id: string; x: number; y: number } | null;
  if (!node) throw new Error('no node on screen to drag');
  return node;
}

/** Where a variable is on screen now. */
async function nodeCentre(page: Page, id: string): Promise<{ id: string; x: number; y: number }> {
  const box = await page.locator(`.react-flow__node[data-id="${id}"]`).boundingBox();
  if (!box) throw new Error(`variable ${id} is not on screen`);
  return { id, x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** The document position of a variable, to check that a scripted drag moved it. */
const docPosition = (page: Page, id: string) => page.evaluate((v) => JSON.stringify(window.__loopfold!.model().variables.find((x) => x.id === v)?.position), id);

async function dragNode(page: Page, node: { x: number; y: number }): Promise<void> {
  await page.mouse.move(node.x, node.y);
  await page.mouse.down();
  for (let i = 0; i < 120; i++) await page.mouse.move(node.x + 150 * Math.sin(i / 10), node.y + 80 * Math.sin(i / 7));
  await page.mouse.up();
}

/**
 * The same drag with a pointer move every 1/60 s, as a 60 Hz mouse sends them whether or not the
 * page has taken the last one (the page merges the moves it could not take): every frame has work.
 */
async function pacedDrag(page: Page, node: { x: number; y: number }): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  const send = (type: 'mouseMoved' | 'mousePressed' | 'mouseReleased', x: number, y: number, buttons: number) =>
    cdp.send('Input.dispatchMouseEvent', { type, x, y, button: type === 'mouseMoved' && buttons === 0 ? 'none' : 'left', buttons, clickCount: type === 'mouseMoved' ? 0 : 1 });
  await send('mouseMoved', node.x, node.y, 0);
  await send('mousePressed', node.x, node.y, 1);
  const sent: Promise<unknown>[] = [];
  const t0 = performance.now();
  let x = node.x;
  let y = node.y;
  for (let i = 0; i < 120; i++) {
    const wait = t0 + (i * 1000) / 60 - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    x = node.x + 150 * Math.sin(i / 10);
    y = node.y + 80 * Math.sin(i / 7);
    sent.push(send('mouseMoved', x, y, 1));
  }
  await Promise.all(sent);
  await send('mouseReleased', x, y, 0);
  await cdp.detach();
}

async function measure(page: Page, base: string, model: Model): Promise<Run> {
  const { cx, cy, loadMs } = await open(page, base, model);
  const idle = await recordFrames(page, () => page.waitForTimeout(1000));
  // pan: drag the empty background in a loop
  const pan = await recordFrames(page, async () => {
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let i = 0; i < 120; i++) await page.mouse.move(cx + 200 * Math.sin(i / 12), cy + 120 * Math.cos(i / 12) - 120);
    await page.mouse.up();
  });
  const node = await centreNode(page, cx, cy);
  let before = await docPosition(page, node.id);
  const drag = await recordFrames(page, () => dragNode(page, node));
  await page.waitForTimeout(300);
  if ((await docPosition(page, node.id)) === before) throw new Error('the drag did not move the variable');
  before = await docPosition(page, node.id);
  const again = await nodeCentre(page, node.id);
  const drag60 = await recordFrames(page, () => pacedDrag(page, again));
  await page.waitForTimeout(300);
  if ((await docPosition(page, node.id)) === before) throw new Error('the paced drag did not move the variable');
  return { pan, drag, drag60, idle, loadMs };
}


/**
 * Busy time per thread and the largest items by self time (CPU time where the trace records it),
 * per pointer move, from one traced drag of 120 moves.
 */
async function traceDrag(page: Page, base: string, model: Model): Promise<void> {
  const { cx, cy } = await open(page, base, model);
  const node = await centreNode(page, cx, cy);
  const moves = 120;
  let wall = 0;
  const rows = await traceOf(page, async () => {
    const t0 = Date.now();
    await dragNode(page, node);
    wall = Date.now() - t0;
  }, moves);
  console.log(`  trace of one 500-variable drag (${moves} moves in ${wall} ms): CPU time per pointer move, by thread and by Chromium's trace event (self time)`);
  for (const r of rows) console.log(`    ${r.thread}: ${r.busy.toFixed(1)} ms — ${r.top.map(([n, t]) => `${n} ${t.toFixed(1)}`).join(', ')}`);
}

const f1 = (x: number) => x.toFixed(1);
const fmt = (s: FrameStats) => `median ${f1(s.median)} ms, p95 ${f1(s.p95)} ms, max ${f1(s.max)} ms, ${f1(s.fps)} fps (${s.frames} frames)`;
const medianStats = (xs: FrameStats[]): FrameStats => ({
  median: medianOf(xs.map((s) => s.median)),
  p95: medianOf(xs.map((s) => s.p95)),
  max: medianOf(xs.map((s) => s.max)),
  fps: medianOf(xs.map((s) => s.fps)),
  frames: Math.round(medianOf(xs.map((s) => s.frames))),
});

function argValue(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

export async function benchCanvas(): Promise<void> {
  const dev = process.argv.includes('--dev');
  const runs = Math.max(1, Number(argValue('--runs') ?? 1) || 1);
  const port = await benchPort();
  let close: () => Promise<void>;
  if (dev) {
    const server = await createServer({ root: ROOT, logLevel: 'error', server: { port, strictPort: true, host: '127.0.0.1' }, clearScreen: false });
    await server.listen();
    close = () => server.close();
  } else {
    const given = argValue('--dist');
    const outDir = given ?? join(tmpdir(), 'loopfold-bench-canvas-dist');
    if (given) console.log(`measuring the build in ${outDir} (not rebuilt)`);
    else {
      console.log(`building the app (vite build → ${outDir}) …`);
      await build({ root: ROOT, logLevel: 'error', build: { outDir, emptyOutDir: true } });
    }
    const server = await preview({ root: ROOT, logLevel: 'error', build: { outDir }, preview: { port, strictPort: true, host: '127.0.0.1' } });
    close = () => new Promise<void>((resolve) => server.httpServer.close(() => resolve()));
  }
  const browser = await chromium.launch(CHROMIUM);
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    const base = `http://127.0.0.1:${port}`;
    // warm-up: the dev server compiles modules on first request
    await page.goto(`${base}/`);
    await page.waitForSelector('.react-flow__pane', { timeout: 120_000 });
    // let the worker start and the dev server finish discovering dependencies (it may reload once)
    await page.waitForTimeout(dev ? 5000 : 1000);
    console.log(`canvas frame times (headless Chromium, software rendering, requestAnimationFrame intervals; ${dev ? 'dev server' : 'production build'})`);
    console.log(`  load average at start ${loadavg().map((x) => x.toFixed(2)).join(' ')} (2 shared cores: figures vary with other work)`);
    const sizes = [['50 variables / 100 links (reference)', generatedModel(50, 100)], ['500 variables / 1000 links', generatedModel(500, 1000)]] as const;
    if (process.argv.includes('--trace-only')) {
      await traceDrag(page, base, sizes[1][1]);
      return;
    }
    const results: Run[][] = sizes.map(() => []);
    for (let r = 0; r < runs; r++) {
      for (let i = 0; i < sizes.length; i++) results[i].push(await measure(page, base, sizes[i][1]));
    }
    sizes.forEach(([name], i) => {
      const rs = results[i];
      console.log(`  ${name}: load ${rs.map((r) => r.loadMs).join(', ')} ms`);
      for (const g of ['idle', 'pan', 'drag', 'drag60'] as const) {
        rs.forEach((r, k) => console.log(`    ${g.padEnd(6)} ${runs > 1 ? `run ${k + 1}  ` : ''}${fmt(r[g])}`));
        if (runs > 1) console.log(`    ${g.padEnd(6)} median of ${runs} runs: ${fmt(medianStats(rs.map((r) => r[g])))}`);
      }
    });
    const [s, l] = results.map((rs) => ({ pan: medianStats(rs.map((r) => r.pan)), drag: medianStats(rs.map((r) => r.drag)), drag60: medianStats(rs.map((r) => r.drag60)) }));
    console.log(`  ratio 500/50: pan median ×${(l.pan.median / s.pan.median).toFixed(2)}, drag median ×${(l.drag.median / s.drag.median).toFixed(2)}, pan p95 ×${(l.pan.p95 / s.pan.p95).toFixed(2)}, drag p95 ×${(l.drag.p95 / s.drag.p95).toFixed(2)}, drag60 p95 ×${(l.drag60.p95 / s.drag60.p95).toFixed(2)}`);
    for (const g of ['drag', 'drag60'] as const) {
      const met = l[g].fps >= 55 && l[g].p95 <= 20;
      console.log(`  goal at 500 variables, ${g} ≥ 55 fps with p95 ≤ 20 ms: ${met ? 'meets goal' : 'MISSES goal'} (${f1(l[g].fps)} fps, p95 ${f1(l[g].p95)} ms)`);
    }
    if (process.argv.includes('--trace')) await traceDrag(page, base, sizes[1][1]);
    console.log(`  load average at end ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  } finally {
    await browser.close();
    await close();
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  benchCanvas().catch((e) => {
    console.error(e);
    process.exitCode = 1;
  });
}
