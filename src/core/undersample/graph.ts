/**
 * Integer-step processes measured every u-th step (Danks & Plis 2013,
 * "Learning causal structure from undersampled time series"; Plis, Danks,
 * Freeman & Calhoun 2015, "Rate-agnostic (causal) structure learning").
 *
 * The causal-step graph G has an edge i → j when X_i at step t affects X_j at
 * step t + 1 (a self-loop i → i: the variable carries over). Seen every u-th
 * step, the measured graph G^u has
 *   - a directed edge i → j when a path of exactly u steps leads from i to j;
 *   - a bidirected edge i ↔ j (i ≠ j) when some k reaches both i and j by paths
 *     of the same length l < u: a common cause that acted between two measurements.
 *
 * Graphs are boolean matrices kept as one bit mask per row (row i: the set of j
 * with i → j), so a power is n mask unions per row. Up to 30 variables.
 */

/** Most variables a graph of this module may have (one 32-bit mask per row, sign bit unused). */
export const MAX_GRAPH_VARIABLES = 30;

/** A causal-step graph: `directed[i]` has bit j set when i → j (bit i: the self-loop). */
export interface StepGraph {
  names: readonly string[];
  directed: readonly number[];
}

/** A measured graph: directed rows as in `StepGraph`, `bidirected[i]` bit j when i ↔ j (symmetric, no diagonal). */
export interface MeasuredGraph {
  names: readonly string[];
  directed: readonly number[];
  bidirected: readonly number[];
}

export const bit = (j: number): number => 1 << j;
export const has = (row: number, j: number): boolean => ((row >>> j) & 1) === 1;

/** Number of set bits of a 32-bit mask (common practice: SWAR popcount). */
export function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** The indices of the set bits of a mask, ascending. */
export function bitsOf(x: number): number[] {
  const out: number[] = [];
  for (let m = x >>> 0; m !== 0; m &= m - 1) out.push(31 - Math.clz32(m & -m));
  return out;
}

/** Rows reached in one more step: next[i] = ∪ { a[k] : k ∈ p[i] }. */
export function stepOnce(p: ArrayLike<number>, a: ArrayLike<number>, n: number, out: Int32Array | number[]): void {
  for (let i = 0; i < n; i++) {
    let r = 0;
    for (let m = p[i]; m !== 0; m &= m - 1) r |= a[31 - Math.clz32(m & -m)];
    out[i] = r;
  }
}

/**
 * The measured graph of `a` (rows, n variables) at rate u into `outD` / `outB`,
 * using `p`, `q` as scratch (length ≥ n). Allocation-free: the inverse search calls it millions of times.
 */
export function measureInto(a: ArrayLike<number>, n: number, u: number, outD: Int32Array, outB: Int32Array, p: Int32Array, q: Int32Array): void {
  for (let i = 0; i < n; i++) { p[i] = a[i]; outB[i] = 0; }
  let cur = p, nxt = q;
  for (let l = 1; l < u; l++) {
    // Every pair reached from one k in l steps is confounded at this rate.
    for (let k = 0; k < n; k++) {
      const s = cur[k];
      if ((s & (s - 1)) === 0) continue;
      for (let m = s; m !== 0; m &= m - 1) outB[31 - Math.clz32(m & -m)] |= s;
    }
    stepOnce(cur, a, n, nxt);
    const t = cur; cur = nxt; nxt = t;
  }
  for (let i = 0; i < n; i++) { outD[i] = cur[i]; outB[i] &= ~(1 << i); }
}

function checkGraph(g: StepGraph): number {
  const n = g.names.length;
  if (n > MAX_GRAPH_VARIABLES) throw new RangeError(`a step graph has at most ${MAX_GRAPH_VARIABLES} variables; this one has ${n}`);
  if (g.directed.length !== n) throw new RangeError(`the graph names ${n} variables but has ${g.directed.length} rows`);
  return n;
}

function checkRate(u: number): void {
  if (!Number.isInteger(u) || u < 1) throw new RangeError(`the rate u must be a whole number ≥ 1 (got ${u})`);
}

/**
 * The measured graph of `g` at rate u.
 * @example measuredGraph({ names: ['1','2','3'], directed: [0b010, 0b100, 0] }, 2).directed // [0b100, 0, 0]: 1 → 3
 */
export function measuredGraph(g: StepGraph, u: number): MeasuredGraph {
  const n = checkGraph(g);
  checkRate(u);
  const d = new Int32Array(n), b = new Int32Array(n), p = new Int32Array(n), q = new Int32Array(n);
  measureInto(g.directed, n, u, d, b, p, q);
  return { names: g.names, directed: Array.from(d, (x) => x >>> 0), bidirected: Array.from(b, (x) => x >>> 0) };
}

