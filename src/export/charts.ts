/**
 * The one drawing of the Numbers pane's charts and networks: time series of a
 * simulated run, the lagged and same-interval networks of the sampled model,
 * and one lagged link against the sampling interval. Each builder returns a
 * root `<svg>` element tree (the `El` of `scene.ts`) with every presentation
 * attribute inline, so `svgDocument` writes a self-contained file and the app
 * turns the same tree into React elements: the screen and the exported figure
 * are one picture. No DOM, no React.
 */
import type { Model, VariableId } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import type { LinkCurve } from '../core/numeric/index';
import { sampleTimes, valueAt } from '../core/numeric/samples';
import { CHART_STYLE as C, FONT_STACK, SERIES_DASHES } from '../theme/visual';
import { extent, linear, logScale, logTicks, niceTicks, tickText } from './axes';
import { studyLength, type StudyAt } from './caption';
import { nameLines, nameWidth, placeNetwork, placeNetworkCompact, textWidth, WEIGHT_FONT, type NetworkPlacement } from '../layout/network';
import { labelOf, numText, significant, unitOf, weightText } from '../present/index';
import { wrapText, type Attr, type El } from './scene';
import { targetScale } from './print/figure';
import { DEFAULT_FONT_PT } from './print/options';

export interface FigureOptions {
  /** Draw the figure's name as a heading line above it (files; the pane has headings of its own). */
  heading?: boolean;
  /** A caption under the figure, worded by the caller (the interval and the study length). */
  caption?: string;
  /**
   * The print width (pt) and base font size (pt) the figure is made for: a builder that can narrow its
   * drawing draws it so that its text is the base size and never under 7 pt at that width (the rank curve).
   */
  fitTo?: { widthPt: number; fontPt?: number };
}

const PAD = 10;

/**
 * The width a chart is drawn at: its screen width, or for print (`opts.fitTo`) the width at which its main
 * text (`main` units) is the base font size and its smallest (`min` units) at least 7 pt, not under `least`.
 */
export function fittedWidth(opts: FigureOptions, screen: number, main: number, min: number, least: number): number {
  if (!opts.fitTo) return screen;
  return Math.round(Math.max(least, Math.min(screen, opts.fitTo.widthPt / targetScale(opts.fitTo.fontPt ?? DEFAULT_FONT_PT, main, min))));
}
/** Drawing helpers the chart modules share: coordinates to a tenth, elements, tick labels, axis lines. */
export const r1 = (x: number) => Math.round(x * 10) / 10;
export const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
export const text = (attrs: Record<string, Attr>, s: string): El => el('text', attrs, [s]);
export const tick = (x: number, y: number, s: string, anchor: 'start' | 'middle' | 'end'): El =>
  text({ x: r1(x), y: r1(y), 'text-anchor': anchor === 'start' ? undefined : anchor, 'font-size': 10, fill: C.text }, s);
export const hline = (x1: number, x2: number, y: number, attrs: Record<string, Attr>): El => el('line', { x1: r1(x1), x2: r1(x2), y1: r1(y), y2: r1(y), ...attrs });
export const vline = (x: number, y1: number, y2: number, attrs: Record<string, Attr>): El => el('line', { x1: r1(x), x2: r1(x), y1: r1(y1), y2: r1(y2), ...attrs });

/** The root: white ground, optional heading and caption around the drawing of `width` × `height`. */
export function figure(kind: string, label: string, width: number, height: number, body: El[], opts: FigureOptions, defs?: El): El {
  const head = opts.heading ? wrapText(label, width - 2 * PAD, 6.8) : [];
  const top = head.length ? 10 + head.length * 16 : 0;
  const cap = opts.caption ? wrapText(opts.caption, width - 2 * PAD, 5.9) : [];
  const total = Math.ceil(top + height + (cap.length ? 6 + cap.length * 14 : 0));
  const w = Math.ceil(width);
  const children: El[] = [];
  if (defs) children.push(defs);
  children.push(el('rect', { x: 0, y: 0, width: w, height: total, fill: C.paper }));
  if (head.length) children.push(el('text', { x: PAD, y: 18, 'font-size': 12, 'font-weight': 700, fill: C.text, 'data-part': 'title' }, head.map((t, i) => el('tspan', { x: PAD, dy: i ? 16 : 0 }, [t]))));
  children.push(el('g', top ? { transform: `translate(0,${top})`, 'data-part': 'figure' } : { 'data-part': 'figure' }, body));
  if (cap.length) children.push(el('g', { 'data-part': 'caption' }, cap.map((t, i) => text({ x: PAD, y: r1(top + height + 14 + i * 14), 'font-size': 10.5, fill: C.text }, t))));
  return el('svg', { xmlns: 'http://www.w3.org/2000/svg', width: w, height: total, viewBox: `0 0 ${w} ${total}`, 'font-family': FONT_STACK, role: 'img', 'aria-label': label, 'data-chart': kind }, children);
}

