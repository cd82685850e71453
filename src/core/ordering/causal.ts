/**
 * Causal ordering of an abstract equation system (Simon, "Causal ordering and
 * identifiability", 1953), computed the matching way (Nayak 1995; Blom, van
 * Diepen & Mooij, JMLR 22, 2021, Algorithm 1): maximum matching → coarse
 * Dulmage–Mendelsohn parts → orientation of the well-determined part by the
 * matching → strongly connected components = Simon's minimal complete
 * subsets → levels. Everything is defined without reference to the matching
 * found, and the output is sorted, so it is the same for every maximum
 * matching and every order of the input.
 *
 * Two layers: `orderIndexed` works on integer arrays only (the hot path),
 * `causalOrder` maps string ids to ranks in id order and back.
 */
import type { EquationId, VariableId } from '../model/types';
import type { Determination, OrderingBlock, OrderingEdge } from './types';
import type { EquationSystem } from './structure';
import { hopcroftKarp, type BipartiteGraph, type Matching } from './matching';
import { dulmageMendelsohn, PART_OVER as OVER, PART_UNDER as UNDER, PART_WELL as WELL, transpose } from './dm';
import { stronglyConnected } from './scc';

export interface CausalOrderOptions {
  /** Replace Hopcroft–Karp by another maximum matcher (tests use this to show independence of the matching). */
  matcher?: (g: BipartiteGraph) => Matching;
}

/** Input of the integer layer: row r involves columns colIdx[rowPtr[r] .. rowPtr[r+1]), sorted, without repeats. */
export interface IndexedSystem {
  rows: number;
  cols: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  /** 1 for exogenous columns. */
  exogenous: Uint8Array;
}

export const DET_WELL = 0;
export const DET_OVER = 1;
export const DET_UNDER = 2;

/** Output of the integer layer. Blocks are numbered in causal order: (level, smallest column). */
export interface IndexedOrder {
  blockCount: number;
  blockOfCol: Int32Array;
  /** Block of each row (every row belongs to exactly one block). */
  blockOfRow: Int32Array;
  level: Int32Array;
  /** DET_* of each block. */
  determination: Uint8Array;
  /** Columns of block b: blockCols[blockColPtr[b] .. blockColPtr[b+1]), increasing. */
  blockColPtr: Int32Array;
  blockCols: Int32Array;
  blockRowPtr: Int32Array;
  blockRows: Int32Array;
  /** Edges sorted by (to, from); each carried by its smallest row. */
  edgeCount: number;
  edgeFrom: Int32Array;
  edgeTo: Int32Array;
  edgeRow: Int32Array;
  /** 1 when both ends are in one block. */
  edgeSimultaneous: Uint8Array;
  matching: Matching;
}

export interface CausalOrder {
  /** Blocks in causal order: by level, then by smallest id. Exogenous variables are level-0 blocks without equations. */
  blocks: OrderingBlock[];
  /** Instantaneous edges, sorted by (to, from). */
  edges: OrderingEdge[];
  /** One maximum matching: equation → the unknown paired with it (built on first access). */
  readonly matching: Record<EquationId, VariableId>;
  /** Size of the maximum matching. */
  matchingSize: number;
  /** The index in `blocks` of every variable (built on first access). */
  readonly blockOf: Record<VariableId, number>;
}

/** Union–find root with path halving. */
function find(parent: Int32Array, a: number): number {
  while (parent[a] !== a) {
    parent[a] = parent[parent[a]];
    a = parent[a];
  }
  return a;
}

/** Stable counting sort of `items` by key[item] ∈ [0, range). */
function countingSort(items: Int32Array, key: Int32Array, range: number): Int32Array {
  const count = new Int32Array(range + 1);
  for (let i = 0; i < items.length; i++) count[key[items[i]] + 1]++;
  for (let k = 0; k < range; k++) count[k + 1] += count[k];
  const out = new Int32Array(items.length);
  for (let i = 0; i < items.length; i++) out[count[key[items[i]]]++] = items[i];
  return out;
}

/** Rows grouped by their block (CSR: rows of block b are items[ptr[b] .. ptr[b+1]), in row order). */
function rowsByBlock(blockOfRow: Int32Array, nb: number): { ptr: Int32Array; items: Int32Array } {
  const ne = blockOfRow.length;
  const ptr = new Int32Array(nb + 1);
  for (let r = 0; r < ne; r++) ptr[blockOfRow[r] + 1]++;
  for (let b = 0; b < nb; b++) ptr[b + 1] += ptr[b];
  const items = new Int32Array(ne);
  const fill = ptr.slice(0, nb);
  for (let r = 0; r < ne; r++) items[fill[blockOfRow[r]]++] = r;
  return { ptr, items };
}

