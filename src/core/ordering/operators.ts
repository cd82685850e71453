/**
 * Operators on equation structures (Iwasaki & Simon, "Causality and model
 * abstraction", Artificial Intelligence 67, 1994): equilibration (a fast
 * state settles: its rate equation becomes a balance equation), exogenization
 * (a slow state is held constant: its equation is dropped), and the
 * do-operator (an intervention fixes a variable; Pearl, Causality, 2000,
 * §3.2.1). Each is pure: it returns a new structure and what changed.
 */
import type { EquationId, VariableId } from '../model/types';
import { equationId } from './types';
import { cloneStructure, compareIds, derivativeOf, type EquationStructure } from './structure';
import { orderStructure } from './order';
import { causalOrder } from './causal';
import { bipartiteFromLists, hopcroftKarp } from './matching';

export interface StructureChange {
  operator: 'equilibrate' | 'exogenize' | 'hold';
  variable: VariableId;
  /** Equations taken out of the structure. */
  removed: EquationId[];
  /** Equations added (hold(x)). */
  added: EquationId[];
  /** Equations kept with other variables (a rate that became a balance equation). */
  changed: EquationId[];
  /** The intervention's value (hold only). */
  value?: number;
  /** Set when the equation to drop was a choice among several (x in a simultaneous block). */
  ambiguous?: { candidates: EquationId[] };
  /**
   * For a variable determined by relations or balance equations (not by its own formula or rate): other
   * equations that the intervention could replace instead while leaving the system determined, each with
   * different effects on the rest (Mooij, "Causal reasoning with bipartite graphical causal models", §5.1;
   * Blom, van Diepen & Mooij 2021). Empty or absent: the choice is forced.
   */
  alternatives?: EquationId[];
  /** What happened, in words. */
  note: string;
}

export interface OperatorResult {
  structure: EquationStructure;
  change: StructureChange;
}

/** `known`: the structure's variables, as a set where many are checked. */
function requireVariable(known: readonly VariableId[] | ReadonlySet<VariableId>, x: VariableId, op: string): void {
  if (!(Array.isArray(known) ? known.includes(x) : (known as ReadonlySet<VariableId>).has(x))) throw new Error(`${op}: no variable "${x}" in this structure`);
}

/**
 * Settle the dynamic state x: x' disappears, rate(x) becomes the balance
 * equation 0 = f(…) over the rate's other variables, and x becomes an
 * unknown. The re-ordering may let the balance equation determine a variable
 * other than x. Example: `equilibrate(s, 'x1')`.
 */
export function equilibrate(s: EquationStructure, x: VariableId): OperatorResult {
  return equilibrateAll(s, [x]);
}

/** Settle several dynamic states at once (the same result as one after another, in any order). */
export function equilibrateAll(s: EquationStructure, xs: VariableId[]): OperatorResult {
  const out = cloneStructure(s);
  const changed: EquationId[] = [];
  const known = new Set(out.variables);
  const byId = new Map(out.equations.map((e) => [e.id, e]));
  const settled = new Set<VariableId>();
  for (const x of [...new Set(xs)].sort(compareIds)) {
    requireVariable(known, x, 'equilibrate');
    const eq = out.derivatives[x];
    if (eq === undefined) throw new Error(`equilibrate: "${x}" is not a dynamic state, so it cannot settle`);
    const d = derivativeOf(x);
    const e = byId.get(eq);
    if (e) e.variables = e.variables.filter((v) => v !== d);
    delete out.derivatives[x];
    settled.add(x);
    changed.push(eq);
  }
  out.exogenous = out.exogenous.filter((v) => !settled.has(v));
  return {
    structure: out,
    change: {
      operator: 'equilibrate',
      variable: xs.length === 1 ? xs[0] : [...new Set(xs)].sort(compareIds).join(', '),
      removed: [],
      added: [],
      changed: changed.sort(compareIds),
      note: `${changed.length > 1 ? 'rate equations' : 'the rate equation'} ${changed.join(', ')} now ${changed.length > 1 ? 'act as balance equations' : 'acts as a balance equation'}`,
    },
  };
}

/**
 * The equation that determines x, to be dropped when x is fixed from
 * outside: its rate (dynamic state), its formula, or else the equation
 * paired with x in the current ordering; in a simultaneous block that is a
 * choice, recorded with its candidates.
 */
