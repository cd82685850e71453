/**
 * The samples a study would take of a simulated run: their times, and the
 * run's values at those times.
 */

/**
 * The times a study would take its samples: 0, Δ, 2Δ, … up to the study
 * length (default `samples` × Δ) and the end of the run, at most `max` of
 * them (null when there would be more: too dense to draw).
 */
export function sampleTimes(interval: number, until: number, studyLength: number, max = 400): number[] | null {
  if (!(interval > 0)) return [];
  const end = Math.min(until, studyLength);
  const count = Math.floor(end / interval + 1e-9) + 1;
  if (count > max) return null;
  return Array.from({ length: count }, (_, k) => k * interval);
}

/** The value of a series at time t by linear interpolation between output points. */
export function valueAt(times: readonly number[], values: readonly number[], t: number): number {
  if (times.length === 0) return NaN;
  if (t <= times[0]) return values[0];
  if (t >= times[times.length - 1]) return values[values.length - 1];
  let lo = 0, hi = times.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid] <= t) lo = mid;
    else hi = mid;
  }
  const w = (t - times[lo]) / (times[hi] - times[lo]);
  return values[lo] + w * (values[hi] - values[lo]);
}
