/**
 * The ordering at the data's interval: each state's role (settled within an
 * interval, dynamic, or frozen over the study) in the sketch, beside the role
 * the fitted drift gives it. The sketch's roles are the ordering core's
 * (`rolesAt`); a fitted state's role follows the same rule with its own
 * fitted rate as timescale, τ = 1/|A_ii| (settled when Δ ≥ kτ, frozen when
 * τ ≥ kW, with the model's separation k): a reading of the diagonal only,
 * which says so beside it.
 */
import { DEFAULT_SEPARATION, type Model, type VariableId } from '../model/types';
import { rolesAt } from '../ordering/timescales';
import type { Role } from '../ordering/types';

export interface DataRole {
  state: VariableId;
  sketch: Role;
  /** From the fitted drift's diagonal, or null without a fit. */
  fitted: Role | null;
  /** 1/|A_ii| of the fitted drift (Infinity when A_ii ≥ 0). */
  fittedTimescale: number | null;
}

/** Example: `dataRoles(model, ['stress', 'mood'], fit.drift, 2.9, 330)`. */
export function dataRoles(model: Model, states: readonly VariableId[], fittedDrift: readonly (readonly number[])[] | null, interval: number, window: number): DataRole[] {
  const sketch = rolesAt(model, { interval, window }).roles;
  const k = typeof model.settings?.separation === 'number' && model.settings.separation >= 1 ? model.settings.separation : DEFAULT_SEPARATION;
  return states.map((state, i) => {
    if (!fittedDrift) return { state, sketch: sketch[state], fitted: null, fittedTimescale: null };
    const a = fittedDrift[i][i];
    const tau = a < 0 ? 1 / -a : Infinity;
    const fitted: Role = interval >= k * tau ? 'settled' : tau >= k * window ? 'frozen' : 'state';
    return { state, sketch: sketch[state], fitted, fittedTimescale: tau };
  });
}

/** The usual span of the data: the median over persons of last minus first occasion time. */
export function medianSpan(persons: readonly { time: ArrayLike<number> }[]): number {
  const spans = persons.filter((p) => p.time.length > 0).map((p) => p.time[p.time.length - 1] - p.time[0]).sort((a, b) => a - b);
  return spans.length ? spans[spans.length >> 1] : NaN;
}
