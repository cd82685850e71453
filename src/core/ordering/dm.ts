/**
 * The coarse Dulmage–Mendelsohn decomposition (Dulmage & Mendelsohn, Canad.
 * J. Math. 10, 1958; as used for equation systems by Pothen & Fan, ACM TOMS
 * 16(4), 1990): with any maximum matching,
 * - over-determined part: rows and columns reachable by alternating paths
 *   from an unmatched row (row → any adjacent column → that column's mate);
 * - under-determined part: reachable from an unmatched column (column → any
 *   row containing it → that row's mate);
 * - well-determined part: the rest, which the matching pairs up perfectly.
 * The parts do not depend on which maximum matching was found.
 */
import { transposeGraph, type BipartiteGraph, type Matching } from './matching';

export const PART_WELL = 0;
export const PART_OVER = 1;
export const PART_UNDER = 2;

export interface DmParts {
  /** PART_* of each row. */
  rowPart: Uint8Array;
  /** PART_* of each column; columns with colActive 0 (exogenous) stay PART_WELL and are to be ignored. */
  colPart: Uint8Array;
}

/** The transpose of a CSR graph: for each column, the rows that contain it (in increasing row order). */
export const transpose = transposeGraph;

/** Coarse DM parts. `colActive[c]` marks the unknowns (exogenous columns are not unknowns). */
export function dulmageMendelsohn(
  g: BipartiteGraph,
  m: Matching,
  t: { colPtr: Int32Array; rowIdx: Int32Array },
  colActive: Uint8Array,
): DmParts {
  const rowPart = new Uint8Array(g.rows);
  const colPart = new Uint8Array(g.cols);
  const queue = new Int32Array(Math.max(g.rows, g.cols));
  // Over: from unmatched rows.
  let qh = 0;
  let qt = 0;
  for (let r = 0; r < g.rows; r++) if (m.rowMate[r] < 0) { rowPart[r] = PART_OVER; queue[qt++] = r; }
  while (qh < qt) {
    const r = queue[qh++];
    for (let k = g.rowPtr[r]; k < g.rowPtr[r + 1]; k++) {
      const c = g.colIdx[k];
      if (colPart[c] === PART_OVER) continue;
      colPart[c] = PART_OVER;
      const r2 = m.colMate[c]; // always matched: else the matching had an augmenting path
      if (r2 >= 0 && rowPart[r2] !== PART_OVER) { rowPart[r2] = PART_OVER; queue[qt++] = r2; }
    }
  }
  // Under: from unmatched unknowns.
  qh = 0;
  qt = 0;
  for (let c = 0; c < g.cols; c++) if (colActive[c] && m.colMate[c] < 0) { colPart[c] = PART_UNDER; queue[qt++] = c; }
  while (qh < qt) {
    const c = queue[qh++];
    for (let k = t.colPtr[c]; k < t.colPtr[c + 1]; k++) {
      const r = t.rowIdx[k];
      if (rowPart[r] === PART_UNDER) continue;
      rowPart[r] = PART_UNDER;
      const c2 = m.rowMate[r];
      if (c2 >= 0 && colPart[c2] !== PART_UNDER) { colPart[c2] = PART_UNDER; queue[qt++] = c2; }
    }
  }
  return { rowPart, colPart };
}