function equationToDrop(s: EquationStructure, x: VariableId): { eq: EquationId | null; candidates?: EquationId[]; upstream?: EquationId[] } {
  if (s.derivatives[x] !== undefined) return { eq: s.derivatives[x] };
  if (s.exogenous.includes(x)) return { eq: null };
  const ids = new Set(s.equations.map((e) => e.id));
  for (const own of [equationId.hold(x), equationId.formula(x), equationId.rate(x)]) if (ids.has(own)) return { eq: own };
  const ordered = orderStructure(s);
  const bi = ordered.causal.blockOf[x];
  if (bi === undefined) return { eq: null };
  const block = ordered.causal.blocks[bi];
  const eqVars = new Map(s.equations.map((e) => [e.id, e.variables]));
  // The equations of x's block and of every block upstream of it: only these can be replaced to fix x
  // (replacing any other leaves its own variable undetermined while x is fixed twice).
  const upstream: EquationId[] = [];
  {
    const seen = new Set<number>([bi]);
    const queue = [bi];
    while (queue.length > 0) {
      const b = ordered.causal.blocks[queue.pop()!];
      for (const e of b.equations) {
        upstream.push(e);
        for (const v of eqVars.get(e) ?? []) {
          const p = ordered.causal.blockOf[v];
          if (p !== undefined && !seen.has(p)) {
            seen.add(p);
            queue.push(p);
          }
        }
      }
    }
  }
  const containing = block.equations.filter((e) => eqVars.get(e)!.includes(x));
  if (block.variables.length <= 1) return { eq: containing[0] ?? Object.keys(ordered.causal.matching).find((e) => ordered.causal.matching[e] === x) ?? null, upstream };
  const pool = removableEquations(block, x, containing, eqVars);
  return { eq: pool[0] ?? null, candidates: pool, upstream };
}

/**
 * Of the equations of a simultaneous block that contain `x`, those whose removal leaves the rest
 * of the block able to determine the rest of its variables (a complete matching remains); all of
 * `containing` when none does.
 */
export function removableEquations(
  block: { variables: VariableId[]; equations: EquationId[] },
  x: VariableId,
  containing: EquationId[],
  eqVars: ReadonlyMap<EquationId, VariableId[]>,
): EquationId[] {
  const rest = block.variables.filter((v) => v !== x);
  const col = new Map(rest.map((v, i) => [v, i]));
  const candidates = containing.filter((drop) => {
    const lists = block.equations.filter((e) => e !== drop).map((e) => eqVars.get(e)!.filter((v) => col.has(v)).map((v) => col.get(v)!));
    return hopcroftKarp(bipartiteFromLists(rest.length, lists)).size === rest.length;
  });
  return candidates.length > 0 ? candidates : containing;
}

/** At most this many equations are tried as alternatives (each try is one ordering). */
const MAX_ALTERNATIVE_TRIES = 200;

/**
 * Implicit equations (relations, balance equations of settled states) upstream
 * of x, other than `chosen`, whose replacement by "x = constant" leaves every
 * part of the system well-determined — provided replacing `chosen` does.
 */
function alternativesFor(s: EquationStructure, x: VariableId, chosen: EquationId, upstream: EquationId[]): EquationId[] {
  const dynamicRates = new Set(Object.values(s.derivatives));
  const implicit = (id: EquationId) => !id.startsWith('formula(') && !id.startsWith('hold(') && !dynamicRates.has(id);
  const tryReplace = (id: EquationId): boolean => {
    const equations = s.equations.map((e) => (e.id === id ? { id, variables: [x] } : e));
    return causalOrder({ equations, exogenous: s.exogenous.filter((v) => v !== x), variables: s.variables }).blocks.every((b) => b.determination === 'well');
  };
  const others = [...new Set(upstream)].filter((id) => id !== chosen && implicit(id));
  if (others.length === 0 || others.length > MAX_ALTERNATIVE_TRIES || !tryReplace(chosen)) return [];
  return others.filter(tryReplace).sort(compareIds);
}

