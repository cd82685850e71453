/**
 * The Data pane's figures as element trees (the `El` of `scene.ts`), drawn
 * the same way on screen and in files: one person's series with the nights
 * marked, the histogram of intervals between occasions by kind, missing
 * cells per variable, and the lagged effect against the interval from the
 * fit and from the sketch with the data's intervals marked. No DOM, no React.
 */
import type { Model, TimeUnit } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { INTERVAL_KINDS, type IntervalHistogram, type IntervalKind, type Missingness, type PersonSeriesData } from '../core/data/overview';
import type { LagCurves } from '../core/fit/lagCurve';
import { CHART_STYLE as C, SERIES_DASHES } from '../theme/visual';
import { extent, linear, logScale, logTicks, niceTicks, tickText } from './axes';
import { el, figure, hline, r1, text, tick, vline, type FigureOptions } from './charts';
import { labelOf, numText, significant } from '../present/index';
import type { Attr, El } from './scene';


const W = 360, L = 50, R = 10;

// ——— one person's series ———

export function personSeriesLabel(model: Pick<Model, 'variables'>, s: PersonSeriesData): string {
  return `Person ${s.id}: ${Object.keys(s.values).map((v) => labelOf(model, v)).join(', ')} at each occasion`;
}

/**
 * One panel per variable; each occasion a dot, consecutive occasions joined
 * within a day, the line broken at each night (a dotted vertical rule) and at
 * missing cells.
 */
