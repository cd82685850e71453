/**
 * Model → numeric system: one compiled function and its partial derivatives
 * for every equation of the model, over one value array with a slot per
 * variable (in the order of model.variables).
 *
 * Equations follow the same reading as the equation structure
 * (src/core/model/equations.ts), with the same ids:
 * - `formula(v)` of a derived variable: v = f(…); a sketch without a formula
 *   reads v = Σ sign·weight·source over its instantaneous links;
 * - `rate(x)` of a state: dx/dt = g(…); a sketch reads
 *   dx/dt = (Σ sign·weight·source − x)/τ over its integrating links, or
 *   Σ sign·weight·source / τ when the state is marked not self-regulating,
 *   with τ its timescale (default 1 model time unit, with a warning);
 *   a link without a strength shares 0.8 with the other links into its
 *   target (src/core/model/strength.ts), so every loop of an unweighted
 *   sketch has a gain below one;
 * - a relation `lhs = rhs`: lhs − rhs = 0.
 * Inputs are held at `value` (default 0); states start at `initial` (default 0).
 */
import type { EquationId, Model, VariableId, VariableKind } from '../model/types';
import { readTimescale } from '../model/timescale';
import { linkStrengths, signedStrength } from '../model/strength';
import { parseExpression, parseRelation } from '../expr/parse';
import { compileExpression, type CompiledExpression } from '../expr/compile';
import { partials } from '../expr/derivative';
import { equationId, type Diagnostic } from '../ordering/types';

export interface NumericEquation {
  id: EquationId;
  kind: 'formula' | 'rate' | 'relation';
  /** The derived variable (formula) or state (rate) the equation belongs to. */
  variable?: VariableId;
  /** formula: f(values); rate: dx/dt; relation: lhs − rhs. */
  value: CompiledExpression;
  /** ∂value/∂(slot), for every slot the equation reads. */
  partials: { slot: number; at: CompiledExpression }[];
  /** Read from the links of a sketch (not from a formula). */
  fromLinks: boolean;
}

export interface StateTimescale {
  /** In the model's time unit. */
  value: number;
  /** Whether the modeller gave it (false: the default of 1). */
  given: boolean;
}

export interface NumericSystem {
  ids: VariableId[];
  kinds: VariableKind[];
  slot: ReadonlyMap<VariableId, number>;
  inputs: VariableId[];
  states: VariableId[];
  derived: VariableId[];
  /** Inputs at their values, states at their initial values, derived at 0. */
  start: Float64Array;
  equations: NumericEquation[];
  byId: ReadonlyMap<EquationId, NumericEquation>;
  timescales: Record<VariableId, StateTimescale>;
  /** Problems found while reading the formulas; errors make the system unusable. */
  diagnostics: Diagnostic[];
}

/** Residual of an equation at `v`: formula v − f, rate g, relation lhs − rhs. */
export function residual(system: NumericSystem, eq: NumericEquation, v: Float64Array): number {
  if (eq.kind === 'formula') return v[system.slot.get(eq.variable!)!] - eq.value(v);
  return eq.value(v);
}

/** ∂residual/∂(slot) for every slot the equation involves (own slot included for formulas). */
export function residualGradient(system: NumericSystem, eq: NumericEquation, v: Float64Array): Map<number, number> {
  const g = new Map<number, number>();
  for (const p of eq.partials) g.set(p.slot, (g.get(p.slot) ?? 0) - (eq.kind === 'formula' ? p.at(v) : -p.at(v)));
  if (eq.kind === 'formula') {
    const s = system.slot.get(eq.variable!)!;
    g.set(s, (g.get(s) ?? 0) + 1);
  }
  return g;
}

function linearCombination(terms: { slot: number; coef: number }[], selfSlot: number | null, tau: number): { value: CompiledExpression; partials: NumericEquation['partials'] } {
  const slots = Int32Array.from(terms.map((t) => t.slot));
  const coefs = Float64Array.from(terms.map((t) => t.coef));
  const inv = 1 / tau;
  const value: CompiledExpression = (v) => {
    let s = 0;
    for (let i = 0; i < slots.length; i++) s += coefs[i] * v[slots[i]];
    if (selfSlot !== null) s -= v[selfSlot];
    return s * inv;
  };
  const bySlot = new Map<number, number>();
  for (const t of terms) bySlot.set(t.slot, (bySlot.get(t.slot) ?? 0) + t.coef * inv);
  if (selfSlot !== null) bySlot.set(selfSlot, (bySlot.get(selfSlot) ?? 0) - inv);
  return { value, partials: [...bySlot].map(([slot, c]) => ({ slot, at: () => c })) };
}

/**
 * Build the numeric system of a model.
 * Example: `buildNumericSystem(model).equations.find((e) => e.id === 'rate(stress)')`.
 */
