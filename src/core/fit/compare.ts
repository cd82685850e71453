/**
 * The sketch held against data: link by link, the sketch's sign and strength
 * beside the fitted value with its 95 % interval and a verdict in words; the
 * free pattern of the confirmatory fit; the likelihood-ratio test of the
 * confirmatory against the open fit; timescales; tables as CSV that
 * spreadsheets will not run as formulas.
 */
import type { Model, VariableId } from '../model/types';
import { driftAtEquilibrium } from '../numeric/index';
import { expm } from '../numeric/expm';
import { fromRows, type Mat } from '../numeric/dense';
import type { CtFit } from './ct';
import type { VarFit } from './var';
import { significant } from '../../present/index';

export type Verdict = 'supported' | 'opposite sign' | 'not detectable with these data' | 'in the data but missing from the sketch' | 'absent in both';

export interface LinkComparison {
  from: VariableId;
  to: VariableId;
  /** The sketch's value of the same quantity (drift entry, or lagged effect at the data's interval for a VAR); 0 when the sketch has no link. */
  sketch: number;
  sketchSign: '+' | '-' | null;
  estimate: number;
  low: number;
  high: number;
  verdict: Verdict;
  words: string;
}

const Z95 = 1.959963984540054;

/** The sketch's drift for the given states (throws with the model's reason when there is none). */
export function sketchDrift(model: Model, states: VariableId[]): number[][] {
  const d = driftAtEquilibrium(model);
  if (!d.ok) throw new Error(`the sketch gives no drift: ${d.reason}`);
  const idx = states.map((s) => {
    const i = d.states.indexOf(s);
    if (i < 0) throw new Error(`"${s}" is not a state of the sketch (its states: ${d.states.join(', ')})`);
    return i;
  });
  const n = d.states.length;
  return idx.map((i) => idx.map((j) => d.drift.data[i * n + j]));
}

/** The model's states (in model order). */
export function sketchStates(model: Model): VariableId[] {
  return model.variables.filter((v) => v.kind === 'state').map((v) => v.id);
}

/**
 * Which drift entries the confirmatory fit frees: those the sketch's links
 * make non-zero (through derived variables too), and each state's own entry
 * when it self-regulates. Example: `sketchFreePattern(model, ['stress', 'sleep'])`.
 */
export function sketchFreePattern(model: Model, states: VariableId[]): boolean[][] {
  const a = sketchDrift(model, states);
  return states.map((si, i) => states.map((_, j) => {
    if (i === j) return model.variables.find((v) => v.id === si)?.selfRegulating !== false || a[i][j] !== 0;
    return a[i][j] !== 0;
  }));
}

function verdictOf(sketch: number, est: number, low: number, high: number): Verdict {
  const excludesZero = low > 0 || high < 0;
  if (sketch === 0) return excludesZero ? 'in the data but missing from the sketch' : 'absent in both';
  if (!excludesZero || !Number.isFinite(low)) return 'not detectable with these data';
  return Math.sign(est) === Math.sign(sketch) ? 'supported' : 'opposite sign';
}

function words(v: Verdict, from: string, to: string, est: number, low: number, high: number): string {
  const ci = `${fmt(est)} [${fmt(low)}, ${fmt(high)}]`;
  switch (v) {
    case 'supported': return `${from} → ${to}: the data agree with the sketch's sign (${ci})`;
    case 'opposite sign': return `${from} → ${to}: the data show the opposite sign to the sketch (${ci})`;
    case 'not detectable with these data': return `${from} → ${to}: the sketch has this link, but these data cannot tell it from zero (${ci})`;
    case 'in the data but missing from the sketch': return `${from} → ${to}: the data show an effect the sketch does not have (${ci})`;
    default: return `${from} → ${to}: neither the sketch nor the data (${ci})`;
  }
}

function fmt(x: number): string {
  return Number.isFinite(x) ? String(significant(x, 3)) : '—';
}

/**
 * Continuous-time fit against the sketch: drift entry by drift entry (read the
 * open fit, where every entry is free). Diagonal entries (self-regulation) are
 * included with from = to.
 */
export function compareDrift(model: Model, fit: CtFit): LinkComparison[] {
  const a = sketchDrift(model, fit.states);
  const out: LinkComparison[] = [];
  fit.states.forEach((to, i) => fit.states.forEach((from, j) => {
    const free = fit.spec.free[i][j];
    const est = fit.drift[i][j], se = free ? fit.se.drift[i][j] : 0;
    const low = free ? est - Z95 * se : est, high = free ? est + Z95 * se : est;
    const v = verdictOf(a[i][j], est, low, high);
    out.push({ from, to, sketch: a[i][j], sketchSign: a[i][j] > 0 ? '+' : a[i][j] < 0 ? '-' : null, estimate: est, low, high, verdict: v, words: words(v, from, to, est, low, high) });
  }));
  return out;
}

