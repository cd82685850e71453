/**
 * Unconstrained minimisation for the likelihood fits: BFGS with an Armijo
 * backtracking line search and central-difference gradients (Nocedal &
 * Wright 2006, Numerical Optimization, Algorithm 6.1 and §8.1), and the
 * Hessian by central differences at the optimum (§8.1, eq. 8.7).
 */

export interface MinimizeResult {
  x: number[];
  f: number;
  iterations: number;
  evaluations: number;
  converged: boolean;
  message: string;
}

function gradient(f: (x: number[]) => number, x: number[], fx: number, count: { n: number }, forward = false): number[] {
  const g = new Array<number>(x.length);
  const xs = x.slice();
  for (let i = 0; i < x.length; i++) {
    if (forward) {
      // One-sided, step near the square root of the precision of f (Nocedal & Wright 2006, eq. 8.3): half the evaluations.
      let h = 1e-7 * Math.max(1, Math.abs(x[i]));
      xs[i] = x[i] + h; let fp = f(xs); count.n++;
      if (!Number.isFinite(fp)) { h = -h; xs[i] = x[i] + h; fp = f(xs); count.n++; }
      xs[i] = x[i];
      g[i] = Number.isFinite(fp) ? (fp - fx) / h : 0;
      continue;
    }
    const h = 1e-5 * Math.max(1, Math.abs(x[i]));
    xs[i] = x[i] + h; const fp = f(xs);
    xs[i] = x[i] - h; const fm = f(xs);
    xs[i] = x[i];
    count.n += 2;
    g[i] = Number.isFinite(fp) && Number.isFinite(fm) ? (fp - fm) / (2 * h) : Number.isFinite(fp) ? (fp - fx) / h : Number.isFinite(fm) ? (fx - fm) / h : 0;
  }
  return g;
}

