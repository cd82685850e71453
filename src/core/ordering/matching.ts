/**
 * Maximum bipartite matching between equations (rows) and unknowns (columns)
 * by Hopcroft–Karp (Hopcroft & Karp, SIAM J. Comput. 2(4), 1973): BFS layers
 * from the free rows, then vertex-disjoint shortest augmenting paths found by
 * DFS. Both phases are iterative over CSR arrays, so deep alternating paths
 * cannot overflow the call stack. O(E·√V).
 */

/** A bipartite graph in compressed sparse row form: row r is adjacent to colIdx[rowPtr[r] .. rowPtr[r+1]). */
export interface BipartiteGraph {
  rows: number;
  cols: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
}

export interface Matching {
  /** The column matched to each row, or -1. */
  rowMate: Int32Array;
  /** The row matched to each column, or -1. */
  colMate: Int32Array;
  size: number;
}

/** Build the CSR graph from adjacency lists (duplicates must already be removed). */
export function bipartiteFromLists(cols: number, lists: ArrayLike<number>[]): BipartiteGraph {
  const rows = lists.length;
  const rowPtr = new Int32Array(rows + 1);
  for (let r = 0; r < rows; r++) rowPtr[r + 1] = rowPtr[r] + lists[r].length;
  const colIdx = new Int32Array(rowPtr[rows]);
  for (let r = 0, k = 0; r < rows; r++) {
    const l = lists[r];
    for (let i = 0; i < l.length; i++) colIdx[k++] = l[i];
  }
  return { rows, cols, rowPtr, colIdx };
}

/** For each column, the rows that contain it (in increasing row order). */
export interface Transposed {
  colPtr: Int32Array;
  rowIdx: Int32Array;
}

/** The transpose of a CSR graph. */
export function transposeGraph(g: BipartiteGraph): Transposed {
  const colPtr = new Int32Array(g.cols + 1);
  for (let k = 0; k < g.colIdx.length; k++) colPtr[g.colIdx[k] + 1]++;
  for (let c = 0; c < g.cols; c++) colPtr[c + 1] += colPtr[c];
  const fill = colPtr.slice(0, g.cols);
  const rowIdx = new Int32Array(g.colIdx.length);
  for (let r = 0; r < g.rows; r++) for (let k = g.rowPtr[r]; k < g.rowPtr[r + 1]; k++) rowIdx[fill[g.colIdx[k]]++] = r;
  return { colPtr, rowIdx };
}

/**
 * Karp–Sipser start (Karp & Sipser, "Maximum matchings in sparse random
 * graphs", FOCS 1981): while some vertex has exactly one free neighbour, the
 * pair is forced (some maximum matching contains it); otherwise match any free
 * row greedily. On sparse systems it leaves only a handful of rows for the
 * augmenting phases. Fills rowMate/colMate, returns the number of pairs.
 */
function karpSipser(g: BipartiteGraph, rowMate: Int32Array, colMate: Int32Array, t?: Transposed): number {
  const { rows, cols, rowPtr, colIdx } = g;
  const { colPtr, rowIdx } = t ?? transposeGraph(g);
  const rowDeg = new Int32Array(rows);
  const colDeg = new Int32Array(cols);
  for (let r = 0; r < rows; r++) rowDeg[r] = rowPtr[r + 1] - rowPtr[r];
  for (let c = 0; c < cols; c++) colDeg[c] = colPtr[c + 1] - colPtr[c];
  // Vertices whose free degree dropped to one: rows as r, columns as ~c.
  const stack = new Int32Array(rows + cols + colIdx.length + 1);
  let sp = 0;
  for (let c = 0; c < cols; c++) if (colDeg[c] === 1) stack[sp++] = ~c;
  for (let r = 0; r < rows; r++) if (rowDeg[r] === 1) stack[sp++] = r;
  let size = 0;
  let scan = 0;
  for (;;) {
    // Pick a pair: a forced one from the stack if any, else the next free row greedily.
    let r = -1;
    let c = -1;
    while (sp > 0 && r < 0) {
      const x = stack[--sp];
      if (x >= 0) {
        if (rowMate[x] >= 0) continue;
        for (let k = rowPtr[x]; k < rowPtr[x + 1]; k++) if (colMate[colIdx[k]] < 0) { r = x; c = colIdx[k]; break; }
      } else {
        const y = ~x;
        if (colMate[y] >= 0) continue;
        for (let k = colPtr[y]; k < colPtr[y + 1]; k++) if (rowMate[rowIdx[k]] < 0) { r = rowIdx[k]; c = y; break; }
      }
    }
    if (r < 0) {
      while (scan < rows && rowMate[scan] >= 0) scan++;
      if (scan >= rows) break;
      const x = scan++;
      for (let k = rowPtr[x]; k < rowPtr[x + 1]; k++) if (colMate[colIdx[k]] < 0) { r = x; c = colIdx[k]; break; }
      if (r < 0) continue;
    }
    rowMate[r] = c;
    colMate[c] = r;
    size++;
    for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
      const c2 = colIdx[k];
      if (colMate[c2] < 0 && --colDeg[c2] === 1) stack[sp++] = ~c2;
    }
    for (let k = colPtr[c]; k < colPtr[c + 1]; k++) {
      const r2 = rowIdx[k];
      if (rowMate[r2] < 0 && --rowDeg[r2] === 1) stack[sp++] = r2;
    }
  }
  return size;
}

