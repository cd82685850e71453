/**
 * The printable report: one self-contained HTML file (inline CSS and SVG, no
 * scripts, no external resources) that walks the interval axis band by band.
 * For each band: the ordering as a figure, what changed at the breakpoint
 * that opens it and why, the diagnostics, the blocks and links as text; then
 * perfect adaptation and, when asked, the commutation check of holds.
 * Every piece of model text is escaped: model files are untrusted.
 */
import type { Model } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { bands, breakpoints, orderingAt, type Band, type Breakpoint, type Ordering, type StudyDesign } from '../core/ordering/index';
import { explainOrdering } from '../core/view/explain';
import { orderingView, studyText } from '../core/view/derive';
import type { ViewModel } from '../core/view/types';
import type { Layout } from '../layout/types';
import { renderSvg } from '../export/svg';
import { perfectAdaptation } from '../core/interventions/adaptation';
import { commutationAt, hasFormulas, interventionEffect } from '../core/interventions/index';
import { solveEquilibrium, timescalesAt } from '../core/numeric/index';
import { viewCaption } from '../export/caption';
import pkg from '../../package.json';

export interface ReportOptions {
  /** A fixed study length W (model time unit). */
  window?: number;
  /** Or a study of N samples per interval. */
  samples?: number;
  /** Lays out a view for its figure (ELK in Node, the app's layout in the browser). Without it the report lists the ordering in text only. */
  layout?: (vm: ViewModel) => Promise<Layout>;
  /** Interventions to check for commutation in every band. */
  hold?: Record<string, number>;
  /** The date printed under the title (left out when absent, so reports compare byte for byte). */
  generated?: string;
  /** The tool's version printed under the title (default: the package's). */
  version?: string;
}

import { htmlEscape } from './html-escape';
import { trajectoryChart } from './chart';
import { designAxis, type StudyAxis } from '../core/study/convert';
import { formatNumber, labelOf } from '../present/index';
import { REPORT_HELD, REPORT_INK, REPORT_LINE, REPORT_MUTED } from '../theme/tokens';

export { htmlEscape };

/** A representative interval inside a band: the geometric middle of a finite band, twice the start of the last one. */
export function bandInterval(b: Band): number {
  if (b.to === Infinity) return b.from > 0 ? b.from * 2 : 1;
  if (b.from === 0) return b.to / 2;
  if (b.from === b.to) return b.from;
  return Math.sqrt(b.from * b.to);
}

/** Give each inline SVG its own id space, so that several figures in one page never share marker ids. */
export function prefixSvgIds(svg: string, prefix: string): string {
  return svg
    .replace(/<\?xml[^>]*\?>\s*/, '')
    .replace(/\bid="([^"]+)"/g, (_m, id: string) => `id="${prefix}${id}"`)
    .replace(/url\(#([^)]+)\)/g, (_m, id: string) => `url(#${prefix}${id})`)
    .replace(/href="#([^"]+)"/g, (_m, id: string) => `href="#${prefix}${id}"`);
}

const CSS = `
body{font:15px/1.45 system-ui,-apple-system,"Segoe UI",sans-serif;color:${REPORT_INK};margin:2rem auto;max-width:60rem;padding:0 1rem}
h1{font-size:1.6rem;margin-bottom:.2rem}h2{font-size:1.25rem;margin-top:2.2rem;border-bottom:2px solid ${REPORT_INK}}h3{font-size:1.05rem}
.sub{color:${REPORT_MUTED}}.caution{border:2px solid ${REPORT_INK};padding:.5rem .8rem;font-weight:600}
table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid ${REPORT_LINE};padding:.2rem .5rem;text-align:left;vertical-align:top}
.figure svg{max-width:100%;height:auto}.error::before{content:"✖ "}.warning::before{content:"▲ "}
@media screen{.charts{display:flex;flex-wrap:wrap;gap:.5rem}}.agree::before{content:"= "}.differ::before{content:"≠ "}
code{font-family:ui-monospace,Menlo,Consolas,monospace;font-size:.9em}
details.band-details{border-top:1px solid ${REPORT_LINE};margin:.4rem 0}details.band-details>summary{cursor:pointer;font-weight:600;padding:.3rem 0}
.held{border:2px solid ${REPORT_HELD};padding:.4rem .8rem;font-weight:600}.num{text-align:right;font-variant-numeric:tabular-nums}
.summary-page{break-after:page}
@media print{body{margin:0;max-width:none}h2{break-after:avoid}.figure{break-inside:avoid}}
`;