// ——— time series ———

export interface ChartSeries {
  id: VariableId;
  name: string;
  unit?: string;
  values: readonly number[];
}

export interface TimeChartInput {
  times: readonly number[];
  series: readonly ChartSeries[];
  /** The times a study would take its samples, drawn as open circles (null: too many to draw). */
  samples: readonly number[] | null;
  timeUnit: string;
}

const TW_SCREEN = 360, PH = 92, TL = 50, TR = 10, GAP = 22, AXIS = 34, KEY = 16;

export function timeChartLabel(series: readonly { name: string }[]): string {
  return `Simulated ${series.map((s) => s.name).join(', ')} over time`;
}

/**
 * Time series, one panel per variable with its own value axis (values of
 * different size stay readable), a shared time axis, one dash pattern per
 * series (tells them apart in grayscale too), and the samples a study would
 * take drawn as open circles.
 */
export function timeSeriesChart(input: TimeChartInput, opts: FigureOptions = {}): El {
  const { times, series, samples, timeUnit } = input;
  // for print: narrower, so its ticks (10 units) stay at 7 pt or more at the width
  const TW = fittedWidth(opts, TW_SCREEN, 10.5, 10, 260);
  const t1 = times[times.length - 1] ?? 1;
  const x = linear(0, t1, TL, TW - TR);
  const xt = niceTicks(0, t1, 5);
  // Draw at most about 1500 points per line: more cannot be told apart at this size.
  const stride = Math.max(1, Math.ceil(times.length / 1500));
  const drawn = times.map((_, k) => k).filter((k) => k % stride === 0 || k === times.length - 1);
  const top = (i: number) => 4 + i * (PH + GAP) + 14;
  const shownSamples = samples && samples.length > 0 ? samples : null;
  const axisEnd = top(Math.max(1, series.length) - 1) + PH + AXIS;
  const height = axisEnd + (shownSamples ? KEY : 0);
  const body: El[] = [];
  series.forEach((s, i) => {
    const y0p = top(i), y1p = y0p + PH;
    const [lo, hi] = extent(s.values);
    const y = linear(lo, hi, y1p, y0p);
    const dash = SERIES_DASHES[i % SERIES_DASHES.length] || undefined;
    const kids: El[] = [
      hline(TL, TL + 24, y0p - 8, { stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': dash }),
      text({ x: TL + 30, y: y0p - 4, 'font-size': 10.5, 'font-weight': 600, fill: C.text }, `${s.name}${s.unit ? ` (${s.unit})` : ''}`),
      el('rect', { x: TL, y: y0p, width: TW - TL - TR, height: PH, fill: C.paper, stroke: C.frame }),
    ];
    for (const v of niceTicks(lo, hi, 5).filter((v) => v >= lo && v <= hi)) {
      kids.push(hline(TL - 4, TL, y(v), { stroke: C.axis }), hline(TL, TW - TR, y(v), { stroke: C.grid }), tick(TL - 6, y(v) + 3.5, tickText(v), 'end'));
    }
    for (const v of xt) kids.push(vline(x(v), y1p, y1p + 3, { stroke: C.axis }));
    const points = drawn.filter((k) => Number.isFinite(s.values[k])).map((k) => `${r1(x(times[k]))},${r1(y(s.values[k]))}`).join(' ');
    kids.push(el('polyline', { 'data-series': s.id, points, fill: 'none', stroke: C.line, 'stroke-width': 1.5, 'stroke-dasharray': dash, 'stroke-linejoin': 'round' }));
    for (const t of shownSamples ?? []) {
      const v = valueAt(times, s.values, t);
      if (Number.isFinite(v)) kids.push(el('circle', { class: 'lf-chart-sample', cx: r1(x(t)), cy: r1(y(v)), r: 2.4, fill: C.paper, stroke: C.accent, 'stroke-width': 1.3 }));
    }
    body.push(el('g', { 'data-panel': s.id }, kids));
  });
  for (const v of xt) body.push(tick(x(v), axisEnd - AXIS + 14, tickText(v), 'middle'));
  body.push(text({ x: (TL + TW - TR) / 2, y: axisEnd - 6, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, `time since the start (${timeUnit})`));
  if (shownSamples) {
    body.push(el('g', { 'data-part': 'legend' }, [
      el('circle', { cx: TL + 4, cy: axisEnd + 6, r: 2.4, fill: C.paper, stroke: C.accent, 'stroke-width': 1.3 }),
      text({ x: TL + 12, y: axisEnd + 9.5, 'font-size': 10, fill: C.text }, 'the samples a study would take'),
    ]));
  }
  return figure('time-series', timeChartLabel(series), TW, height, body, opts);
}

/** The run of a model drawn for the variables in `plot`, with the samples of the study at `study.interval`. */
export function simulationChart(model: Model, run: { times: readonly number[]; series: Record<VariableId, readonly number[]> }, plot: readonly VariableId[], study: StudyAt, opts: FigureOptions = {}): El {
  return timeSeriesChart(simulationChartInput(model, run, plot, study), opts);
}

export function simulationChartInput(model: Model, run: { times: readonly number[]; series: Record<VariableId, readonly number[]> }, plot: readonly VariableId[], study: StudyAt): TimeChartInput {
  const series = plot.map((id) => ({ id, name: labelOf(model, id), unit: unitOf(model, id), values: run.series[id] ?? [] }));
  const end = run.times[run.times.length - 1] ?? 0;
  const samples = study.interval === undefined ? [] : sampleTimes(study.interval, end, studyLength(model, study) ?? Infinity);
  return { times: run.times, series, samples, timeUnit: model.timeUnit };
}

// ——— networks ———

/** Lay n nodes on a circle in a w×h box, the first at the top, clockwise. */
export function circleLayout(n: number, w: number, h: number, margin: number): { x: number; y: number }[] {
  const r = Math.max(10, Math.min(w, h) / 2 - margin);
  if (n === 1) return [{ x: w / 2, y: h / 2 }];
  return Array.from({ length: n }, (_, i) => {
    const a = -Math.PI / 2 + (2 * Math.PI * i) / n;
    return { x: w / 2 + r * Math.cos(a), y: h / 2 + r * Math.sin(a) };
  });
}

/** Edge weights of a network shown as lines: |w| at least `share` of the largest off-diagonal |w|. */
export function strongEdges(m: readonly (readonly number[])[], share = 0.02, symmetric = false): { from: number; to: number; weight: number }[] {
  const n = m.length;
  let max = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j) max = Math.max(max, Math.abs(m[i][j]));
  const out: { from: number; to: number; weight: number }[] = [];
  if (max === 0) return out;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j || (symmetric && j < i)) continue;
      // Row i, column j: the effect of j on i.
      if (Math.abs(m[i][j]) >= share * max) out.push({ from: j, to: i, weight: m[i][j] });
    }
  return out;
}

