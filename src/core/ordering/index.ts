/**
 * The public API of the ordering core: the causal ordering a model shows at a
 * study design, the roles and their breakpoints along the interval axis, the
 * operators, and causal ordering of abstract equation systems.
 */
import type { EquationId, Model, VariableId } from '../model/types';
import { buildStructure } from '../model/equations';
import type { Diagnostic, Ordering, StudyDesign } from './types';
import { compareIds, derivativeOf, displayName, type EquationStructure } from './structure';
import { equilibrateAll, exogenize, exogenizeAll, hold } from './operators';
import { listNames, orderStructure } from './order';
import { rolesAt } from './timescales';
import { bipartiteFromLists, hopcroftKarp } from './matching';

export { buildStructure } from '../model/equations';
export type { ModelStructure } from '../model/equations';
export { causalOrder } from './causal';
export type { CausalOrder, CausalOrderOptions } from './causal';
export { orderStructure } from './order';
export { equilibrate, equilibrateAll, exogenize, exogenizeAll, hold } from './operators';
export type { OperatorResult, StructureChange } from './operators';
export { rolesAt, breakpoints, bands } from './timescales';
export type { AxisOptions, RolesResult } from './timescales';
export { derivativeOf, displayName } from './structure';
export type { EquationStructure, EquationSystem, StructureEquation } from './structure';
export * from './types';

function sortDiagnostics(ds: Diagnostic[]): Diagnostic[] {
  const rank = (d: Diagnostic) => (d.level === 'error' ? 0 : 1);
  return ds.sort((a, b) => rank(a) - rank(b) || compareIds(a.code, b.code) || compareIds(a.message, b.message));
}

// The structure of a model object is built once: a drag across the interval axis asks for the same
// model at many designs. Models are never mutated (edits make new objects), and the operators copy.
const builtCache = new WeakMap<Model, ReturnType<typeof buildStructure>>();
function builtStructureOf(model: Model): ReturnType<typeof buildStructure> {
  let built = builtCache.get(model);
  if (!built) builtCache.set(model, (built = buildStructure(model)));
  return built;
}

/**
 * The equation structure at a design, with the diagnostics of building it.
 * Holds are applied before anything settles: an intervention replaces the
 * mechanism of the held variable, and only then does the rest reach balance
 * (manipulate, then equilibrate: Dash 2005, AISTATS, from memory).
 */
function structureAt(model: Model, design: StudyDesign): { structure: EquationStructure; diagnostics: Diagnostic[]; settled: VariableId[]; roles: Ordering['roles'] } {
  const built = builtStructureOf(model);
  const r = rolesAt(model, design);
  const diagnostics = [...built.diagnostics, ...r.diagnostics];
  let s = built.structure;
  const ids = Object.keys(r.roles).sort(compareIds);
  for (const x of ids) {
    if (r.roles[x] !== 'held') continue;
    const res = hold(s, x, design.hold![x]);
    s = res.structure;
    if (res.change.ambiguous)
      diagnostics.push({
        level: 'warning',
        code: 'hold-ambiguous',
        message: `holding ${x} drops one of the equations ${listNames(res.change.ambiguous.candidates)} that determine ${x} together with other variables; ${res.change.removed[0]} was chosen: if another is the one the intervention replaces, hold that one's variable instead or rewrite the relations`,
        variables: [x],
        equations: res.change.ambiguous.candidates,
      });
    else if (res.change.alternatives)
      diagnostics.push({
        level: 'warning',
        code: 'hold-alternatives',
        message: `holding ${x} replaces ${res.change.removed[0]}, the equation that determines ${x} now; replacing ${listNames(res.change.alternatives, 'or')} instead would also fix ${x}, with different effects on the other variables: which mechanism an intervention overrides decides what it changes`,
        variables: [x],
        equations: [...res.change.removed, ...res.change.alternatives].sort(compareIds),
      });
  }
  const settled = ids.filter((x) => r.roles[x] === 'settled' && s.derivatives[x] !== undefined);
  if (settled.length > 0) s = equilibrateAll(s, settled).structure;
  const frozen = ids.filter((x) => r.roles[x] === 'frozen');
  const frozenStates = frozen.filter((x) => s.derivatives[x] !== undefined);
  if (frozenStates.length > 0) s = exogenizeAll(s, frozenStates).structure;
  for (const x of frozen) if (s.derivatives[x] === undefined && !s.exogenous.includes(x)) s = exogenize(s, x).structure;
  return { structure: s, diagnostics, settled, roles: r.roles };
}

