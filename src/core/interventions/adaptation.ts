/**
 * Perfect adaptation found from causal orderings (Blom & Mooij, "Causality
 * and independence in perfectly adapted dynamical systems", Journal of
 * Causal Inference 11(1), 2023, doi 10.1515/jci-2021-0005; arXiv 2101.11885):
 * an input u reaches x in the ordering of the running mechanism (within the
 * instant and across time), but not in the ordering of the equilibrium model
 * (every state settled). Then a persistent change of u moves x for a while,
 * and x returns to the same equilibrium value. The paper gives its graphical
 * conditions as sufficient ones; the exact form used here is reconstructed
 * from memory. It finds structural adaptation only (not adaptation that
 * comes from particular parameter values), and with formulas
 * `confirmAdaptation` checks each pair by simulation.
 */
import type { Model, VariableId } from '../model/types';
import type { Ordering } from '../ordering/types';
import { orderingAt } from '../ordering/index';
import { compareIds } from '../ordering/structure';

export interface Adapted {
  variable: VariableId;
  input: VariableId;
}

export interface AdaptationResult {
  adapted: Adapted[];
  /** Variables whose equilibrium is not well-determined: no equilibrium value to return to, so not judged. */
  unjudged: VariableId[];
  dynamic: Ordering;
  equilibrium: Ordering;
}

/** Variables reachable from `from` along the ordering's edges (simultaneous blocks count as one). */
export function reachable(o: Ordering, from: VariableId, kinds: ReadonlySet<string> = new Set(['instantaneous', 'integrating'])): Set<VariableId> {
  const next = new Map<VariableId, VariableId[]>();
  const add = (a: VariableId, b: VariableId) => {
    let l = next.get(a);
    if (!l) next.set(a, (l = []));
    l.push(b);
  };
  for (const e of o.edges) if (kinds.has(e.kind)) add(e.from, e.to);
  for (const b of o.blocks) if (b.variables.length > 1) for (const a of b.variables) for (const c of b.variables) if (a !== c) add(a, c);
  const seen = new Set<VariableId>([from]);
  const stack = [from];
  while (stack.length) for (const w of next.get(stack.pop()!) ?? []) if (!seen.has(w)) { seen.add(w); stack.push(w); }
  seen.delete(from);
  return seen;
}

/** Compare two orderings of one model: the pairs (x, u) that reach in the first and not in the second. */
export function adaptedPairs(dynamic: Ordering, equilibrium: Ordering, inputs: VariableId[]): { adapted: Adapted[]; unjudged: VariableId[] } {
  const unjudged = [...new Set(equilibrium.blocks.filter((b) => b.determination !== 'well').flatMap((b) => b.variables))].sort(compareIds);
  const skip = new Set([...unjudged, ...inputs]);
  const adapted: Adapted[] = [];
  for (const u of [...inputs].sort(compareIds)) {
    const inDyn = reachable(dynamic, u);
    const inEq = reachable(equilibrium, u);
    for (const x of [...inDyn].sort(compareIds)) if (!skip.has(x) && !inEq.has(x)) adapted.push({ variable: x, input: u });
  }
  adapted.sort((a, b) => compareIds(a.variable, b.variable) || compareIds(a.input, b.input));
  return { adapted, unjudged };
}

/**
 * The variables of a model that perfectly adapt to an input.
 * Example: a heater driven by the integrated temperature error makes the
 * air temperature adapt to the outside temperature.
 */
export function perfectAdaptation(model: Model): AdaptationResult {
  const dynamic = orderingAt(model, {});
  const equilibrium = orderingAt(model, { settleAll: true });
  const inputs = model.variables.filter((v) => v.kind === 'input').map((v) => v.id);
  return { ...adaptedPairs(dynamic, equilibrium, inputs), dynamic, equilibrium };
}
