/**
 * What the core worker answers. The UI reads only these types; the worker
 * file is a thin switch over `analyzeModel` in analyze.ts.
 */
import type { Model } from '../core/model/types';
import type { Breakpoint, Ordering, StudyDesign } from '../core/ordering/types';
import type { EquationMatching } from '../core/ordering/index';

export interface Analysis {
  ordering: Ordering;
  breakpoints: Breakpoint[];
  /** The equation–variable structure at the design, with one maximum matching. */
  matching: EquationMatching;
  /** Milliseconds the core took (inside the worker, or on the main thread in the fallback). */
  elapsedMs: number;
}

export type AnalysisResult = { ok: true; analysis: Analysis } | { ok: false; message: string };

export interface CoreApi {
  analyze(model: Model, design: StudyDesign): Promise<AnalysisResult>;
}

export type { StudyDesign };