export interface NetworkInput {
  model: Model;
  states: readonly VariableId[];
  /** Row i, column j: the effect of state j on state i. */
  matrix: readonly (readonly number[])[];
  directed: boolean;
  label: string;
  /** Give each link a wide invisible hit path (the pane makes links clickable). */
  pickable?: boolean;
}

/** The least width of a network figure. */
const NW = 410;
/** Text of a network's nodes (units): the name, its line height when on two lines, the self-effect. */
const NET_NAME_FONT = 10.5, NET_LINE = 12, NET_SELF_FONT = 9;
/** Room kept between the two columns of a compact ring. */
const NODE_GAP_COMPACT = 30;

/** A share of the strongest link below which links are left out (2 %), and the most links drawn per state. */
export const NETWORK_SHARE = 0.02;
export const LINKS_PER_STATE = 3;

function shorten(s: string): string {
  return s.length > 17 ? `${s.slice(0, 16)}…` : s;
}

/**
 * The links a network figure draws: those of at least 2 % of the strongest
 * |weight|, and at most `LINKS_PER_STATE` per state (the strongest; ties by
 * ids, so the file's order does not matter). `threshold`: the |weight| below
 * which links are left out; `left`: how many were.
 */
export function drawnLinks(states: readonly VariableId[], matrix: readonly (readonly number[])[], directed: boolean): { links: { from: number; to: number; weight: number }[]; threshold: number; left: number } {
  // an undirected link runs from the smaller id to the larger (not by the file's order): its weight sits at the same place in any order
  const all = strongEdges(matrix, 0, !directed)
    .filter((e) => e.weight !== 0)
    .map((e) => (!directed && states[e.from] > states[e.to] ? { from: e.to, to: e.from, weight: e.weight } : e));
  const max = Math.max(0, ...all.map((e) => Math.abs(e.weight)));
  const cap = Math.max(6, LINKS_PER_STATE * states.length);
  const key = (e: { from: number; to: number }) => `${states[e.from]}>${states[e.to]}`;
  const sorted = [...all].sort((a, b) => Math.abs(b.weight) - Math.abs(a.weight) || (key(a) < key(b) ? -1 : 1));
  let keep = sorted.filter((e) => Math.abs(e.weight) >= NETWORK_SHARE * max);
  let threshold = NETWORK_SHARE * max;
  if (keep.length > cap) {
    // a cut between two sizes, so that links of equal size are all kept or all left out
    let k = cap;
    while (k > 0 && Math.abs(keep[k - 1].weight) === Math.abs(keep[k].weight)) k--;
    threshold = Math.abs(keep[k].weight) * (1 + 1e-12);
    keep = keep.slice(0, k);
  }
  return { links: keep.sort((a, b) => (key(a) < key(b) ? -1 : 1)), threshold, left: all.length - keep.length };
}

