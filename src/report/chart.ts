/**
 * A small line chart of one variable in two runs (without and with an
 * intervention) as a self-contained SVG string. The runs differ by line
 * style (dashed without, solid with), not by colour alone, so the chart
 * survives print and grayscale.
 */
import type { Trajectories } from '../core/interventions/effects';
import { htmlEscape } from './html-escape';

export interface ChartOptions {
  width?: number;
  height?: number;
  /** Time unit shown on the axis. */
  timeUnit?: string;
  /** Show the run only until both lines are within 1% of their final range (plus half as long again). */
  crop?: boolean;
}

/** The index up to which a chart shows the runs: where they have done 99% of their moving, with a margin. */
export function settledIndex(times: number[], runs: number[][]): number {
  const n = times.length;
  let last = 1;
  for (const r of runs) {
    if (r.length < n) continue;
    const lo = Math.min(...r);
    const hi = Math.max(...r);
    const band = 0.01 * (hi - lo);
    const end = r[n - 1];
    for (let k = n - 1; k >= 0; k--) if (Math.abs(r[k] - end) > band) { last = Math.max(last, k); break; }
  }
  const tEnd = Math.min(times[n - 1], times[0] + 1.5 * (times[last] - times[0]));
  let k = last;
  while (k < n - 1 && times[k] < tEnd) k++;
  return Math.max(k, Math.min(n - 1, 4));
}

const fmt = (x: number) => (x === 0 ? '0' : Math.abs(x) >= 1e-3 && Math.abs(x) < 1e5 ? String(Number(x.toPrecision(3))) : x.toExponential(2));

/** `trajectoryChart(t, 'airTemp', 'Air temperature')` → '<svg …>…</svg>'. */
export function trajectoryChart(t: Trajectories, variable: string, label: string, options: ChartOptions = {}): string {
  const W = options.width ?? 300;
  const H = options.height ?? 140;
  const pad = { l: 48, r: 10, t: 22, b: 26 };
  const end = options.crop ? settledIndex(t.times, [t.without[variable] ?? [], t.with[variable] ?? []]) + 1 : t.times.length;
  t = { times: t.times.slice(0, end), without: { [variable]: (t.without[variable] ?? []).slice(0, end) }, with: { [variable]: (t.with[variable] ?? []).slice(0, end) } };
  const a = t.without[variable];
  const b = t.with[variable];
  const all = [...a, ...b].filter(Number.isFinite);
  const t0 = t.times[0] ?? 0;
  const t1 = t.times[t.times.length - 1] ?? 1;
  let lo = all.length ? Math.min(...all) : 0;
  let hi = all.length ? Math.max(...all) : 1;
  if (hi - lo < 1e-12 * (1 + Math.abs(hi))) { lo -= 0.5; hi += 0.5; }
  const x = (tt: number) => pad.l + ((tt - t0) / (t1 - t0 || 1)) * (W - pad.l - pad.r);
  const y = (v: number) => H - pad.b - ((v - lo) / (hi - lo)) * (H - pad.t - pad.b);
  const line = (vs: number[]) => vs.map((v, k) => (Number.isFinite(v) ? `${x(t.times[k]).toFixed(1)},${y(v).toFixed(1)}` : '')).filter(Boolean).join(' ');
  const e = htmlEscape;
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" aria-label="${e(`${label}: without and with the hold`)}">`,
    `<rect x="0" y="0" width="${W}" height="${H}" fill="#fff"/>`,
    `<text x="${pad.l}" y="14" font-size="12" font-family="system-ui,sans-serif" font-weight="600">${e(label)}</text>`,
    `<line x1="${pad.l}" y1="${H - pad.b}" x2="${W - pad.r}" y2="${H - pad.b}" stroke="#555"/>`,
    `<line x1="${pad.l}" y1="${pad.t}" x2="${pad.l}" y2="${H - pad.b}" stroke="#555"/>`,
    `<text x="${pad.l - 4}" y="${pad.t + 4}" font-size="10" text-anchor="end" font-family="system-ui,sans-serif">${e(fmt(hi))}</text>`,
    `<text x="${pad.l - 4}" y="${H - pad.b}" font-size="10" text-anchor="end" font-family="system-ui,sans-serif">${e(fmt(lo))}</text>`,
    `<text x="${W - pad.r}" y="${H - 8}" font-size="10" text-anchor="end" font-family="system-ui,sans-serif">${e(`${fmt(t1)} ${options.timeUnit ?? ''}`.trim())}</text>`,
    `<polyline class="without" points="${line(a)}" fill="none" stroke="#777" stroke-width="1.5" stroke-dasharray="6 3"/>`,
    `<polyline class="with" points="${line(b)}" fill="none" stroke="#1d1d1f" stroke-width="2"/>`,
    '</svg>',
  ].join('\n');
}
