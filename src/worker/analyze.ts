/**
 * The core call the worker hosts, as plain code shared by the worker and the
 * main-thread fallback. Exceptions become a message; nothing is thrown across.
 */
import type { Model } from '../core/model/types';
import type { StudyDesign } from '../core/ordering/types';
import { breakpoints, equationMatching, orderingAt } from '../core/ordering/index';
import { dynamicsDiagnostics } from '../core/numeric/stability';
import type { AnalysisResult, CoreApi } from './protocol';

/** Above this many states the live checks skip the eigenvalue checks (the Numbers tab and `loopfold check` still run them). */
export const LIVE_DYNAMICS_CHECK_STATES = 150;

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/**
 * Ordering at the design, the interval axis (breakpoints) and the equation
 * matching. Not the roles of every band: those are a variable × band table
 * (2,000 variables: about 1,600 bands, some 200 MB as objects), and the
 * views ask the core for the band they show.
 */
export function analyzeModel(model: Model, design: StudyDesign): AnalysisResult {
  const t0 = now();
  try {
    const ordering = orderingAt(model, design);
    if (!ordering.diagnostics.some((d) => d.level === 'error') && model.variables.filter((v) => v.kind === 'state').length <= LIVE_DYNAMICS_CHECK_STATES)
      ordering.diagnostics = [...ordering.diagnostics, ...dynamicsDiagnostics(model)];
    const axis = design.window !== undefined ? { window: design.window } : { samples: design.samples };
    const bps = breakpoints(model, axis);
    const matching = equationMatching(model, design);
    return { ok: true, analysis: { ordering, breakpoints: bps, matching, elapsedMs: now() - t0 } };
  } catch (e) {
    return { ok: false, message: `the analysis failed: ${(e as Error).message}` };
  }
}

export const localCore: CoreApi = { analyze: async (model, design) => analyzeModel(model, design) };
