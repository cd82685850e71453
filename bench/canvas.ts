/**
 * Canvas frame times on a large model: opens the editor in headless
 * Chromium on a Vite dev server it starts itself, loads a generated
 * 500-variable / 1,000-link model, scripts a pan and a node drag, and
 * measures frame intervals with requestAnimationFrame. The reference is the
 * same script on a 50-variable model in the same run.
 * Run alone: `npx tsx bench/canvas.ts`.
 */
import { createServer as createNetServer } from 'node:net';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from 'playwright-core';
import { createServer } from 'vite';
import type { Model, Variable, Link } from '../src/core/model/types';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createNetServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
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

interface FrameStats {
  median: number;
  p95: number;
  fps: number;
  frames: number;
}

function stats(deltas: number[]): FrameStats {
  const d = [...deltas].sort((a, b) => a - b);
  const q = (p: number) => d[Math.min(d.length - 1, Math.floor(p * (d.length - 1)))];
  const total = deltas.reduce((a, b) => a + b, 0);
  return { median: q(0.5), p95: q(0.95), fps: (1000 * deltas.length) / total, frames: deltas.length };
}

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
  return stats(frames.slice(1));
}

async function measure(page: Page, base: string, model: Model): Promise<{ pan: FrameStats; drag: FrameStats; idle: FrameStats; loadMs: number }> {
  await page.goto(`${base}/`);
  await page.waitForSelector('.react-flow__pane');
  const t0 = Date.now();
  await page.evaluate((m) => window.__loopfold!.load(m), model);
  await page.waitForFunction((n) => document.querySelectorAll('.react-flow__node-variable').length >= n, Math.min(model.variables.length, 50));
  await page.waitForFunction(() => document.querySelectorAll('.react-flow__edge-link path').length > 0);
  const loadMs = Date.now() - t0;
  await page.waitForTimeout(1500);
  const idle = await recordFrames(page, () => page.waitForTimeout(1000));
  const pane = (await page.locator('.react-flow__pane').boundingBox())!;
  const cx = pane.x + pane.width / 2;
  const cy = pane.y + pane.height / 2;
  // pan: drag the empty background in a loop for about two seconds
  const pan = await recordFrames(page, async () => {
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let i = 0; i < 120; i++) await page.mouse.move(cx + 200 * Math.sin(i / 12), cy + 120 * Math.cos(i / 12) - 120);
    await page.mouse.up();
  });
  // node drag: the variable nearest the centre of the view
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
  const drag = await recordFrames(page, async () => {
    await page.mouse.move(node.x, node.y);
    await page.mouse.down();
    for (let i = 0; i < 120; i++) await page.mouse.move(node.x + 150 * Math.sin(i / 10), node.y + 80 * Math.sin(i / 7));
    await page.mouse.up();
  });
  return { pan, drag, idle, loadMs };
}

const fmt = (s: FrameStats) => `median ${s.median.toFixed(1)} ms, p95 ${s.p95.toFixed(1)} ms, ${s.fps.toFixed(1)} fps (${s.frames} frames)`;

export async function benchCanvas(): Promise<void> {
  const port = await freePort();
  const root = fileURLToPath(new URL('..', import.meta.url));
  const server = await createServer({ root, logLevel: 'error', server: { port, strictPort: true, host: '127.0.0.1' }, clearScreen: false });
  await server.listen();
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    const base = `http://127.0.0.1:${port}`;
    // warm-up: the dev server compiles modules on first request
    await page.goto(`${base}/`);
    await page.waitForSelector('.react-flow__pane', { timeout: 120_000 });
    // let the worker start and the dev server finish discovering dependencies (it may reload once)
    await page.waitForTimeout(5000);
    const small = await measure(page, base, generatedModel(50, 100));
    const large = await measure(page, base, generatedModel(500, 1000));
    console.log('canvas frame times (headless Chromium, software rendering, requestAnimationFrame intervals)');
    for (const [name, r] of [['50 variables / 100 links (reference)', small], ['500 variables / 1000 links', large]] as const) {
      console.log(`  ${name}: load ${r.loadMs} ms`);
      console.log(`    idle  ${fmt(r.idle)}`);
      console.log(`    pan   ${fmt(r.pan)}`);
      console.log(`    drag  ${fmt(r.drag)}`);
    }
    console.log(`  ratio 500/50: pan median ×${(large.pan.median / small.pan.median).toFixed(2)}, drag median ×${(large.drag.median / small.drag.median).toFixed(2)}, pan p95 ×${(large.pan.p95 / small.pan.p95).toFixed(2)}`);
  } finally {
    await browser.close();
    await server.close();
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  benchCanvas().catch((e) => {
    console.error(e);
    process.exitCode = 1;
  });
}
