/**
 * The design advisor's figure: power for each link of interest against one axis of the design
 * (the interval, log scale; the persons; the prompts a day), the 80 % target as a rule and the
 * recommended design marked. One builder for the pane and the exported file. No DOM, no React.
 */
import { CHART_STYLE as C, SERIES_DASHES } from '../theme/visual';
import { linear, logScale, logTicks, tickText } from './axes';
import { figure, type FigureOptions } from './charts';
import type { Attr, El } from './scene';

export interface PowerChartInput {
  /** What the figure shows, e.g. "Power against the interval, 70 prompts per person". */
  label: string;
  xs: readonly number[];
  /** One line per link: its name and its power at each x. */
  series: readonly { name: string; power: readonly number[] }[];
  xLabel: string;
  log: boolean;
  target: number;
  recommended: number | null;
}

const W = 380, H = 220, L = 48, R = 12, T = 12, B = 40;
const r1 = (x: number) => Math.round(x * 10) / 10;
const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
const text = (attrs: Record<string, Attr>, s: string): El => el('text', { 'font-size': 10, fill: C.text, ...attrs }, [s]);

export function powerChart(input: PowerChartInput, opts: FigureOptions = {}): El {
  const { xs, series } = input;
  const x0 = xs[0], x1 = xs[xs.length - 1] === x0 ? x0 + 1 : xs[xs.length - 1];
  const x = input.log ? logScale(x0, x1, L, W - R) : linear(x0, x1, L, W - R);
  const y = linear(0, 1, H - B, T);
  const body: El[] = [el('rect', { x: L, y: T, width: W - L - R, height: H - T - B, fill: C.paper, stroke: C.frame })];
  for (const v of [0, 0.2, 0.4, 0.6, 0.8, 1]) body.push(el('line', { x1: L - 4, x2: W - R, y1: r1(y(v)), y2: r1(y(v)), stroke: C.grid }), text({ x: L - 6, y: r1(y(v) + 3.5), 'text-anchor': 'end' }, `${Math.round(v * 100)} %`));
  const ticks = input.log ? logTicks(x0, x1) : xs.length <= 12 ? [...xs] : xs.filter((_, k) => k % Math.ceil(xs.length / 8) === 0);
  for (const v of ticks) body.push(el('line', { x1: r1(x(v)), x2: r1(x(v)), y1: H - B, y2: H - B + 4, stroke: C.axis }), text({ x: r1(x(v)), y: H - B + 15, 'text-anchor': 'middle' }, tickText(v)));
  body.push(el('line', { x1: L, x2: W - R, y1: r1(y(input.target)), y2: r1(y(input.target)), stroke: C.breakpoint, 'stroke-dasharray': C.breakpointDash, 'data-part': 'target' }));
  series.forEach((s, i) => {
    const points = xs.map((v, k) => [v, s.power[k]] as const).filter(([, p]) => Number.isFinite(p)).map(([v, p]) => `${r1(x(v))},${r1(y(p))}`).join(' ');
    body.push(el('polyline', { points, fill: 'none', stroke: C.line, 'stroke-width': 1.6, 'stroke-dasharray': SERIES_DASHES[i % SERIES_DASHES.length] || undefined, 'stroke-linejoin': 'round', 'data-series': s.name }));
  });
  if (input.recommended !== null) body.push(el('line', { x1: r1(x(input.recommended)), x2: r1(x(input.recommended)), y1: T, y2: H - B, stroke: C.accent, 'stroke-width': 2, 'data-recommended': input.recommended }));
  body.push(text({ x: (L + W - R) / 2, y: H - 8, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, input.xLabel));
  const mid = (T + H - B) / 2;
  body.push(text({ x: 12, y: mid, 'text-anchor': 'middle', transform: `rotate(-90 12 ${mid})`, 'font-size': 10.5, fill: C.label }, 'power (α = .05)'));
  const legend: El[] = [];
  let lx = 0, ly = 0;
  const item = (w: number, kids: El[]) => {
    if (lx + w > W - L - R) { lx = 0; ly += 14; }
    legend.push(el('g', { transform: `translate(${lx},${ly})` }, kids));
    lx += w;
  };
  series.forEach((s, i) => item(28 + s.name.length * 5.6, [el('line', { x1: 0, x2: 16, y1: 6, y2: 6, stroke: C.line, 'stroke-width': 1.6, 'stroke-dasharray': SERIES_DASHES[i % SERIES_DASHES.length] || undefined }), text({ x: 20, y: 10 }, s.name)]));
  item(110, [el('line', { x1: 0, x2: 16, y1: 6, y2: 6, stroke: C.breakpoint, 'stroke-dasharray': C.breakpointDash }), text({ x: 20, y: 10 }, `target ${Math.round(input.target * 100)} %`)]);
  if (input.recommended !== null) item(110, [el('line', { x1: 0, x2: 16, y1: 6, y2: 6, stroke: C.accent, 'stroke-width': 2 }), text({ x: 20, y: 10 }, 'recommended')]);
  body.push(el('g', { transform: `translate(${L},${H + 4})`, 'data-part': 'legend' }, legend));
  return figure('power-curve', input.label, W, H + 18 + ly, body, opts);
}
