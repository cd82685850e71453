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
 * and leaves out the downward bias of person-mean centring (Nickell 1981: about −(1+φ)/(T−1)),
 * which `centredMoments` gives separately.
 */
import { axpby, inverse, mul, mulT, zeros, type Mat } from '../numeric/dense';
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

/**
 * The moments a person-mean-centred VAR(1) pools over one person's occasions, in expectation:
 * N = Σ_a E[ỹ_a ỹ_{a−1}ᵀ] and D = Σ_a E[ỹ_{a−1} ỹ_{a−1}ᵀ], ỹ = y − (the person's mean over all T
 * occasions). Over many persons the analysis converges to (Σ N)(Σ D)⁻¹ at a fixed T: the
 * within-person estimate it is expected to give, including the small-T bias of centring
 * (Nickell 1981, Econometrica 49, 1417–1426: about −(1+φ)/(T−1) for one autoregression; common
 * result). Exact for a stationary process, from Cov(y_a, y_c) = Φ(t_a − t_c)Σ (a ≥ c) plus the
 * error variance Θ when a = c, with the row sums R_a = Σ_c Cov(y_a, y_c) by two recursions (O(T)).
 * `phiOf(gap)` gives Φ over a gap; `times` the person's answered occasions, increasing.
 */
export function centredMoments(phiOf: (gap: number) => Mat, sigma: Mat, errorVariance: ArrayLike<number>, times: ArrayLike<number>): { num: Mat; den: Mat } {
  const n = sigma.rows, T = times.length;
  const num = zeros(n), den = zeros(n);
  if (T < 2) return { num, den };
  const phis: Mat[] = [];
  for (let a = 1; a < T; a++) phis.push(phiOf(times[a] - times[a - 1]));
  const measured = axpby(1, sigma, 0, sigma);
  for (let i = 0; i < n; i++) measured.data[i * n + i] += errorVariance[i];
  // F_a = Σ_{c≤a} Φ(t_a − t_c)Σ;  H_a = Σ_{c>a} Σ Φ(t_c − t_a)ᵀ;  R_a = F_a + H_a + Θ.
  const F: Mat[] = [sigma];
  for (let a = 1; a < T; a++) F.push(axpby(1, sigma, 1, mul(phis[a - 1], F[a - 1])));
  const H: Mat[] = new Array(T);
  H[T - 1] = zeros(n);
  for (let a = T - 2; a >= 0; a--) H[a] = mulT(axpby(1, sigma, 1, H[a + 1]), phis[a]);
  const R = F.map((f, a) => {
    const r = axpby(1, f, 1, H[a]);
    for (let i = 0; i < n; i++) r.data[i * n + i] += errorVariance[i];
    return r;
  });
  const G = zeros(n);
  for (const r of R) for (let x = 0; x < n * n; x++) G.data[x] += r.data[x];
  for (let a = 1; a < T; a++) {
    const lag = mul(phis[a - 1], sigma); // Cov(y_a, y_{a−1})
    const ra = R[a].data, rb = R[a - 1].data;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const g = G.data[i * n + j] / (T * T);
        num.data[i * n + j] += lag.data[i * n + j] - ra[i * n + j] / T - rb[j * n + i] / T + g;
        den.data[i * n + j] += measured.data[i * n + j] - rb[i * n + j] / T - rb[j * n + i] / T + g;
      }
  }
  return { num, den };
}
