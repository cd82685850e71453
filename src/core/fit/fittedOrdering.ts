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
import { sketchDrift } from './compare';

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

/** One variable's place in an ordering: its role, its block's level, and what acts on it. */
export interface OrderingPlace {
  role: string;
  /** The level of its block (0: determined by nothing else in the model at this interval). */
  level: number;
  /** Determined together with these (a simultaneous block), itself left out. */
  together: VariableId[];
  /** What acts on it: within the instant (a balance or formula) or across time (through its rate). */
  from: { id: VariableId; kind: 'instantaneous' | 'integrating' }[];
}

export interface OrderingRow {
  variable: VariableId;
  sketch: OrderingPlace | null;
  /** Null for a variable of the sketch that is not in the fit (not measured, derived or an input). */
  fitted: OrderingPlace | null;
  /** For a fitted state: the role differs between the two. */
  roleDiffers: boolean;
  /** Fitted states acting on it in the sketch (through derived variables too) but not in the fitted model. */
  onlySketch: VariableId[];
  /** Fitted states acting on it in the fitted model but not in the sketch. */
  onlyFitted: VariableId[];
}

function placeOf(o: Ordering, v: VariableId): OrderingPlace | null {
  const role = o.roles[v];
  if (role === undefined) return null;
  const block = o.blocks.find((b) => b.variables.includes(v));
  const seen = new Map<VariableId, 'instantaneous' | 'integrating'>();
  for (const e of o.edges) if (e.to === v && e.from !== v && !seen.has(e.from)) seen.set(e.from, e.kind);
  return {
    role,
    level: block?.level ?? 0,
    together: block ? block.variables.filter((x) => x !== v) : [],
    from: [...seen].map(([id, kind]) => ({ id, kind })).sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)),
  };
}

/**
 * The two orderings row by row: every variable of the sketch and of the fit (by the sketch's level,
 * then id), each with its role, level and what acts on it in the sketch and in the fitted model. For
 * a fitted state, what the two disagree on: its role, and the fitted states acting on it in one model
 * and not the other, the sketch read through its derived variables (its drift among the fitted
 * states, `sketchDrift`), since the fit sees only those states.
 * Example: `orderingRows(model, fittedOrdering(model, open, design))`.
 */
export function orderingRows(model: Model, o: FittedOrdering): OrderingRow[] {
  const states = Object.keys(o.fitted.roles);
  let reduced: number[][] | null;
  try { reduced = sketchDrift(model, states); } catch { reduced = null; }
  const ids = [...new Set([...Object.keys(o.sketch.roles), ...states])];
  const rows = ids.map((variable): OrderingRow => {
    const sketch = placeOf(o.sketch, variable), fitted = placeOf(o.fitted, variable);
    const i = states.indexOf(variable);
    let onlySketch: VariableId[] = [], onlyFitted: VariableId[] = [];
    if (fitted && reduced && i >= 0) {
      const f = new Set(fitted.from.map((x) => x.id));
      const s = new Set(states.filter((id, j) => j !== i && reduced![i][j] !== 0));
      onlySketch = [...s].filter((id) => !f.has(id)).sort();
      onlyFitted = [...f].filter((id) => !s.has(id)).sort();
    }
    return { variable, sketch, fitted, roleDiffers: !!(sketch && fitted && sketch.role !== fitted.role), onlySketch, onlyFitted };
  });
  const key = (r: OrderingRow) => r.sketch?.level ?? r.fitted?.level ?? 0;
  return rows.sort((a, b) => key(a) - key(b) || (a.variable < b.variable ? -1 : a.variable > b.variable ? 1 : 0));
}

/** The sketch's ordering alone at the data's design (before a continuous-time fit), in the same rows. */
export function sketchOrderingRows(model: Model, design: { interval: number; window: number }): OrderingRow[] {
  if (!(design.interval > 0) || !(design.window > 0)) throw new Error(`the data's interval and span must be positive numbers, not ${design.interval} and ${design.window}`);
  const empty: Ordering = { roles: {}, blocks: [], edges: [], integrations: [], diagnostics: [] };
  const sketch = orderingAt(model, { interval: design.interval, window: design.window });
  return orderingRows(model, { design, sketch, fitted: empty, fittedModel: { ...model, variables: [], links: [] }, links: [] });
}
