/**
 * From a measured graph back to the causal-step graphs that give it.
 *
 * Every edge of G^u is a monotone function of the edges of G: adding a causal
 * edge never removes a measured one (Plis, Danks, Freeman & Calhoun 2015, who
 * prune their search with the same fact). A node of the search fixes some
 * edges in (L) and some out, leaving the rest open (U = L ∪ open). Then
 *   L^u ⊆ G^u ⊆ U^u for every completion G,
 * so a node is dropped when L^u has an edge the measured graph H lacks, or U^u
 * lacks an edge of H; and when L^u = U^u = H every completion is a solution,
 * counted as 2^open without listing them all.
 *
 * Two ways to run it:
 *   - `search` (exact, up to 5 variables): branch on the edges in order with the
 *     two bounds above;
 *   - `solver` (up to 10 variables): the same constraint model, one 0/1 variable
 *     per possible causal edge and the constraint G^u = H, with propagation to a
 *     fixpoint at every node (an open edge whose inclusion would make L^u leave H
 *     is fixed out; one whose exclusion would make U^u miss part of H is fixed
 *     in; both at once is a conflict), branching on the open edge that appears
 *     in most open paths of the measured graph's edges.
 * Both report the nodes visited and the time, and can be stopped.
 */
import { bit, bitsOf, has, measureInto, popcount, type MeasuredGraph } from './graph';

/** Most variables of the pruned search; above it the solver runs. */
export const SEARCH_MAX_VARIABLES = 5;
/** Most variables of the solver (100 causal edge variables). */
export const SOLVER_MAX_VARIABLES = 10;

export type InverseMethod = 'search' | 'solver';

export interface InverseProgress {
  rate: number;
  /** Which of the rates asked for is under way (0-based) and how many there are. */
  rateIndex: number;
  rates: number;
  nodes: number;
  /** Share of this rate's search space settled so far (0 … 1). */
  fraction: number;
  count: number;
}

export interface InverseOptions {
  /** Default: `search` up to 5 variables, `solver` above. */
  method?: InverseMethod;
  /** Most solutions listed (all are counted); default 1000. */
  maxSolutions?: number;
  /** Most search nodes per rate before giving up (the answer says it is incomplete); default 50 million. */
  maxNodes?: number;
  onProgress?: (p: InverseProgress) => void;
  /** Nodes between two progress reports (default 20,000). */
  progressEvery?: number;
  /** Asked every 1,024 nodes; true stops the search (the answer says so). */
  shouldStop?: () => boolean;
  /** Milliseconds, for the cost figures (default `Date.now`). */
  clock?: () => number;
}

export interface RateAnswer {
  rate: number;
  /** Causal-step graphs whose measured graph at this rate is the one given (exact when `complete`). */
  count: number;
  method: InverseMethod;
  nodes: number;
  ms: number;
  complete: boolean;
  /** Rows of the edges in every solution at this rate, and in at least one. */
  always: number[];
  sometimes: number[];
}

export interface CausalSolution {
  rate: number;
  /** Rows of the causal-step graph (bit j of row i: i → j). */
  directed: number[];
}

export interface InverseAnswer {
  names: readonly string[];
  byRate: RateAnswer[];
  /** Listed solutions, rate by rate (at most `maxSolutions`). */
  solutions: CausalSolution[];
  count: number;
  /** More solutions exist than are listed. */
  truncated: boolean;
  /** Every rate searched to the end. */
  complete: boolean;
  stopped: boolean;
}

/** Why a measured graph cannot be searched, in words, or null. */
export function inverseLimit(h: MeasuredGraph, method?: InverseMethod): string | null {
  const n = h.names.length;
  const m = method ?? (n <= SEARCH_MAX_VARIABLES ? 'search' : 'solver');
  if (m === 'search' && n > SEARCH_MAX_VARIABLES) return `the exact search handles up to ${SEARCH_MAX_VARIABLES} variables; this graph has ${n} (the solver takes up to ${SOLVER_MAX_VARIABLES})`;
  if (n > SOLVER_MAX_VARIABLES) return `the solver handles up to ${SOLVER_MAX_VARIABLES} variables (${SOLVER_MAX_VARIABLES * SOLVER_MAX_VARIABLES} causal edge variables); this graph has ${n}`;
  for (let i = 0; i < n; i++) {
    if (has(h.bidirected[i], i)) return `${h.names[i]} ↔ ${h.names[i]}: a bidirected edge joins two different variables`;
    for (let j = 0; j < n; j++) if (has(h.bidirected[i], j) !== has(h.bidirected[j], i)) return `${h.names[i]} ↔ ${h.names[j]} is listed one way only`;
  }
  return null;
}

