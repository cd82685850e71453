/** Pieces every benchmark script prints with: the sizes asked for, median and p95, the wording of figures, and a Chromium trace's summary. */
import { spawn, spawnSync } from 'node:child_process';
import type { CDPSession } from 'playwright-core';

/** `--sizes 500` (or `--sizes 200,500`) measures only those models; by default 50, 200, 500 and 2,000 variables. */
export function sizesFromArgs(argv: readonly string[] = process.argv): number[] {
  const arg = argv[argv.indexOf('--sizes') + 1];
  return argv.includes('--sizes') && arg ? arg.split(',').map(Number) : [50, 200, 500, 2000];
}

/** Median and 95th percentile (nearest rank). */
export function stats(xs: number[]): { median: number; p95: number } {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))];
  return { median: q(0.5), p95: q(0.95) };
}

export const ms = (x: number) => `${x < 10 ? x.toFixed(2) : x.toFixed(0)} ms`;
export const verdict = (ok: boolean) => (ok ? 'meets goal' : 'MISSES goal');

interface TraceEvent {
  ph: string;
  name: string;
  pid: number;
  tid: number;
  ts: number;
  dur?: number;
  /** Thread (CPU) time, where the trace has it: less inflated than wall time by other work on the machine. */
  tdur?: number;
  args?: { name?: string };
}

/** Per thread: CPU ms per step, and the six trace events with most self time (ms per step). */
export interface TraceRow {
  thread: string;
  busy: number;
  top: [string, number][];
}

/**
 * Record a Chromium trace while `act` runs in the page and say where the time
 * went: for each thread busy more than 2 % of the wall time, its CPU time per
 * step (`steps` = pointer moves, frames, …) and the events with the most self
 * time (thread time where the trace has it).
 */
export async function traceOf(page: { context(): { newCDPSession(p: unknown): Promise<CDPSession> } }, act: () => Promise<void>, steps: number): Promise<TraceRow[]> {
  const cdp = await page.context().newCDPSession(page);
  const events: TraceEvent[] = [];
  cdp.on('Tracing.dataCollected', (e: { value: object[] }) => events.push(...(e.value as TraceEvent[])));
  await cdp.send('Tracing.start', { traceConfig: { includedCategories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'blink', 'cc', 'v8'] } });
  const t0 = Date.now();
  await act();
  const wall = Date.now() - t0;
  const done = new Promise<void>((r) => cdp.once('Tracing.tracingComplete', () => r()));
  await cdp.send('Tracing.end');
  await done;
  await cdp.detach();
  const names = new Map<string, string>();
  for (const e of events) if (e.ph === 'M' && e.name === 'thread_name' && e.args?.name) names.set(`${e.pid}:${e.tid}`, e.args.name);
  const byThread = new Map<string, TraceEvent[]>();
  for (const e of events) {
    if (e.ph !== 'X' || typeof e.dur !== 'number') continue;
    const k = `${e.pid}:${e.tid}`;
    if (!byThread.has(k)) byThread.set(k, []);
    byThread.get(k)!.push(e);
  }
  const rows: TraceRow[] = [];
  for (const [k, list] of byThread) {
    list.sort((a, b) => a.ts - b.ts || b.dur! - a.dur!);
    const cost = (e: TraceEvent) => e.tdur ?? e.dur!;
    const self = new Map<string, number>();
    const stack: TraceEvent[] = [];
    for (const e of list) {
      while (stack.length && stack[stack.length - 1].ts + stack[stack.length - 1].dur! <= e.ts) stack.pop();
      const p = stack[stack.length - 1];
      if (p) self.set(p.name, (self.get(p.name) ?? 0) - Math.min(cost(e), cost(p)));
      self.set(e.name, (self.get(e.name) ?? 0) + cost(e));
      stack.push(e);
    }
    const busy = [...self.values()].reduce((a, b) => a + b, 0) / 1000 / steps;
    if (busy < 0.02 * (wall / steps)) continue;
    rows.push({ thread: names.get(k) ?? k, busy, top: [...self].sort((a, b) => b[1] - a[1]).slice(0, 6).map(([n, us]) => [n, us / 1000 / steps]) });
  }
  return rows.sort((a, b) => b.busy - a.busy);
}

/** How every bench launches Chromium: Debian's browser, software rendering, nothing running in the background. */
export const CHROMIUM = {
  executablePath: '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
};

/** `vite build` of the app in `root` into `out`, printing what it is doing; false (with the build's message printed) when it fails. */
export function buildApp(root: string, out: string): boolean {
  console.log(`building the app (vite build → ${out}) …`);
  const b = spawnSync('npx', ['vite', 'build', '--outDir', out, '--emptyOutDir', '--logLevel', 'error'], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) console.log(`  build failed: ${b.stderr.slice(0, 800)}`);
  return b.status === 0;
}

/** Serve the build in `out` with `vite preview` on 127.0.0.1:`port`; resolves once it answers (or after 10 s), with the function that stops it. */
export async function serveBuild(root: string, out: string, port: number): Promise<() => void> {
  const server = spawn('npx', ['vite', 'preview', '--outDir', out, '--port', String(port), '--strictPort', '--host', '127.0.0.1'], { cwd: root, stdio: 'ignore', detached: true });
  for (let i = 0; i < 50; i++) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/`)).ok) break;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return () => {
    if (server.pid) {
      try {
        process.kill(-server.pid);
      } catch {
        /* already gone */
      }
    }
  };
}
