/**
 * Linearization of the mechanism at a point: the effective drift of the
 * states with the algebraic variables (derived and relation-determined)
 * eliminated, A = G_x − G_z R_z⁻¹ R_x, where g are the rates and r the
 * algebraic residuals (formulas v − f, relations lhs − rhs).
 */
import type { VariableId } from '../model/types';
import { luFactor, luSolveMat, zeros, type Mat } from './dense';
import { residualGradient, type NumericSystem } from './system';

export type Linearization =
  | { ok: true; states: VariableId[]; drift: Mat; algebraic: VariableId[] }
  | { ok: false; reason: string };

export function linearize(system: NumericSystem, point: Float64Array): Linearization {
  const states = system.states;
  const n = states.length;
  const algebraic = system.ids.filter((_, i) => system.kinds[i] === 'derived');
  const algEqs = system.equations.filter((e) => e.kind !== 'rate');
  const m = algebraic.length;
  if (algEqs.length !== m)
    return { ok: false, reason: `the algebraic part has ${algEqs.length} equation${algEqs.length === 1 ? '' : 's'} (formulas and relations) for ${m} derived variable${m === 1 ? '' : 's'}: it does not determine them` };
  const sx = new Map(states.map((s, i) => [system.slot.get(s)!, i]));
  const sz = new Map(algebraic.map((z, i) => [system.slot.get(z)!, i]));
  const Gx = zeros(n, n), Gz = zeros(n, m), Rx = zeros(m, n), Rz = zeros(m, m);
  for (const [i, x] of states.entries()) {
    const eq = system.byId.get(`rate(${x})`);
    if (!eq) return { ok: false, reason: `the rate of ${x} could not be read` };
    for (const p of eq.partials) {
      const d = p.at(point);
      const a = sx.get(p.slot), b = sz.get(p.slot);
      if (a !== undefined) Gx.data[i * n + a] += d;
      if (b !== undefined) Gz.data[i * m + b] += d;
    }
  }
  for (const [i, eq] of algEqs.entries()) {
    for (const [slot, d] of residualGradient(system, eq, point)) {
      const a = sx.get(slot), b = sz.get(slot);
      if (a !== undefined) Rx.data[i * n + a] += d;
      if (b !== undefined) Rz.data[i * m + b] += d;
    }
  }
  if (m === 0) return { ok: true, states, drift: Gx, algebraic };
  const lu = luFactor(Rz);
  if (lu.singular || lu.pivotRatio < 1e-14)
    return { ok: false, reason: `the formulas and relations do not determine ${algebraic.join(', ')} at this point (their Jacobian is singular)` };
  const dzdx = luSolveMat(lu, Rx); // R_z⁻¹ R_x
  const A = zeros(n, n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let s = Gx.data[i * n + j];
      for (let k = 0; k < m; k++) s -= Gz.data[i * m + k] * dzdx.data[k * n + j];
      A.data[i * n + j] = s;
    }
  for (const v of A.data) if (!Number.isFinite(v)) return { ok: false, reason: 'the linearized drift has entries that are not finite numbers at this point' };
  return { ok: true, states, drift: A, algebraic };
}
