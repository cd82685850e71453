/**
 * How many patterns the lagged matrix Φ(Δ) = e^{AΔ} carries over, restricted
 * to the analysed variables: its singular values. Over intervals long
 * against the fast loops the fast modes have died away and Φ(Δ) approaches
 * the rank-one e^{λ₁Δ} v₁w₁′ of the slowest mode: lagged effects then look
 * like one common cause acting on every variable, whatever the loops between
 * them (the eigen-expansion of e^{AΔ}; common practice).
 */
import type { VariableId } from '../model/types';
import { expm } from '../numeric/expm';
import { scale, zeros, type Mat } from '../numeric/dense';
import { logGrid } from '../numeric/sampled';
import { singularValues, symmetricEigen } from './symmetric';

export interface LaggedRank {
  interval: number;
  variables: VariableId[];
  /** Φ(Δ) over the analysed variables, rows = effect on, columns = effect of. */
  phi: number[][];
  /** Singular values, largest first. */
  singularValues: number[];
  /** Smallest / largest singular value (0 when the largest is 0). */
  ratio: number;
  /** Second / largest: how far from rank one. */
  secondRatio: number;
  /** The leading pattern (left singular vector, sign with positive sum) over the variables. */
  pattern: number[];
  /** How many variables the leading pattern spreads over: 1/Σ uᵢ⁴ (participation ratio, between 1 and p). */
  spread: number;
}

function submatrix(m: Mat, idx: number[]): Mat {
  const out = zeros(idx.length);
  idx.forEach((i, r) => idx.forEach((j, c) => (out.data[r * idx.length + c] = m.data[i * m.cols + j])));
  return out;
}

/**
 * Singular values of Φ(Δ) over `variables` (a subset of `states`).
 * Example: `laggedRank(A, ['a', 'b', 'c'], ['a', 'b'], 24).ratio`.
 */
export function laggedRank(drift: Mat, states: VariableId[], variables: VariableId[], interval: number): LaggedRank {
  const idx = variables.map((v) => {
    const i = states.indexOf(v);
    if (i < 0) throw new Error(`"${v}" is not a state of the model`);
    return i;
  });
  const phi = submatrix(expm(scale(drift, interval)), idx);
  const sv = singularValues(phi);
  const p = idx.length;
  const pp = zeros(p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = 0; k < p; k++) s += phi.data[i * p + k] * phi.data[j * p + k];
      pp.data[i * p + j] = s;
    }
  const e = symmetricEigen(pp);
  let pattern = Array.from({ length: p }, (_, i) => e.vectors.data[i * p]);
  if (pattern.reduce((a, b) => a + b, 0) < 0) pattern = pattern.map((x) => -x);
  const q4 = pattern.reduce((a, b) => a + b ** 4, 0);
  const top = sv[0] ?? 0;
  return {
    interval,
    variables,
    phi: Array.from({ length: p }, (_, i) => Array.from(phi.data.subarray(i * p, (i + 1) * p))),
    singularValues: sv,
    ratio: top > 0 ? sv[sv.length - 1] / top : 0,
    secondRatio: top > 0 && sv.length > 1 ? sv[1] / top : 0,
    pattern,
    spread: q4 > 0 ? 1 / q4 : 0,
  };
}

/** The singular values of Φ(Δ) over a log grid of intervals. */
export function laggedRankCurve(drift: Mat, states: VariableId[], variables: VariableId[], from: number, to: number, count = 60): LaggedRank[] {
  return logGrid(from, to, count).map((d) => laggedRank(drift, states, variables, d));
}