/**
 * The causal ordering a model shows at a study design.
 * Example: `orderingAt(model, { interval: 24, samples: 50 })` — sampled daily for 50 days.
 */
export function orderingAt(model: Model, design: StudyDesign = {}): Ordering {
  const { structure, diagnostics, settled, roles } = structureAt(model, design);
  const o = orderStructure(structure);
  diagnostics.push(...o.diagnostics);
  // Settling a state whose rate does not involve it re-orients the ordering: its
  // balance equation now determines another variable (Iwasaki & Simon 1994, §4).
  const blockOfEq = new Map<EquationId, number>();
  o.blocks.forEach((b, i) => b.equations.forEach((e) => blockOfEq.set(e, i)));
  for (const x of settled) {
    const eq = structure.derivatives[x] ?? `rate(${x})`;
    const bi = blockOfEq.get(eq);
    if (bi === undefined) continue;
    const b = o.blocks[bi];
    if (b.determination !== 'well' || b.variables.includes(x)) continue;
    const own = o.causal.blockOf[x];
    const xBlock = own !== undefined ? o.causal.blocks[own] : undefined;
    diagnostics.push({
      level: 'warning',
      code: 're-oriented',
      message: `settling ${x} turns its rate into a balance equation that determines ${listNames(b.variables)}, not ${x}${xBlock && xBlock.equations.length > 0 ? `; ${x} is now determined by ${listNames(xBlock.equations)}` : ''}: the causal direction through ${x} reverses at this interval`,
      variables: [...new Set([x, ...b.variables])].sort(compareIds),
      equations: [...new Set([eq, ...(xBlock?.equations ?? [])])].sort(compareIds),
    });
  }
  return { roles, blocks: o.blocks, edges: o.edges, integrations: o.integrations, diagnostics: sortDiagnostics(diagnostics) };
}

export interface EquationMatching {
  equations: { id: EquationId; variables: string[]; determines?: string }[];
  /** The unknowns at this design (derivatives shown as d(x)/dt), sorted. */
  variables: string[];
}

/**
 * The equation–variable structure at a design with one maximum matching,
 * for an equations view. Derivatives are shown as `d(x)/dt`.
 */
export function equationMatching(model: Model, design: StudyDesign = {}): EquationMatching {
  const { structure } = structureAt(model, design);
  const exo = new Set(structure.exogenous);
  const unknowns = new Set<string>();
  for (const v of structure.variables) if (!exo.has(v)) unknowns.add(v);
  for (const x of Object.keys(structure.derivatives)) unknowns.add(derivativeOf(x));
  const cols = [...unknowns].sort(compareIds);
  const col = new Map(cols.map((v, i) => [v, i]));
  const eqs = [...structure.equations].sort((a, b) => compareIds(a.id, b.id));
  const lists = eqs.map((e) => [...new Set(e.variables)].filter((v) => col.has(v)).sort(compareIds).map((v) => col.get(v)!));
  const m = hopcroftKarp(bipartiteFromLists(cols.length, lists));
  return {
    equations: eqs.map((e, r) => {
      const row: EquationMatching['equations'][number] = { id: e.id, variables: [...new Set(e.variables)].sort(compareIds).map(displayName) };
      if (m.rowMate[r] >= 0) row.determines = displayName(cols[m.rowMate[r]]);
      return row;
    }),
    variables: cols.map(displayName),
  };
}