class Stop extends Error {}

interface Scratch {
  d: Int32Array; b: Int32Array; p: Int32Array; q: Int32Array;
}
const scratch = (n: number): Scratch => ({ d: new Int32Array(n), b: new Int32Array(n), p: new Int32Array(n), q: new Int32Array(n) });

/**
 * Every causal-step graph whose measured graph at one of `rates` is `h`.
 * @example causalGraphsFor(measured, [2]).count // how many causal graphs give `measured` at u = 2
 */
export function causalGraphsFor(h: MeasuredGraph, rates: readonly number[], options: InverseOptions = {}): InverseAnswer {
  const limit = inverseLimit(h, options.method);
  if (limit) throw new RangeError(limit);
  const n = h.names.length;
  const method: InverseMethod = options.method ?? (n <= SEARCH_MAX_VARIABLES ? 'search' : 'solver');
  const maxSolutions = options.maxSolutions ?? 1000;
  const maxNodes = options.maxNodes ?? 50_000_000;
  const every = options.progressEvery ?? 20_000;
  const clock = options.clock ?? Date.now;
  const HD = Int32Array.from(h.directed), HB = Int32Array.from(h.bidirected);
  const s = scratch(n);
  const solutions: CausalSolution[] = [];
  const byRate: RateAnswer[] = [];
  let stopped = false;
  let truncated = false;

  rates.forEach((u, rateIndex) => {
    if (!Number.isInteger(u) || u < 1) throw new RangeError(`the rate u must be a whole number ≥ 1 (got ${u})`);
    const t0 = clock();
    let nodes = 0, count = 0, covered = 0;
    const always = new Int32Array(n).fill(-1);
    const sometimes = new Int32Array(n);
    let complete = true;
    const Ls = Array.from({ length: n * n + 2 }, () => new Int32Array(n));
    const Us = Array.from({ length: n * n + 2 }, () => new Int32Array(n));
    const full = n === 32 ? -1 : (1 << n) - 1;

    /** 1: L^u ⊆ H, 2: also equal; 0: L^u leaves H. */
    const lowerState = (L: Int32Array): number => {
      measureInto(L, n, u, s.d, s.b, s.p, s.q);
      let eq = 2;
      for (let i = 0; i < n; i++) {
        if ((s.d[i] & ~HD[i]) | (s.b[i] & ~HB[i])) return 0;
        if (s.d[i] !== HD[i] || s.b[i] !== HB[i]) eq = 1;
      }
      return eq;
    };
    const upperState = (U: Int32Array): number => {
      measureInto(U, n, u, s.d, s.b, s.p, s.q);
      let eq = 2;
      for (let i = 0; i < n; i++) {
        if ((HD[i] & ~s.d[i]) | (HB[i] & ~s.b[i])) return 0;
        if (s.d[i] !== HD[i] || s.b[i] !== HB[i]) eq = 1;
      }
      return eq;
    };

    /** Fix open edges that the bounds decide; false on a conflict. */
    const propagate = (L: Int32Array, U: Int32Array): boolean => {
      let changed = true;
      while (changed) {
        changed = false;
        for (let i = 0; i < n; i++) {
          for (let m = U[i] & ~L[i]; m !== 0; m &= m - 1) {
            const e = m & -m;
            if (!(U[i] & e) || L[i] & e) continue;
            L[i] |= e;
            const inBad = lowerState(L) === 0;
            L[i] &= ~e;
            U[i] &= ~e;
            const outBad = upperState(U) === 0;
            U[i] |= e;
            if (inBad && outBad) return false;
            if (inBad) { U[i] &= ~e; changed = true; }
            else if (outBad) { L[i] |= e; changed = true; }
          }
        }
      }
      return true;
    };

    const record = (L: Int32Array, U: Int32Array) => {
      const free: [number, number][] = [];
      for (let i = 0; i < n; i++) for (const j of bitsOf(U[i] & ~L[i])) free.push([i, j]);
      count += 2 ** free.length;
      for (let i = 0; i < n; i++) { always[i] &= L[i]; sometimes[i] |= U[i]; }
      const room = maxSolutions - solutions.length;
      const total = 2 ** free.length;
      if (total > room) truncated = true;
      for (let k = 0; k < Math.min(room, total); k++) {
        const g = Array.from(L, (x) => x >>> 0);
        for (let f = 0; f < free.length; f++) if (Math.floor(k / 2 ** f) % 2 === 1) g[free[f][0]] = (g[free[f][0]] | bit(free[f][1])) >>> 0;
        solutions.push({ rate: u, directed: g });
      }
    };

    /** The open edge to branch on. */
    const choose = (L: Int32Array, U: Int32Array): [number, number] => {
      if (method === 'search') {
        for (let i = 0; i < n; i++) { const m = U[i] & ~L[i]; if (m) return [i, 31 - Math.clz32(m & -m)]; }
      } else {
        // The open edge from the row with the fewest open edges (a "fail first" choice, common practice in constraint solving).
        let best: [number, number] = [-1, -1], bestOpen = Infinity;
        for (let i = 0; i < n; i++) {
          const m = U[i] & ~L[i];
          const c = popcount(m);
          if (c > 0 && c < bestOpen) { bestOpen = c; best = [i, 31 - Math.clz32(m & -m)]; }
        }
        return best;
      }
      return [-1, -1];
    };

    const dfs = (depth: number, weight: number): void => {
      nodes++;
      if ((nodes & 1023) === 0 && options.shouldStop?.()) { stopped = true; throw new Stop(); }
      if (nodes > maxNodes) throw new Stop();
      if (options.onProgress && nodes % every === 0) options.onProgress({ rate: u, rateIndex, rates: rates.length, nodes, fraction: covered, count });
      const L = Ls[depth], U = Us[depth];
      if (method === 'solver' && !propagate(L, U)) { covered += weight; return; }
      const lo = lowerState(L);
      if (lo === 0) { covered += weight; return; }
      const up = upperState(U);
      if (up === 0) { covered += weight; return; }
      if (lo === 2 && up === 2) { record(L, U); covered += weight; return; }
      const [i, j] = choose(L, U);
      const e = bit(j);
      const L2 = Ls[depth + 1], U2 = Us[depth + 1];
      L2.set(L); U2.set(U); U2[i] &= ~e;
      dfs(depth + 1, weight / 2);
      L2.set(L); U2.set(U); L2[i] |= e;
      dfs(depth + 1, weight / 2);
    };

    Ls[0].fill(0);
    Us[0].fill(full);
    try {
      dfs(0, 1);
    } catch (e) {
      if (!(e instanceof Stop)) throw e;
      complete = false;
    }
    if (count === 0) always.fill(0);
    byRate.push({ rate: u, count, method, nodes, ms: clock() - t0, complete, always: Array.from(always, (x) => x >>> 0), sometimes: Array.from(sometimes, (x) => x >>> 0) });
    options.onProgress?.({ rate: u, rateIndex, rates: rates.length, nodes, fraction: complete ? 1 : covered, count });
  });
  const count = byRate.reduce((a, r) => a + r.count, 0);
  return { names: h.names, byRate, solutions, count, truncated: truncated || solutions.length < count, complete: byRate.every((r) => r.complete), stopped };
}

