/**
 * The model as canvas nodes and link-layer lines. Pure: the canvas component
 * keeps the previous nodes so that unchanged ones keep their identity (and
 * their measured size), which keeps large models smooth.
 */
import type { Node, NodeChange } from '@xyflow/react';
import type { Change } from '../../state/changes';
import type { Link, Model, Relation, Variable } from '../../core/model/types';
import type { Role } from '../../core/ordering/types';
import { symbolsOf } from '../../state/validate';
import { labeller } from '../../present/index';

export interface VariableNodeData extends Record<string, unknown> {
  variable: Variable;
  role?: Role;
  /** Number of errors and warnings that name this variable. */
  errors: number;
  warnings: number;
}
export interface RelationNodeData extends Record<string, unknown> {
  relation: Relation;
  errors: number;
}

export type VariableFlowNode = Node<VariableNodeData, 'variable'>;
export type RelationFlowNode = Node<RelationNodeData, 'relation'>;
export type FlowNode = VariableFlowNode | RelationFlowNode;

export interface Badges {
  errors: Map<string, number>;
  warnings: Map<string, number>;
}

/** Where a node without a stored position goes: a loose grid. */
export function defaultPosition(index: number): { x: number; y: number } {
  return { x: 40 + (index % 6) * 200, y: 40 + Math.floor(index / 6) * 120 };
}

const KIND_WORD = { input: 'input', state: 'state', derived: 'derived variable' } as const;

export function variableAriaLabel(v: Variable, role?: Role): string {
  const name = v.label ?? v.id;
  const r = role && role !== v.kind ? `, ${role} at this interval` : '';
  return `${name}: ${KIND_WORD[v.kind]}${r}`;
}

export function buildNodes(model: Model, roles: Record<string, Role> | undefined, badges: Badges, selected: ReadonlySet<string>, prev: readonly FlowNode[]): FlowNode[] {
  const old = new Map(prev.map((n) => [n.id, n]));
  const out: FlowNode[] = [];
  model.variables.forEach((v, i) => {
    const role = roles?.[v.id];
    const errors = badges.errors.get(v.id) ?? 0;
    const warnings = badges.warnings.get(v.id) ?? 0;
    const sel = selected.has(v.id);
    const p = old.get(v.id) as VariableFlowNode | undefined;
    const position = v.position ?? defaultPosition(i);
    if (p && p.type === 'variable' && p.data.variable === v && p.data.role === role && p.data.errors === errors && p.data.warnings === warnings && !!p.selected === sel && p.position.x === position.x && p.position.y === position.y) {
      out.push(p);
      return;
    }
    out.push({
      id: v.id,
      type: 'variable',
      position,
      data: { variable: v, role, errors, warnings },
      selected: sel,
      ariaLabel: variableAriaLabel(v, role),
      measured: p?.measured,
    });
  });
  (model.relations ?? []).forEach((r, i) => {
    const errors = badges.errors.get(r.id) ?? 0;
    const sel = selected.has(r.id);
    const p = old.get(r.id) as RelationFlowNode | undefined;
    const position = r.position ?? defaultPosition(model.variables.length + i);
    if (p && p.type === 'relation' && p.data.relation === r && p.data.errors === errors && !!p.selected === sel && p.position.x === position.x && p.position.y === position.y) {
      out.push(p);
      return;
    }
    out.push({ id: r.id, type: 'relation', position, data: { relation: r, errors }, selected: sel, ariaLabel: `relation ${r.equation}`, measured: p?.measured });
  });
  return out;
}

/** A line of the canvas's link layer: a link, or a relation joined to one of its variables. */
export interface CanvasLines {
  links: { id: string; link: Link; label: string }[];
  members: { id: string; relation: string; variable: string }[];
}

/** What a screen reader hears for a link. */
export function linkAriaLabel(l: Link, name: (id: string) => string): string {
  return `link from ${name(l.from)} to ${name(l.to)}: ${l.kind}${l.sign ? `, sign ${l.sign === '-' ? 'minus' : 'plus'}` : ''}`;
}

/**
 * The lines the link layer draws for a model: every link with its spoken
 * label, and every relation joined to each variable its equation names (a
 * name that is not a variable joins nothing). Depends on the document only,
 * so the layer computes it once per edit, not once per pointer move.
 */
export function canvasLines(model: Model): CanvasLines {
  const name = labeller(model);
  const ids = new Set(model.variables.map((v) => v.id));
  const links = model.links.map((link) => ({ id: link.id!, link, label: linkAriaLabel(link, name) }));
  const members: CanvasLines['members'] = [];
  for (const r of model.relations ?? []) for (const s of symbolsOf(r.equation, true)) if (ids.has(s)) members.push({ id: `member:${r.id}:${s}`, relation: r.id, variable: s });
  return { links, members };
}

/**
 * The document edit for a batch of canvas node changes: the positions that
 * stopped moving (the end of a drag, an arrow-key step), or null. Positions
 * while a drag is under way stay on the canvas, so a drag is one edit and one
 * undo step, and the model, its checks and its analysis do not change under a
 * moving pointer.
 */
export function settledMove(changes: readonly NodeChange[]): { change: Change; squash: string } | null {
  const positions: Record<string, { x: number; y: number }> = {};
  for (const c of changes) if (c.type === 'position' && c.dragging === false && c.position !== undefined) positions[c.id] = c.position;
  const ids = Object.keys(positions);
  if (ids.length === 0) return null;
  return { change: { type: 'move', positions }, squash: `move:${ids.sort().join(',')}` };
}
