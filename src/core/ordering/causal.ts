/**
 * Causal ordering of an abstract equation system (Simon, "Causal ordering and
 * identifiability", 1953), computed the matching way (Nayak 1995; Blom, van
 * Diepen & Mooij, JMLR 22, 2021, Algorithm 1): maximum matching → coarse
 * Dulmage–Mendelsohn parts → orientation of the well-determined part by the
 * matching → strongly connected components = Simon's minimal complete
 * subsets → levels. Everything below is defined without reference to the
 * matching found, and the output is sorted, so it is the same for every
 * maximum matching and every order of the input.
 */
import type { EquationId, VariableId } from '../model/types';
import type { Determination, OrderingBlock, OrderingEdge } from './types';
import { compareIds, type EquationSystem } from './structure';
import { bipartiteFromLists, hopcroftKarp, type BipartiteGraph, type Matching } from './matching';
import { dulmageMendelsohn, PART_OVER, PART_UNDER, PART_WELL, transpose } from './dm';
import { stronglyConnected } from './scc';

export interface CausalOrderOptions {
  /** Replace Hopcroft–Karp by another maximum matcher (tests use this to show independence of the matching). */
  matcher?: (g: BipartiteGraph) => Matching;
}

export interface CausalOrder {
  /** Blocks in causal order: by level, then by smallest id. Exogenous variables are level-0 blocks without equations. */
  blocks: OrderingBlock[];
  /** Instantaneous edges, sorted by (to, from). */
  edges: OrderingEdge[];
  /** One maximum matching, equation → the unknown it is paired with (well- and over-determined parts only complete). */
  matching: Record<EquationId, VariableId>;
  /** Size of the maximum matching. */
  matchingSize: number;
  /** The block index of every variable. */
  blockOf: Record<VariableId, number>;
}

class Ids {
  readonly ids: string[];
  readonly index = new Map<string, number>();
  constructor(set: Iterable<string>) {
    this.ids = [...set].sort(compareIds);
    this.ids.forEach((id, i) => this.index.set(id, i));
  }
}

/** Union–find with path halving, for connected components of the over- and under-determined parts. */
function find(parent: Int32Array, a: number): number {
  while (parent[a] !== a) {
    parent[a] = parent[parent[a]];
    a = parent[a];
  }
  return a;
}

/**
 * Causal order of an equation system.
 * Example: `causalOrder({ equations: [{ id: 'f1', variables: ['x1'] }, { id: 'f2', variables: ['x1', 'x2'] }] })`
 * gives blocks {x1}/[f1] at level 0 and {x2}/[f2] at level 1, with edge x1 → x2 carried by f2.
 */
