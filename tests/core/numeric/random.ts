import { seededRandom } from '../../../src/core/stats/random';

/**
 * A random stable n×n drift matrix: Gaussian entries scaled by 1/√n (spectrum
 * roughly inside the unit disc, by the circular law), shifted left by `shift`,
 * with rows scaled by `spread` decades to make the system stiff.
 */
export function randomStable(n: number, seed: number, shift = 1.5, spread = 0): number[][] {
  const g = seededRandom(seed).normal;
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) {
    const s = 10 ** ((spread * i) / Math.max(1, n - 1));
    const r: number[] = [];
    for (let j = 0; j < n; j++) r.push(s * (g() / Math.sqrt(n) - (i === j ? shift : 0)));
    rows.push(r);
  }
  return rows;
}

/** A random positive semi-definite G Gᵀ with G n×n Gaussian. */
export function randomDiffusion(n: number, seed: number): number[][] {
  const g = seededRandom(seed).normal;
  const G: number[][] = [];
  for (let i = 0; i < n; i++) G.push(Array.from({ length: n }, () => g()));
  const c: number[][] = [];
  for (let i = 0; i < n; i++) {
    c.push([]);
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += G[i][k] * G[j][k];
      c[i].push(s);
    }
  }
  return c;
}