/** "0.034" for a threshold: two significant digits, rounded up (every link left out is below it). */
function thresholdText(t: number): string {
  if (t <= 0) return '0';
  const p = Math.pow(10, Math.floor(Math.log10(t)) - 1);
  return weightText(Math.ceil(t / p - 1e-9) * p);
}

/**
 * A node-link drawing of a network: line width ∝ |weight|, solid for
 * positive and dashed for negative weights, each labelled with its value;
 * a legend of both codes and the size below which links are left out.
 * Directed networks get arrowheads and show the self-effect in the node.
 * The placement (`placeNetwork`) keeps nodes apart, every link visible and
 * every weight readable.
 */
export function networkDiagram(input: NetworkInput, opts: FigureOptions = {}): El {
  const { model, states, matrix, directed, label } = input;
  const chosen = drawnLinks(states, matrix, directed);
  const max = Math.max(1e-300, ...chosen.links.map((e) => Math.abs(e.weight)));
  const netLinks = chosen.links.map((e) => ({ ...e, label: weightText(e.weight) }));
  let place: NetworkPlacement = placeNetwork(states, netLinks, directed);
  // for a print width the usual drawing would not fit at the base size: a compact one (names on two
  // lines in smaller nodes, a ring as wide as the room and as tall as it must be), its text unchanged
  const room = opts.fitTo ? Math.floor(opts.fitTo.widthPt / targetScale(opts.fitTo.fontPt ?? DEFAULT_FONT_PT, NET_NAME_FONT, NET_SELF_FONT)) : undefined;
  let names = states.map((s) => [shorten(labelOf(model, s))]);
  let compact = false;
  if (room !== undefined && Math.max(NW, place.width) > room) {
    const lineMax = Math.min(92, (room - 24 - NODE_GAP_COMPACT) / 2 - 12);
    const wrapped = states.map((s) => nameLines(labelOf(model, s), lineMax, NET_NAME_FONT));
    const w = Math.ceil(Math.max(60, ...wrapped.flat().map((t) => nameWidth(t, NET_NAME_FONT))) + 12);
    const lines = Math.max(...wrapped.map((l) => l.length));
    const h = 4 + NET_LINE * lines + (directed ? 11 : 0) + 5;
    const small = placeNetworkCompact(states, netLinks, directed, { width: w, height: h }, room);
    if (small) { place = small; names = wrapped; compact = true; }
  }
  const marker = `lf-arrow-${directed ? 'd' : 'u'}-${label.replace(/\W+/g, '')}`;
  const widthOf = (w: number) => r1(0.8 + 4 * (Math.abs(w) / max));
  const body: El[] = [];
  for (const { link: e, start, control, end, label: at } of place.links) {
    const straight = Math.abs((start.x + end.x) / 2 - control.x) < 1e-6 && Math.abs((start.y + end.y) / 2 - control.y) < 1e-6;
    const d = straight ? `M${r1(start.x)},${r1(start.y)} L${r1(end.x)},${r1(end.y)}` : `M${r1(start.x)},${r1(start.y)} Q${r1(control.x)},${r1(control.y)} ${r1(end.x)},${r1(end.y)}`;
    const from = states[e.from], to = states[e.to];
    const weight = weightText(e.weight), weightWidth = textWidth(weight, WEIGHT_FONT);
    const kids: El[] = [el('title', {}, [`${labelOf(model, from)} ${directed ? '→' : '—'} ${labelOf(model, to)}: ${weight}`])];
    if (input.pickable) kids.push(el('path', { d, class: 'lf-net-hit', fill: 'none', stroke: C.paper, 'stroke-opacity': 0, 'stroke-width': 12 }));
    kids.push(
      el('path', { d, class: 'lf-net-edge', fill: 'none', stroke: C.line, 'stroke-width': widthOf(e.weight), 'stroke-dasharray': e.weight < 0 ? C.negativeDash : undefined, 'marker-end': directed ? `url(#${marker})` : undefined }),
      // a box in the paper colour under the weight, so a thick or dashed line never shows between its glyphs
      el('rect', { class: 'lf-net-weight-box', x: r1(at.x - weightWidth / 2 - 3), y: r1(at.y - 5), width: r1(weightWidth + 6), height: 10, rx: 2, fill: C.paper }),
      text({ class: 'lf-net-weight', x: r1(at.x), y: r1(at.y + 3.4), 'text-anchor': 'middle', 'font-size': WEIGHT_FONT, fill: C.text, stroke: C.paper, 'stroke-width': 3, 'paint-order': 'stroke' }, weight),
    );
    body.push(el('g', { 'data-edge': `${from}>${to}`, 'data-sign': e.weight < 0 ? 'negative' : 'positive' }, kids));
  }
  const bw = place.nodeWidth, bh = place.nodeHeight;
  states.forEach((s, i) => {
    const p = place.centers[i];
    const name = labelOf(model, s);
    const kids: El[] = [
      el('title', {}, [name]),
      el('rect', { x: -bw / 2, y: -bh / 2, width: bw, height: bh, rx: 4, fill: C.paper, stroke: C.line }),
    ];
    if (compact) {
      // the name's lines from the top of the node, the self-effect under them
      names[i].forEach((t, k) => kids.push(text({ y: r1(-bh / 2 + 4 + 10 + NET_LINE * k), 'text-anchor': 'middle', 'font-size': NET_NAME_FONT, fill: C.text }, t)));
      if (directed) kids.push(text({ y: r1(-bh / 2 + 4 + NET_LINE * names[i].length + 9), 'text-anchor': 'middle', 'font-size': NET_SELF_FONT, fill: C.label }, `self ${weightText(matrix[i][i])}`));
    } else {
      kids.push(text({ y: directed ? -2 : 4, 'text-anchor': 'middle', 'font-size': NET_NAME_FONT, fill: C.text }, names[i][0]));
      // the self-effect inside the node, under the name
      if (directed) kids.push(text({ y: 11, 'text-anchor': 'middle', 'font-size': NET_SELF_FONT, fill: C.label }, `self ${weightText(matrix[i][i])}`));
    }
    body.push(el('g', { 'data-variable': s, transform: `translate(${r1(p.x)},${r1(p.y)})` }, kids));
  });
  // the legend: line style for the sign, width for the size, and what is left out
  const width = compact && room !== undefined ? room : Math.max(NW, place.width);
  const y0 = place.height + 6;
  const what = directed ? 'lagged effect' : 'partial correlation';
  const sample = (x: number, w: number, dash: string | undefined, dy = 0) => hline(x, x + 26, y0 + 6 + dy, { stroke: C.line, 'stroke-width': widthOf(w), 'stroke-dasharray': dash });
  const minW = Math.min(...chosen.links.map((e) => Math.abs(e.weight)), max);
  const minText = weightText(minW).replace('−', '');
  // compact: the sizes on a second row, each sample after the text before it
  const sizeRow = compact ? 16 : 0;
  const sizeX = compact ? PAD : PAD + 182;
  const maxX = compact ? Math.ceil(sizeX + 30 + textWidth(minText, 10) + 12) : PAD + 252;
  const legend: El[] = [
    sample(PAD, max, undefined), tick(PAD + 30, y0 + 9.5, 'positive', 'start'),
    sample(PAD + 90, max, C.negativeDash), tick(PAD + 120, y0 + 9.5, 'negative', 'start'),
    sample(sizeX, minW, undefined, sizeRow), tick(sizeX + 30, y0 + 9.5 + sizeRow, minText, 'start'),
    sample(maxX, max, undefined, sizeRow), tick(maxX + 30, y0 + 9.5 + sizeRow, `${weightText(max).replace('−', '')} (size)`, 'start'),
  ];
  const note = chosen.left > 0
    ? `Not drawn: ${chosen.left} ${chosen.left === 1 ? 'link' : 'links'} with |${what}| below ${thresholdText(chosen.threshold)}.`
    : `Every ${what} between two states is drawn.`;
  const noteLines = wrapText(note, width - 2 * PAD, 5.4);
  noteLines.forEach((t, k) => legend.push(tick(PAD, y0 + 26 + sizeRow + k * 13, t, 'start')));
  body.push(el('g', { 'data-part': 'legend', 'data-threshold': chosen.threshold }, legend));
  const height = y0 + 26 + sizeRow + noteLines.length * 13;
  const defs = directed
    ? el('defs', {}, [el('marker', { id: marker, viewBox: '0 0 10 10', refX: 9, refY: 5, markerWidth: 9, markerHeight: 9, markerUnits: 'userSpaceOnUse', orient: 'auto-start-reverse' }, [el('path', { d: 'M0,0 L10,5 L0,10 z', fill: C.line })])])
    : undefined;
  const root = figure(directed ? 'lagged-network' : 'same-interval-network', label, width, height, body, opts, defs);
  if (compact) root.attrs['data-adapted'] = 'the network is drawn compact (names on two lines in smaller nodes, a narrower and taller ring)';
  return root;
}

