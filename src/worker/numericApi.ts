/**
 * What the numeric worker hosts: the numeric questions of the core
 * (core/numeric/answers.ts) as an async API; the main-thread fallback is
 * the same object.
 */
import type { Model, Study, VariableId } from '../core/model/types';
import { studyDesign, type StudyDesignReport } from '../core/study/report';
import {
  adviceOf,
  curveOf,
  equilibriumOf,
  sampledOf,
  simulationOf,
  timescalesOfModel,
  type AdviceAnswer,
  type CurveAnswer,
  type EquilibriumAnswer,
  type Failed,
  type SampledAnswer,
  type SimulationAnswer,
  type TimescalesAnswer,
} from '../core/numeric/answers';

export type { StudyDesignReport };
export type { AdviceAnswer, CurveAnswer, EquilibriumAnswer, Failed, SampledAnswer, SimulationAnswer, TimescalesAnswer };

/** What the numeric worker hosts; the main-thread fallback is the same object. */
export interface NumericApi {
  equilibrium(model: Model, hold?: Record<VariableId, number>): Promise<EquilibriumAnswer | Failed>;
  simulate(model: Model, options: { until: number; every?: number; hold?: Record<VariableId, number> }, onProgress?: (fraction: number) => void): Promise<SimulationAnswer | Failed>;
  sampled(model: Model, interval: number): Promise<SampledAnswer | Failed>;
  timescales(model: Model, interval?: number): Promise<TimescalesAnswer | Failed>;
  curve(model: Model, from: VariableId, to: VariableId): Promise<CurveAnswer | Failed>;
  advise(model: Model, links: { from: VariableId; to: VariableId }[], fraction: number): Promise<AdviceAnswer | Failed>;
  /** What a study's schedule estimates: its gaps, Φ per gap, the pooled and same-day VAR limits (`studyDesign` of the core). */
  design(model: Model, study?: Study): Promise<{ ok: true; report: StudyDesignReport } | Failed>;
  /** The sampled model at each of several intervals, in one question (designs compared side by side). */
  sampledAt(model: Model, intervals: number[]): Promise<{ ok: true; answers: (SampledAnswer | Failed)[] }>;
}

export const localNumeric: NumericApi = {
  equilibrium: async (m, h) => equilibriumOf(m, h),
  simulate: async (m, o, p) => simulationOf(m, o, p, undefined, () => performance.now()),
  sampled: async (m, i) => sampledOf(m, i),
  timescales: async (m, i) => timescalesOfModel(m, i),
  curve: async (m, f, t) => curveOf(m, f, t),
  advise: async (m, l, f) => adviceOf(m, l, f),
  sampledAt: async (m, xs) => ({ ok: true, answers: xs.map((i) => sampledOf(m, i)) }),
  design: async (m, st) => {
    try {
      const r = studyDesign(m, st);
      return r.ok ? r : { ok: false, reason: r.reason };
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
  },
};
