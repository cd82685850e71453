/**
 * Ordinary least squares with conventional standard errors, by Householder QR
 * (Golub & Van Loan, "Matrix Computations", 4th ed., §5.2 and §5.3.3): the
 * coefficients from R β = Qᵀy, their covariance σ² (RᵀR)⁻¹ with
 * σ² = SSR / (n − k). Small and dense: the unit-root and cointegration tests
 * regress a few hundred rows on a handful of columns.
 */

export interface OlsFit {
  /** Coefficients, one per column of the design. */
  beta: Float64Array;
  /** Conventional standard errors √(σ² [(XᵀX)⁻¹]ⱼⱼ). */
  se: Float64Array;
  /** t statistics β / se. */
  t: Float64Array;
  /** Covariance of the coefficients σ² (XᵀX)⁻¹, row-major k × k. */
  cov: Float64Array;
  residuals: Float64Array;
  /** Sum of squared residuals. */
  ssr: number;
  /** SSR / (n − k). */
  sigma2: number;
  n: number;
  k: number;
  /** Gaussian log-likelihood at the estimate: −n/2 (ln 2π + ln(SSR/n) + 1). */
  logLik: number;
  /** −2 logLik + 2k (every column counted as a parameter, the constant included). */
  aic: number;
  /** Centred R² when the design has a constant column, uncentred otherwise. */
  rSquared: number;
}

/**
 * Regress y on the columns of X (each column a Float64Array of y's length).
 * Throws when a column's length differs from y's, when there are no more rows
 * than columns, or when the columns are linearly dependent.
 *
 * Example: `ols([1, 2, 3.1], [[1, 1, 1], [0, 1, 2]]).beta` ≈ [0.983, 1.05].
 */
export function ols(y: ArrayLike<number>, columns: readonly ArrayLike<number>[]): OlsFit {
  const n = y.length;
  const k = columns.length;
  for (let j = 0; j < k; j++) if (columns[j].length !== n) throw new Error(`column ${j + 1} of the regression has ${columns[j].length} rows, not ${n}`);
  if (n <= k) throw new Error(`the regression needs more rows (${n}) than columns (${k})`);
  // A: n × k column-major copy, reduced in place to R (upper part) and the Householder vectors.
  const { a, colScale } = columnMajor(columns, n);
  const qty = Float64Array.from(y);
  const rdiag = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    let norm = 0;
    for (let i = j; i < n; i++) norm += a[j * n + i] ** 2;
    norm = Math.sqrt(norm);
    if (!(norm > 1e-13 * colScale)) throw new Error(`the regression's columns are linearly dependent (column ${j + 1} adds nothing)`);
    const alpha = a[j * n + j] > 0 ? -norm : norm;
    // v = x − alpha e₁, stored in place of the column below (and on) the diagonal.
    a[j * n + j] -= alpha;
    let vv = 0;
    for (let i = j; i < n; i++) vv += a[j * n + i] ** 2;
    const apply = (col: Float64Array, offset: number): void => {
      let d = 0;
      for (let i = j; i < n; i++) d += a[j * n + i] * col[offset + i];
      const f = (2 * d) / vv;
      for (let i = j; i < n; i++) col[offset + i] -= f * a[j * n + i];
    };
    for (let c = j + 1; c < k; c++) apply(a, c * n);
    apply(qty, 0);
    rdiag[j] = alpha;
  }
  const r = (i: number, j: number): number => (i === j ? rdiag[i] : a[j * n + i]);
  const beta = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let s = qty[i];
    for (let j = i + 1; j < k; j++) s -= r(i, j) * beta[j];
    beta[i] = s / r(i, i);
  }
  // R⁻¹ (upper triangular), then (XᵀX)⁻¹ = R⁻¹ R⁻ᵀ.
  const rinv = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let j = i + 1; j <= c; j++) s -= r(i, j) * rinv[j * k + c];
      rinv[i * k + c] = s / r(i, i);
    }
  }
  const residuals = new Float64Array(n);
  let ssr = 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i] / n;
  let tss = 0;
  let uss = 0;
  for (let i = 0; i < n; i++) {
    let f = 0;
    for (let j = 0; j < k; j++) f += columns[j][i] * beta[j];
    residuals[i] = y[i] - f;
    ssr += residuals[i] ** 2;
    tss += (y[i] - mean) ** 2;
    uss += y[i] ** 2;
  }
  const sigma2 = ssr / (n - k);
  const cov = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let m = Math.max(i, j); m < k; m++) s += rinv[i * k + m] * rinv[j * k + m];
      cov[i * k + j] = sigma2 * s;
    }
  const se = new Float64Array(k);
  const t = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    se[j] = Math.sqrt(cov[j * k + j]);
    t[j] = beta[j] / se[j];
  }
  const hasConstant = columns.some((c) => { for (let i = 1; i < n; i++) if (c[i] !== c[0]) return false; return c[0] !== 0; });
  const logLik = (-n / 2) * (Math.log(2 * Math.PI) + Math.log(ssr / n) + 1);
  return { beta, se, t, cov, residuals, ssr, sigma2, n, k, logLik, aic: -2 * logLik + 2 * k, rSquared: 1 - ssr / (hasConstant ? tss : uss) };
}

/**
 * Residual sums of squares of the nested regressions of y on the first m
 * columns, m = 1…k, from one Householder QR: the QR of a column prefix is the
 * prefix of the QR, and the residual of the first m columns is
 * Σ_{i≥m} (Qᵀy)ᵢ². Used to choose a lag order without k separate fits.
 */
export function nestedResidualSums(y: ArrayLike<number>, columns: readonly ArrayLike<number>[]): Float64Array {
  const n = y.length;
  const k = columns.length;
  if (n <= k) throw new Error(`the regression needs more rows (${n}) than columns (${k})`);
  const { a, colScale } = columnMajor(columns, n);
  const qty = Float64Array.from(y);
  for (let j = 0; j < k; j++) {
    const o = j * n;
    let norm = 0;
    for (let i = j; i < n; i++) norm += a[o + i] ** 2;
    norm = Math.sqrt(norm);
    if (!(norm > 1e-13 * colScale)) throw new Error(`the regression's columns are linearly dependent (column ${j + 1} adds nothing)`);
    a[o + j] -= a[o + j] > 0 ? -norm : norm;
    let vv = 0;
    for (let i = j; i < n; i++) vv += a[o + i] ** 2;
    for (let c = j + 1; c <= k; c++) {
      const col = c === k ? qty : a;
      const off = c === k ? 0 : c * n;
      let d = 0;
      for (let i = j; i < n; i++) d += a[o + i] * col[off + i];
      const f = (2 * d) / vv;
      for (let i = j; i < n; i++) col[off + i] -= f * a[o + i];
    }
  }
  const out = new Float64Array(k);
  let tail = 0;
  for (let i = n - 1; i >= k; i--) tail += qty[i] ** 2;
  for (let m = k; m >= 1; m--) {
    out[m - 1] = tail;
    tail += qty[m - 1] ** 2;
  }
  return out;
}

/** The n × k column-major copy of `columns` and the largest column norm (the scale for the rank test). */
function columnMajor(columns: readonly ArrayLike<number>[], n: number): { a: Float64Array; colScale: number } {
  const k = columns.length;
  const a = new Float64Array(n * k);
  let colScale = 0;
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) {
      a[j * n + i] = columns[j][i];
      s += columns[j][i] ** 2;
    }
    colScale = Math.max(colScale, Math.sqrt(s));
  }
  return { a, colScale };
}
