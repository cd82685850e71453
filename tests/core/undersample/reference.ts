/**
 * A plain reference for the measured graph, written straight from the
 * definition of Danks & Plis (2013) with 0/1 matrices (no bit masks), for
 * enumerations too large to send to NetworkX. It is itself checked against
 * NetworkX's latent projection in forward.test.ts.
 */
export type Matrix = number[][];

export function matrixOf(rows: readonly number[], n: number): Matrix {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (rows[i] >>> j) & 1));
}

function times(a: Matrix, b: Matrix): Matrix {
  const n = a.length;
  return a.map((_, i) => Array.from({ length: n }, (_, j) => {
    for (let k = 0; k < n; k++) if (a[i][k] && b[k][j]) return 1;
    return 0;
  }));
}

/** { directed, bidirected } as 0/1 matrices: i → j when (A^u)_ij; i ↔ j (i ≠ j) when some k, l < u has (A^l)_ki and (A^l)_kj. */
export function referenceMeasured(a: Matrix, u: number): { directed: Matrix; bidirected: Matrix } {
  const n = a.length;
  const bidirected: Matrix = a.map(() => new Array<number>(n).fill(0));
  let p = a;
  for (let l = 1; l < u; l++) {
    for (let k = 0; k < n; k++)
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) if (i !== j && p[k][i] && p[k][j]) bidirected[i][j] = 1;
    p = times(p, a);
  }
  return { directed: p, bidirected };
}

/** A key for a measured graph given as matrices. */
export function keyOf(m: { directed: Matrix; bidirected: Matrix }): string {
  return `${m.directed.map((r) => r.join('')).join('/')}|${m.bidirected.map((r) => r.join('')).join('/')}`;
}

/** Rows (bit masks) of a 0/1 matrix. */
export function rowsOf(m: Matrix): number[] {
  return m.map((r) => r.reduce((acc, x, j) => (x ? acc | (1 << j) : acc), 0) >>> 0);
}

/** The causal-step graph with number `code` among all 2^(n²) graphs on n variables (bit i·n + j: i → j). */
export function graphNumber(code: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => Math.floor(code / 2 ** (i * n)) % 2 ** n);
}
