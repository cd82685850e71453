/**
 * The one tolerance policy for numeric checks in this test suite.
 * |actual − expected| ≤ absTol + relTol·|expected|, elementwise.
 */
export const DEFAULT_TOL = { relTol: 1e-10, absTol: 1e-12 };

export function close(actual: number, expected: number, tol: { relTol?: number; absTol?: number } = {}): boolean {
  const relTol = tol.relTol ?? DEFAULT_TOL.relTol;
  const absTol = tol.absTol ?? DEFAULT_TOL.absTol;
  return Math.abs(actual - expected) <= absTol + relTol * Math.abs(expected);
}

/** Throws with the first mismatching index when two arrays (or matrices as arrays of rows) differ. */
export function expectClose(actual: number | number[] | number[][], expected: number | number[] | number[][], tol: { relTol?: number; absTol?: number } = {}, label = 'value'): void {
  const a = ([] as number[]).concat(...([actual] as unknown as number[][]).flat(2) as unknown as number[][]);
  const e = ([] as number[]).concat(...([expected] as unknown as number[][]).flat(2) as unknown as number[][]);
  if (a.length !== e.length) throw new Error(`${label}: length ${a.length} ≠ expected ${e.length}`);
  for (let i = 0; i < a.length; i++) {
    if (!close(a[i], e[i], tol)) throw new Error(`${label}[${i}]: ${a[i]} ≠ expected ${e[i]} (relTol ${tol.relTol ?? DEFAULT_TOL.relTol}, absTol ${tol.absTol ?? DEFAULT_TOL.absTol})`);
  }
}

/**
 * Agreement to `d` decimal places: |actual − expected| < 10⁻ᵈ/2, the check
 * for values printed or stated to d decimals. Example: `expectClose(x, 9.296, decimals(3))`.
 */
export function decimals(d: number): { relTol: number; absTol: number } {
  return { relTol: 0, absTol: 10 ** -d / 2 };
}