/**
 * Hopcroft–Karp maximum matching, started from a Karp–Sipser matching.
 * Each phase layers the rows by BFS from the free rows up to the shortest
 * augmenting length, then augments along vertex-disjoint shortest paths.
 * `transposed` may pass the graph's transpose when the caller has it already.
 * Example: rows 0:{0,1}, 1:{0} → size 2 with rowMate [1, 0].
 */
export function hopcroftKarp(g: BipartiteGraph, transposed?: Transposed): Matching {
  const { rows, cols, rowPtr, colIdx } = g;
  const rowMate = new Int32Array(rows).fill(-1);
  const colMate = new Int32Array(cols).fill(-1);
  let size = karpSipser(g, rowMate, colMate, transposed);
  const INF = 0x7fffffff;
  const dist = new Int32Array(rows).fill(INF);
  const queue = new Int32Array(rows);
  const it = new Int32Array(rows);
  const stack = new Int32Array(rows);
  const free = new Int32Array(rows);
  let nFree = 0;
  for (let r = 0; r < rows; r++) if (rowMate[r] < 0) free[nFree++] = r;
  while (nFree > 0) {
    // BFS from the free rows; `limit` is the length of the shortest augmenting path.
    let qh = 0;
    let qt = 0;
    for (let i = 0; i < nFree; i++) {
      dist[free[i]] = 0;
      queue[qt++] = free[i];
    }
    let limit = INF;
    while (qh < qt) {
      const r = queue[qh++];
      const d = dist[r];
      if (d >= limit) break;
      for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
        const r2 = colMate[colIdx[k]];
        if (r2 < 0) {
          if (limit === INF) limit = d + 1;
        } else if (dist[r2] === INF) {
          dist[r2] = d + 1;
          queue[qt++] = r2;
        }
      }
    }
    const touched = qt; // queue[0 .. touched) holds every row whose dist was set
    if (limit === INF) {
      for (let i = 0; i < touched; i++) dist[queue[i]] = INF;
      break;
    }
    for (let i = 0; i < touched; i++) it[queue[i]] = rowPtr[queue[i]];
    // DFS along the layers from each free row.
    let stillFree = 0;
    for (let i = 0; i < nFree; i++) {
      const s = free[i];
      let top = 0;
      stack[0] = s;
      let augmented = false;
      while (top >= 0) {
        const r = stack[top];
        if (it[r] === rowPtr[r + 1]) {
          dist[r] = INF; // dead end for this phase
          top--;
          continue;
        }
        const c = colIdx[it[r]];
        const r2 = colMate[c];
        if (r2 < 0) {
          if (dist[r] + 1 !== limit) {
            it[r]++;
            continue;
          }
          // Augment: each row on the stack takes the column its pointer shows.
          for (let j = top; j >= 0; j--) {
            const row = stack[j];
            const col = colIdx[it[row]];
            rowMate[row] = col;
            colMate[col] = row;
          }
          for (let j = 0; j <= top; j++) dist[stack[j]] = INF; // vertex-disjoint paths within a phase
          size++;
          augmented = true;
          break;
        }
        if (dist[r2] === dist[r] + 1 && dist[r2] < limit) stack[++top] = r2;
        else it[r]++;
      }
      if (!augmented) free[stillFree++] = s;
    }
    for (let i = 0; i < touched; i++) dist[queue[i]] = INF;
    nFree = stillFree;
  }
  return { rowMate, colMate, size };
}
