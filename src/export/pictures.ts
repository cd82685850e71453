/**
 * Figures of the pictures a study would see (src/core/pictures/): the factor
 * picture of one level (loadings as bars, uniquenesses beside them), the
 * lagged matrix at an interval (cells shaded by |Φ_ij|, values written, its
 * singular values below), and how far from rank one Φ(Δ) is across intervals.
 * Each returns a root `<svg>` El tree with every presentation attribute
 * inline, like charts.ts; the within-person network is charts.ts's own
 * `networkDiagram`. No DOM, no React.
 */
import type { Model } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import type { LaggedRank, LevelPicture, Pictures } from '../core/pictures/index';
import { CHART_STYLE as C, FONT_STACK, SERIES_DASHES } from '../theme/visual';
import { logScale, logTicks, linear, tickText } from './axes';
import { fittedWidth, networkDiagram, type FigureOptions } from './charts';
import { nameOf, weightText } from './format';
import { wrapText, type Attr, type El } from './scene';
import { fixedText } from '../present/index';

const PAD = 10;
const r1 = (x: number) => Math.round(x * 10) / 10;
const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
const text = (attrs: Record<string, Attr>, s: string): El => el('text', { 'font-size': 10.5, fill: C.text, ...attrs }, [s]);
const short = (s: string, n = 16) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
const two = (x: number) => weightText(x);

/** Root element: white ground, optional heading above and caption below a drawing of width × height. */
function figure(kind: string, label: string, width: number, height: number, body: El[], opts: FigureOptions): El {
  const head = opts.heading ? wrapText(label, width - 2 * PAD, 6.8) : [];
  const top = head.length ? 10 + head.length * 16 : 0;
  const cap = opts.caption ? wrapText(opts.caption, width - 2 * PAD, 5.9) : [];
  const total = Math.ceil(top + height + (cap.length ? 6 + cap.length * 14 : 0));
  const w = Math.ceil(width);
  const children: El[] = [el('rect', { x: 0, y: 0, width: w, height: total, fill: C.paper })];
  if (head.length) children.push(el('text', { x: PAD, y: 18, 'font-size': 12, 'font-weight': 700, fill: C.text, 'data-part': 'title' }, head.map((t, i) => el('tspan', { x: PAD, dy: i ? 16 : 0 }, [t]))));
  children.push(el('g', top ? { transform: `translate(0,${top})`, 'data-part': 'figure' } : { 'data-part': 'figure' }, body));
  if (cap.length) children.push(el('g', { 'data-part': 'caption' }, cap.map((t, i) => text({ x: PAD, y: r1(top + height + 14 + i * 14) }, t))));
  return el('svg', { xmlns: 'http://www.w3.org/2000/svg', width: w, height: total, viewBox: `0 0 ${w} ${total}`, 'font-family': FONT_STACK, role: 'img', 'aria-label': label, 'data-chart': kind }, children);
}

const LEVEL_NAME = { within: 'within persons', between: 'across persons (person means)', cross: 'in a one-time survey' } as const;

/** The heading of a level's factor figure: "One factor across persons (person means): RMSEA .02". */
export function factorLabel(pic: LevelPicture): string {
  const fit = pic.oneFactor;
  if (!fit) return `No factor analysis ${LEVEL_NAME[pic.level]}`;
  return `One factor ${LEVEL_NAME[pic.level]}: ${fit.rmsea === null ? `df ${fit.df}` : `RMSEA ${two(fit.rmsea)}`}`;
}

/**
 * Loadings of the one-factor fit of a level as horizontal bars from a zero
 * line (solid: positive, dashed outline: negative), each with its value, and
 * the uniqueness as a thin grey bar and number to the right.
 */