/** Example: `minimize((x) => (x[0] - 1) ** 2, [0]).x` ≈ [1]. `f` may return Infinity where it is not defined. */
export function minimize(f: (x: number[]) => number, x0: number[], opts: { maxIterations?: number; gradTol?: number; relTol?: number; onIteration?: (iteration: number, f: number) => void; gradient?: 'central' | 'forward-then-central'; diagonalStart?: boolean } = {}): MinimizeResult {
  const n = x0.length;
  const maxIt = opts.maxIterations ?? 500;
  const gradTol = opts.gradTol ?? 1e-6;
  const relTol = opts.relTol ?? 1e-12;
  const count = { n: 0 };
  let x = x0.slice();
  let fx = f(x); count.n++;
  if (!Number.isFinite(fx)) return { x, f: fx, iterations: 0, evaluations: count.n, converged: false, message: 'the starting values give no finite likelihood' };
  // 'forward-then-central': one-sided differences while far from the optimum (half the
  // evaluations), central ones (accurate to O(h²)) from the first sign of stalling to the end; only
  // central gradients may declare convergence.
  let forward = opts.gradient === 'forward-then-central';
  let stall = 0;
  let g: number[];
  // Inverse Hessian approximation, started at a scaled identity, or (diagonalStart) at the inverse of
  // the diagonal curvature by central second differences, which also give a central gradient: 2n
  // evaluations that spare many iterations when the parameters differ in scale (log SDs beside drift
  // entries).
  let H0: number[][] | null = null;
  if (opts.diagonalStart) {
    g = new Array<number>(n);
    const c = new Array<number>(n);
    const xs = x.slice();
    for (let i = 0; i < n; i++) {
      const h = 1e-4 * Math.max(1, Math.abs(x[i]));
      xs[i] = x[i] + h; const fp = f(xs);
      xs[i] = x[i] - h; const fm = f(xs);
      xs[i] = x[i];
      count.n += 2;
      g[i] = Number.isFinite(fp) && Number.isFinite(fm) ? (fp - fm) / (2 * h) : Number.isFinite(fp) ? (fp - fx) / h : Number.isFinite(fm) ? (fx - fm) / h : 0;
      c[i] = Number.isFinite(fp) && Number.isFinite(fm) ? (fp - 2 * fx + fm) / (h * h) : NaN;
    }
    const pos = c.filter((v) => v > 0).sort((a, b) => a - b);
    if (pos.length > 0) {
      const mid = pos[pos.length >> 1];
      H0 = identityRows(n).map((row, i) => row.map((v) => v / (c[i] > 1e-8 * mid ? c[i] : mid)));
    }
  } else g = gradient(f, x, fx, count, forward);
  const toCentral = (): void => { forward = false; g = gradient(f, x, fx, count, false); stall = 0; };
  let H = H0 ? H0.map((r) => r.slice()) : identityRows(n);
  let first = !H0;
  let it = 0;
  let message = 'iteration limit reached';
  let converged = false;
  for (; it < maxIt; it++) {
    const gnorm = Math.max(...g.map(Math.abs));
    if (gnorm <= gradTol * Math.max(1, Math.abs(fx)) * 1e-3 || gnorm < gradTol) {
      if (forward) { toCentral(); it--; continue; }
      converged = true; message = 'gradient vanished'; break;
    }
    let d = H.map((row) => -row.reduce((s, h, j) => s + h * g[j], 0));
    let slope = d.reduce((s, di, i) => s + di * g[i], 0);
    if (!(slope < 0)) {
      if (H0) { H = H0.map((r) => r.slice()); first = false; d = H.map((row, i) => -row[i] * g[i]); } else { H = identityRows(n); first = true; d = g.map((v) => -v); }
      slope = d.reduce((s, di, i) => s + di * g[i], 0);
    }
    let step = first ? Math.min(1, 0.1 / Math.max(1e-12, Math.max(...d.map(Math.abs)))) : 1;
    let xn: number[] = x, fn = Infinity;
    for (let ls = 0; ls < 60; ls++) {
      xn = x.map((xi, i) => xi + step * d[i]);
      fn = f(xn); count.n++;
      if (Number.isFinite(fn) && fn <= fx + 1e-4 * step * slope) break;
      step *= 0.5;
    }
    if (!(Number.isFinite(fn) && fn <= fx)) {
      if (forward) { toCentral(); it--; continue; }
      message = 'line search found no lower point'; converged = Math.max(...g.map(Math.abs)) < 1e-3; break;
    }
    const gn = gradient(f, xn, fn, count, forward);
    const s = xn.map((v, i) => v - x[i]);
    const yv = gn.map((v, i) => v - g[i]);
    const sy = s.reduce((a, v, i) => a + v * yv[i], 0);
    if (sy > 1e-14) {
      if (first) { const yy = yv.reduce((a, v) => a + v * v, 0); H = identityRows(n).map((r) => r.map((v) => (v * sy) / yy)); first = false; }
      const Hy = H.map((row) => row.reduce((a, h, j) => a + h * yv[j], 0));
      const yHy = yv.reduce((a, v, i) => a + v * Hy[i], 0);
      const rho = 1 / sy;
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) H[i][j] += rho * ((1 + rho * yHy) * s[i] * s[j] - Hy[i] * s[j] - s[i] * Hy[j]);
    }
    const df = fx - fn;
    x = xn; g = gn;
    const prev = fx;
    fx = fn;
    opts.onIteration?.(it + 1, fx);
    if (forward && df <= 1e-9 * Math.max(1, Math.abs(prev))) { toCentral(); continue; }
    if (df <= relTol * Math.max(1, Math.abs(prev))) { if (++stall >= 3) { converged = true; message = 'no further decrease'; it++; break; } } else stall = 0;
  }
  return { x, f: fx, iterations: it, evaluations: count.n, converged, message };
}

function identityRows(n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (__, j) => (i === j ? 1 : 0)));
}

/** Hessian of f at x by central differences (Nocedal & Wright 2006, eq. 8.7 with steps scaled to |x|). */
export function hessian(f: (x: number[]) => number, x: number[]): number[][] {
  const n = x.length;
  const h = x.map((v) => 1e-4 * Math.max(1, Math.abs(v)));
  const f0 = f(x);
  const H = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const at = (i: number, si: number, j: number, sj: number) => {
    const xs = x.slice();
    xs[i] += si * h[i];
    xs[j] += sj * h[j];
    return f(xs);
  };
  // Row by row over the upper triangle, the steps in x_i outermost: a function that caches work on
  // its leading arguments (the likelihood's dynamics) meets the same x ± h_i many times in a row.
  for (let i = 0; i < n; i++) {
    H[i][i] = (at(i, 1, i, 0) - 2 * f0 + at(i, -1, i, 0)) / (h[i] * h[i]);
    for (let j = i + 1; j < n; j++) {
      const v = (at(i, 1, j, 1) - at(i, 1, j, -1) - at(i, -1, j, 1) + at(i, -1, j, -1)) / (4 * h[i] * h[j]);
      H[i][j] = v; H[j][i] = v;
    }
  }
  return H;
}
