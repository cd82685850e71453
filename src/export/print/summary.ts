/**
 * The summary of a big model's ordering, legible at two-column width: the
 * variables a modeller chooses and their neighbours (one link away, either
 * direction) drawn as usual, every simultaneous block that holds none of
 * them folded into one card, and everything else left out. The title says it
 * is a summary and how many variables it leaves out, so the figure never
 * claims links it does not show. Pure functions of the view model.
 */
import type { VariableId } from '../../core/model/types';
import type { ViewModel, ViewNode } from '../../core/view/types';

/** The variables of the focus and their neighbours in the view (by variable, any instant). */
export function neighbourhood(vm: ViewModel, focus: readonly VariableId[]): Set<VariableId> {
  const keep = new Set(focus);
  for (const e of vm.edges) {
    for (const p of e.pairs) {
      if (focus.includes(p.from)) keep.add(p.to);
      if (focus.includes(p.to)) keep.add(p.from);
    }
  }
  return keep;
}

/** Keys of the blocks that hold no variable of the neighbourhood (to be folded). */
export function foldedAwayFrom(vm: ViewModel, focus: readonly VariableId[]): string[] {
  const keep = neighbourhood(vm, focus);
  return vm.groups.filter((g) => !g.variables.some((v) => keep.has(v))).map((g) => g.key);
}

/**
 * The view cut down to the focus and its neighbours: their nodes, the folded blocks they link to, and the
 * links among those. Example: `summaryView(vm, ['stress'])`.
 */
export function summaryView(vm: ViewModel, focus: readonly VariableId[]): ViewModel {
  const keep = neighbourhood(vm, focus);
  const keptNode = (n: ViewNode) => (n.variable !== undefined ? keep.has(n.variable) : false);
  const ids = new Set(vm.nodes.filter(keptNode).map((n) => n.id));
  // folded blocks that a kept node links to stay as cards
  for (const e of vm.edges) {
    const a = vm.nodes.find((n) => n.id === e.from), b = vm.nodes.find((n) => n.id === e.to);
    if (a && b && ids.has(a.id) && b.count !== undefined) ids.add(b.id);
    if (a && b && ids.has(b.id) && a.count !== undefined) ids.add(a.id);
  }
  const nodes = vm.nodes.filter((n) => ids.has(n.id));
  const groups = vm.groups.map((g) => ({ ...g, members: g.members.filter((m) => ids.has(m)) })).filter((g) => g.members.length > 0);
  const edges = vm.edges.filter((e) => ids.has(e.from) && ids.has(e.to));
  const allVars = new Set(vm.nodes.flatMap((n) => (n.variable ? [n.variable] : [])));
  for (const g of vm.groups) for (const v of g.variables) allVars.add(v);
  for (const n of vm.nodes) if (n.count !== undefined && n.block) for (const v of n.block.split('+')) allVars.add(v);
  const shownVars = new Set(nodes.flatMap((n) => (n.variable ? [n.variable] : [])));
  const folded = vm.folded.filter((k) => nodes.some((n) => n.block === k && n.count !== undefined));
  for (const n of nodes) if (n.count !== undefined && n.block) for (const v of n.block.split('+')) shownVars.add(v);
  const left = allVars.size - shownVars.size;
  return {
    ...vm,
    title: `${vm.title} — summary around ${focus.map((f) => nodeLabel(vm, f)).join(', ')}${left > 0 ? ` (${left} of ${allVars.size} variables left out)` : ''}`,
    nodes,
    groups,
    edges,
    folded,
    rolesShown: vm.rolesShown.filter((r) => nodes.some((n) => n.role === r)),
    kindsShown: vm.kindsShown.filter((k) => edges.some((e) => e.kind === k)),
  };
}

/** What the view calls a variable: its first node's label, or the id where the view has no node for it. */
function nodeLabel(vm: ViewModel, id: VariableId): string {
  const node = vm.nodes.find((n) => n.variable === id);
  return node ? node.label : id;
}