/**
 * The integer layer. Blocks of equal level are ordered by their smallest
 * column; a block without columns (equations that only constrain exogenous
 * variables) by `constraintKey(row)` of its smallest row — default cols + row,
 * after every column; callers with string ids pass a key that interleaves
 * such blocks by id. Example: rows [[0], [0, 1]] over 2 columns give blocks
 * {0}/[0] at level 0 and {1}/[1] at level 1.
 */
export function orderIndexed(sys: IndexedSystem, options: CausalOrderOptions & { constraintKey?: (row: number) => number } = {}): IndexedOrder {
  const { rows: ne, cols: nv, rowPtr, colIdx, exogenous: isExo } = sys;
  // Local copies: imported bindings can be slow accessors in hot loops under some module loaders.
  const PART_OVER = OVER;
  const PART_UNDER = UNDER;
  const PART_WELL = WELL;
  // The bipartite graph of unknowns: exogenous columns left out.
  const uPtr = new Int32Array(ne + 1);
  for (let r = 0; r < ne; r++) {
    let u = 0;
    for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) if (!isExo[colIdx[k]]) u++;
    uPtr[r + 1] = uPtr[r] + u;
  }
  let uIdx = colIdx;
  if (uPtr[ne] !== rowPtr[ne]) {
    uIdx = new Int32Array(uPtr[ne]);
    for (let r = 0, p = 0; r < ne; r++) for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) if (!isExo[colIdx[k]]) uIdx[p++] = colIdx[k];
  }
  const g: BipartiteGraph = { rows: ne, cols: nv, rowPtr: uPtr, colIdx: uIdx };
  const t = transpose(g);
  const m = options.matcher ? options.matcher(g) : hopcroftKarp(g, t);
  const active = new Uint8Array(nv);
  for (let c = 0; c < nv; c++) active[c] = isExo[c] ? 0 : 1;
  const { rowPart, colPart } = dulmageMendelsohn(g, m, t, active);

  // Provisional blocks (numbered in a topological order), as column and row owners.
  const blockOfCol = new Int32Array(nv).fill(-1);
  const blockOfRow = new Int32Array(ne).fill(-1);
  const det: number[] = [];
  let nb = 0;
  for (let c = 0; c < nv; c++) if (isExo[c]) { blockOfCol[c] = nb++; det.push(DET_WELL); }

  const components = (part: number, d: number): void => {
    let any = false;
    for (let r = 0; r < ne && !any; r++) if (rowPart[r] === part) any = true;
    for (let c = 0; c < nv && !any; c++) if (active[c] && colPart[c] === part) any = true;
    if (!any) return;
    const parent = new Int32Array(ne + nv);
    for (let i = 0; i < parent.length; i++) parent[i] = i;
    for (let r = 0; r < ne; r++) {
      if (rowPart[r] !== part) continue;
      for (let k = uPtr[r]; k < uPtr[r + 1]; k++) {
        const c = uIdx[k];
        if (colPart[c] !== part) continue;
        const a = find(parent, r);
        const b = find(parent, ne + c);
        if (a !== b) parent[a] = b;
      }
    }
    const blockOfRoot = new Map<number, number>();
    const take = (node: number): number => {
      const root = find(parent, node);
      let b = blockOfRoot.get(root);
      if (b === undefined) { blockOfRoot.set(root, (b = nb++)); det.push(d); }
      return b;
    };
    for (let c = 0; c < nv; c++) if (active[c] && colPart[c] === part) blockOfCol[c] = take(ne + c);
    for (let r = 0; r < ne; r++) if (rowPart[r] === part) blockOfRow[r] = take(r);
  };
  components(PART_OVER, DET_OVER);

  // Well-determined part: u → mate(e) for each well row e containing u (u ≠ mate(e)); SCCs.
  const wellPtr = new Int32Array(nv + 1);
  for (let u = 0; u < nv; u++) {
    let d = 0;
    if (active[u] && colPart[u] === PART_WELL)
      for (let k = t.colPtr[u]; k < t.colPtr[u + 1]; k++) {
        const r = t.rowIdx[k];
        if (rowPart[r] === PART_WELL && m.rowMate[r] !== u) d++;
      }
    wellPtr[u + 1] = wellPtr[u] + d;
  }
  const wellAdj = new Int32Array(wellPtr[nv]);
  const wellActive = new Uint8Array(nv);
  for (let u = 0, p = 0; u < nv; u++) {
    if (!(active[u] && colPart[u] === PART_WELL)) continue;
    wellActive[u] = 1;
    for (let k = t.colPtr[u]; k < t.colPtr[u + 1]; k++) {
      const r = t.rowIdx[k];
      if (rowPart[r] === PART_WELL && m.rowMate[r] !== u) wellAdj[p++] = m.rowMate[r];
    }
  }
  const scc = stronglyConnected(nv, wellPtr, wellAdj, wellActive);
  // Tarjan completes sinks first: component count-1 … 0 is a causal order.
  const base = nb;
  for (let c = 0; c < nv; c++) if (scc.comp[c] >= 0) blockOfCol[c] = base + scc.count - 1 - scc.comp[c];
  for (let s = 0; s < scc.count; s++) det.push(DET_WELL);
  nb += scc.count;
  for (let r = 0; r < ne; r++) if (rowPart[r] === PART_WELL) blockOfRow[r] = blockOfCol[m.rowMate[r]];
  components(PART_UNDER, DET_UNDER);

  // Levels, in provisional order (exogenous, over, well in causal order, under), which is topological.
  const { ptr: rowsOfBlockPtr, items: rowsOfBlock } = rowsByBlock(blockOfRow, nb);
  const lv = new Int32Array(nb);
  for (let b = 0; b < nb; b++) {
    let l = 0;
    for (let i = rowsOfBlockPtr[b]; i < rowsOfBlockPtr[b + 1]; i++) {
      const r = rowsOfBlock[i];
      for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
        const p = blockOfCol[colIdx[k]];
        if (p !== b && lv[p] + 1 > l) l = lv[p] + 1;
      }
    }
    lv[b] = l;
  }

  // Final numbering: by level, then by key (smallest column; constraint blocks by constraintKey).
  const minKey = new Float64Array(nb).fill(Infinity);
  for (let c = nv - 1; c >= 0; c--) if (blockOfCol[c] >= 0) minKey[blockOfCol[c]] = c;
  for (let r = 0; r < ne; r++) {
    const b = blockOfRow[r];
    if (minKey[b] === Infinity || minKey[b] >= nv) {
      const k = options.constraintKey ? options.constraintKey(r) : nv + r;
      if (!(minKey[b] < k)) minKey[b] = k;
    }
  }
  // Keys are columns (integers) or, for blocks without columns, a half-integer or nv + row: rank them, then
  // stable counting sorts by key and by level.
  const keyRank = new Int32Array(nb);
  {
    const all = Float64Array.from(minKey).sort();
    for (let b = 0; b < nb; b++) {
      let lo = 0;
      let hi = nb;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (all[mid] < minKey[b]) lo = mid + 1;
        else hi = mid;
      }
      keyRank[b] = lo;
    }
  }
  let maxLevel = 0;
  for (let b = 0; b < nb; b++) if (lv[b] > maxLevel) maxLevel = lv[b];
  let order: Int32Array = new Int32Array(nb);
  for (let b = 0; b < nb; b++) order[b] = b;
  order = countingSort(order, keyRank, nb);
  order = countingSort(order, lv, maxLevel + 1);
  const renum = new Int32Array(nb);
  for (let i = 0; i < nb; i++) renum[order[i]] = i;
  const level = new Int32Array(nb);
  const determination = new Uint8Array(nb);
  for (let b = 0; b < nb; b++) { level[renum[b]] = lv[b]; determination[renum[b]] = det[b]; }
  for (let c = 0; c < nv; c++) if (blockOfCol[c] >= 0) blockOfCol[c] = renum[blockOfCol[c]];
  for (let r = 0; r < ne; r++) blockOfRow[r] = renum[blockOfRow[r]];
  const blockColPtr = new Int32Array(nb + 1);
  for (let c = 0; c < nv; c++) if (blockOfCol[c] >= 0) blockColPtr[blockOfCol[c] + 1]++;
  for (let b = 0; b < nb; b++) blockColPtr[b + 1] += blockColPtr[b];
  const blockCols = new Int32Array(blockColPtr[nb]);
  {
    const fill = blockColPtr.slice(0, nb);
    for (let c = 0; c < nv; c++) if (blockOfCol[c] >= 0) blockCols[fill[blockOfCol[c]]++] = c;
  }
  // again after the renumbering into the final causal order
  const { ptr: blockRowPtr, items: blockRows } = rowsByBlock(blockOfRow, nb);

  // Edges (matching-independent): for row e in block B, u in e outside B → every v in e ∩ B;
  // u, v both in e ∩ B → one simultaneous edge per pair (u < v). Generated in row order, then
  // stably sorted by from and by to, so the first of each (to, from) run has the smallest row.
  // One walk over the edges, run twice: to count them per `to`, then to place them.
  const walkEdges = (emit: (u: number, v: number, r: number) => void) => {
    for (let r = 0; r < ne; r++) {
      const b = blockOfRow[r];
      const k0 = rowPtr[r];
      const k1 = rowPtr[r + 1];
      for (let i = k0; i < k1; i++) {
        const v = colIdx[i];
        if (blockOfCol[v] !== b) continue;
        for (let j = k0; j < k1; j++) {
          const u = colIdx[j];
          if (u !== v && !(blockOfCol[u] === b && u > v)) emit(u, v, r);
        }
      }
    }
  };
  // Bucket by `to` (counting sort); rows are visited in increasing order, so each bucket is
  // already sorted by row; a short insertion sort by `from` (stable) finishes it.
  const toPtr = new Int32Array(nv + 1);
  walkEdges((_u, v) => { toPtr[v + 1]++; });
  for (let c = 0; c < nv; c++) toPtr[c + 1] += toPtr[c];
  const n = toPtr[nv];
  const eFrom = new Int32Array(n);
  const eRow = new Int32Array(n);
  {
    const fill = toPtr.slice(0, nv);
    walkEdges((u, v, r) => {
      const at = fill[v]++;
      eFrom[at] = u;
      eRow[at] = r;
    });
  }
  let w = 0;
  const oFrom = new Int32Array(n);
  const oTo = new Int32Array(n);
  const oRow = new Int32Array(n);
  const oSim = new Uint8Array(n);
  for (let v = 0; v < nv; v++) {
    const lo = toPtr[v];
    const hi = toPtr[v + 1];
    if (hi - lo > 32) {
      // A hub: sort packed (from, row) keys instead (exact below 2^53).
      const keys = new Float64Array(hi - lo);
      for (let i = lo; i < hi; i++) keys[i - lo] = eFrom[i] * ne + eRow[i];
      keys.sort();
      for (let i = lo; i < hi; i++) {
        const rr = keys[i - lo] % ne;
        eRow[i] = rr;
        eFrom[i] = (keys[i - lo] - rr) / ne;
      }
    } else for (let i = lo + 1; i < hi; i++) {
      const f = eFrom[i];
      const rr = eRow[i];
      let j = i - 1;
      while (j >= lo && eFrom[j] > f) {
        eFrom[j + 1] = eFrom[j];
        eRow[j + 1] = eRow[j];
        j--;
      }
      eFrom[j + 1] = f;
      eRow[j + 1] = rr;
    }
    for (let i = lo; i < hi; i++) {
      if (i > lo && eFrom[i] === eFrom[i - 1]) continue; // same (to, from): the first has the smallest row
      oFrom[w] = eFrom[i];
      oTo[w] = v;
      oRow[w] = eRow[i];
      oSim[w] = blockOfCol[eFrom[i]] === blockOfCol[v] ? 1 : 0;
      w++;
    }
  }
  return {
    blockCount: nb,
    blockOfCol,
    blockOfRow,
    level,
    determination,
    blockColPtr,
    blockCols,
    blockRowPtr,
    blockRows,
    edgeCount: w,
    edgeFrom: oFrom.subarray(0, w),
    edgeTo: oTo.subarray(0, w),
    edgeRow: oRow.subarray(0, w),
    edgeSimultaneous: oSim.subarray(0, w),
    matching: m,
  };
}

