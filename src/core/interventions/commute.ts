/**
 * The commutation check: does holding a variable and letting the fast states
 * settle give the same causal structure in either order?
 *
 * - hold then settle: the do-operator acts on the running mechanism (a
 *   derived variable loses its formula, a state its rate), then the states
 *   that are fast at this interval settle. This is what happens when a
 *   variable is fixed in the real system.
 * - settle then hold: the fast states settle first, and the do-operator acts
 *   on the equilibrium model, replacing the equation that the equilibrium
 *   model's causal ordering pairs with the variable.
 *
 * Dash ("Restructuring dynamic causal systems in equilibrium", AISTATS 2005;
 * reconstructed from memory, §3–4) showed that the two need not agree: when a
 * fast state x settles through a feedback loop that passes through v, the
 * balance equation of x is what the equilibrium model pairs with v, so the
 * equilibrium model predicts that fixing v removes x's balance; in the
 * running system fixing v removes v's own equation and cuts the loop, and x
 * settles somewhere else or not at all. The exact structural test used here
 * compares the equation sets of the two results; the criterion
 * `commutesByCriterion` says in advance when they agree: exactly when the
 * equilibrium ordering pairs v with its own equation (or v is given at this
 * interval).
 *
 * Sources. The property itself (manipulation and equilibration commute, or
 * not; models that violate it have feedback; manipulating some variables of
 * such models leaves no equilibrium at all) is as stated in the abstract of
 * Dash's thesis "Caveats for causal reasoning with equilibrium models"
 * (University of Pittsburgh, 2003) and in the abstract of Dash & Druzdzel's
 * paper on the manipulation postulate for equilibrium models, both read
 * from stored public pages. The 2005 paper's own text was not available
 * here: its cases, section numbers and the pairing criterion below are
 * rebuilt from memory and marked so in the tests.
 */
import type { EquationId, VariableId } from '../model/types';
import type { Diagnostic, Ordering, OrderingEdge, Role } from '../ordering/types';
import { equationId } from '../ordering/types';
import { cloneStructure, compareIds, stateOfDerivative, type EquationStructure } from '../ordering/structure';
import { equilibrateAll, exogenize, hold, removableEquations, type StructureChange } from '../ordering/operators';
import { listNames, orderStructure } from '../ordering/order';

/** Which states settle and which freeze at the interval under study (held variables are skipped). */
export interface SettlePlan {
  settle: VariableId[];
  freeze: VariableId[];
}

export interface StructureStep {
  structure: EquationStructure;
  changes: StructureChange[];
}

export interface Ambiguity {
  variable: VariableId;
  /** Equations of the equilibrium model any one of which the hold could replace. */
  candidates: EquationId[];
  /** The one replaced in the result shown (the equation the causal ordering pairs with the variable). */
  chosen: EquationId;
}

export type DifferenceKind = 'edge' | 'equation' | 'determination';
export type Side = 'holdThenSettle' | 'settleThenHold';

export interface Difference {
  kind: DifferenceKind;
  /** The ordering in which the edge/equation is present (absent from the other). */
  only: Side;
  edge?: OrderingEdge;
  equation?: EquationId;
  variables?: VariableId[];
  reason: string;
}

export interface Drift {
  /** Balance equations left with no unknown: conditions on held values and inputs that generally fail. */
  equations: EquationId[];
  /** Variables nothing determines any more: they keep moving instead of settling. */
  variables: VariableId[];
  /** The settled states whose balance breaks. */
  states: VariableId[];
  message: string;
}

export interface Commutation {
  agree: boolean;
  hold: Record<VariableId, number>;
  holdThenSettle: Ordering;
  settleThenHold: Ordering;
  differences: Difference[];
  ambiguous: Ambiguity[];
  /** Set when hold-then-settle has no equilibrium. */
  drift: Drift | null;
  /** Why, in words: one line per finding. */
  explanation: string[];
}

