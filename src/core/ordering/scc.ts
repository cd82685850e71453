/**
 * Strongly connected components by Tarjan's algorithm (Tarjan, SIAM J.
 * Comput. 1(2), 1972), written with explicit stacks so that long chains of
 * variables cannot exceed a recursion limit.
 */

export interface Components {
  /** Component of each node; -1 for nodes outside `active`. */
  comp: Int32Array;
  count: number;
}

/**
 * Components of the graph node → adj[ptr[node] .. ptr[node+1]). Components
 * are numbered in the order Tarjan completes them, which is a reverse
 * topological order: a component's successors all have smaller numbers.
 * Only nodes with active[node] !== 0 are visited (all when omitted); edges to
 * inactive nodes must not exist.
 */
export function stronglyConnected(n: number, ptr: Int32Array, adj: Int32Array, active?: Uint8Array): Components {
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const comp = new Int32Array(n).fill(-1);
  const onStack = new Uint8Array(n);
  const stack = new Int32Array(n);
  const call = new Int32Array(n);
  const it = new Int32Array(n);
  let sp = 0;
  let next = 0;
  let count = 0;
  for (let s = 0; s < n; s++) {
    if (index[s] >= 0 || (active && !active[s])) continue;
    let cp = 0;
    call[0] = s;
    index[s] = low[s] = next++;
    it[s] = ptr[s];
    stack[sp++] = s;
    onStack[s] = 1;
    while (cp >= 0) {
      const v = call[cp];
      if (it[v] < ptr[v + 1]) {
        const w = adj[it[v]++];
        if (index[w] < 0) {
          index[w] = low[w] = next++;
          it[w] = ptr[w];
          stack[sp++] = w;
          onStack[w] = 1;
          call[++cp] = w;
        } else if (onStack[w] && index[w] < low[v]) low[v] = index[w];
        continue;
      }
      cp--;
      if (cp >= 0) {
        const u = call[cp];
        if (low[v] < low[u]) low[u] = low[v];
      }
      if (low[v] === index[v]) {
        let w: number;
        do {
          w = stack[--sp];
          onStack[w] = 0;
          comp[w] = count;
        } while (w !== v);
        count++;
      }
    }
  }
  return { comp, count };
}
