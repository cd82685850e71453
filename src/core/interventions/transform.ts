/**
 * Interventions as model transforms, so that any simulator of models runs
 * the intervened system as it is: a held variable becomes an input fixed at
 * its value (a state held this way has its rate held at zero), the links into
 * it are cut, and a relation that determined it in the mechanism is dropped
 * (the do-operator replaces the variable's own mechanism: Pearl, Causality,
 * 2000, §3.2.1). The input model is never changed.
 */
import type { Model, Variable, VariableId } from '../model/types';
import { buildStructure, hold } from '../ordering/index';
import { compareIds } from '../ordering/structure';

/**
 * The model with `hold` applied. Example: `heldModel(model, { heater: 0 })`
 * turns the derived `heater` into an input of value 0.
 */
export function heldModel(model: Model, holds: Record<VariableId, number>): Model {
  const ids = Object.keys(holds).sort(compareIds);
  const known = new Set(model.variables.map((v) => v.id));
  for (const v of ids) if (!known.has(v)) throw new Error(`cannot hold "${v}": no such variable in this model`);
  // The relation each held variable loses: the one the mechanism pairs with it.
  const relationIds = new Set((model.relations ?? []).map((r) => r.id));
  let s = buildStructure(model).structure;
  const dropped = new Set<string>();
  for (const v of ids) {
    const r = hold(s, v, holds[v]);
    s = r.structure;
    for (const e of r.change.removed) if (relationIds.has(e)) dropped.add(e);
  }
  const held = new Set(ids);
  const variables: Variable[] = model.variables.map((v) => {
    if (!held.has(v.id)) return v;
    const out: Variable = { id: v.id, kind: 'input', value: holds[v.id] };
    if (v.label !== undefined) out.label = v.label;
    if (v.unit !== undefined) out.unit = v.unit;
    if (v.position !== undefined) out.position = v.position;
    out.note = `held at ${holds[v.id]} (was ${v.kind})`;
    return out;
  });
  const out: Model = { ...model, variables, links: model.links.filter((l) => !held.has(l.to)) };
  if (model.relations) out.relations = model.relations.filter((r) => !dropped.has(r.id));
  return out;
}

/** The model with one input set to a new value (a persistent step). */
export function steppedModel(model: Model, input: VariableId, value: number): Model {
  const v = model.variables.find((x) => x.id === input);
  if (!v) throw new Error(`no variable "${input}" in this model`);
  if (v.kind !== 'input') throw new Error(`${input} is a ${v.kind}, not an input: only inputs can be stepped`);
  return { ...model, variables: model.variables.map((x) => (x.id === input ? { ...x, value } : x)) };
}

/** The model with its states started at the given values (e.g. an equilibrium reached before an intervention). */
export function startedAt(model: Model, initial: Record<VariableId, number>): Model {
  return { ...model, variables: model.variables.map((x) => (x.kind === 'state' && initial[x.id] !== undefined ? { ...x, initial: initial[x.id] } : x)) };
}
