/**
 * The model as canvas nodes and edges. Pure: the canvas component keeps the
 * previous nodes so that unchanged ones keep their identity (and their
 * measured size), which keeps large models smooth.
 */
import type { Edge, Node } from '@xyflow/react';
import type { Link, Model, Relation, Variable } from '../../core/model/types';
import type { Role } from '../../core/ordering/types';
import { symbolsOf } from '../../state/validate';

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
export interface LinkEdgeData extends Record<string, unknown> {
  link: Link;
}

export type VariableFlowNode = Node<VariableNodeData, 'variable'>;
export type RelationFlowNode = Node<RelationNodeData, 'relation'>;
export type FlowNode = VariableFlowNode | RelationFlowNode;
export type LinkFlowEdge = Edge<LinkEdgeData, 'link'>;
export type FlowEdge = LinkFlowEdge | Edge<Record<string, unknown>, 'member'>;

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

export function buildEdges(model: Model, selected: ReadonlySet<string>): FlowEdge[] {
  const edges: FlowEdge[] = model.links.map((l) => ({
    id: l.id!,
    type: 'link',
    source: l.from,
    target: l.to,
    data: { link: l },
    selected: selected.has(l.id!),
    ariaLabel: `link from ${l.from} to ${l.to}: ${l.kind}${l.sign ? `, sign ${l.sign === '-' ? 'minus' : 'plus'}` : ''}`,
  }));
  const ids = new Set(model.variables.map((v) => v.id));
  for (const r of model.relations ?? []) {
    for (const s of symbolsOf(r.equation, true)) {
      if (!ids.has(s)) continue;
      edges.push({ id: `member:${r.id}:${s}`, type: 'member', source: r.id, target: s, selectable: false, focusable: false, deletable: false, data: {} });
    }
  }
  return edges;
}