/** Apply the interval's settling and freezing, skipping held variables. */
function applyPlan(s: EquationStructure, plan: SettlePlan, held: ReadonlySet<VariableId>): StructureStep {
  const changes: StructureChange[] = [];
  let out = s;
  const settle = plan.settle.filter((x) => !held.has(x) && out.derivatives[x] !== undefined);
  if (settle.length > 0) {
    const r = equilibrateAll(out, settle);
    out = r.structure;
    changes.push(r.change);
  }
  for (const x of [...plan.freeze].sort(compareIds)) {
    if (held.has(x)) continue;
    const r = exogenize(out, x);
    out = r.structure;
    changes.push(r.change);
  }
  return { structure: out, changes };
}

function holdAll(s: EquationStructure, holds: Record<VariableId, number>, drop: typeof hold): StructureStep {
  const changes: StructureChange[] = [];
  let out = s;
  for (const v of Object.keys(holds).sort(compareIds)) {
    const r = drop(out, v, holds[v]);
    out = r.structure;
    changes.push(r.change);
  }
  return { structure: out, changes };
}

/** Hold then settle: the do-operator on the running mechanism, then the interval's operators. */
export function holdThenSettle(mechanism: EquationStructure, plan: SettlePlan, holds: Record<VariableId, number>): StructureStep {
  const h = holdAll(mechanism, holds, hold);
  const p = applyPlan(h.structure, plan, new Set(Object.keys(holds)));
  return { structure: p.structure, changes: [...h.changes, ...p.changes] };
}

/**
 * The equation the equilibrium model's causal ordering pairs with v, and
 * the alternatives when v is determined together with others.
 */
export function pairedEquation(s: EquationStructure, v: VariableId): { equation: EquationId | null; candidates: EquationId[] } {
  if (s.derivatives[v] !== undefined) return { equation: s.derivatives[v], candidates: [s.derivatives[v]] };
  if (s.exogenous.includes(v)) return { equation: null, candidates: [] };
  const h = equationId.hold(v);
  if (s.equations.some((e) => e.id === h)) return { equation: h, candidates: [h] };
  const causal = orderStructure(s).causal;
  const block = causal.blocks.find((b) => b.variables.includes(v));
  if (block === undefined) return { equation: null, candidates: [] };
  const eqVars = new Map(s.equations.map((e) => [e.id, e.variables]));
  const paired = matchedEquation(causal.matching, v);
  const containing = block.equations.filter((e) => eqVars.get(e)!.includes(v));
  if (block.variables.length <= 1) {
    const eq = paired ?? containing[0] ?? null;
    return { equation: eq, candidates: containing.length > 0 ? containing : eq ? [eq] : [] };
  }
  // In a simultaneous block: equations whose removal leaves the rest of the block able to fix the rest of its variables.
  const pool = removableEquations(block, v, containing, eqVars);
  const eq = paired !== null && pool.includes(paired) ? paired : (pool[0] ?? null);
  return { equation: eq, candidates: pool };
}

/** The equation a maximum matching (equation → variable) pairs with v. */
function matchedEquation(matching: Readonly<Record<EquationId, VariableId>>, v: VariableId): EquationId | null {
  for (const e in matching) if (matching[e] === v) return e;
  return null;
}

/** The do-operator on an equilibrium model: replace the equation its ordering pairs with v by hold(v). */
export function holdInEquilibrium(s: EquationStructure, v: VariableId, value: number): { structure: EquationStructure; change: StructureChange } {
  if (!s.variables.includes(v)) throw new Error(`hold: no variable "${v}" in this structure`);
  const { equation, candidates } = pairedEquation(s, v);
  const out = cloneStructure(s);
  const h = equationId.hold(v);
  if (equation !== null) out.equations = out.equations.filter((e) => e.id !== equation);
  delete out.derivatives[v];
  out.exogenous = out.exogenous.filter((x) => x !== v);
  out.equations = [...out.equations.filter((e) => e.id !== h), { id: h, variables: [v] }].sort((a, b) => compareIds(a.id, b.id));
  const removed = equation !== null && equation !== h ? [equation] : [];
  const change: StructureChange = {
    operator: 'hold',
    variable: v,
    removed,
    added: [h],
    changed: [],
    value,
    note: removed.length ? `${v} is held at ${value}; equation ${removed[0]} of the equilibrium model is replaced` : `${v} is held at ${value}`,
  };
  if (candidates.length > 1) change.ambiguous = { candidates };
  return { structure: out, change };
}

