/**
 * Euler–Maruyama for a stochastic differential equation with diagonal (additive) noise,
 * dX = f(X) dt + G dW, G = diag(g):
 *   X_{k+1} = X_k + f(X_k) h + G √h Z_k,  Z_k ~ N(0, I).
 * Weak order 1, and strong order 1 for additive noise (common result; Kloeden & Platen 1992,
 * Numerical Solution of Stochastic Differential Equations, cited from memory): the error in the
 * moments shrinks in proportion to the step. The step is taken well below the fastest
 * timescale of the mechanism by the caller; each gap between two output times is cut into
 * equal steps no longer than `step`, so every output time is hit exactly.
 */

export interface SdeSystem {
  /** Number of states. */
  n: number;
  /** The drift f(y) into `dy`; false when it cannot be evaluated there (the run stops with a message). */
  drift(y: Float64Array, dy: Float64Array): boolean;
  /** Diagonal of G: the noise amplitude of each state per √time. */
  diffusion: ArrayLike<number>;
}

export interface EulerMaruyamaOptions {
  /** Longest step, in the model's time unit. */
  step: number;
  /** Standard normal draws (the caller's seeded stream: the path is reproducible). */
  normal: () => number;
}

/**
 * The states at each of `times` (increasing), starting from `y0` at `times[0]`; row k of the
 * result (n values) is the state at times[k]. Throws when the drift cannot be evaluated or a
 * state leaves the finite numbers (the step is too long for the mechanism, or it blows up).
 * Example: `eulerMaruyama({ n: 1, drift: (y, d) => ((d[0] = -y[0]), true), diffusion: [1] }, [0], [0, 1, 2], { step: 0.01, normal })`.
 */
export function eulerMaruyama(sys: SdeSystem, y0: ArrayLike<number>, times: ArrayLike<number>, opt: EulerMaruyamaOptions): Float64Array {
  const n = sys.n, m = times.length;
  if (!(opt.step > 0) || !Number.isFinite(opt.step)) throw new Error(`the integrator's step must be a positive number, not ${opt.step}`);
  const out = new Float64Array(m * n);
  if (m === 0) return out;
  const y = Float64Array.from(y0);
  const dy = new Float64Array(n);
  out.set(y, 0);
  for (let k = 1; k < m; k++) {
    const gap = times[k] - times[k - 1];
    if (!(gap > 0)) throw new Error(`output times must increase (time ${k + 1} is not after time ${k})`);
    const steps = Math.ceil(gap / opt.step - 1e-9);
    const h = gap / steps, sh = Math.sqrt(h);
    for (let s = 0; s < steps; s++) {
      if (!sys.drift(y, dy)) throw new Error(`the drift cannot be evaluated at time ${times[k - 1] + s * h}`);
      for (let i = 0; i < n; i++) {
        y[i] += dy[i] * h + sys.diffusion[i] * sh * opt.normal();
        if (!Number.isFinite(y[i])) throw new Error(`state ${i + 1} left the finite numbers at time ${times[k - 1] + (s + 1) * h}: the mechanism grows without bound or the step is too long`);
      }
    }
    out.set(y, k * n);
  }
  return out;
}
