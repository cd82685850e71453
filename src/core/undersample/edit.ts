/**
 * Editing a measured graph by hand: add or remove one directed (i → j, i = j
 * allowed: a variable that carries over between measurements) or bidirected
 * (i ↔ j, i ≠ j) edge. Every refusal names the edge and the variables.
 */
import { bit, has, type MeasuredGraph } from './graph';

export type EdgeKind = 'directed' | 'bidirected';
export interface EdgeEdit {
  op: 'add' | 'remove';
  kind: EdgeKind;
  /** Variable indices. */
  from: number;
  to: number;
}

export type EditResult = { ok: true; graph: MeasuredGraph } | { ok: false; message: string };

export function edgeText(g: MeasuredGraph, kind: EdgeKind, from: number, to: number): string {
  const name = (i: number) => g.names[i] ?? `variable ${i + 1}`;
  return `${name(from)} ${kind === 'directed' ? '→' : '↔'} ${name(to)}`;
}

export function editMeasuredGraph(g: MeasuredGraph, e: EdgeEdit): EditResult {
  const n = g.names.length;
  const text = edgeText(g, e.kind, e.from, e.to);
  for (const [end, i] of [['from', e.from], ['to', e.to]] as const)
    if (!Number.isInteger(i) || i < 0 || i >= n) return { ok: false, message: `${text}: no variable at the ${end} end (the variables are ${g.names.join(', ')})` };
  if (e.kind === 'bidirected' && e.from === e.to) return { ok: false, message: `${text}: a bidirected edge joins two different variables` };
  const present = has((e.kind === 'directed' ? g.directed : g.bidirected)[e.from], e.to);
  if (e.op === 'add' && present) return { ok: false, message: `${text} is already in the graph` };
  if (e.op === 'remove' && !present) return { ok: false, message: `${text} is not in the graph` };
  const directed = [...g.directed];
  const bidirected = [...g.bidirected];
  const flip = (rows: number[], i: number, j: number) => { rows[i] = (e.op === 'add' ? rows[i] | bit(j) : rows[i] & ~bit(j)) >>> 0; };
  if (e.kind === 'directed') flip(directed, e.from, e.to);
  else {
    flip(bidirected, e.from, e.to);
    flip(bidirected, e.to, e.from);
  }
  return { ok: true, graph: { names: g.names, directed, bidirected } };
}