/** Settle then hold: the interval's operators first, then the do-operator on the equilibrium model. */
export function settleThenHold(mechanism: EquationStructure, plan: SettlePlan, holds: Record<VariableId, number>): StructureStep {
  const p = applyPlan(mechanism, plan, new Set());
  const h = holdAll(p.structure, holds, holdInEquilibrium);
  return { structure: h.structure, changes: [...p.changes, ...h.changes] };
}

/** The equation a variable has of its own in the mechanism: its formula or rate, if it has one. */
export function ownEquation(mechanism: EquationStructure, v: VariableId): EquationId | null {
  if (mechanism.derivatives[v] !== undefined) return mechanism.derivatives[v];
  const f = equationId.formula(v);
  return mechanism.equations.some((e) => e.id === f) ? f : null;
}

/**
 * The criterion (after Dash 2005, reconstructed from memory): holding v
 * commutes with the interval's settling when v is given at this interval
 * (input, frozen, dynamic state) or the equilibrium ordering pairs v, alone
 * in its block, with v's own equation. Cheap: one ordering of the
 * equilibrium model. Example: for x' = u − x, y = 2x, settling x pairs x
 * with rate(x), so holding x commutes.
 */
export function commutesByCriterion(mechanism: EquationStructure, plan: SettlePlan, v: VariableId): boolean {
  const eq = applyPlan(mechanism, plan, new Set()).structure;
  if (eq.exogenous.includes(v) || eq.derivatives[v] !== undefined) return true;
  const { equation, candidates } = pairedEquation(eq, v);
  if (candidates.length > 1) return false;
  return equation !== null && equation === ownEquation(mechanism, v);
}

/** Equations of a structure as comparable keys `id{v1,v2}`. */
function equationKeys(s: EquationStructure): Map<EquationId, string> {
  return new Map(s.equations.map((e) => [e.id, [...new Set(e.variables)].sort(compareIds).join(',')]));
}

/** The exact structural test: same equations over the same variables, same exogenous and dynamic states. */
export function sameStructure(a: EquationStructure, b: EquationStructure): boolean {
  const ka = equationKeys(a);
  const kb = equationKeys(b);
  if (ka.size !== kb.size) return false;
  for (const [id, vs] of ka) if (kb.get(id) !== vs) return false;
  const ex = (s: EquationStructure) => [...new Set(s.exogenous)].sort(compareIds).join(',');
  const dv = (s: EquationStructure) => Object.keys(s.derivatives).sort(compareIds).join(',');
  return ex(a) === ex(b) && dv(a) === dv(b);
}

/** An Ordering (the published contract) of a structure, with the roles of the design. */
export function orderingOf(s: EquationStructure, roles: Record<VariableId, Role>, extra: Diagnostic[] = []): Ordering {
  const o = orderStructure(s);
  return { roles: { ...roles }, blocks: o.blocks, edges: o.edges, integrations: o.integrations, diagnostics: [...extra, ...o.diagnostics] };
}

const edgeKey = (e: OrderingEdge) => `${e.from}\u0000${e.to}\u0000${e.kind}\u0000${e.equation}`;

/** Variables reachable from `from` along instantaneous edges (`from` included). */
function reach(edges: OrderingEdge[], from: VariableId[], reverse = false): Set<VariableId> {
  const next = new Map<VariableId, VariableId[]>();
  for (const e of edges) {
    if (e.kind !== 'instantaneous') continue;
    const [a, b] = reverse ? [e.to, e.from] : [e.from, e.to];
    let l = next.get(a);
    if (!l) next.set(a, (l = []));
    l.push(b);
  }
  const seen = new Set(from);
  const stack = [...from];
  while (stack.length) for (const w of next.get(stack.pop()!) ?? []) if (!seen.has(w)) { seen.add(w); stack.push(w); }
  return seen;
}

/**
 * The feedback set of a state x (after Dash 2005, from memory): the
 * variables that x acts on within the instant and that act, within the
 * instant, on x's own rate. States that settle at the same interval act
 * within the instant too (their balance links their sources to them), so a
 * loop may pass through them. Holding a member cuts the loop through which
 * x settles. Example: for x′ = u − q, p = f(x), q = g(p), the set of x is {p, q}.
 */
