/**
 * Analytic power of a first-order VAR analysis for one lagged link.
 *
 * The analysis regresses each measured variable at a prompt on all measured variables at
 * the prompt before (pooled least squares within persons). Under a schedule whose gaps
 * between consecutive prompts differ (night gaps, random timing, missed prompts) and with
 * measurement error, the coefficient it estimates is not Φ at the nominal interval but the
 * pooled limit B = (Σ_k w_k C_k) S⁻¹, with C_k = Φ(Δ_k)·Σ the lag covariance of the true
 * process over gap Δ_k, S = Σ + Θ the covariance of the measurements (Θ: error variances)
 * and w_k the share of pairs with gap Δ_k.
 *
 * Its sampling variance is the sandwich of the pooled regression for equation i:
 * Var(b_i) ≈ S⁻¹ M_i S⁻¹ / T with M_i = Σ_k w_k (v_ik·S + 2 c_ik c_ikᵀ), where
 * e = y_i(t+Δ_k) − b_iᵀy(t), v_ik = Var(e) and c_ik = Cov(y(t), e) (Gaussian fourth moments:
 * E[e² y yᵀ] = v·S + 2 c cᵀ; Isserlis' theorem). With one gap and no measurement error
 * c = 0, v = Σu,ii and this is the textbook Var(φ̂_ij) = Σu,ii (Γ₀⁻¹)_jj / T
 * (Lütkepohl 2005, New Introduction to Multiple Time Series Analysis, Prop. 3.1).
 * It treats the pairs as independent draws: an approximation that is optimistic for short
 * series (below about 100 occasions per person, where Monte Carlo is the figure to trust)
 * and ignores the downward bias of person-mean centring (Nickell 1981: about −(1+φ)/(T−1)).
 */
import { inverse, mul, mulT, zeros, type Mat } from '../numeric/dense';
import { normalCdf, normalQuantile } from '../stats/normal';

export interface GapShare {
  /** The gap between two consecutive prompts, in the model's time unit. */
  gap: number;
  /** Its share of all consecutive pairs the analysis uses (the shares add up to 1). */
  share: number;
}

export interface PooledVarMoments {
  /** The coefficients the analysis estimates in the limit: row i = target, column j = source. */
  coefficients: Mat;
  /** Asymptotic variance of each coefficient for one pair (divide by the number of pairs). */
  variancePerPair: Mat;
}

/**
 * The pooled VAR(1) limit and its per-pair variance from the lag covariances of the true
 * process (`lagCovariance[k]` = Φ(Δ_k)·Σ) and the covariance of the measurements `S`.
 * Example: one gap, S = Σ: `pooledVarMoments(Σ, [{ gap, share: 1 }], [ΦΣ])` gives B = Φ.
 */
export function pooledVarMoments(measured: Mat, gaps: readonly GapShare[], lagCovariance: readonly Mat[]): PooledVarMoments {
  const n = measured.rows;
  if (gaps.length === 0) throw new Error('the design has no pair of consecutive prompts to analyse');
  if (lagCovariance.length !== gaps.length) throw new Error('one lag covariance is needed for each gap');
  const total = gaps.reduce((s, g) => s + g.share, 0);
  if (!(total > 0)) throw new Error('the gaps of the design have no weight');
  const sInv = inverse(measured);
  const pooled = zeros(n);
  gaps.forEach((g, k) => {
    for (let x = 0; x < n * n; x++) pooled.data[x] += (g.share / total) * lagCovariance[k].data[x];
  });
  const b = mul(pooled, sInv);
  const variance = zeros(n);
  const bs = mul(b, measured); // row i: b_iᵀ S
  const bsbt = mulT(bs, b); // B S Bᵀ
  for (let i = 0; i < n; i++) {
    const m = zeros(n);
    gaps.forEach((g, k) => {
      const w = g.share / total;
      const c = lagCovariance[k];
      // Var(e) = S_ii − 2 (C_k Bᵀ)_ii + (B S Bᵀ)_ii  (y_i(t+Δ) has variance S_ii under stationarity)
      let cbt = 0;
      for (let j = 0; j < n; j++) cbt += c.data[i * n + j] * b.data[i * n + j];
      const v = measured.data[i * n + i] - 2 * cbt + bsbt.data[i * n + i];
      // Cov(y(t), e) = (C_k)_{i,:} − b_iᵀ S
      const cv = new Float64Array(n);
      for (let j = 0; j < n; j++) cv[j] = c.data[i * n + j] - bs.data[i * n + j];
      for (let r = 0; r < n; r++) for (let s = 0; s < n; s++) m.data[r * n + s] += w * (v * measured.data[r * n + s] + 2 * cv[r] * cv[s]);
    });
    const sand = mul(mul(sInv, m), sInv);
    for (let j = 0; j < n; j++) variance.data[i * n + j] = sand.data[j * n + j];
  }
  return { coefficients: b, variancePerPair: variance };
}

/**
 * Power of a two-sided Wald test at level `alpha` for an effect with standard error `se`:
 * Φ(|β|/se − z) + Φ(−|β|/se − z), z = Φ⁻¹(1 − α/2) (common practice).
 * Example: `powerOfTest(0.2, 0.0719)` ≈ 0.79.
 */
export function powerOfTest(effect: number, se: number, alpha = 0.05): number {
  if (!(se > 0) || !Number.isFinite(se)) return NaN;
  const z = normalQuantile(1 - alpha / 2);
  const d = Math.abs(effect) / se;
  return normalCdf(d - z) + normalCdf(-d - z);
}

/**
 * Standard error of a pooled estimate over `persons` persons with `pairsPerPerson` pairs each:
 * √((τ² + v/T)/N), where v is the per-pair variance and τ the standard deviation of the effect
 * across persons (person differences add to the sampling variance of the average).
 */
export function pooledStandardError(variancePerPair: number, pairsPerPerson: number, persons: number, betweenSD = 0): number {
  if (!(pairsPerPerson > 0) || !(persons > 0)) return Infinity;
  return Math.sqrt((betweenSD * betweenSD + variancePerPair / pairsPerPerson) / persons);
}