/** A measured graph that some causal graph gives, near the one asked about. */
export interface NearGraph {
  /** The first rate that gives it. */
  rate: number;
  /** Every rate searched that gives it. */
  rates: number[];
  /** Edges changed: directed edges plus bidirected pairs added or removed. */
  distance: number;
  measured: MeasuredGraph;
  /** One causal-step graph that gives it. */
  example: number[];
  added: { directed: [number, number][]; bidirected: [number, number][] };
  removed: { directed: [number, number][]; bidirected: [number, number][] };
}

export interface NearestAnswer {
  distance: number;
  graphs: NearGraph[];
  /** The search ran to the end: no consistent graph is nearer. */
  complete: boolean;
  nodes: number;
  ms: number;
}

const pairCount = (rows: ArrayLike<number>): number => {
  let c = 0;
  for (let i = 0; i < rows.length; i++) c += popcount(rows[i]);
  return c;
};

/**
 * The measured graphs nearest to `h` (fewest edges added or removed) that some
 * causal-step graph gives at one of `rates`: branch and bound over the causal
 * edges, bounding the distance below by the edges L^u already has that h
 * lacks plus those of h that U^u cannot reach.
 */
export function nearestMeasuredGraphs(h: MeasuredGraph, rates: readonly number[], options: { maxResults?: number; maxNodes?: number; shouldStop?: () => boolean; clock?: () => number } = {}): NearestAnswer {
  const limit = inverseLimit(h, 'solver');
  if (limit) throw new RangeError(limit);
  const n = h.names.length;
  const maxResults = options.maxResults ?? 5;
  const maxNodes = options.maxNodes ?? 5_000_000;
  const clock = options.clock ?? Date.now;
  const t0 = clock();
  const HD = Int32Array.from(h.directed), HB = Int32Array.from(h.bidirected);
  const s = scratch(n);
  const lo = { d: new Int32Array(n), b: new Int32Array(n) };
  let best = pairCount(HD) + pairCount(HB) / 2 + 1;
  const found = new Map<string, NearGraph>();
  let nodes = 0;
  let complete = true;
  const full = (1 << n) - 1;

  const diff = (d: Int32Array, b: Int32Array) => {
    const added = { directed: [] as [number, number][], bidirected: [] as [number, number][] };
    const removed = { directed: [] as [number, number][], bidirected: [] as [number, number][] };
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        if (has(d[i], j) && !has(HD[i], j)) added.directed.push([i, j]);
        if (!has(d[i], j) && has(HD[i], j)) removed.directed.push([i, j]);
        if (j > i && has(b[i], j) && !has(HB[i], j)) added.bidirected.push([i, j]);
        if (j > i && !has(b[i], j) && has(HB[i], j)) removed.bidirected.push([i, j]);
      }
    return { added, removed };
  };

  for (const u of rates) {
    const Ls = Array.from({ length: n * n + 2 }, () => new Int32Array(n));
    const Us = Array.from({ length: n * n + 2 }, () => new Int32Array(n));
    const dfs = (depth: number): void => {
      nodes++;
      if ((nodes & 1023) === 0 && options.shouldStop?.()) throw new Stop();
      if (nodes > maxNodes) throw new Stop();
      const L = Ls[depth], U = Us[depth];
      measureInto(L, n, u, lo.d, lo.b, s.p, s.q);
      measureInto(U, n, u, s.d, s.b, s.p, s.q);
      let bound = 0, same = true;
      for (let i = 0; i < n; i++) {
        bound += popcount(lo.d[i] & ~HD[i]) + popcount(HD[i] & ~s.d[i]) + (popcount(lo.b[i] & ~HB[i]) + popcount(HB[i] & ~s.b[i])) / 2;
        if (lo.d[i] !== s.d[i] || lo.b[i] !== s.b[i]) same = false;
      }
      if (bound > best) return;
      if (same) {
        // every completion gives the same measured graph: the bound is its distance
        if (bound < best) { best = bound; found.clear(); }
        const key = `${Array.from(lo.d).join(',')}|${Array.from(lo.b).join(',')}`;
        const seen = found.get(key);
        if (seen) { if (!seen.rates.includes(u)) seen.rates.push(u); }
        else if (found.size < maxResults) {
          const { added, removed } = diff(lo.d, lo.b);
          found.set(key, {
            rate: u, rates: [u], distance: bound, example: Array.from(L, (x) => x >>> 0), added, removed,
            measured: { names: h.names, directed: Array.from(lo.d, (x) => x >>> 0), bidirected: Array.from(lo.b, (x) => x >>> 0) },
          });
        }
        return;
      }
      let i = 0;
      while (i < n && (U[i] & ~L[i]) === 0) i++;
      const m = U[i] & ~L[i];
      const e = m & -m;
      const L2 = Ls[depth + 1], U2 = Us[depth + 1];
      L2.set(L); U2.set(U); U2[i] &= ~e;
      dfs(depth + 1);
      L2.set(L); U2.set(U); L2[i] |= e;
      dfs(depth + 1);
    };
    Ls[0].fill(0);
    Us[0].fill(full);
    try {
      dfs(0);
    } catch (e) {
      if (!(e instanceof Stop)) throw e;
      complete = false;
      break;
    }
  }
  const graphs = [...found.values()].filter((g) => g.distance === best).sort((a, b) => a.rate - b.rate);
  return { distance: best, graphs, complete, nodes, ms: clock() - t0 };
}