export function buildNumericSystem(model: Model): NumericSystem {
  const diagnostics: Diagnostic[] = [];
  const ids = model.variables.map((v) => v.id);
  const slot = new Map<VariableId, number>(ids.map((id, i) => [id, i]));
  const known = new Set(ids);
  const start = new Float64Array(ids.length);
  const timescales: Record<VariableId, StateTimescale> = {};
  const equations: NumericEquation[] = [];
  const incoming = new Map<VariableId, { slot: number; coef: number; kind: string }[]>();
  const strengths = linkStrengths(model);
  for (const [k, l] of model.links.entries()) {
    if (!known.has(l.from) || !known.has(l.to) || l.from === l.to) continue;
    const list = incoming.get(l.to) ?? [];
    list.push({ slot: slot.get(l.from)!, coef: signedStrength(l, strengths[k]), kind: l.kind });
    incoming.set(l.to, list);
  }
  const inRelation = new Set<VariableId>();
  for (const r of model.relations ?? []) {
    const p = parseRelation(r.equation);
    if (p.ok) for (const s of p.symbols) inRelation.add(s);
  }
  const err = (code: string, message: string, variables: VariableId[], eqs: EquationId[]): void => {
    diagnostics.push({ level: 'error', code, message, variables, equations: eqs });
  };
  const fromText = (text: string, owner: VariableId | undefined, id: EquationId, what: string, relation: boolean) => {
    const p = relation ? parseRelation(text, known) : parseExpression(text, known);
    if (!p.ok) {
      err('formula-error', `${what}: ${p.error.message}`, owner ? [owner] : [], [id]);
      return null;
    }
    const value = compileExpression(p.node, slot);
    return { value, partials: partials(p.node, p.symbols, slot, value).map((d) => ({ slot: d.slot, at: d.at })) };
  };

  for (const v of model.variables) {
    const i = slot.get(v.id)!;
    const links = incoming.get(v.id) ?? [];
    if (v.kind === 'input') {
      start[i] = v.value ?? 0;
      continue;
    }
    if (v.kind === 'derived') {
      const id = equationId.formula(v.id);
      const compiled = v.formula !== undefined ? fromText(v.formula, v.id, id, `the formula of ${v.id}`, false) : null;
      if (compiled) equations.push({ id, kind: 'formula', variable: v.id, ...compiled, fromLinks: false });
      else if (v.formula === undefined && links.length === 0 && inRelation.has(v.id)) {
        // Determined by the relations that name it.
      } else {
        const lin = linearCombination(links.filter((l) => l.kind === 'instantaneous'), null, 1);
        equations.push({ id, kind: 'formula', variable: v.id, ...lin, fromLinks: true });
      }
      continue;
    }
    // A state.
    start[i] = v.initial ?? 0;
    let tau = 1;
    let given = false;
    if (v.timescale !== undefined) {
      // A range counts at its geometric mean √(low·high).
      const d = readTimescale(v.timescale, model.timeUnit);
      if (d.ok) { tau = d.point; given = true; }
      else err('timescale', `the timescale of ${v.id}: ${d.message}`, [v.id], []);
    }
    timescales[v.id] = { value: tau, given };
    const id = equationId.rate(v.id);
    const compiled = v.rate !== undefined ? fromText(v.rate, v.id, id, `the rate of ${v.id}`, false) : null;
    if (compiled) equations.push({ id, kind: 'rate', variable: v.id, ...compiled, fromLinks: false });
    else {
      if (!given && v.rate === undefined)
        diagnostics.push({ level: 'warning', code: 'default-timescale', message: `${v.id} has no timescale: 1 ${model.timeUnit} is assumed for its sketched rate; give ${v.id} a timescale`, variables: [v.id], equations: [id] });
      const lin = linearCombination(links.filter((l) => l.kind === 'integrating'), v.selfRegulating === false ? null : i, tau);
      equations.push({ id, kind: 'rate', variable: v.id, ...lin, fromLinks: true });
    }
  }
  for (const r of model.relations ?? []) {
    const compiled = fromText(r.equation, undefined, r.id, `relation ${r.id}`, true);
    if (compiled) equations.push({ id: r.id, kind: 'relation', ...compiled, fromLinks: false });
  }
  const kinds = model.variables.map((v) => v.kind);
  return {
    ids,
    kinds,
    slot,
    inputs: ids.filter((_, k) => kinds[k] === 'input'),
    states: ids.filter((_, k) => kinds[k] === 'state'),
    derived: ids.filter((_, k) => kinds[k] === 'derived'),
    start,
    equations,
    byId: new Map(equations.map((e) => [e.id, e])),
    timescales,
    diagnostics,
  };
}

/** The first error of a system as one line, or null when it is usable. */
export function systemError(system: NumericSystem): string | null {
  const e = system.diagnostics.find((d) => d.level === 'error');
  return e ? e.message : null;
}

/** Apply interventions / overrides: a copy of the start values with some variables set. */
export function withValues(system: NumericSystem, values: Record<VariableId, number>): Float64Array {
  const v = system.start.slice();
  for (const [id, x] of Object.entries(values)) {
    const s = system.slot.get(id);
    if (s !== undefined) v[s] = x;
  }
  return v;
}
