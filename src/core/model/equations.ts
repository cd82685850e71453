/**
 * Model → equation structure: which variables each equation of the model
 * involves. With formulas the formulas decide; a sketch (no formula) reads
 * the links. The mechanism itself: every state is dynamic (given at each
 * instant, with its derivative determined by its rate equation).
 */
import type { EquationId, Model, Variable, VariableId } from './types';
import type { Diagnostic } from '../ordering/types';
import { equationId } from '../ordering/types';
import { parseExpression, parseRelation, type ExpressionError } from '../expr/parse';
import { compareIds, derivativeOf, type EquationStructure } from '../ordering/structure';

export interface ModelStructure {
  structure: EquationStructure;
  diagnostics: Diagnostic[];
}

function where(err: ExpressionError): string {
  return err.position !== undefined ? ` (at character ${err.position + 1})` : '';
}

function sortedUnique(xs: Iterable<string>): string[] {
  return [...new Set(xs)].sort(compareIds);
}

/**
 * The equation structure of a model's mechanism, with diagnostics about its
 * formulas and links. Example: a derived `y` with formula `a*x` gives the
 * equation `formula(y)` over {a, x, y}.
 */
export function buildStructure(model: Model): ModelStructure {
  const diagnostics: Diagnostic[] = [];
  const warn = (code: string, message: string, variables: VariableId[], equations: EquationId[] = [], level: 'error' | 'warning' = 'warning') =>
    diagnostics.push({ level, code, message, variables: sortedUnique(variables), equations: sortedUnique(equations) });
  const byId = new Map<VariableId, Variable>(model.variables.map((v) => [v.id, v]));
  const known = new Set(byId.keys());
  const incoming = new Map<VariableId, { from: VariableId; kind: 'instantaneous' | 'integrating' }[]>();
  for (const l of model.links) {
    if (!byId.has(l.from) || !byId.has(l.to) || l.from === l.to) continue; // the file check reports these
    let list = incoming.get(l.to);
    if (!list) incoming.set(l.to, (list = []));
    list.push({ from: l.from, kind: l.kind });
  }

  // A derived variable with neither a formula nor incoming links, named in a
  // relation, is determined by the relations alone: it has no equation of its own.
  const inRelation = new Set<VariableId>();
  for (const r of model.relations ?? []) {
    const parsed = parseRelation(r.equation);
    if (parsed.ok) for (const s of parsed.symbols) inRelation.add(s);
  }

  const equations: { id: EquationId; variables: VariableId[] }[] = [];
  const exogenous: VariableId[] = [];
  const derivatives: Record<VariableId, EquationId> = {};

  /** Symbols of a formula, with its errors reported; null when it cannot be read. */
  const symbolsOf = (text: string, owner: VariableId, eq: EquationId, what: string, relation = false): string[] | null => {
    const parsed = relation ? parseRelation(text) : parseExpression(text);
    if (!parsed.ok) {
      warn('formula-error', `${what}: ${parsed.error.message}${where(parsed.error)}`, owner ? [owner] : [], [eq], 'error');
      return null;
    }
    const unknown = parsed.symbols.filter((s) => !known.has(s));
    if (unknown.length > 0)
      warn(
        'unknown-name',
        `${what} uses ${unknown.map((u) => `"${u}"`).join(', ')}, which ${unknown.length > 1 ? 'are not variables' : 'is not a variable'} of this model: add ${unknown.length > 1 ? 'them' : 'it'} or correct the spelling`,
        owner ? [owner] : [],
        [eq],
        'error',
      );
    return parsed.symbols.filter((s) => known.has(s));
  };

  /** The names a written formula or rate uses; null when there is none, or (with a note) when it cannot be read and the links stand in. */
  const written = (text: string | undefined, id: VariableId, eq: EquationId, what: 'formula' | 'rate'): string[] | null => {
    if (text === undefined) return null;
    const symbols = symbolsOf(text, id, eq, `the ${what} of ${id}`);
    if (symbols === null) warn('formula-ignored', `until the ${what} of ${id} is fixed, its links are used instead`, [id], [eq]);
    return symbols;
  };

  for (const v of [...model.variables].sort((a, b) => compareIds(a.id, b.id))) {
    const links = incoming.get(v.id) ?? [];
    if (v.kind === 'input') {
      exogenous.push(v.id);
      if (links.length > 0)
        warn('link-into-input', `${links.length > 1 ? 'links' : 'the link'} from ${links.map((l) => l.from).sort(compareIds).join(', ')} into the input ${v.id} ${links.length > 1 ? 'are' : 'is'} ignored: an input is set from outside; make ${v.id} derived or a state if it depends on them`, [v.id, ...links.map((l) => l.from)]);
      continue;
    }
    if (v.kind === 'derived') {
      const eq = equationId.formula(v.id);
      const symbols = written(v.formula, v.id, eq, 'formula');
      const inst = links.filter((l) => l.kind === 'instantaneous');
      const integ = links.filter((l) => l.kind === 'integrating');
      if (symbols !== null) {
        if (symbols.includes(v.id))
          warn('self-reference', `the formula of ${v.id} uses ${v.id} itself: a derived variable cannot be defined by itself; make ${v.id} a state with a rate, or write the equation as a relation`, [v.id], [eq], 'error');
        for (const l of links)
          if (!symbols.includes(l.from))
            warn('link-not-in-formula', `the link ${l.from} → ${v.id} is drawn, but the formula of ${v.id} does not use ${l.from}: the formula wins; remove the link or add ${l.from} to the formula`, [l.from, v.id], [eq]);
        for (const l of integ)
          if (symbols.includes(l.from))
            warn('link-kind', `the link ${l.from} → ${v.id} is drawn integrating, but ${v.id} is derived and follows its formula at once: mark the link instantaneous, or make ${v.id} a state`, [l.from, v.id], [eq]);
        equations.push({ id: eq, variables: sortedUnique([v.id, ...symbols]) });
      } else if (v.formula === undefined && links.length === 0 && inRelation.has(v.id)) {
        // Determined by the relations that name it (see inRelation above).
      } else {
        if (inst.length > 0 && integ.length > 0)
          warn('mixed-links', `the links into ${v.id} are of mixed kind (instantaneous from ${inst.map((l) => l.from).sort(compareIds).join(', ')}; integrating from ${integ.map((l) => l.from).sort(compareIds).join(', ')}): make ${v.id} a state, or mark the links instantaneous; the integrating ones are left out for now`, [v.id, ...links.map((l) => l.from)], [eq]);
        else if (integ.length > 0)
          warn('link-kind', `${integ.length > 1 ? 'the links' : 'the link'} ${integ.map((l) => `${l.from} → ${v.id}`).join(', ')} ${integ.length > 1 ? 'are' : 'is'} integrating, but ${v.id} is derived: make ${v.id} a state, or mark the links instantaneous; ${integ.length > 1 ? 'they are' : 'it is'} left out for now`, [v.id, ...integ.map((l) => l.from)], [eq]);
        equations.push({ id: eq, variables: sortedUnique([v.id, ...inst.map((l) => l.from)]) });
      }
      continue;
    }
    // A state.
    const eq = equationId.rate(v.id);
    const d = derivativeOf(v.id);
    exogenous.push(v.id);
    derivatives[v.id] = eq;
    const symbols = written(v.rate, v.id, eq, 'rate');
    const inst = links.filter((l) => l.kind === 'instantaneous');
    const integ = links.filter((l) => l.kind === 'integrating');
    for (const l of inst)
      warn('link-kind', `the link ${l.from} → ${v.id} is drawn instantaneous, but ${v.id} is a state, which changes only through its rate: mark the link integrating, or make ${v.id} derived${symbols === null ? '; it is left out for now' : ''}`, [l.from, v.id], [eq]);
    if (symbols !== null) {
      for (const l of links)
        if (!symbols.includes(l.from))
          warn('link-not-in-formula', `the link ${l.from} → ${v.id} is drawn, but the rate of ${v.id} does not use ${l.from}: the rate wins; remove the link or add ${l.from} to the rate`, [l.from, v.id], [eq]);
      const selfIn = symbols.includes(v.id);
      if (v.selfRegulating === true && !selfIn)
        warn('self-regulation', `${v.id} is marked self-regulating, but its rate does not use ${v.id}: the rate wins; add ${v.id} to the rate or clear the mark`, [v.id], [eq]);
      if (v.selfRegulating === false && selfIn)
        warn('self-regulation', `${v.id} is marked not self-regulating, but its rate uses ${v.id}: the rate wins; clear the mark or take ${v.id} out of the rate`, [v.id], [eq]);
      equations.push({ id: eq, variables: sortedUnique([d, ...symbols]) });
    } else {
      const vs = [d, ...integ.map((l) => l.from)];
      if (v.selfRegulating !== false) vs.push(v.id);
      equations.push({ id: eq, variables: sortedUnique(vs) });
    }
  }
  for (const r of [...(model.relations ?? [])].sort((a, b) => compareIds(a.id, b.id))) {
    const symbols = symbolsOf(r.equation, '', r.id, `relation ${r.id}`, true);
    if (symbols === null) {
      warn('relation-ignored', `relation ${r.id} is left out until it can be read`, [], [r.id]);
      continue;
    }
    equations.push({ id: r.id, variables: symbols });
  }
  return {
    structure: {
      equations,
      exogenous: exogenous.sort(compareIds),
      variables: model.variables.map((v) => v.id).sort(compareIds),
      derivatives,
    },
    diagnostics,
  };
}