function rangeText(model: Model, b: Band): string {
  const u = model.timeUnit;
  const from = b.from === 0 ? '0' : formatDuration(b.from, u);
  const to = b.to === Infinity ? '∞' : formatDuration(b.to, u);
  const open = b.excludesFrom ? '(' : '[';
  const close = b.includesTo ? ']' : ')';
  return `${open}${from}, ${to}${close}`;
}

/** A role in the report's words: a state that keeps moving is "dynamic". */
const roleWord = (r: string): string => (r === 'state' ? 'dynamic' : r);

const label = labelOf;

/** An equation in the modeller's words: "the formula of Mood", "the rate of Stress", a relation by its text. */
export function equationWords(model: Model, id: string): string {
  const m = /^(formula|rate|hold)\((.+)\)$/.exec(id);
  if (m) return `${m[1] === 'formula' ? 'the formula of' : m[1] === 'rate' ? 'the rate of' : 'the hold of'} ${label(model, m[2])}`;
  const rel = model.relations?.find((r) => r.id === id);
  return rel ? `the relation ${rel.equation}` : `the relation ${id}`;
}

/** Words of the core's sentences that stay as they are even when a variable has that id. */
const TEMPLATE_WORDS = new Set(['a', 'an', 'and', 'are', 'as', 'at', 'be', 'by', 'for', 'from', 'in', 'is', 'it', 'its', 'no', 'not', 'now', 'of', 'on', 'or', 'the', 'to', 'with',
  'all', 'both', 'but', 'can', 'cannot', 'each', 'either', 'give', 'gives', 'has', 'have', 'into', 'lag', 'letting', 'more', 'one', 'only', 'own', 'pairs', 'same', 'so', 'than', 'that', 'this', 'through', 'turns', 'two', 'when', 'which',
  'balance', 'block', 'causal', 'change', 'conflict', 'derived', 'determined', 'determines', 'direction', 'dynamic', 'equation', 'equilibrium', 'formula', 'frozen', 'hold', 'held', 'holding', 'input', 'interval', 'model',
  'rate', 'relation', 'reverses', 'settle', 'settled', 'settles', 'settling', 'state', 'states', 'structure', 'study', 'time', 'timescale', 'value', 'variable', 'variables']);

/**
 * Text from the core in the modeller's words: equation ids (formula(x), rate(x), hold(x)) put in words and
 * variable ids by their labels (one pass: a label put in is not read again; case as written, so "Mood" in a
 * sentence is not the id "mood"). Example: "settling pipeline determines deliveries" → "settling Goods in
 * transit determines Deliveries".
 */
export function withEquationWords(model: Model, text: string): string {
  const labels = new Map(model.variables.filter((v) => v.label && v.label !== v.id && !TEMPLATE_WORDS.has(v.id)).map((v) => [v.id, v.label!]));
  // phrases of the core's own sentences come first and stay as they are ("both orders give the same structure")
  return text.replace(/\b(?:both orders|either order)\b|\b(formula|rate|hold)\(([^()\s]+)\)|\b[A-Za-z_][A-Za-z0-9_]*\b/g, (m: string, k: string | undefined, v: string | undefined) => (k ? equationWords(model, `${k}(${v})`) : labels.get(m) ?? m));
}

function orderingTables(model: Model, o: Ordering): string {
  const e = htmlEscape;
  const rows = o.blocks.map((b) => {
    const vars = b.variables.map((v) => `${e(label(model, v))} <span class="sub">(${e(o.roles[v] ?? '')})</span>`).join(', ');
    const eqs = b.equations.length ? b.equations.map((q) => e(equationWords(model, q))).join('; ') : '<span class="sub">given</span>';
    return `<tr><td>${b.level}</td><td>${vars}</td><td>${eqs}</td><td>${e(b.determination)}</td></tr>`;
  });
  const within = o.edges.filter((x) => x.kind === 'instantaneous').map((x) => `<li>${e(label(model, x.from))} ${x.simultaneous ? '↔' : '→'} ${e(label(model, x.to))} <span class="sub">by ${e(equationWords(model, x.equation))}</span></li>`);
  const across = o.edges.filter((x) => x.kind === 'integrating').map((x) => `<li>${e(label(model, x.from))} ⇒ ${e(label(model, x.to))} <span class="sub">across time, by ${e(equationWords(model, x.equation))}</span></li>`);
  return [
    '<table><thead><tr><th>level</th><th>variables</th><th>determined by</th><th>determination</th></tr></thead><tbody>',
    ...rows,
    '</tbody></table>',
    `<h4>Within the instant (${within.length})</h4>`,
    within.length ? `<ul>${within.join('')}</ul>` : '<p class="sub">none</p>',
    `<h4>Across time (${across.length})</h4>`,
    across.length ? `<ul>${across.join('')}</ul>` : '<p class="sub">none</p>',
  ].join('\n');
}