/** The measured graphs at u = 1 … maxRate (one pass: each rate adds one step). */
export function measuredSeries(g: StepGraph, maxRate: number): MeasuredGraph[] {
  const n = checkGraph(g);
  checkRate(maxRate);
  const out: MeasuredGraph[] = [];
  let p = Int32Array.from(g.directed);
  const b = new Int32Array(n);
  for (let u = 1; u <= maxRate; u++) {
    if (u > 1) {
      // pairs reached from one k in u − 1 steps join the confounded pairs
      for (let k = 0; k < n; k++) {
        const s = p[k];
        if ((s & (s - 1)) === 0) continue;
        for (let m = s; m !== 0; m &= m - 1) b[31 - Math.clz32(m & -m)] |= s;
      }
      const q = new Int32Array(n);
      stepOnce(p, g.directed, n, q);
      p = q;
    }
    out.push({ names: g.names, directed: Array.from(p, (x) => x >>> 0), bidirected: Array.from(b, (x, i) => (x & ~(1 << i)) >>> 0) });
  }
  return out;
}

/** Edges of a measured graph as name pairs: directed (with self-loops) and bidirected (i < j, once). */
export function edgeList(h: MeasuredGraph): { directed: [string, string][]; bidirected: [string, string][] } {
  const directed: [string, string][] = [];
  const bidirected: [string, string][] = [];
  const n = h.names.length;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (has(h.directed[i], j)) directed.push([h.names[i], h.names[j]]);
      if (j > i && has(h.bidirected[i], j)) bidirected.push([h.names[i], h.names[j]]);
    }
  return { directed, bidirected };
}

/** Why one edge of the measured graph is there. */
export type EdgeReason =
  | { kind: 'directed'; from: number; to: number; rate: number; path: number[]; paths: number; text: string }
  | { kind: 'bidirected'; a: number; b: number; rate: number; steps: number; causes: number[]; text: string };

/** The sets reached from `i` in exactly 0 … u steps. */
function reachLayers(a: readonly number[], n: number, i: number, u: number): number[] {
  const layers = [bit(i)];
  for (let l = 1; l <= u; l++) {
    let r = 0;
    for (let m = layers[l - 1]; m !== 0; m &= m - 1) r |= a[31 - Math.clz32(m & -m)];
    layers.push(r >>> 0);
  }
  return layers;
}

const list = (xs: string[]): string => (xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`);

/**
 * One reason per edge of the measured graph at rate u, in words:
 * "1 → 3 appears at u = 2 through 2", "2 ↔ 3 appears at u = 2: 1 reaches both in 1 step".
 */
export function explainMeasured(g: StepGraph, u: number): EdgeReason[] {
  const n = checkGraph(g);
  checkRate(u);
  const names = g.names;
  const a = g.directed;
  const out: EdgeReason[] = [];
  for (let i = 0; i < n; i++) {
    const layers = reachLayers(a, n, i, u);
    for (const j of bitsOf(layers[u])) {
      // Walk back from j through the layers, taking the first predecessor each time.
      const path = [j];
      let cur = j;
      for (let l = u - 1; l >= 0; l--) {
        const prev = bitsOf(layers[l]).find((k) => has(a[k], cur))!;
        path.unshift(prev);
        cur = prev;
      }
      // Count the paths of length u (dynamic programming over the layers).
      let ways = new Map<number, number>([[i, 1]]);
      for (let l = 1; l <= u; l++) {
        const next = new Map<number, number>();
        for (const [k, w] of ways) for (const t of bitsOf(a[k])) next.set(t, Math.min(Number.MAX_SAFE_INTEGER, (next.get(t) ?? 0) + w));
        ways = next;
      }
      const paths = ways.get(j) ?? 0;
      const via = path.slice(1, -1).map((k) => names[k]);
      const self = i === j;
      const arrow = `${names[i]} → ${names[j]}`;
      let text: string;
      if (u === 1) text = self ? `${names[i]} carries over from step to step (its self-loop)` : `${arrow} is a causal-step link`;
      else {
        const route = via.join(' → ');
        text = `${arrow} appears at u = ${u} through ${route}` + (paths > 1 ? ` (one of ${paths} paths of ${u} steps)` : '');
        if (self) text = `${names[i]} → ${names[i]} (self-loop) appears at u = ${u} through ${route}` + (paths > 1 ? ` (one of ${paths} paths of ${u} steps)` : '');
      }
      out.push({ kind: 'directed', from: i, to: j, rate: u, path, paths, text });
    }
  }
  // Bidirected: the first l < u at which a common cause reaches both.
  const layersOf = Array.from({ length: n }, (_, k) => reachLayers(a, n, k, Math.max(0, u - 1)));
  for (let x = 0; x < n; x++)
    for (let y = x + 1; y < n; y++) {
      for (let l = 1; l < u; l++) {
        const causes: number[] = [];
        for (let k = 0; k < n; k++) if (has(layersOf[k][l], x) && has(layersOf[k][l], y)) causes.push(k);
        if (causes.length === 0) continue;
        const who = list(causes.map((k) => names[k]));
        const text = `${names[x]} ↔ ${names[y]} appears at u = ${u}: ${who} ${causes.length > 1 ? 'each reach' : 'reaches'} both in ${l} step${l > 1 ? 's' : ''}, between two measurements`;
        out.push({ kind: 'bidirected', a: x, b: y, rate: u, steps: l, causes, text });
        break;
      }
    }
  return out;
}
