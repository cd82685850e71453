/**
 * Timescales of a linearized system: eigenvalues of the drift, their
 * characteristic times 1/|Re λ|, and each state's share in each mode by
 * participation factors p_ki = |v_ki w_ik| (right eigenvector v, left
 * eigenvector w, wᵀv = 1), normalised per mode to sum 1: Pérez-Arriaga,
 * Verghese & Schweppe (1982), "Selective modal analysis with applications to
 * electric power systems, Part I", IEEE Trans. PAS-101(9).
 */
import type { VariableId } from '../model/types';
import { eigen, inverse, type Mat } from './dense';
import type { StateTimescale } from './system';
import { formatNumber } from '../../present/numbers';

export interface Mode {
  re: number;
  im: number;
  /** 1/|Re λ| (Infinity when Re λ = 0). */
  time: number;
  /** 2π/|Im λ| for an oscillating mode. */
  period?: number;
  stable: boolean;
  /** Participation of each state (in `states` order), summing to 1. */
  participation: number[];
}

export interface StateTimescaleReport {
  state: VariableId;
  /** The timescale the modeller gave, if any. */
  given?: number;
  /** The characteristic time of the mode the state participates in most. */
  derived: number;
  /** Index into modes. */
  mode: number;
  /** Share of the state in that mode. */
  share: number;
}

export interface TimescaleReport {
  states: VariableId[];
  modes: Mode[];
  perState: StateTimescaleReport[];
  warnings: string[];
}

/**
 * Modes and per-state timescales of drift A over `states`.
 * Example: `timescalesOf(fromRows([[-1, 0], [0, -0.1]]), ['a', 'b'])` gives times 1 and 10.
 */
export function timescalesOf(a: Mat, states: VariableId[], given: Record<VariableId, StateTimescale> = {}): TimescaleReport {
  const n = states.length;
  if (n === 0) return { states, modes: [], perState: [], warnings: [] };
  const e = eigen(a);
  const V = e.vectors;
  let W: Mat | null = inverse(V);
  if (!W.data.every(Number.isFinite)) W = null;
  const modes: Mode[] = [];
  const part: number[][] = [];
  // Column where each eigenvalue's (real-packed) eigenvector starts: a complex pair occupies two columns.
  const startCol = new Int32Array(n);
  for (let j = 0; j < n; ) {
    startCol[j] = j;
    if (e.im[j] !== 0 && j + 1 < n) { startCol[j + 1] = j; j += 2; } else j++;
  }
  for (let j = 0; j < n; j++) {
    const re = e.re[j], im = e.im[j];
    const p = new Array<number>(n).fill(0);
    if (W) {
      if (im === 0) {
        for (let k = 0; k < n; k++) p[k] = Math.abs(V.data[k * n + j] * W.data[j * n + k]);
      } else {
        // Columns (c, c+1) hold Re v and Im v of the eigenvalue at c; the left eigenvector row is (W_c − i W_{c+1})/2.
        const c = startCol[j];
        for (let k = 0; k < n; k++) {
          const vr = V.data[k * n + c], vi = V.data[k * n + c + 1];
          const wr = W.data[c * n + k] / 2, wi = -W.data[(c + 1) * n + k] / 2;
          p[k] = Math.hypot(vr * wr - vi * wi, vr * wi + vi * wr);
        }
      }
    } else p.fill(1);
    const total = p.reduce((s, x) => s + x, 0) || 1;
    const norm = p.map((x) => x / total);
    part.push(norm);
    modes.push({
      re, im,
      time: re === 0 ? Infinity : 1 / Math.abs(re),
      ...(im !== 0 ? { period: (2 * Math.PI) / Math.abs(im) } : {}),
      stable: re < 0,
      participation: norm,
    });
  }
  const perState: StateTimescaleReport[] = states.map((s, k) => {
    let best = 0;
    for (let j = 1; j < n; j++) if (part[j][k] > part[best][k] + 1e-12) best = j;
    const g = given[s];
    return { state: s, ...(g?.given ? { given: g.value } : {}), derived: modes[best].time, mode: best, share: part[best][k] };
  });
  const warnings: string[] = [];
  modes.forEach((m) => {
    if (m.stable) return;
    const main = states.filter((_, k) => m.participation[k] >= 0.1);
    warnings.push(
      `a mode with eigenvalue ${fmt(m.re)}${m.im !== 0 ? ` ± ${fmt(Math.abs(m.im))}i` : ''} is ${m.re === 0 ? 'neutral (it neither grows nor decays)' : 'unstable (it grows)'}, carried mostly by ${main.join(', ')}: ` +
        'these states do not settle, so treating them as settled at any interval is not valid',
    );
  });
  return { states, modes, perState, warnings };
}

const fmt = (x: number) => formatNumber(x, { digits: 4 });

/**
 * Whether the settled (fast) states come to rest when the others are held:
 * the eigenvalues of the drift restricted to them, A_FF, must all have
 * negative real parts — the stability condition of the quasi-steady-state
 * reduction (Tikhonov's theorem; Kokotović, Khalil & O'Reilly, Singular
 * Perturbation Methods in Control, 1986, Ch. 1). Returns warnings, empty when stable.
 */
export function fastPartWarnings(a: Mat, states: VariableId[], settled: VariableId[]): string[] {
  const idx = settled.map((s) => states.indexOf(s)).filter((i) => i >= 0);
  if (idx.length === 0) return [];
  const n = states.length;
  const sub = idx.map((i) => idx.map((j) => a.data[i * n + j]));
  const e = eigen(fromRowsLocal(sub));
  const bad: string[] = [];
  for (let k = 0; k < idx.length; k++) if (!(e.re[k] < 0)) bad.push(`${fmt(e.re[k])}${e.im[k] !== 0 ? ` ${e.im[k] > 0 ? '+' : '−'} ${fmt(Math.abs(e.im[k]))}i` : ''}`);
  if (bad.length === 0) return [];
  const names = idx.map((i) => states[i]);
  return [
    `the fast part (${names.join(', ')}, settled at this interval) is not stable on its own (eigenvalue${bad.length > 1 ? 's' : ''} ${bad.join(', ')}): these states would not come to rest, so settling them is not valid here`,
  ];
}

function fromRowsLocal(rows: number[][]): Mat {
  const n = rows.length;
  const data = new Float64Array(n * n);
  rows.forEach((r, i) => r.forEach((x, j) => (data[i * n + j] = x)));
  return { rows: n, cols: n, data };
}