/** The networks of the sampled model at an interval, as the numeric questions return them. */
export interface SampledNetworksData {
  states: VariableId[];
  interval: number;
  phi: number[][];
  phiStandardized: number[][] | null;
  innovationPartial: number[][] | null;
}

/** The lagged network: Φ(Δ), raw or standardized (null when standardized is asked for but undefined). */
export function laggedNetwork(model: Model, s: SampledNetworksData, standardized: boolean, opts: FigureOptions & { pickable?: boolean } = {}): El | null {
  const matrix = standardized ? s.phiStandardized : s.phi;
  if (!matrix) return null;
  const label = `Lagged network at ${formatDuration(s.interval, model.timeUnit)}${standardized ? ', standardized' : ''}`;
  return networkDiagram({ model, states: s.states, matrix, directed: true, label, pickable: opts.pickable }, opts);
}

/** The same-interval network: partial correlations of the innovations (null when some state receives no noise). */
export function sameIntervalNetwork(model: Model, s: SampledNetworksData, opts: FigureOptions = {}): El | null {
  if (!s.innovationPartial) return null;
  return networkDiagram({ model, states: s.states, matrix: s.innovationPartial, directed: false, label: `Same-interval network at ${formatDuration(s.interval, model.timeUnit)}` }, opts);
}

