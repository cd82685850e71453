/**
 * What a variable is called where people read it: its label, or its id
 * when it has none. The core's explanations, the figures, the reports, the
 * command line and the app all name variables through here.
 */
import type { Model, Variable, VariableId } from '../core/model/types';

/** A variable's label, or its id. Example: `labelOf(model, 'soilWater')` → "Soil water". */
export function labelOf(model: Pick<Model, 'variables'>, id: VariableId): string {
  return model.variables.find((v) => v.id === id)?.label ?? id;
}

/** The unit a variable is measured in, if it has one. */
export function unitOf(model: Pick<Model, 'variables'>, id: VariableId): string | undefined {
  return model.variables.find((v) => v.id === id)?.unit;
}

/** `labelOf` for many lookups in a row (one map, built once). Example: `const name = labeller(model); name('x')`. */
export function labeller(model: Pick<Model, 'variables'>): (id: VariableId) => string {
  const byId = new Map<VariableId, Variable>(model.variables.map((v) => [v.id, v]));
  return (id) => byId.get(id)?.label ?? id;
}
