/**
 * Interventions at a chosen timescale: the do-operator at a sampling
 * interval, the commutation check, perfect adaptation.
 */
import type { Model, VariableId } from '../model/types';
import type { Diagnostic, StudyDesign } from '../ordering/types';
import { buildStructure, rolesAt } from '../ordering/index';
import { compareIds } from '../ordering/structure';
import { commutation, type Commutation } from './commute';

export * from './commute';
export * from './adaptation';
export * from './transform';
export * from './effects';

/** A bad intervention, worded for the modeller (the command line shows it as the one-line reason). */
export class InterventionError extends Error {}

/** Check a hold against the model: every variable exists and every value is a finite number. */
export function checkHold(model: Model, hold: Record<VariableId, number> | undefined): Record<VariableId, number> {
  const entries = Object.entries(hold ?? {});
  if (entries.length === 0) throw new InterventionError('name at least one variable to hold, e.g. x=3');
  const known = new Set(model.variables.map((v) => v.id));
  for (const [v, value] of entries) {
    if (!known.has(v)) throw new InterventionError(`cannot hold "${v}": no such variable in this model`);
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new InterventionError(`cannot hold ${v} at ${String(value)}: the value must be a finite number`);
  }
  return Object.fromEntries(entries.sort((a, b) => compareIds(a[0], b[0])));
}

/**
 * The commutation check of a model at a study design; `design.hold` names the intervention.
 * Example: `commutationAt(model, { interval: 60, hold: { heater: 0 } })`.
 */
export function commutationAt(model: Model, design: StudyDesign): Commutation {
  const hold = checkHold(model, design.hold);
  const built = buildStructure(model);
  const r = rolesAt(model, { ...design, hold: undefined });
  const ids = Object.keys(r.roles).sort(compareIds);
  const plan = { settle: ids.filter((x) => r.roles[x] === 'settled'), freeze: ids.filter((x) => r.roles[x] === 'frozen') };
  const c = commutation({ mechanism: built.structure, plan, hold, roles: r.roles });
  const extra: Diagnostic[] = [...built.diagnostics, ...r.diagnostics];
  c.holdThenSettle.diagnostics.unshift(...extra);
  c.settleThenHold.diagnostics.unshift(...extra.map((d) => ({ ...d })));
  return c;
}