const DETERMINATION: Determination[] = ['well', 'over', 'under'];

/** Smallest index i with ids[i] >= key (ids sorted by compareIds). */
function lowerBound(ids: string[], key: string): number {
  let lo = 0;
  let hi = ids.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (ids[mid] < key) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Causal order of an equation system.
 * Example: `causalOrder({ equations: [{ id: 'f1', variables: ['x1'] }, { id: 'f2', variables: ['x1', 'x2'] }] })`
 * gives blocks {x1}/[f1] at level 0 and {x2}/[f2] at level 1, with edge x1 → x2 carried by f2.
 */
export function causalOrder(system: EquationSystem, options: CausalOrderOptions = {}): CausalOrder {
  // Rank equations and variables in id order; all later work is on the ranks.
  const ne = system.equations.length;
  const cmp = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
  const byRank = [...system.equations].sort(cmp);
  const eqIds: string[] = new Array(ne);
  for (let i = 0; i < ne; i++) eqIds[i] = byRank[i].id;
  for (let i = 1; i < ne; i++) if (eqIds[i] === eqIds[i - 1]) throw new Error(`equation id "${eqIds[i]}" is used twice`);
  // Variables: number them in order of first mention, then rank the numbers by id.
  const firstSeen = new Map<string, number>();
  const seen: { id: string; first: number }[] = [];
  const mention = (v: string): number => {
    let i = firstSeen.get(v);
    if (i === undefined) {
      i = seen.length;
      firstSeen.set(v, i);
      seen.push({ id: v, first: i });
    }
    return i;
  };
  const exoList = system.exogenous ?? [];
  const exoFirst = exoList.map(mention);
  let total = 0;
  for (let r = 0; r < ne; r++) total += byRank[r].variables.length;
  const raw = new Int32Array(total);
  for (let r = 0, p = 0; r < ne; r++) for (const v of byRank[r].variables) raw[p++] = mention(v);
  for (const v of system.variables ?? []) mention(v);
  seen.sort(cmp);
  const nv = seen.length;
  const varIds: string[] = new Array(nv);
  const rankOf = new Int32Array(nv);
  for (let i = 0; i < nv; i++) {
    varIds[i] = seen[i].id;
    rankOf[seen[i].first] = i;
  }
  const exogenous = new Uint8Array(nv);
  for (const f of exoFirst) exogenous[rankOf[f]] = 1;
  const rowPtr = new Int32Array(ne + 1);
  const colIdx = new Int32Array(total);
  let p = 0;
  for (let r = 0, q = 0; r < ne; r++) {
    const start = p;
    for (let n = byRank[r].variables.length; n > 0; n--) {
      const c = rankOf[raw[q++]];
      // insertion into the sorted segment, skipping repeats (rows are short)
      let j = p - 1;
      while (j >= start && colIdx[j] > c) j--;
      if (j >= start && colIdx[j] === c) continue;
      for (let k = p; k > j + 1; k--) colIdx[k] = colIdx[k - 1];
      colIdx[j + 1] = c;
      p++;
    }
    rowPtr[r + 1] = p;
  }
  const o = orderIndexed(
    { rows: ne, cols: nv, rowPtr, colIdx: colIdx.subarray(0, p), exogenous },
    { ...options, constraintKey: (r) => lowerBound(varIds, eqIds[r]) - 0.5 },
  );
  const blocks: OrderingBlock[] = new Array(o.blockCount);
  for (let b = 0; b < o.blockCount; b++) {
    const vs: string[] = new Array(o.blockColPtr[b + 1] - o.blockColPtr[b]);
    for (let i = o.blockColPtr[b], j = 0; i < o.blockColPtr[b + 1]; i++, j++) vs[j] = varIds[o.blockCols[i]];
    const es: string[] = new Array(o.blockRowPtr[b + 1] - o.blockRowPtr[b]);
    for (let i = o.blockRowPtr[b], j = 0; i < o.blockRowPtr[b + 1]; i++, j++) es[j] = eqIds[o.blockRows[i]];
    blocks[b] = { variables: vs, equations: es, level: o.level[b], determination: DETERMINATION[o.determination[b]] };
  }
  const edges: OrderingEdge[] = new Array(o.edgeCount);
  for (let i = 0; i < o.edgeCount; i++) {
    const e: OrderingEdge = { from: varIds[o.edgeFrom[i]], to: varIds[o.edgeTo[i]], kind: 'instantaneous', equation: eqIds[o.edgeRow[i]] };
    if (o.edgeSimultaneous[i]) e.simultaneous = true;
    edges[i] = e;
  }
  let matching: Record<EquationId, VariableId> | null = null;
  let blockOf: Record<VariableId, number> | null = null;
  return {
    blocks,
    edges,
    matchingSize: o.matching.size,
    get matching() {
      if (!matching) {
        matching = {};
        for (let r = 0; r < ne; r++) if (o.matching.rowMate[r] >= 0) matching[eqIds[r]] = varIds[o.matching.rowMate[r]];
      }
      return matching;
    },
    get blockOf() {
      if (!blockOf) {
        blockOf = {};
        for (let c = 0; c < nv; c++) if (o.blockOfCol[c] >= 0) blockOf[varIds[c]] = o.blockOfCol[c];
      }
      return blockOf;
    },
  };
}