export function factorFigure(model: Model, variables: readonly string[], pic: LevelPicture, opts: FigureOptions = {}): El {
  const label = factorLabel(pic);
  const W = 410, rowH = 24, top = 24;
  const fit = pic.oneFactor;
  const body: El[] = [];
  if (!fit) {
    body.push(text({ x: PAD, y: 20 }, pic.problem ?? 'no fit'));
    return figure('factor', label, W, 40, body, opts);
  }
  const nameW = 118, barX = nameW + 14, barW = 150, uniqX = barX + barW + 58, uniqW = 60;
  body.push(text({ x: barX, y: 12, fill: C.label, 'font-size': 9.5 }, 'loading on the factor'));
  body.push(text({ x: uniqX, y: 12, fill: C.label, 'font-size': 9.5 }, 'uniqueness'));
  const zero = barX + barW / 2;
  body.push(el('line', { x1: zero, x2: zero, y1: top - 4, y2: r1(top + variables.length * rowH), stroke: C.frame }));
  variables.forEach((id, i) => {
    const y = top + i * rowH;
    const l = fit.loadings[i][0];
    const u = fit.uniqueness[i];
    const len = (Math.min(1, Math.abs(l)) * barW) / 2;
    const x0 = l >= 0 ? zero : zero - len;
    body.push(el('g', { 'data-variable': id, 'data-loading': fixedText(l, 4, { ascii: true }) }, [
      el('title', {}, [`${nameOf(model, id)}: loading ${two(l)}, uniqueness ${two(u)}`]),
      text({ x: nameW, y: r1(y + 14), 'text-anchor': 'end' }, short(nameOf(model, id))),
      el('rect', { x: r1(x0), y: y + 5, width: r1(Math.max(len, 0.5)), height: 13, fill: l >= 0 ? C.accent : C.paper, stroke: C.accent, 'stroke-dasharray': l < 0 ? C.negativeDash : undefined }),
      text({ x: r1(zero + barW / 2 + 6), y: r1(y + 15), 'font-size': 9.5 }, two(l)),
      el('rect', { x: uniqX, y: y + 9, width: r1(Math.min(1, u) * uniqW), height: 6, fill: C.frame }),
      text({ x: uniqX + uniqW + 4, y: r1(y + 15), 'font-size': 9.5, fill: C.label }, two(u)),
    ]));
  });
  const h = top + variables.length * rowH + 8;
  const stats = fit.chi2 === null ? `df ${fit.df}` : `χ² ${fixedText(fit.chi2, 1)}, df ${fit.df}, N ${pic.n}${fit.rmsea === null ? '' : `, RMSEA ${two(fit.rmsea)}`}`;
  body.push(text({ x: barX, y: h + 6, 'font-size': 9.5, fill: C.label }, stats));
  return figure('factor', label, W, h + 14, body, opts);
}

/**
 * Φ(Δ) over the analysed variables as a grid: row = effect on, column =
 * effect of; each cell shaded by |Φ_ij| relative to the largest, its value
 * written (a dashed border for a negative value), the singular values below.
 */
export function laggedMatrixFigure(model: Model, rank: LaggedRank, opts: FigureOptions = {}): El {
  const label = `Lagged matrix at ${formatDuration(rank.interval, model.timeUnit)}: second/first singular value ${two(rank.secondRatio)}`;
  const p = rank.variables.length;
  const cell = Math.max(34, Math.min(56, 300 / Math.max(1, p)));
  const left = 112, top = 70;
  const W = Math.max(410, left + p * cell + PAD);
  const max = Math.max(1e-300, ...rank.phi.flat().map(Math.abs));
  const body: El[] = [text({ x: left, y: 12, 'font-size': 9.5, fill: C.label }, 'effect of (one interval earlier) →')];
  rank.variables.forEach((id, j) => {
    body.push(el('text', { x: r1(left + j * cell + cell / 2), y: top - 6, 'font-size': 9.5, fill: C.text, transform: `rotate(-40 ${r1(left + j * cell + cell / 2)} ${top - 6})` }, [short(nameOf(model, id), 12)]));
  });
  rank.variables.forEach((id, i) => {
    body.push(text({ x: left - 6, y: r1(top + i * cell + cell / 2 + 4), 'text-anchor': 'end' }, short(nameOf(model, id))));
    rank.variables.forEach((jd, j) => {
      const v = rank.phi[i][j];
      const a = Math.abs(v) / max;
      // Grey from white (0) to ink-dark (the largest |Φ|); the value's text turns white on dark cells.
      const g = Math.round(255 - a * 185);
      body.push(el('g', { 'data-cell': `${id}<${jd}` }, [
        el('title', {}, [`${nameOf(model, jd)} → ${nameOf(model, id)} one interval later: ${two(v)}`]),
        el('rect', { x: r1(left + j * cell), y: r1(top + i * cell), width: r1(cell - 2), height: r1(cell - 2), fill: `rgb(${g},${g},${g})`, stroke: v < 0 ? C.line : C.frame, 'stroke-dasharray': v < 0 ? C.negativeDash : undefined }),
        text({ x: r1(left + j * cell + cell / 2 - 1), y: r1(top + i * cell + cell / 2 + 3), 'text-anchor': 'middle', 'font-size': 9, fill: a > 0.55 ? C.paper : C.text }, two(v)),
      ]));
    });
  });
  const sy = top + p * cell + 16;
  body.push(text({ x: PAD, y: sy, 'font-size': 9.5, fill: C.label }, 'singular values'));
  const s0 = rank.singularValues[0] || 1;
  rank.singularValues.forEach((s, k) => {
    const x = left + k * 46;
    body.push(el('g', { 'data-singular': k }, [
      el('rect', { x, y: r1(sy + 22 - 18 * (s / s0)), width: 30, height: r1(Math.max(0.5, 18 * (s / s0))), fill: C.accent }),
      text({ x: x + 15, y: sy + 34, 'text-anchor': 'middle', 'font-size': 9 }, two(s)),
    ]));
  });
  return figure('lagged-matrix', label, W, sy + 40, body, opts);
}

/**
 * How far from rank one the lagged matrix is over the interval: second/first
 * and smallest/largest singular value of Φ(Δ) on a log axis, with the study's
 * interval (heavy line) and the long interval of the matrix figure (dashed).
 */