function diagnosticsList(model: Model, o: Ordering): string {
  if (o.diagnostics.length === 0) return '<p class="sub">No diagnostics.</p>';
  return `<ul>${o.diagnostics.map((d) => `<li class="${d.level}">${htmlEscape(withEquationWords(model, d.message))}</li>`).join('')}</ul>`;
}

function changesAt(model: Model, bp: Breakpoint | undefined): string {
  if (!bp) return '<p class="sub">The start of the interval axis: the ordering of the shortest intervals.</p>';
  const items = bp.changes.map((c) => `<li><strong>${htmlEscape(label(model, c.variable))}</strong>: ${htmlEscape(roleWord(c.from))} → ${htmlEscape(roleWord(c.to))} — ${htmlEscape(withEquationWords(model, c.reason))}</li>`);
  return `<p>At ${htmlEscape(formatDuration(bp.interval, model.timeUnit))}${bp.exclusive ? ' (just above it)' : ''}:</p><ul>${items.join('')}</ul>`;
}

/** Round for reading: 4 significant digits, exponent form outside [0.001, 10⁶). */
const num = (x: number) => formatNumber(x, { digits: 4, exponentDigits: 3 });

/**
 * The equilibrium and the timescales, computed by the same calls as the `equilibrium` and `timescales`
 * commands (so the report and the command line agree); a sketch has them too (its links' semantics).
 */
function numbersSection(model: Model): string {
  const e = htmlEscape;
  const u = model.timeUnit;
  const out: string[] = [];
  const eq = solveEquilibrium(model);
  out.push(`<h3>Equilibrium (every state settled)</h3>${hasFormulas(model) ? '' : '<p class="sub">From the sketch: each variable the weighted sum of its sources, each state relaxing to it (the model has no formulas).</p>'}`);
  out.push('<table><thead><tr><th>variable</th><th>value</th><th>unit</th></tr></thead><tbody>');
  for (const v of model.variables) out.push(`<tr><td>${e(label(model, v.id))}</td><td class="num" data-equilibrium="${e(v.id)}">${e(num(eq.values[v.id]))}</td><td>${e(v.unit ?? '')}</td></tr>`);
  out.push('</tbody></table>');
  if (!eq.ok) out.push(`<p class="warning">The equilibrium was not found for every block.</p>`);
  if (eq.diagnostics.length) out.push(`<ul>${eq.diagnostics.map((d) => `<li class="${d.level}">${e(withEquationWords(model, d.message))}</li>`).join('')}</ul>`);
  const ts = timescalesAt(model);
  out.push('<h3>Timescales at the equilibrium</h3>');
  if (!ts.ok) out.push(`<p class="warning">${e(ts.reason)}</p>`);
  else {
    out.push('<p class="sub">From the mechanism linearised at the equilibrium: the characteristic time 1/|Re λ| of each mode, and for each state the mode it takes most part in (participation factors), beside the timescale the model gives.</p>');
    out.push('<table><thead><tr><th>state</th><th>given</th><th>derived</th><th>share in its mode</th></tr></thead><tbody>');
    for (const r of ts.report.perState) out.push(`<tr><td>${e(label(model, r.state))}</td><td>${r.given !== undefined ? e(formatDuration(r.given, u)) : '—'}</td><td data-timescale="${e(r.state)}" data-value="${Number.isFinite(r.derived) ? r.derived : ''}">${Number.isFinite(r.derived) ? e(formatDuration(r.derived, u)) : 'none (does not settle)'}</td><td class="num">${e(num(r.share))}</td></tr>`);
    out.push('</tbody></table>');
    if (ts.warnings.length) out.push(`<ul>${ts.warnings.map((w) => `<li class="warning">${e(withEquationWords(model, w))}</li>`).join('')}</ul>`);
  }
  return out.join('\n');
}