/** Median interval between consecutive occasions (the data's interval for a VAR). */
export function medianInterval(times: Float64Array[]): number {
  const g: number[] = [];
  for (const t of times) for (let k = 1; k < t.length; k++) g.push(t[k] - t[k - 1]);
  g.sort((x, y) => x - y);
  return g.length ? g[g.length >> 1] : NaN;
}

/** VAR fit against the sketch's lagged effects e^{AΔ} at the data's interval Δ (cluster-robust intervals when there are several persons). */
export function compareLagged(model: Model, fit: VarFit, interval: number): LinkComparison[] {
  const a = sketchDrift(model, fit.variables);
  const n = fit.variables.length;
  const phi: Mat = expm({ rows: n, cols: n, data: fromRows(a).data.map((v) => v * interval) });
  const se = fit.se.phiCluster ?? fit.se.phi;
  const out: LinkComparison[] = [];
  fit.variables.forEach((to, i) => fit.variables.forEach((from, j) => {
    // A lagged effect of j on i exists in the sketch when the drift reaches i from j (the exponential is then non-zero).
    const s = Math.abs(phi.data[i * n + j]) < 1e-12 ? 0 : phi.data[i * n + j];
    const est = fit.phi[i][j], low = est - Z95 * se[i][j], high = est + Z95 * se[i][j];
    const v = verdictOf(s, est, low, high);
    out.push({ from, to, sketch: s, sketchSign: s > 0 ? '+' : s < 0 ? '-' : null, estimate: est, low, high, verdict: v, words: words(v, from, to, est, low, high) });
  }));
  return out;
}

/** Likelihood-ratio test of a restricted fit against a fuller one: χ² = Δ(−2LL) on the difference in parameters. */
export function likelihoodRatio(restricted: { minus2LL: number; parameters: number }, full: { minus2LL: number; parameters: number }): { chi2: number; df: number; p: number } {
  const chi2 = Math.max(0, restricted.minus2LL - full.minus2LL);
  const df = full.parameters - restricted.parameters;
  return { chi2, df, p: df > 0 ? chiSquareSurvival(chi2, df) : NaN };
}

/** P(χ²_df > x) = Q(df/2, x/2), the regularised upper incomplete gamma (Press et al. 2007, Numerical Recipes 3rd ed., §6.2: series below a + 1, Lentz continued fraction above). */
export function chiSquareSurvival(x: number, df: number): number {
  if (x <= 0) return 1;
  const a = df / 2, z = x / 2;
  const lg = logGamma(a);
  if (z < a + 1) {
    let sum = 1 / a, term = sum;
    for (let n = 1; n < 1000; n++) { term *= z / (a + n); sum += term; if (Math.abs(term) < Math.abs(sum) * 1e-16) break; }
    return 1 - sum * Math.exp(-z + a * Math.log(z) - lg);
  }
  const tiny = 1e-300;
  let b = z + 1 - a, c = 1 / tiny, d = 1 / b, h = d;
  for (let i = 1; i < 1000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b; if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c; if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return Math.exp(-z + a * Math.log(z) - lg) * h;
}

/** ln Γ(x) by the Lanczos approximation (g = 7, n = 9; common practice). */
function logGamma(x: number): number {
  const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
  if (x < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  x -= 1;
  let s = c[0];
  for (let i = 1; i < 9; i++) s += c[i] / (x + i);
  const t = x + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(s);
}

export type CsvValue = string | number | boolean | null | undefined;

/** One RFC 4180 field: quoted when it holds a comma, quote, CR or LF. */
function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A text cell a spreadsheet would run as a formula (starting with =, +, -, @, tab or CR) gets a leading apostrophe; numbers stay numbers (OWASP, CSV injection: common practice). */
export function safeCsvField(value: CsvValue): string {
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(value)) return csvField(`'${value}`);
  return csvField(value);
}

/** A table as CSV (RFC 4180, CRLF), formula-like text cells escaped. */
export function safeCsv(rows: readonly (readonly CsvValue[])[]): string {
  return rows.map((r) => r.map(safeCsvField).join(',') + '\r\n').join('');
}

/** The comparison as a CSV table. */
export function comparisonCsv(rows: LinkComparison[]): string {
  return safeCsv([['from', 'to', 'sketch', 'estimate', 'low', 'high', 'verdict'], ...rows.map((r) => [r.from, r.to, r.sketch, r.estimate, r.low, r.high, r.verdict])]);
}