export function feedbackSet(mechanism: EquationStructure, x: VariableId, settledWith: readonly VariableId[] = [], mechanismEdges?: OrderingEdge[]): VariableId[] {
  if (mechanism.derivatives[x] === undefined) return [];
  const g = loopGraph(mechanism, settledWith.filter((s) => s !== x), mechanismEdges);
  const down = reach(g.edges, [x]);
  const up = reach(g.edges, g.sources.get(x) ?? [], true);
  return [...down].filter((v) => v !== x && up.has(v)).sort(compareIds);
}

/** The mechanism's within-instant links plus, for each state settling with the others, links from what its rate reads to it. */
function loopGraph(mechanism: EquationStructure, settled: readonly VariableId[], mechanismEdges?: OrderingEdge[]): { edges: OrderingEdge[]; sources: Map<VariableId, VariableId[]> } {
  const eqVars = new Map(mechanism.equations.map((e) => [e.id, e.variables]));
  const sources = new Map<VariableId, VariableId[]>();
  for (const [s, eq] of Object.entries(mechanism.derivatives)) sources.set(s, (eqVars.get(eq) ?? []).filter((v) => stateOfDerivative(v) === null && v !== s));
  const edges: OrderingEdge[] = [...(mechanismEdges ?? orderStructure(mechanism).edges)];
  for (const s of settled) for (const v of sources.get(s) ?? []) edges.push({ from: v, to: s, kind: 'instantaneous', equation: mechanism.derivatives[s] });
  return { edges, sources };
}

/**
 * The settled states whose feedback loop passes through v (v in their
 * feedback set), found with two searches from v instead of one per state:
 * s qualifies when s reaches v and v reaches something s's rate reads.
 */
export function loopsThrough(mechanism: EquationStructure, v: VariableId, settled: readonly VariableId[], mechanismEdges?: OrderingEdge[]): VariableId[] {
  const out: VariableId[] = [];
  const g = loopGraph(mechanism, settled, mechanismEdges);
  const up = reach(g.edges, [v], true);
  const down = reach(g.edges, [v]);
  for (const s of settled) {
    if (s === v || !up.has(s)) continue;
    const src = g.sources.get(s) ?? [];
    // s's own balance link (its sources → s) never shortens these paths: a path through it already met a source of s.
    if (src.some((w) => down.has(w))) out.push(s);
  }
  return out.sort(compareIds);
}

function detectDrift(held: EquationStructure, before: EquationStructure, settled: VariableId[]): Drift | null {
  const o = orderStructure(held).causal;
  const bad = o.blocks.filter((b) => b.determination !== 'well');
  if (bad.length === 0) return null;
  const baseBad = new Set(orderStructure(before).causal.blocks.filter((b) => b.determination !== 'well').flatMap((b) => [...b.variables.map((v) => stateOfDerivative(v) ?? v), ...b.equations]));
  const overEqs = [...new Set(bad.filter((b) => b.determination === 'over').flatMap((b) => b.equations))].sort(compareIds);
  // Only what the hold brings: an over-determined part made of equations that were already in conflict is not new.
  const equations = overEqs.some((e) => !e.startsWith('hold(') && !baseBad.has(e)) ? overEqs : [];
  const variables = [...new Set(bad.filter((b) => b.determination === 'under').flatMap((b) => b.variables))]
    .map((v) => stateOfDerivative(v) ?? v)
    .filter((v) => !baseBad.has(v))
    .sort(compareIds);
  if (equations.length === 0 && variables.length === 0) return null;
  const rateOf = new Map(settled.map((x) => [equationId.rate(x), x]));
  const states = [...new Set([...equations.filter((e) => rateOf.has(e)).map((e) => rateOf.get(e)!), ...variables.filter((v) => settled.includes(v))])].sort(compareIds);
  const balances = equations.filter((e) => rateOf.has(e));
  const parts: string[] = [];
  if (equations.length)
    parts.push(
      balances.length
        ? `the balance ${balances.length > 1 ? 'equations' : 'equation'} ${listNames(balances)} ${balances.length > 1 ? 'are' : 'is'} left with nothing of ${balances.length > 1 ? 'their' : 'its'} own to fix (${listNames(equations)} over-determine the held part) and ${balances.length > 1 ? 'become conditions' : 'becomes a condition'} that the held values generally break`
        : `${listNames(equations)} over-determine the held part`,
    );
  if (variables.length) parts.push(`nothing determines ${listNames(variables)} any more`);
  const movers = states.length ? states : variables;
  const message = `held, the system has no equilibrium: ${parts.join(', and ')}; ${listNames(movers)} ${movers.length > 1 ? 'keep' : 'keeps'} moving (drifts) instead of settling`;
  return { equations, variables, states, message };
}

