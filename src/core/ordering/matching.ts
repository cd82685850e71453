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

/**
 * Hopcroft–Karp maximum matching.
 * Example: rows 0:{0,1}, 1:{0} → size 2 with rowMate [1, 0].
 */
export function hopcroftKarp(g: BipartiteGraph): Matching {
  const { rows, cols, rowPtr, colIdx } = g;
  const rowMate = new Int32Array(rows).fill(-1);
  const colMate = new Int32Array(cols).fill(-1);
  let size = 0;
  // Greedy start: usually matches most rows of a sparse system at once.
  for (let r = 0; r < rows; r++) {
    for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
      const c = colIdx[k];
      if (colMate[c] < 0) {
        colMate[c] = r;
        rowMate[r] = c;
        size++;
        break;
      }
    }
  }
  const INF = 0x7fffffff;
  const dist = new Int32Array(rows);
  const queue = new Int32Array(rows);
  const it = new Int32Array(rows);
  const stack = new Int32Array(rows);
  for (;;) {
    // BFS: layer the rows by the length of the shortest alternating path from a free row.
    let qh = 0;
    let qt = 0;
    for (let r = 0; r < rows; r++) {
      if (rowMate[r] < 0) {
        dist[r] = 0;
        queue[qt++] = r;
      } else dist[r] = INF;
    }
    let found = false;
    while (qh < qt) {
      const r = queue[qh++];
      const d = dist[r] + 1;
      for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
        const r2 = colMate[colIdx[k]];
        if (r2 < 0) found = true;
        else if (dist[r2] === INF) {
          dist[r2] = d;
          queue[qt++] = r2;
        }
      }
    }
    if (!found) break;
    // DFS along the layers, one augmenting path per free row at most.
    for (let r = 0; r < rows; r++) it[r] = rowPtr[r];
    for (let s = 0; s < rows; s++) {
      if (rowMate[s] >= 0) continue;
      let top = 0;
      stack[0] = s;
      while (top >= 0) {
        const r = stack[top];
        if (it[r] === rowPtr[r + 1]) {
          dist[r] = INF; // dead end: never try this row again in this phase
          top--;
          continue;
        }
        const c = colIdx[it[r]];
        const r2 = colMate[c];
        if (r2 < 0) {
          // Augment: every row on the stack takes the column its pointer shows.
          for (let i = top; i >= 0; i--) {
            const row = stack[i];
            const col = colIdx[it[row]];
            rowMate[row] = col;
            colMate[col] = row;
          }
          size++;
          for (let i = 0; i <= top; i++) it[stack[i]]++;
          break;
        }
        if (dist[r2] === dist[r] + 1) stack[++top] = r2;
        else it[r]++;
      }
    }
  }
  return { rowMate, colMate, size };
}
