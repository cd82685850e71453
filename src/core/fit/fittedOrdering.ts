/**
 * The causal ordering the fitted model gives at the data's interval, beside
 * the sketch's. A model is built from the fitted drift: each fitted state keeps
 * its id and label, its timescale is 1/|A_ii| when the 95 % interval of A_ii
 * lies below zero (it self-regulates), else it does not self-regulate and has
 * no timescale; a link j → i (integrating, the sign of the estimate, weight
 * |A_ij|) is present when the 95 % interval of A_ij excludes zero. The
 * ordering core (`orderingAt`) then orders both models at the same design
 * (the data's median interval and median span), so the two answers are read
 * the same way. Read the open fit: only there can a link missing from the
 * sketch show.
 */
import type { Link, Model, Variable, VariableId } from '../model/types';
import { orderingAt } from '../ordering/index';
import type { Ordering, StudyDesign } from '../ordering/types';

const Z95 = 1.959963984540054;

/** What the function needs of a continuous-time fit (a `CtFit` has it). */
export interface DriftWithErrors {
  states: VariableId[];
  drift: number[][];
  se: { drift: number[][] };
  spec?: { free: boolean[][] };
}

export interface FittedLink {
  from: VariableId;
  to: VariableId;
  estimate: number;
  low: number;
  high: number;
}

export interface FittedOrdering {
  design: { interval: number; window: number };
  sketch: Ordering;
  fitted: Ordering;
  /** The model built from the fitted drift (for drawing it like any sketch). */
  fittedModel: Model;
  /** Links the fitted model has (intervals excluding zero), self-regulation included as from = to. */
  links: FittedLink[];
}

/** The model the fitted drift implies: the links whose 95 % interval excludes zero. */
export function modelFromDrift(model: Model, fit: DriftWithErrors): { model: Model; links: FittedLink[] } {
  const n = fit.states.length;
  const links: FittedLink[] = [];
  const present = (i: number, j: number): FittedLink | null => {
    if (fit.spec && !fit.spec.free[i][j]) return null;
    const est = fit.drift[i][j], se = fit.se.drift[i][j];
    if (!Number.isFinite(est) || !Number.isFinite(se)) return null;
    const low = est - Z95 * se, high = est + Z95 * se;
    return low > 0 || high < 0 ? { from: fit.states[j], to: fit.states[i], estimate: est, low, high } : null;
  };
  const variables: Variable[] = fit.states.map((id, i) => {
    const v = model.variables.find((x) => x.id === id);
    const self = present(i, i);
    if (self) links.push(self);
    const regulates = self !== null && self.estimate < 0;
    return { id, ...(v?.label ? { label: v.label } : {}), kind: 'state' as const, initial: 0, selfRegulating: regulates, ...(regulates ? { timescale: 1 / -self.estimate } : {}) };
  });
  const modelLinks: Link[] = [];
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const l = present(i, j);
      if (!l) continue;
      links.push(l);
      modelLinks.push({ from: l.from, to: l.to, kind: 'integrating', sign: l.estimate > 0 ? '+' : '-', weight: Math.abs(l.estimate) });
    }
  const built: Model = {
    format: 'loopfold-model',
    version: 2,
    name: `${model.name} — fitted to data`,
    timeUnit: model.timeUnit,
    variables,
    links: modelLinks,
    ...(model.settings?.separation !== undefined ? { settings: { separation: model.settings.separation } } : {}),
  };
  return { model: built, links };
}

/**
 * The sketch's ordering and the fitted model's at one design.
 * Example: `fittedOrdering(model, openFit, { interval: 2.4, window: 330 })`.
 */
export function fittedOrdering(model: Model, fit: DriftWithErrors, design: { interval: number; window: number }): FittedOrdering {
  if (!(design.interval > 0) || !(design.window > 0)) throw new Error(`the data's interval and span must be positive numbers, not ${design.interval} and ${design.window}`);
  const { model: fittedModel, links } = modelFromDrift(model, fit);
  const d: StudyDesign = { interval: design.interval, window: design.window };
  return { design, sketch: orderingAt(model, d), fitted: orderingAt(fittedModel, d), fittedModel, links };
}