export interface CommutationInput {
  /** The mechanism: every state dynamic (from buildStructure). */
  mechanism: EquationStructure;
  plan: SettlePlan;
  hold: Record<VariableId, number>;
  /** Roles at the interval without the intervention; held variables become 'held'. */
  roles: Record<VariableId, Role>;
}

/**
 * Compare hold-then-settle with settle-then-hold at one interval.
 * Example: `commutation({ mechanism, plan: { settle: ['x'], freeze: [] }, hold: { p: 1 }, roles })`.
 */
export function commutation(input: CommutationInput): Commutation {
  const { mechanism, plan, roles } = input;
  const holds = input.hold;
  const heldIds = Object.keys(holds).sort(compareIds);
  for (const v of heldIds) if (!mechanism.variables.includes(v)) throw new Error(`hold: the model has no variable "${v}"`);
  const heldRoles: Record<VariableId, Role> = { ...roles };
  for (const v of heldIds) heldRoles[v] = 'held';

  const hts = holdThenSettle(mechanism, plan, holds);
  const sth = settleThenHold(mechanism, plan, holds);
  const equilibrium = applyPlan(mechanism, plan, new Set()).structure;
  const htsOrdering = orderingOf(hts.structure, heldRoles);
  const sthOrdering = orderingOf(sth.structure, heldRoles);
  const settled = plan.settle.filter((x) => mechanism.derivatives[x] !== undefined);

  const ambiguous: Ambiguity[] = [];
  for (const c of sth.changes) if (c.operator === 'hold' && c.ambiguous) ambiguous.push({ variable: c.variable, candidates: c.ambiguous.candidates, chosen: c.removed[0] ?? '' });

  const differences: Difference[] = [];
  const ka = equationKeys(hts.structure);
  const kb = equationKeys(sth.structure);
  for (const [id, vs] of ka)
    if (kb.get(id) !== vs) differences.push({ kind: 'equation', only: 'holdThenSettle', equation: id, variables: vs ? vs.split(',') : [], reason: equationReason(id, 'holdThenSettle', mechanism, heldIds) });
  for (const [id, vs] of kb)
    if (ka.get(id) !== vs) differences.push({ kind: 'equation', only: 'settleThenHold', equation: id, variables: vs ? vs.split(',') : [], reason: equationReason(id, 'settleThenHold', mechanism, heldIds) });
  const ea = new Map(htsOrdering.edges.map((e) => [edgeKey(e), e]));
  const eb = new Map(sthOrdering.edges.map((e) => [edgeKey(e), e]));
  for (const [k, e] of ea) if (!eb.has(k)) differences.push({ kind: 'edge', only: 'holdThenSettle', edge: e, reason: `in the running system ${e.from} acts on ${e.to} through ${e.equation}; the equilibrium model, held, has no such link` });
  for (const [k, e] of eb) if (!ea.has(k)) differences.push({ kind: 'edge', only: 'settleThenHold', edge: e, reason: `the equilibrium model, held, predicts ${e.from} → ${e.to} through ${e.equation}; the running system, held, does not have it` });

  const drift = detectDrift(hts.structure, equilibrium, settled);
  const same = sameStructure(hts.structure, sth.structure);
  if (drift && !same) differences.push({ kind: 'determination', only: 'settleThenHold', variables: [...new Set([...drift.states, ...drift.variables])].sort(compareIds), reason: `the equilibrium model, held, still settles; ${drift.message}` });

  const agree = same && ambiguous.length === 0;
  const runningDrops: Record<VariableId, EquationId | undefined> = {};
  for (const ch of hts.changes) if (ch.operator === 'hold') runningDrops[ch.variable] = ch.removed[0];
  const explanation = explain({ mechanism, equilibrium, heldIds, holds, settled, sth, agree, same, ambiguous, drift, runningDrops });
  return { agree, hold: { ...holds }, holdThenSettle: htsOrdering, settleThenHold: sthOrdering, differences, ambiguous, drift, explanation };
}