export function causalOrder(system: EquationSystem, options: CausalOrderOptions = {}): CausalOrder {
  const eqs = [...system.equations].sort((a, b) => compareIds(a.id, b.id));
  for (let i = 1; i < eqs.length; i++) if (eqs[i].id === eqs[i - 1].id) throw new Error(`equation id "${eqs[i].id}" is used twice`);
  const exoSet = new Set(system.exogenous ?? []);
  const all = new Set<string>(exoSet);
  for (const e of eqs) for (const v of e.variables) all.add(v);
  for (const v of system.variables ?? []) all.add(v);
  const vars = new Ids(all);
  const nv = vars.ids.length;
  const ne = eqs.length;
  const isExo = new Uint8Array(nv);
  for (const v of exoSet) isExo[vars.index.get(v)!] = 1;
  const active = new Uint8Array(nv);
  for (let c = 0; c < nv; c++) active[c] = isExo[c] ? 0 : 1;

  // Each equation's variables as sorted, de-duplicated indices; unknowns only for the graph.
  const eqAll: Int32Array[] = new Array(ne);
  const eqUnknown: Int32Array[] = new Array(ne);
  for (let r = 0; r < ne; r++) {
    const vs = eqs[r].variables;
    const idx = new Int32Array(vs.length);
    for (let i = 0; i < vs.length; i++) idx[i] = vars.index.get(vs[i])!;
    idx.sort();
    let k = 0;
    for (let i = 0; i < idx.length; i++) if (i === 0 || idx[i] !== idx[i - 1]) idx[k++] = idx[i];
    const uniq = idx.subarray(0, k);
    eqAll[r] = uniq;
    let u = 0;
    for (let i = 0; i < k; i++) if (!isExo[uniq[i]]) u++;
    if (u === k) eqUnknown[r] = uniq;
    else {
      const un = new Int32Array(u);
      for (let i = 0, j = 0; i < k; i++) if (!isExo[uniq[i]]) un[j++] = uniq[i];
      eqUnknown[r] = un;
    }
  }
  const g = bipartiteFromLists(nv, eqUnknown);
  const m = (options.matcher ?? hopcroftKarp)(g);
  const t = transpose(g);
  const { rowPart, colPart } = dulmageMendelsohn(g, m, t, active);

  // Blocks, as lists of variable and equation indices.
  const blockOfVar = new Int32Array(nv).fill(-1);
  const blockVars: number[][] = [];
  const blockEqs: number[][] = [];
  const blockDet: Determination[] = [];
  const addBlock = (vs: number[], es: number[], det: Determination): number => {
    const b = blockVars.length;
    blockVars.push(vs);
    blockEqs.push(es);
    blockDet.push(det);
    for (const v of vs) blockOfVar[v] = b;
    return b;
  };
  for (let c = 0; c < nv; c++) if (isExo[c]) addBlock([c], [], 'well');

  // Over- and under-determined parts: one block per connected component.
  const componentsOf = (part: number, det: Determination): void => {
    const parent = new Int32Array(ne + nv);
    for (let i = 0; i < parent.length; i++) parent[i] = i;
    let any = false;
    for (let r = 0; r < ne; r++) {
      if (rowPart[r] !== part) continue;
      any = true;
      for (let k = g.rowPtr[r]; k < g.rowPtr[r + 1]; k++) {
        const c = g.colIdx[k];
        if (colPart[c] !== part) continue;
        const a = find(parent, r);
        const b = find(parent, ne + c);
        if (a !== b) parent[a] = b;
      }
    }
    for (let c = 0; c < nv; c++) if (active[c] && colPart[c] === part) any = true;
    if (!any) return;
    const byRoot = new Map<number, { vs: number[]; es: number[] }>();
    const get = (root: number) => {
      let x = byRoot.get(root);
      if (!x) byRoot.set(root, (x = { vs: [], es: [] }));
      return x;
    };
    for (let r = 0; r < ne; r++) if (rowPart[r] === part) get(find(parent, r)).es.push(r);
    for (let c = 0; c < nv; c++) if (active[c] && colPart[c] === part) get(find(parent, ne + c)).vs.push(c);
    for (const x of byRoot.values()) addBlock(x.vs, x.es, det);
  };
  componentsOf(PART_OVER, 'over');

  // Well-determined part: orient u → mate-variable of each equation containing u, then SCCs.
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
  for (let u = 0, p = 0; u < nv; u++) {
    if (!(active[u] && colPart[u] === PART_WELL)) continue;
    for (let k = t.colPtr[u]; k < t.colPtr[u + 1]; k++) {
      const r = t.rowIdx[k];
      if (rowPart[r] === PART_WELL && m.rowMate[r] !== u) wellAdj[p++] = m.rowMate[r];
    }
  }
  const wellActive = new Uint8Array(nv);
  for (let c = 0; c < nv; c++) wellActive[c] = active[c] && colPart[c] === PART_WELL ? 1 : 0;
  const scc = stronglyConnected(nv, wellPtr, wellAdj, wellActive);
  // Tarjan numbers components sinks first: count-1 … 0 is a causal (topological) order.
  const sccVars: number[][] = Array.from({ length: scc.count }, () => []);
  for (let c = 0; c < nv; c++) if (scc.comp[c] >= 0) sccVars[scc.comp[c]].push(c);
  for (let s = scc.count - 1; s >= 0; s--) {
    const vs = sccVars[s];
    const es = vs.map((v) => m.colMate[v]).sort((a, b) => a - b);
    addBlock(vs, es, 'well');
  }
  componentsOf(PART_UNDER, 'under');

  // Levels, in the order the blocks were made (exogenous, over, well in causal order, under), which is topological.
  const nb = blockVars.length;
  const level = new Int32Array(nb);
  for (let b = 0; b < nb; b++) {
    let lv = 0;
    for (const r of blockEqs[b]) {
      const vs = eqAll[r];
      for (let i = 0; i < vs.length; i++) {
        const p = blockOfVar[vs[i]];
        if (p !== b && level[p] + 1 > lv) lv = level[p] + 1;
      }
    }
    level[b] = lv;
  }

  // Edges (matching-independent): for e in block B, u in e outside B → every v in e ∩ B;
  // u, v both in B and in e → one simultaneous edge per pair. Equations are scanned in id order,
  // so the first equation seen for a pair is the smallest id.
  const edgeFrom: number[] = [];
  const edgeTo: number[] = [];
  const edgeEq: number[] = [];
  const blockOfEq = new Int32Array(ne).fill(-1);
  for (let b = 0; b < nb; b++) for (const r of blockEqs[b]) blockOfEq[r] = b;
  for (let r = 0; r < ne; r++) {
    const b = blockOfEq[r];
    const vs = eqAll[r];
    for (let i = 0; i < vs.length; i++) {
      const v = vs[i];
      if (blockOfVar[v] !== b) continue;
      for (let j = 0; j < vs.length; j++) {
        const u = vs[j];
        if (u === v) continue;
        if (blockOfVar[u] !== b) {
          edgeFrom.push(u);
          edgeTo.push(v);
          edgeEq.push(r);
        } else if (u < v) {
          edgeFrom.push(u);
          edgeTo.push(v);
          edgeEq.push(r);
        }
      }
    }
  }
  const order = sortEdges(edgeFrom, edgeTo, edgeEq, nv, ne);
  const edges: OrderingEdge[] = [];
  let lastFrom = -1;
  let lastTo = -1;
  for (const k of order) {
    const f = edgeFrom[k];
    const to = edgeTo[k];
    if (f === lastFrom && to === lastTo) continue;
    lastFrom = f;
    lastTo = to;
    const e: OrderingEdge = { from: vars.ids[f], to: vars.ids[to], kind: 'instantaneous', equation: eqs[edgeEq[k]].id };
    if (blockOfVar[f] === blockOfVar[to]) e.simultaneous = true;
    edges.push(e);
  }

  // Output blocks sorted by (level, smallest id); ids within blocks are already in rank order.
  const out: { block: OrderingBlock; key: string }[] = new Array(nb);
  for (let b = 0; b < nb; b++) {
    const vs = blockVars[b].sort((x, y) => x - y).map((i) => vars.ids[i]);
    const es = blockEqs[b].sort((x, y) => x - y).map((i) => eqs[i].id);
    out[b] = { block: { variables: vs, equations: es, level: level[b], determination: blockDet[b] }, key: vs[0] ?? es[0] };
  }
  const perm = out.map((_, i) => i).sort((a, b) => level[a] - level[b] || compareIds(out[a].key, out[b].key));
  const blocks = perm.map((i) => out[i].block);
  const blockOf: Record<VariableId, number> = {};
  perm.forEach((old, i) => { for (const v of out[old].block.variables) blockOf[v] = i; });
  const matching: Record<EquationId, VariableId> = {};
  for (let r = 0; r < ne; r++) if (m.rowMate[r] >= 0) matching[eqs[r].id] = vars.ids[m.rowMate[r]];
  return { blocks, edges, matching, matchingSize: m.size, blockOf };
}