/** Durations of the model file as written ("3h") or in the model's unit. */
function durationText(model: Model, d: number | string | { low: number | string; high: number | string } | undefined): string {
  if (d === undefined) return '—';
  if (typeof d === 'object') return `${durationText(model, d.low)} to ${durationText(model, d.high)}`;
  return typeof d === 'number' ? formatDuration(d, model.timeUnit) : d;
}

/** The model specification: variables, links, relations, noise and the study design. */
function specification(model: Model, axis: StudyAxis): string {
  const e = htmlEscape;
  const out: string[] = ['<h2>Model specification</h2>'];
  const noiseOf = (id: string) => model.variables.find((v) => v.id === id)?.noise ?? model.settings?.noise?.[id];
  out.push(`<h3>Variables (${model.variables.length})</h3><table class="spec" data-spec="variables"><thead><tr><th>name</th><th>id</th><th>kind</th><th>timescale</th><th>formula or rate</th><th>unit</th><th>noise</th></tr></thead><tbody>`);
  for (const v of model.variables) {
    const f = v.kind === 'state' ? (v.rate ? `d/dt = ${v.rate}` : v.selfRegulating === false ? 'accumulates its sources' : 'relaxes to its sources') : v.kind === 'derived' ? (v.formula ?? 'weighted sum of its sources') : v.value !== undefined ? `set to ${v.value}` : 'set from outside';
    const n = noiseOf(v.id);
    out.push(`<tr><td>${e(label(model, v.id))}</td><td><code>${e(v.id)}</code></td><td>${e(v.kind)}</td><td>${v.kind === 'state' ? e(durationText(model, v.timescale)) : '—'}</td><td>${e(f)}</td><td>${e(v.unit ?? '')}</td><td class="num">${n !== undefined ? e(num(n)) : '—'}</td></tr>`);
  }
  out.push('</tbody></table>');
  out.push(`<h3>Links (${model.links.length})</h3><table class="spec" data-spec="links"><thead><tr><th>from</th><th>to</th><th>acts</th><th>sign</th><th>strength</th></tr></thead><tbody>`);
  for (const l of model.links) out.push(`<tr><td>${e(label(model, l.from))}</td><td>${e(label(model, l.to))}</td><td>${l.kind === 'integrating' ? 'accumulates over time (lagged)' : 'within the instant'}</td><td>${l.sign === '-' ? '−' : '+'}</td><td class="num">${l.weight !== undefined ? e(num(l.weight)) : '—'}</td></tr>`);
  out.push('</tbody></table>');
  if (model.relations?.length) {
    out.push(`<h3>Relations (${model.relations.length})</h3><ul>${model.relations.map((r) => `<li><code>${e(r.equation)}</code>${r.note ? ` <span class="sub">${e(r.note)}</span>` : ''}</li>`).join('')}</ul>`);
  }
  const study = (model as Model & { study?: { interval?: unknown; length?: unknown; persons?: unknown } }).study;
  const design = [
    axis.window !== undefined ? `a study of fixed length ${formatDuration(axis.window, model.timeUnit)} at every interval` : `a study of ${axis.samples} samples at every interval`,
    `timescale separation k = ${model.settings?.separation ?? 5} (a state settles when its timescale is under Δ/k, freezes when over k times the study length)`,
    `time unit ${model.timeUnit}`,
  ];
  if (study) design.push(`the model file's study: ${e(JSON.stringify(study))}`);
  out.push(`<h3>Study design</h3><ul>${design.map((d) => `<li>${d.startsWith('the model file') ? d : e(d)}</li>`).join('')}</ul>`);
  return out.join('\n');
}