function equationReason(id: EquationId, only: Side, mechanism: EquationStructure, held: VariableId[]): string {
  if (id.startsWith('hold(')) return `${id} fixes the held variable`;
  const owner = held.find((v) => ownEquation(mechanism, v) === id);
  if (only === 'settleThenHold' && owner) return `${id} is ${owner}'s own equation: the running system loses it when ${owner} is held, the equilibrium model keeps it`;
  if (only === 'holdThenSettle') return `${id} keeps acting in the running system; the equilibrium model's hold replaced it`;
  return `${id} differs between the two orders`;
}

interface ExplainInput {
  mechanism: EquationStructure;
  equilibrium: EquationStructure;
  heldIds: VariableId[];
  holds: Record<VariableId, number>;
  settled: VariableId[];
  sth: StructureStep;
  agree: boolean;
  same: boolean;
  ambiguous: Ambiguity[];
  drift: Drift | null;
  /** The equation the do-operator removes from the running mechanism, per held variable. */
  runningDrops: Record<VariableId, EquationId | undefined>;
}

function explain(x: ExplainInput): string[] {
  const lines: string[] = [];
  let mechanismEdges: OrderingEdge[] | undefined;
  const edgesOnce = () => (mechanismEdges ??= orderStructure(x.mechanism).edges);
  const held = listNames(x.heldIds.map((v) => `${v} = ${x.holds[v]}`));
  if (x.agree) {
    lines.push(x.settled.length === 0
      ? `no state settles at this interval, so holding ${held} and settling cannot conflict: both orders give the same structure`
      : `holding ${held} and letting ${listNames(x.settled)} settle give the same structure in either order: the equilibrium model pairs each held variable with its own equation`);
    if (x.drift) lines.push(x.drift.message);
    return lines;
  }
  for (const c of x.sth.changes) {
    if (c.operator !== 'hold') continue;
    const v = c.variable;
    const own = ownEquation(x.mechanism, v) ?? x.runningDrops[v] ?? null;
    const replaced = c.removed[0];
    if (c.ambiguous) {
      lines.push(`holding ${v} in the equilibrium model is ambiguous: ${v} is determined together with others, and any of ${listNames(c.ambiguous.candidates)} could be the equation the hold replaces (shown: ${replaced}); the equilibrium model alone cannot say which, the running system replaces ${own ?? 'none of them'}`);
      continue;
    }
    if (replaced !== undefined && replaced !== own) {
      const balanceOf = x.settled.find((s) => equationId.rate(s) === replaced);
      lines.push(
        balanceOf !== undefined
          ? `at equilibrium, ${v} is what the balance of ${balanceOf} (${replaced}) fixes; the equilibrium model, held, loses that balance, while the running system, held, loses ${own ?? `the equation of ${v}`} instead`
          : `at equilibrium, ${v} is determined by ${replaced}, not by its own equation ${own ?? '(none)'}; the equilibrium model, held, loses ${replaced}, while the running system, held, loses ${own ?? 'nothing of its own'} and ${replaced} keeps acting`,
      );
    }
    const loops = loopsThrough(x.mechanism, v, x.settled, edgesOnce());
    for (const s of loops)
      lines.push(`${v} lies on the loop ${s} → … → ${v} → d(${s})/dt through which ${s} settles: holding ${v} breaks the feedback through which ${s} settles, so the system reaches a different equilibrium than the equilibrium model predicts${x.drift ? ', or none' : ''}`);
    if (x.settled.includes(v)) lines.push(`${v} settles at this interval, but held it no longer moves: its rate equation ${equationId.rate(v)} is gone from the running system, while the equilibrium model keeps it as a balance equation unless it pairs it with ${v}`);
  }
  if (x.drift) lines.push(x.drift.message);
  if (lines.length === 0 && !x.same) lines.push('the two orders give different equation sets');
  return lines;
}

