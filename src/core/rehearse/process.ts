/**
 * The linear process a study of a model samples, and how persons differ.
 *
 * The drift is the model's linearization at its equilibrium (exact for a sketch). Person
 * differences enter to first order: an input whose value varies across persons with SD σ
 * moves the person's equilibrium by (∂μ/∂u)·δ; a link whose strength varies with SD σ changes
 * the drift by (∂A/∂w)·δ (exact for a sketch, whose drift is linear in its strengths).
 */
import type { Model, VariableId } from '../model/types';
import { driftAtEquilibrium, solveEquilibrium } from '../numeric/index';
import { axpby, scale, type Mat } from '../numeric/dense';
import type { PersonProcess } from './simulate';
import type { Random } from '../stats/random';

export interface StudyProcess {
  states: VariableId[];
  base: PersonProcess;
  /** Inputs that vary across persons: SD and the equilibrium's change per unit of the input. */
  inputs: { id: VariableId; sd: number; meanPerUnit: Float64Array }[];
  /** Links that vary across persons: SD and the drift's change per unit of strength. */
  links: { from: VariableId; to: VariableId; sd: number; driftPerUnit: Mat }[];
  warnings: string[];
}

/** Process noise of a state: its own `noise`, else the file's older per-model table, else 1. */
export function noiseOf(model: Model, id: VariableId): number {
  const v = model.variables.find((x) => x.id === id);
  return v?.noise ?? model.settings?.noise?.[id] ?? 1;
}

/** Example: `studyProcess(model).base.drift` is the model's drift at equilibrium. */
export function studyProcess(model: Model): StudyProcess {
  const d = driftAtEquilibrium(model);
  if (!d.ok) throw new Error(d.reason);
  const states = d.states;
  const noise = states.map((s) => noiseOf(model, s));
  const badNoise = states.find((_, i) => !(noise[i] >= 0) || !Number.isFinite(noise[i]));
  if (badNoise) throw new Error(`the process noise of "${badNoise}" must be a non-negative number`);
  const mean = Float64Array.from(states, (s) => d.equilibrium.values[s] ?? 0);
  const inputs: StudyProcess['inputs'] = [];
  for (const v of model.variables) {
    if (v.kind !== 'input' || !(v.personSD && v.personSD > 0)) continue;
    const h = Math.max(1e-3, Math.abs(v.value ?? 0) * 1e-3);
    const at = (x: number) => solveEquilibrium({ ...model, variables: model.variables.map((w) => (w.id === v.id ? { ...w, value: x } : w)) });
    const up = at((v.value ?? 0) + h), down = at((v.value ?? 0) - h);
    if (!up.ok || !down.ok) throw new Error(`the equilibrium cannot be found when "${v.label ?? v.id}" differs between persons`);
    inputs.push({ id: v.id, sd: v.personSD, meanPerUnit: Float64Array.from(states, (s) => (up.values[s] - down.values[s]) / (2 * h)) });
  }
  const links: StudyProcess['links'] = [];
  model.links.forEach((l, li) => {
    if (!(l.personSD && l.personSD > 0)) return;
    const w = l.weight ?? 1;
    const h = Math.max(1e-4, Math.abs(w) * 1e-4);
    const at = (x: number) => driftAtEquilibrium({ ...model, links: model.links.map((m, mi) => (mi === li ? { ...m, weight: x } : m)) });
    const up = at(w + h), down = at(w - h);
    if (!up.ok || !down.ok) throw new Error(`the drift cannot be found when the strength of ${l.from} → ${l.to} differs between persons`);
    links.push({ from: l.from, to: l.to, sd: l.personSD, driftPerUnit: scale(axpby(1, up.drift, -1, down.drift), 1 / (2 * h)) });
  });
  return { states, base: { drift: d.drift, noise: Float64Array.from(noise), mean }, inputs, links, warnings: d.warnings };
}

/** Draw one person's process: the base with each person difference drawn from its normal distribution. */
export function drawPerson(p: StudyProcess, rng: Random): PersonProcess {
  if (p.inputs.length === 0 && p.links.length === 0) return p.base;
  const mean = Float64Array.from(p.base.mean);
  for (const u of p.inputs) {
    const delta = u.sd * rng.normal();
    for (let i = 0; i < mean.length; i++) mean[i] += delta * u.meanPerUnit[i];
  }
  let drift = p.base.drift;
  for (const l of p.links) drift = axpby(1, drift, l.sd * rng.normal(), l.driftPerUnit);
  return { drift, noise: p.base.noise, mean };
}