/**
 * Edge indices sorted by (to, from, equation) — numerically, since ids were
 * ranked in id order. A packed Float64 key is exact while below 2^53.
 */
function sortEdges(from: number[], to: number[], eq: number[], nv: number, ne: number): number[] {
  const n = from.length;
  if (nv * nv * Math.max(ne, 1) < 2 ** 52) {
    const keys = new Float64Array(n);
    for (let k = 0; k < n; k++) keys[k] = (to[k] * nv + from[k]) * ne + eq[k];
    keys.sort();
    const idx: number[] = new Array(n);
    // Decode back to one representative triple per key: rebuild arrays in sorted order.
    const f2: number[] = new Array(n);
    const t2: number[] = new Array(n);
    const e2: number[] = new Array(n);
    for (let k = 0; k < n; k++) {
      const key = keys[k];
      const e = key % ne;
      const rest = (key - e) / ne;
      const fr = rest % nv;
      f2[k] = fr;
      t2[k] = (rest - fr) / nv;
      e2[k] = e;
      idx[k] = k;
    }
    for (let k = 0; k < n; k++) {
      from[k] = f2[k];
      to[k] = t2[k];
      eq[k] = e2[k];
    }
    return idx;
  }
  const idx = Array.from({ length: n }, (_, k) => k);
  idx.sort((a, b) => to[a] - to[b] || from[a] - from[b] || eq[a] - eq[b]);
  return idx;
}