// ——— one link against the interval ———

export interface LinkCurveInput {
  model: Model;
  curve: LinkCurve;
  /** Intervals where the causal ordering changes. */
  breakpoints: readonly number[];
  /** The current sampling interval. */
  current: number | undefined;
}

const CW_SCREEN = 360, CH = 230, CL = 52, CR = 10, CT = 14, CB = 40;

export function linkCurveLabel(model: Model, curve: { from: VariableId; to: VariableId }): string {
  return `Lagged effect of ${labelOf(model, curve.from)} on ${labelOf(model, curve.to)} against the sampling interval`;
}

/**
 * The lagged effect of one state on another against the sampling interval
 * (log axis), with its peak, the ordering's breakpoints (dashed) and the
 * current Δ (a heavy solid line) marked.
 */
export function linkCurveChart(input: LinkCurveInput, opts: FigureOptions = {}): El {
  const { model, curve, breakpoints, current } = input;
  const CW = fittedWidth(opts, CW_SCREEN, 10.5, 10, 260);
  // the key's two items on one row when there is room for both, else one under the other
  const keyRows = CW - CL < 250;
  const d0 = curve.intervals[0], d1 = curve.intervals[curve.intervals.length - 1];
  const x = logScale(d0, d1, CL, CW - CR);
  const [y0, y1] = extent([...curve.effect, 0]);
  const y = linear(y0, y1, CH - CB, CT);
  const u = model.timeUnit;
  const peak = curve.peaks.length > 0 ? curve.peaks.reduce((a, b) => (Math.abs(b.effect) > Math.abs(a.effect) ? b : a)) : null;
  const inside = (d: number) => d >= d0 && d <= d1;
  const breakpointLine = { stroke: C.breakpoint, 'stroke-width': 1, 'stroke-dasharray': C.breakpointDash };
  const currentLine = { stroke: C.accent, 'stroke-width': 2 };
  const diamond = (cx: number, cy: number) => `M${r1(cx)},${r1(cy - 6)} l5,6 l-5,6 l-5,-6 z`;
  const peakFill = { fill: C.accent, stroke: C.paper, 'stroke-width': 0.8 };
  const body: El[] = [el('rect', { x: CL, y: CT, width: CW - CL - CR, height: CH - CT - CB, fill: C.paper, stroke: C.frame })];
  for (const v of logTicks(d0, d1)) body.push(el('g', {}, [vline(x(v), CH - CB, CH - CB + 4, { stroke: C.axis }), tick(x(v), CH - CB + 15, tickText(v), 'middle')]));
  for (const v of niceTicks(y0, y1, 5)) {
    body.push(el('g', {}, [
      hline(CL - 4, CL, y(v), { stroke: C.axis }),
      hline(CL, CW - CR, y(v), v === 0 ? { stroke: C.label, 'stroke-width': 0.8 } : { stroke: C.grid }),
      tick(CL - 6, y(v) + 4, tickText(v), 'end'),
    ]));
  }
  body.push(text({ x: (CL + CW - CR) / 2, y: CH - 8, 'text-anchor': 'middle', 'font-size': 10.5, fill: C.label }, `sampling interval Δ (${u}, log scale)`));
  const mid = (CT + CH - CB) / 2;
  body.push(text({ x: 12, y: mid, 'text-anchor': 'middle', transform: `rotate(-90 12 ${mid})`, 'font-size': 10.5, fill: C.label }, 'effect one interval later'));
  for (const b of breakpoints.filter(inside)) body.push(vline(x(b), CT, CH - CB, { 'data-breakpoint': b, ...breakpointLine }));
  if (current !== undefined && inside(current)) body.push(el('g', { 'data-current': current }, [vline(x(current), CT, CH - CB, currentLine)]));
  const points = curve.intervals.map((d, k) => [d, curve.effect[k]] as const).filter(([, e]) => Number.isFinite(e)).map(([d, e]) => `${r1(x(d))},${r1(y(e))}`).join(' ');
  body.push(el('polyline', { points, fill: 'none', stroke: C.line, 'stroke-width': 1.5, 'stroke-linejoin': 'round' }));
  if (peak) body.push(el('g', { 'data-peak': peak.interval }, [el('path', { d: diamond(x(peak.interval), y(peak.effect)), ...peakFill })]));
  const legend: El[] = [
    hline(0, 16, 6, breakpointLine),
    tick(20, 10, 'the causal ordering changes', 'start'),
    hline(keyRows ? 0 : 170, keyRows ? 16 : 186, keyRows ? 22 : 6, currentLine),
    tick(keyRows ? 20 : 190, keyRows ? 26 : 10, 'current Δ', 'start'),
  ];
  const peakRow = keyRows ? 16 : 0;
  if (peak) legend.push(el('path', { d: diamond(8, 22 + peakRow), ...peakFill }), tick(20, 26 + peakRow, `strongest: ${numText(significant(peak.effect, 3))} at Δ = ${formatDuration(peak.interval, u)}`, 'start'));
  body.push(el('g', { transform: `translate(${CL},${CH + 6})`, 'data-part': 'legend' }, legend));
  return figure('link-curve', linkCurveLabel(model, curve), CW, CH + 42 + (keyRows ? 16 : 0), body, opts);
}