function dropFor(s: EquationStructure, x: VariableId): { out: EquationStructure; removed: EquationId[]; candidates?: EquationId[]; alternatives?: EquationId[] } {
  const { eq, candidates, upstream } = equationToDrop(s, x);
  const alternatives = eq !== null && upstream ? alternativesFor(s, x, eq, upstream) : undefined;
  const out = cloneStructure(s);
  if (eq !== null) out.equations = out.equations.filter((e) => e.id !== eq);
  delete out.derivatives[x];
  return { out, removed: eq !== null ? [eq] : [], candidates, alternatives };
}

/**
 * Hold x constant from outside (a slow state frozen over the study): the
 * equation that determined it is dropped and x becomes exogenous.
 * Example: `exogenize(s, 'x3')`.
 */
export function exogenize(s: EquationStructure, x: VariableId): OperatorResult {
  requireVariable(s.variables, x, 'exogenize');
  const { out, removed, candidates, alternatives } = dropFor(s, x);
  if (!out.exogenous.includes(x)) out.exogenous = [...out.exogenous, x].sort(compareIds);
  const change: StructureChange = {
    operator: 'exogenize',
    variable: x,
    removed,
    added: [],
    changed: [],
    note: removed.length ? `${x} is constant; equation ${removed[0]} is dropped` : `${x} was already given from outside`,
  };
  if (candidates && candidates.length > 1) change.ambiguous = { candidates };
  if (alternatives && alternatives.length > 0) change.alternatives = alternatives;
  return { structure: out, change };
}

/**
 * Exogenize several dynamic states at once (the slow states frozen over a
 * study): each one's rate equation is dropped and it stays given. One copy of
 * the structure instead of one per state; the same result as calling
 * `exogenize` for each in turn. Example: `exogenizeAll(s, ['x3', 'x4'])`.
 */
export function exogenizeAll(s: EquationStructure, xs: VariableId[]): OperatorResult {
  const states = [...new Set(xs)].sort(compareIds);
  const known = new Set(s.variables);
  for (const x of states) {
    requireVariable(known, x, 'exogenize');
    if (s.derivatives[x] === undefined) throw new Error(`exogenizeAll: "${x}" is not a dynamic state; use exogenize for it`);
  }
  const dropped = new Set(states.map((x) => s.derivatives[x]));
  const out = cloneStructure(s);
  out.equations = out.equations.filter((e) => !dropped.has(e.id));
  for (const x of states) delete out.derivatives[x];
  out.exogenous = [...new Set([...out.exogenous, ...states])].sort(compareIds);
  const removed = [...dropped].sort(compareIds);
  return {
    structure: out,
    change: {
      operator: 'exogenize',
      variable: states.join(', '),
      removed,
      added: [],
      changed: [],
      note: `${states.join(', ')} ${states.length > 1 ? 'are' : 'is'} constant; ${removed.length > 1 ? 'equations' : 'equation'} ${removed.join(', ')} ${removed.length > 1 ? 'are' : 'is'} dropped`,
    },
  };
}

/**
 * The do-operator: fix x at `value`. x is then determined by the equation
 * hold(x) alone; the equation that determined it before is dropped (a
 * state's rate, a derived variable's formula, or for a variable determined
 * by relations the one paired with it now — a choice when x is in a
 * simultaneous block). Example: `hold(s, 'x2', 0)`.
 */
export function hold(s: EquationStructure, x: VariableId, value: number): OperatorResult {
  requireVariable(s.variables, x, 'hold');
  const { out, removed, candidates, alternatives } = dropFor(s, x);
  const h = equationId.hold(x);
  out.exogenous = out.exogenous.filter((v) => v !== x);
  out.equations = [...out.equations.filter((e) => e.id !== h), { id: h, variables: [x] }].sort((a, b) => compareIds(a.id, b.id));
  const change: StructureChange = {
    operator: 'hold',
    variable: x,
    removed: removed.filter((e) => e !== h),
    added: [h],
    changed: [],
    value,
    note: removed.length && removed[0] !== h ? `${x} is held at ${value}; equation ${removed[0]} is dropped` : `${x} is held at ${value}`,
  };
  if (candidates && candidates.length > 1) {
    change.ambiguous = { candidates };
    change.note += ` (a choice: ${x} is determined together with others, and any of ${candidates.join(', ')} could be the one dropped)`;
  }
  if (alternatives && alternatives.length > 0) change.alternatives = alternatives;
  return { structure: out, change };
}