export function rankCurveFigure(model: Model, pictures: Pick<Pictures, 'rankCurve' | 'rankNow' | 'rankLong'>, opts: FigureOptions = {}): El {
  const label = 'Singular value ratios of the lagged matrix over the interval';
  // for print: as wide as keeps its text (9.5 units) at the base size and at least 7 pt; never wider than on screen
  const W = fittedWidth(opts, 410, 9.5, 9.5, 240);
  const H = 190, L = 44, R = 12, T = 12, B = 34;
  const xs = pictures.rankCurve.map((c) => c.interval);
  const x = logScale(xs[0], xs[xs.length - 1], L, W - R);
  const y = linear(0, 1, H - B, T);
  const body: El[] = [el('rect', { x: L, y: T, width: W - L - R, height: H - T - B, fill: 'none', stroke: C.frame })];
  for (const t of logTicks(xs[0], xs[xs.length - 1])) {
    body.push(el('line', { x1: r1(x(t)), x2: r1(x(t)), y1: T, y2: H - B, stroke: C.grid }));
    body.push(text({ x: r1(x(t)), y: H - B + 13, 'text-anchor': 'middle', 'font-size': 9.5 }, tickText(t)));
  }
  for (const t of [0, 0.5, 1]) body.push(text({ x: L - 4, y: r1(y(t) + 3), 'text-anchor': 'end', 'font-size': 9.5 }, String(t)));
  body.push(text({ x: r1((L + W - R) / 2), y: H - 4, 'text-anchor': 'middle', 'font-size': 9.5, fill: C.label }, `interval (${model.timeUnit})`));
  const series: { key: 'secondRatio' | 'ratio'; name: string }[] = [{ key: 'secondRatio', name: 'second / first' }, { key: 'ratio', name: 'smallest / largest' }];
  series.forEach((s, k) => {
    const d = pictures.rankCurve.map((c, i) => `${i ? 'L' : 'M'}${r1(x(c.interval))},${r1(y(Math.min(1, c[s.key])))}`).join(' ');
    body.push(el('path', { d, fill: 'none', stroke: C.line, 'stroke-width': 1.6, 'stroke-dasharray': SERIES_DASHES[k] || undefined, 'data-series': s.key }));
    // the key below the axis (inside the plot it would cover the curves, which start at the top left)
    body.push(el('line', { x1: L, x2: L + 26, y1: H + 6 + k * 14, y2: H + 6 + k * 14, stroke: C.line, 'stroke-width': 1.6, 'stroke-dasharray': SERIES_DASHES[k] || undefined }));
    body.push(text({ x: L + 30, y: H + 9 + k * 14, 'font-size': 9.5 }, s.name));
  });
  const mark = (at: number, heavy: boolean, what: string) => {
    if (at < xs[0] || at > xs[xs.length - 1]) return;
    body.push(el('line', { x1: r1(x(at)), x2: r1(x(at)), y1: T, y2: H - B, stroke: C.accent, 'stroke-width': heavy ? 2.2 : 1.2, 'stroke-dasharray': heavy ? undefined : C.breakpointDash, 'data-mark': what }, [el('title', {}, [`${what}: ${formatDuration(at, model.timeUnit)}`])]));
  };
  mark(pictures.rankNow.interval, true, 'the study\'s interval');
  if (pictures.rankLong.interval !== pictures.rankNow.interval) mark(pictures.rankLong.interval, false, 'long interval');
  return figure('rank-curve', label, W, H + 30, body, opts);
}

/**
 * The caption of the rank curve, the same in the app and for `loopfold rank --caption`: the variables
 * analysed, the range of intervals drawn, what the two marks are, and that it is model-based.
 */
export function rankCurveCaption(model: Model, pictures: Pick<Pictures, 'rankCurve' | 'rankNow' | 'rankLong'>): string {
  const u = model.timeUnit;
  const c = pictures.rankCurve;
  const names = pictures.rankNow.variables.map((id) => nameOf(model, id)).join(', ');
  const marks = pictures.rankLong.interval !== pictures.rankNow.interval
    ? `solid mark: the study's interval (${formatDuration(pictures.rankNow.interval, u)}); dashed: the long interval (${formatDuration(pictures.rankLong.interval, u)})`
    : `mark: the study's interval (${formatDuration(pictures.rankNow.interval, u)})`;
  return `Model-based, not a finding: how close the lagged matrix of ${names} comes to rank one at intervals from ${formatDuration(c[0].interval, u)} to ${formatDuration(c[c.length - 1].interval, u)}; ${marks}.`;
}

/** The within-person lagged network at the study's interval (standardized), through charts.ts's network drawing. */
export function withinNetworkFigure(model: Model, within: Pictures['within'], opts: FigureOptions = {}): El | null {
  if (!within.lagged) return null;
  return networkDiagram({ model, states: within.variables, matrix: within.lagged, directed: true, label: `Within persons: lagged network at ${formatDuration(within.interval, model.timeUnit)}, standardized` }, opts);
}