function effectSection(model: Model, hold: Record<string, number>): string {
  const e = htmlEscape;
  const fx = interventionEffect(model, hold);
  const out: string[] = [`<p>Holding ${e(Object.entries(hold).map(([k, v]) => `${labelOf(model, k)} = ${v}`).join(', '))} in the running system, from the equilibrium without the hold.</p>`];
  if (fx.equilibrium) {
    out.push('<table><thead><tr><th>variable</th><th>equilibrium without</th><th>with the hold</th><th>change</th></tr></thead><tbody>');
    for (const r of fx.equilibrium) out.push(`<tr><td>${e(labelOf(model, r.variable))}</td><td>${e(num(r.before))}</td><td>${e(num(r.after))}</td><td>${e(num(r.change))}</td></tr>`);
    out.push('</tbody></table>');
  }
  if (fx.trajectories) {
    const t = fx.trajectories;
    const moved = model.variables
      .map((v) => v.id)
      .filter((id) => (t.with[id] ?? []).some((y, k) => Math.abs(y - (t.without[id]?.[k] ?? y)) > 1e-9 * (1 + Math.abs(y))))
      .slice(0, 8);
    if (moved.length) {
      out.push('<p class="sub">Runs from the equilibrium without the hold: dashed without, solid with the hold held from the start.</p><div class="charts">');
      for (const id of moved) out.push(trajectoryChart(t, id, labelOf(model, id), { timeUnit: model.timeUnit, crop: true }));
      out.push('</div>');
    }
  }
  if (fx.drifting.length) out.push(`<ul>${fx.drifting.map((d) => `<li class="warning">${e(labelOf(model, d.variable))} keeps moving at ${e(num(d.slope))} per ${e(model.timeUnit)} at the end of the held run: held, the system has no equilibrium</li>`).join('')}</ul>`);
  if (fx.messages.length) out.push(`<ul>${fx.messages.map((m) => `<li class="error">${e(m)}</li>`).join('')}</ul>`);
  return out.join('\n');
}

/**
 * The report as one HTML string.
 * Example: `await buildReport(model, { samples: 50, layout: (vm) => layoutInNode(vm) })`.
 */
