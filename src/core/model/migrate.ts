/**
 * Migration of model files to the current version (2).
 *
 * Version 1 → 2 keeps the meaning of the file:
 * - `settings.noise[x]` becomes state x's own `noise`;
 * - `settings.samples` becomes `study.length` (a number of samples), with the
 *   interval the app opened such a file at (the middle of its interval
 *   control) and prompts at that fixed interval;
 * - everything else is copied as it is (a variable's `timescale` unchanged,
 *   whatever form it takes).
 * A file without `settings.samples` gets no study: it opens at the same
 * default design as before.
 */
import { defaultInterval } from '../study/design';
import type { Model, ModelSettings } from './types';

/**
 * A version-1 model (already validated) as version 2.
 * Example: `migrateV1({ …, version: 1, settings: { samples: 14 } })` → `{ …, version: 2, study: { interval, length: 14, schedule: { kind: "fixed" } } }`.
 */
export function migrateV1(v1: Model): Model {
  const { settings, ...rest } = v1;
  const noise = settings?.noise ?? {};
  const variables = v1.variables.map((v) => (noise[v.id] !== undefined && v.noise === undefined ? { ...v, noise: noise[v.id] } : v));
  const kept: ModelSettings = {};
  if (settings?.separation !== undefined) kept.separation = settings.separation;
  const out: Model = { ...rest, version: 2, variables };
  if (Object.keys(kept).length > 0) out.settings = kept;
  if (settings?.samples !== undefined && out.study === undefined) {
    const samples = settings.samples;
    // the interval is the one of the version-1 meaning: the middle of the control for this length
    out.study = { interval: defaultInterval(out, { samples }), length: samples, schedule: { kind: 'fixed' } };
  }
  return out;
}

/** Bring a model of any known version (validated for its version) to the current one. */
export function migrateModel(model: Model): Model {
  return model.version === 1 ? migrateV1(model) : model;
}