export function personSeriesChart(model: Pick<Model, 'variables'>, s: PersonSeriesData, timeUnit: TimeUnit, opts: FigureOptions = {}): El {
  const PH = 70, GAP = 22, AXIS = 34;
  const vars = Object.keys(s.values);
  const t1 = s.times[s.times.length - 1] || 1;
  const x = linear(0, t1, L, W - R);
  const top = (i: number) => 4 + i * (PH + GAP) + 14;
  const axisY = top(Math.max(1, vars.length) - 1) + PH;
  const nights = new Set(s.nights);
  const body: El[] = [];
  vars.forEach((v, i) => {
    const y0 = top(i), y1 = y0 + PH;
    const vals = s.values[v];
    const [lo, hi] = extent(vals.filter(Number.isFinite).length ? vals : [0, 1]);
    const y = linear(lo, hi, y1 - 4, y0 + 4);
    const kids: El[] = [
      text({ x: L, y: y0 - 4, 'font-size': 10.5, 'font-weight': 600, fill: C.text }, labelOf(model, v)),
      el('rect', { x: L, y: y0, width: W - L - R, height: PH, fill: C.paper, stroke: C.frame }),
    ];
    for (const t of niceTicks(lo, hi, 3).filter((t) => t >= lo && t <= hi)) kids.push(hline(L - 4, L, y(t), { stroke: C.axis }), tick(L - 6, y(t) + 3.5, tickText(t), 'end'));
    for (const k of s.nights) kids.push(vline(x((s.times[k - 1] + s.times[k]) / 2), y0, y1, { stroke: C.grid, 'stroke-dasharray': '1 2', 'data-night': k }));
    const runs: string[][] = [];
    let cur: string[] = [];
    vals.forEach((val, k) => {
      if (!Number.isFinite(val) || nights.has(k)) { if (cur.length > 1) runs.push(cur); cur = []; }
      if (Number.isFinite(val)) cur.push(`${r1(x(s.times[k]))},${r1(y(val))}`);
    });
    if (cur.length > 1) runs.push(cur);
    for (const r of runs) kids.push(el('polyline', { points: r.join(' '), fill: 'none', stroke: C.line, 'stroke-width': 1 }));
    vals.forEach((val, k) => { if (Number.isFinite(val)) kids.push(el('circle', { cx: r1(x(s.times[k])), cy: r1(y(val)), r: 1.8, fill: C.accent })); });
    body.push(el('g', { 'data-panel': v }, kids));
  });
  for (const t of niceTicks(0, t1, 5).filter((t) => t <= t1)) body.push(vline(x(t), axisY, axisY + 3, { stroke: C.axis }), tick(x(t), axisY + 14, tickText(t), 'middle'));
  body.push(text({ x: (L + W - R) / 2, y: axisY + AXIS - 6, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, `time since the first occasion (${timeUnit}); dotted rules: nights`));
  return figure('person-series', personSeriesLabel(model, s), W, axisY + AXIS, body, opts);
}

// ——— intervals between occasions ———

/** Fill of each kind of interval (told apart by the legend's words too). */
export const KIND_FILL: Record<IntervalKind, string> = { 'within a day': C.label, 'skipped prompt': C.breakpoint, overnight: C.accent };

export function intervalHistogramLabel(): string {
  return 'Intervals between consecutive occasions, by kind';
}

/** Stacked bars on a log axis of the interval; the median marked. */
export function intervalHistogramChart(h: IntervalHistogram, timeUnit: TimeUnit, opts: FigureOptions = {}): El {
  const H = 200, T = 10, B = 40;
  const body: El[] = [];
  const n = h.edges.length - 1;
  if (n < 1) return figure('interval-histogram', intervalHistogramLabel(), W, 40, [text({ x: L, y: 24, 'font-size': 11, fill: C.text }, 'No two consecutive occasions: no intervals to show.')], opts);
  const x = logScale(h.edges[0], h.edges[n], L, W - R);
  const stack = Array.from({ length: n }, (_, i) => INTERVAL_KINDS.reduce((s, k) => s + h.counts[k][i], 0));
  const ymax = Math.max(1, ...stack);
  const y = linear(0, ymax, H - B, T);
  body.push(el('rect', { x: L, y: T, width: W - L - R, height: H - T - B, fill: C.paper, stroke: C.frame }));
  for (const v of niceTicks(0, ymax, 4).filter((v) => v <= ymax)) body.push(hline(L - 4, L, y(v), { stroke: C.axis }), hline(L, W - R, y(v), { stroke: C.grid }), tick(L - 6, y(v) + 3.5, tickText(v), 'end'));
  for (let i = 0; i < n; i++) {
    let base = 0;
    for (const k of INTERVAL_KINDS) {
      const c = h.counts[k][i];
      if (!c) continue;
      const x0 = x(h.edges[i]), x1 = x(h.edges[i + 1]);
      body.push(el('rect', { x: r1(x0 + 0.5), y: r1(y(base + c)), width: r1(Math.max(0.5, x1 - x0 - 1)), height: r1(y(base) - y(base + c)), fill: KIND_FILL[k], 'data-kind': k, 'data-count': c }));
      base += c;
    }
  }
  for (const v of logTicks(h.edges[0], h.edges[n])) body.push(vline(x(v), H - B, H - B + 4, { stroke: C.axis }), tick(x(v), H - B + 15, tickText(v), 'middle'));
  if (Number.isFinite(h.median)) body.push(vline(x(h.median), T, H - B, { stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': '4 2', 'data-median': h.median }));
  body.push(text({ x: (L + W - R) / 2, y: H - 10, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, `interval between occasions (${timeUnit}, log scale)`));
  const legend: El[] = [];
  INTERVAL_KINDS.forEach((k, i) => {
    const lx = (i % 2) * 150, ly = Math.floor(i / 2) * 14;
    legend.push(el('rect', { x: lx, y: ly, width: 10, height: 10, fill: KIND_FILL[k] }), tick(lx + 14, ly + 9, `${k} (${h.totals[k]})`, 'start'));
  });
  legend.push(hline(150, 166, 21, { stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': '4 2' }), tick(170, 24, `median ${formatDuration(significant(h.median, 3), timeUnit)}`, 'start'));
  body.push(el('g', { transform: `translate(${L},${H + 2})`, 'data-part': 'legend' }, legend));
  return figure('interval-histogram', intervalHistogramLabel(), W, H + 32, body, opts);
}

// ——— missing cells ———

export function missingnessLabel(): string {
  return 'Missing cells per variable';
}

/** One bar per variable: the share of occasions without a value. */
export function missingnessChart(model: Pick<Model, 'variables'>, rows: readonly Missingness[], opts: FigureOptions = {}): El {
  const LL = 110, RH = 18, T = 6;
  const x = linear(0, 1, LL, W - 50);
  const body: El[] = [];
  rows.forEach((m, i) => {
    const yy = T + i * RH;
    const share = m.total ? m.missing / m.total : 0;
    body.push(el('g', { 'data-variable': m.variable }, [
      tick(LL - 6, yy + 11, labelOf(model, m.variable), 'end'),
      el('rect', { x: LL, y: yy + 2, width: r1(x(1) - LL), height: RH - 6, fill: C.paper, stroke: C.frame }),
      el('rect', { x: LL, y: yy + 2, width: r1(x(share) - LL), height: RH - 6, fill: C.label, 'data-share': share }),
      tick(x(1) + 4, yy + 11, `${numText(significant(100 * share, 3))} %`, 'start'),
    ]));
  });
  const axisY = T + rows.length * RH + 2;
  for (const v of [0, 0.25, 0.5, 0.75, 1]) body.push(vline(x(v), axisY, axisY + 3, { stroke: C.axis }), tick(x(v), axisY + 14, `${v * 100}`, 'middle'));
  body.push(text({ x: (LL + x(1)) / 2, y: axisY + 28, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, 'occasions without a value (%)'));
  return figure('missingness', missingnessLabel(), W, axisY + 34, body, opts);
}

// ——— lagged effect against the interval, fit and sketch ———

export function lagCurveLabel(model: Pick<Model, 'variables'>, c: Pick<LagCurves, 'from' | 'to'>): string {
  return `Lagged effect of ${labelOf(model, c.from)} on ${labelOf(model, c.to)} against the interval: sketch and data`;
}

/**
 * The sketch's curve (dashed) and the fitted one (solid), the VAR estimate at
 * the data's interval with its 95 % interval, and the data's intervals (the
 * middle half shaded, the median a rule).
 */
export function lagCurveChart(model: Pick<Model, 'variables'>, c: LagCurves, timeUnit: TimeUnit, opts: FigureOptions = {}): El {
  const H = 230, T = 14, B = 40;
  const d0 = c.intervals[0], d1 = c.intervals[c.intervals.length - 1];
  const x = logScale(d0, d1, L + 2, W - R);
  const vals = [...c.sketch, ...(c.fitted ?? []), 0, ...(c.point ? [c.point.low, c.point.high] : [])].filter(Number.isFinite);
  const [y0, y1] = extent(vals);
  const y = linear(y0, y1, H - B, T);
  const body: El[] = [el('rect', { x: L, y: T, width: W - L - R, height: H - T - B, fill: C.paper, stroke: C.frame })];
  body.push(el('rect', { x: r1(x(c.data.q1)), y: T, width: r1(Math.max(1, x(c.data.q3) - x(c.data.q1))), height: H - T - B, fill: C.grid, 'data-part': 'data-intervals' }));
  body.push(vline(x(c.data.median), T, H - B, { stroke: C.accent, 'stroke-width': 1, 'data-median': c.data.median }));
  for (const v of niceTicks(y0, y1, 5)) body.push(hline(L - 4, L, y(v), { stroke: C.axis }), hline(L, W - R, y(v), v === 0 ? { stroke: C.label, 'stroke-width': 0.8 } : { stroke: C.grid }), tick(L - 6, y(v) + 4, tickText(v), 'end'));
  for (const v of logTicks(d0, d1)) body.push(vline(x(v), H - B, H - B + 4, { stroke: C.axis }), tick(x(v), H - B + 15, tickText(v), 'middle'));
  const line = (ys: readonly number[], attrs: Record<string, Attr>) => el('polyline', { points: c.intervals.map((d, k) => [d, ys[k]] as const).filter(([, e]) => Number.isFinite(e)).map(([d, e]) => `${r1(x(d))},${r1(y(e))}`).join(' '), fill: 'none', 'stroke-linejoin': 'round', ...attrs });
  body.push(line(c.sketch, { stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': SERIES_DASHES[1], 'data-curve': 'sketch' }));
  if (c.fitted) body.push(line(c.fitted, { stroke: C.accent, 'stroke-width': 2, 'data-curve': 'fitted' }));
  if (c.point) {
    const px = x(c.point.interval);
    body.push(el('g', { 'data-part': 'estimate' }, [
      vline(px, y(c.point.low), y(c.point.high), { stroke: C.breakpoint, 'stroke-width': 1.5 }),
      hline(px - 4, px + 4, y(c.point.low), { stroke: C.breakpoint, 'stroke-width': 1.5 }),
      hline(px - 4, px + 4, y(c.point.high), { stroke: C.breakpoint, 'stroke-width': 1.5 }),
      el('circle', { cx: r1(px), cy: r1(y(c.point.estimate)), r: 3.5, fill: C.breakpoint }),
    ]));
  }
  body.push(text({ x: (L + W - R) / 2, y: H - 8, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, `interval Δ (${timeUnit}, log scale)`));
  const mid = (T + H - B) / 2;
  body.push(text({ x: 12, y: mid, 'text-anchor': 'middle', transform: `rotate(-90 12 ${mid})`, 'font-size': 10.5, fill: C.label }, 'effect one interval later'));
  const legend: El[] = [hline(0, 16, 6, { stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': SERIES_DASHES[1] }), tick(20, 10, 'sketch', 'start')];
  if (c.fitted) legend.push(hline(70, 86, 6, { stroke: C.accent, 'stroke-width': 2 }), tick(90, 10, 'fitted drift', 'start'));
  if (c.point) legend.push(el('circle', { cx: 170, cy: 6, r: 3.5, fill: C.breakpoint }), tick(178, 10, 'VAR with 95 % interval', 'start'));
  legend.push(el('rect', { x: 0, y: 16, width: 16, height: 10, fill: C.grid }), tick(20, 25, `middle half of the data's intervals (median ${formatDuration(significant(c.data.median, 3), timeUnit)})`, 'start'));
  body.push(el('g', { transform: `translate(${L},${H + 4})`, 'data-part': 'legend' }, legend));
  return figure('lag-curve', lagCurveLabel(model, c), W, H + 34, body, opts);
}