export async function buildReport(model: Model, options: ReportOptions = {}): Promise<string> {
  const e = htmlEscape;
  const axis = designAxis(model, options);
  const bps = breakpoints(model, axis);
  const bds = bands(model, axis);
  const parts: string[] = [];
  parts.push(`<h1>${e(model.name)}</h1>`);
  parts.push(`<p class="sub">Loopfold ${e(options.version ?? pkg.version)} report: how the causal ordering changes with the sampling interval${options.generated ? ` · ${e(options.generated)}` : ''}</p>`);
  const held = options.hold && Object.keys(options.hold).length > 0 ? options.hold : undefined;
  if (held) parts.push(`<p class="held">Held (fixed by an intervention) throughout this report: ${e(Object.entries(held).map(([k, v]) => `${label(model, k)} = ${v}`).join(', '))}. “Frozen” below means constant by slowness; “held” means fixed by the intervention.</p>`);
  if (model.caution) parts.push(`<p class="caution">${e(model.caution)}</p>`);
  if (model.description) parts.push(`<p>${e(model.description)}</p>`);
  parts.push('<p class="sub">The orderings are model-based hypotheses: they say what the model implies at each sampling interval, not what the measured system does.</p>');
  parts.push(specification(model, axis));

  parts.push('<div class="summary-page"><h2>The interval axis at a glance</h2>');
  parts.push('<p class="sub">Settled: fast states at balance at that interval. Frozen: slow states, constant over the study. Dynamic: states that move from one sample to the next.</p>');
  parts.push('<table><thead><tr><th>band</th><th>intervals</th><th>settled</th><th>frozen</th><th>dynamic</th></tr></thead><tbody>');
  bds.forEach((b, i) => {
    const ids = (r: string) => Object.keys(b.roles).filter((v) => b.roles[v] === r).map((v) => e(labelOf(model, v))).join(', ') || '—';
    parts.push(`<tr><td><a href="#band-${i + 1}">${i + 1}</a></td><td>${e(rangeText(model, b))}</td><td>${ids('settled')}</td><td>${ids('frozen')}</td><td>${ids('state')}</td></tr>`);
  });
  parts.push('</tbody></table>');
  if (bps.length) {
    parts.push('<h3>What changes where</h3><ul class="changes">');
    for (const bp of bps) parts.push(`<li>At ${e(formatDuration(bp.interval, model.timeUnit))}${bp.exclusive ? ' (just above)' : ''}: ${bp.changes.map((c) => `${e(label(model, c.variable))} ${e(roleWord(c.from))} → ${e(roleWord(c.to))}`).join('; ')}</li>`);
    parts.push('</ul>');
  }
  parts.push('</div>');
  parts.push('<section><h2>Equilibrium and timescales</h2>', numbersSection(model), '</section>');
  parts.push('<h2>Band by band</h2><p class="sub">Each band opens to its figure, the changes that start it, a reading in words and the ordering as tables.</p>');

  if (!options.layout) parts.push('<p class="sub">Figures were left out (no layout engine was given); the orderings are listed as text.</p>');
  for (let i = 0; i < bds.length; i++) {
    const b = bds[i];
    const interval = bandInterval(b);
    const design: StudyDesign = options.window !== undefined ? { interval, window: options.window } : { interval, samples: axis.samples };
    const o = orderingAt(model, design);
    const opening = i === 0 ? undefined : bps.find((p) => p.interval === b.from && Boolean(p.exclusive) === Boolean(b.excludesFrom));
    parts.push(`<details class="band-details"${i === 0 ? ' open' : ''}><summary>Band ${i + 1}: intervals ${e(rangeText(model, b))}</summary><section class="band" id="band-${i + 1}">`);
    parts.push(`<p class="sub">Shown at ${e(formatDuration(interval, model.timeUnit))}, ${e(studyText(model, interval, design.window, design.samples))}.</p>`);
    parts.push('<h3>What changed and why</h3>', changesAt(model, opening));
    if (options.layout) {
      const vm = orderingView(model, o, { mode: 'ordering', interval, window: design.window, samples: design.samples });
      const layout = await options.layout(vm);
      parts.push(`<div class="figure">${prefixSvgIds(renderSvg(vm, layout, { caption: true, captionText: viewCaption(vm) }), `b${i + 1}-`)}</div>`);
    }
    parts.push('<h3>Reading</h3>', `<ul>${explainOrdering(model, o, design, bps).map((l) => `<li>${e(withEquationWords(model, l.text))}</li>`).join('')}</ul>`);
    parts.push('<h3>The ordering</h3>', orderingTables(model, o));
    parts.push('<h3>Diagnostics</h3>', diagnosticsList(model, o));
    if (options.hold && Object.keys(options.hold).length > 0) {
      const c = commutationAt(model, { ...design, hold: options.hold });
      parts.push('<h3>Holding ' + e(Object.entries(options.hold).map(([k, v]) => `${labelOf(model, k)} = ${v}`).join(', ')) + '</h3>');
      parts.push(`<p class="${c.agree ? 'agree' : 'differ'}">${c.agree ? 'Hold then settle and settle then hold agree.' : 'Hold then settle and settle then hold differ.'}</p>`);
      parts.push(`<ul>${c.explanation.map((l) => `<li>${e(withEquationWords(model, l))}</li>`).join('')}</ul>`);
    }
    parts.push('</section></details>');
  }

  if (options.hold && Object.keys(options.hold).length > 0 && hasFormulas(model)) parts.push('<section><h2>The intervention with the formulas</h2>', effectSection(model, options.hold), '</section>');

  const pa = perfectAdaptation(model);
  parts.push('<section><h2>Perfect adaptation</h2>');
  if (pa.adapted.length === 0) parts.push('<p>No variable returns to the same equilibrium after a persistent change of an input.</p>');
  else {
    parts.push('<p>These variables answer a persistent change of the input for a while, then return to the same equilibrium value: the input reaches them in the running mechanism, but not in the equilibrium model.</p>');
    parts.push(`<table><thead><tr><th>variable</th><th>adapts to</th></tr></thead><tbody>${pa.adapted.map((a) => `<tr><td>${e(labelOf(model, a.variable))}</td><td>${e(labelOf(model, a.input))}</td></tr>`).join('')}</tbody></table>`);
  }
  if (pa.unjudged.length) parts.push(`<p class="sub">Not judged (no well-determined equilibrium): ${e(pa.unjudged.map((v) => labelOf(model, v)).join(', '))}.</p>`);
  parts.push('</section>');

  return `<!DOCTYPE html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n<meta name="viewport" content="width=device-width, initial-scale=1">\n<title>${e(model.name)} — Loopfold report</title>\n<style>${CSS}</style>\n</head>\n<body>\n${parts.join('\n')}\n</body>\n</html>\n`;
}