// ——— one variable in two runs (without and with an intervention) ———

export interface RunsInput {
  times: readonly number[];
  without: readonly number[];
  with: readonly number[];
  /** The variable's name. */
  label: string;
  timeUnit: string;
}

/** The index up to which a chart shows the runs: where they have done 99% of their moving, with a margin of half as long again. */
export function settledIndex(times: readonly number[], runs: readonly (readonly number[])[]): number {
  const n = times.length;
  let last = 1;
  for (const r of runs) {
    if (r.length < n) continue;
    let lo = Infinity, hi = -Infinity;
    for (const v of r) { if (v < lo) lo = v; if (v > hi) hi = v; }
    const band = 0.01 * (hi - lo);
    const end = r[n - 1];
    for (let k = n - 1; k >= 0; k--) if (Math.abs(r[k] - end) > band) { last = Math.max(last, k); break; }
  }
  const tEnd = Math.min(times[n - 1], times[0] + 1.5 * (times[last] - times[0]));
  let k = last;
  while (k < n - 1 && times[k] < tEnd) k++;
  return Math.max(k, Math.min(n - 1, 4));
}

/**
 * One variable in two runs, in one panel: dashed without the intervention,
 * solid with it (told apart by line style, so the chart survives print and
 * grayscale), with value and time axes. `crop` shows the runs only until
 * both have settled (see settledIndex).
 */
