/**
 * Test mechanisms: fast chained symptoms (a loop s1 → s2 → s3 → s4 → s1 of
 * integrating links) and a person-level driver, either an input acting
 * directly or through a slow state. Invented for these tests; the drift A and
 * input gain B are written out here from the sketch reading
 * dx_i/dt = (Σ_j w_ij x_j + b_i u − x_i)/τ_i (src/core/numeric/system.ts),
 * independently of the code under test.
 */
import type { Model } from '../../../src/core/model/types';

export const SYMPTOMS = ['s1', 's2', 's3', 's4'];
export const TAUS = [0.5, 1, 1.5, 2];
export const GAINS = [0.8, 0.6, 0.7, 0.5];
export const SLOW_TAU = 500;
export const SLOW_NOISE = 0.002;

export function chainModel(chain: number, personSD: number, slow = false): Model {
  const variables: Model['variables'] = [{ id: 'load', kind: 'input', value: 1, ...(personSD !== 0 ? { personSD } : {}) }, ...SYMPTOMS.map((id, i) => ({ id, kind: 'state' as const, timescale: TAUS[i] }))];
  const links: Model['links'] = SYMPTOMS.map((id, i) => ({ from: slow ? 'strain' : 'load', to: id, kind: 'integrating' as const, weight: GAINS[i] }));
  if (slow) {
    variables.push({ id: 'strain', kind: 'state', timescale: SLOW_TAU, noise: SLOW_NOISE });
    links.push({ from: 'load', to: 'strain', kind: 'integrating', weight: 1 });
  }
  if (chain !== 0) for (let i = 0; i < 4; i++) links.push({ from: SYMPTOMS[i], to: SYMPTOMS[(i + 1) % 4], kind: 'integrating', weight: chain });
  return { format: 'loopfold-model', version: 1, name: 'chain', timeUnit: 'h', variables, links };
}

/** A and B of chainModel in the state order of model.variables (s1..s4, then strain when slow). */
export function chainMatrices(chain: number, slow = false): { A: number[][]; B: number[][]; noise: number[] } {
  const n = slow ? 5 : 4;
  const A = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const B = Array.from({ length: n }, () => [0]);
  for (let i = 0; i < 4; i++) {
    A[i][i] = -1 / TAUS[i];
    const prev = (i + 3) % 4;
    A[i][prev] += chain / TAUS[i];
    if (slow) A[i][4] = GAINS[i] / TAUS[i];
    else B[i][0] = GAINS[i] / TAUS[i];
  }
  if (slow) {
    A[4][4] = -1 / SLOW_TAU;
    B[4][0] = 1 / SLOW_TAU;
  }
  return { A, B, noise: slow ? [1, 1, 1, 1, SLOW_NOISE] : [1, 1, 1, 1] };
}