export function runsChart(input: RunsInput, opts: FigureOptions & { crop?: boolean } = {}): El {
  const W = 300, H = 150, L = 48, R = 10, T = 22, B = 30;
  const end = opts.crop ? settledIndex(input.times, [input.without, input.with]) + 1 : input.times.length;
  const times = input.times.slice(0, end), a = input.without.slice(0, end), b = input.with.slice(0, end);
  const t0 = times[0] ?? 0, t1 = times[times.length - 1] ?? 1;
  const x = linear(t0, t1 === t0 ? t0 + 1 : t1, L, W - R);
  const [lo, hi] = extent([...a, ...b]);
  const y = linear(lo, hi, H - B, T);
  const line = (vs: readonly number[]) => vs.map((v, k) => (Number.isFinite(v) ? `${r1(x(times[k]))},${r1(y(v))}` : '')).filter(Boolean).join(' ');
  const label = `${input.label}: without and with the hold`;
  const body: El[] = [
    text({ x: L, y: 14, 'font-size': 12, 'font-weight': 700, fill: C.text }, input.label),
    el('rect', { x: L, y: T, width: W - L - R, height: H - T - B, fill: 'none', stroke: C.frame }),
  ];
  for (const v of niceTicks(lo, hi, 4).filter((v) => v >= lo && v <= hi)) {
    body.push(hline(L - 4, L, y(v), { stroke: C.axis }), tick(L - 6, y(v) + 3.5, tickText(v), 'end'));
  }
  for (const v of niceTicks(t0, t1, 4).filter((v) => v >= t0 && v <= t1)) {
    body.push(vline(x(v), H - B, H - B + 3, { stroke: C.axis }), tick(x(v), H - B + 13, tickText(v), 'middle'));
  }
  body.push(
    text({ x: (L + W - R) / 2, y: H - 4, 'text-anchor': 'middle', 'font-size': 10, fill: C.label }, `time (${input.timeUnit})`),
    el('polyline', { class: 'without', points: line(a), fill: 'none', stroke: C.label, 'stroke-width': 1.5, 'stroke-dasharray': '6 3' }),
    el('polyline', { class: 'with', points: line(b), fill: 'none', stroke: C.line, 'stroke-width': 2 }),
  );
  return figure('runs', label, W, H, body, opts);
}
