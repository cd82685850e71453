/**
 * The pictures pane's questions as plain functions over plain data: the
 * three pictures of a study (within, between, across persons) and the
 * probability of each ordering under uncertain timescales (a seeded Monte
 * Carlo). The same object runs in the pictures worker and on the main thread.
 */
import type { Model } from '../core/model/types';
import type { StudyDesign } from '../core/ordering/types';
import { orderingProbabilities, picturesAt, type OrderingProbabilities, type PictureOptions, type Pictures } from '../core/pictures/index';
import { adviceUnderStrengthRanges, type StrengthRangeAdvice, type StrengthRangeOptions } from '../core/pictures/strengthRanges';
import type { VariableId } from '../core/model/types';

export type PicturesAnswer = { ok: true; pictures: Omit<Pictures, 'levels'> & { levels: Omit<Pictures['levels'], 'drift'> } } | { ok: false; reason: string };
export type ProbabilitiesAnswer = { ok: true; result: OrderingProbabilities } | { ok: false; reason: string };
/** The advice under strength ranges, without the per-draw samples (the pane shows the summary). */
export type StrengthAdviceAnswer = Omit<StrengthRangeAdvice, 'samples'> | { ok: false; reason: string };

export interface PicturesApi {
  pictures(model: Model, options: PictureOptions): Promise<PicturesAnswer>;
  probabilities(model: Model, design: StudyDesign & { interval: number }, draws: number, seed: number): Promise<ProbabilitiesAnswer>;
  strengthAdvice(model: Model, links: { from: VariableId; to: VariableId }[], options: StrengthRangeOptions): Promise<StrengthAdviceAnswer>;
}

export const localPictures: PicturesApi = {
  async pictures(model, options) {
    try {
      const r = picturesAt(model, options);
      if (!r.ok) return r;
      // The drift (typed arrays) stays behind: the pane needs its figures, not the matrix.
      const { drift: _drift, ...levels } = r.pictures.levels;
      void _drift;
      return { ok: true, pictures: { ...r.pictures, levels } };
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
  },
  async probabilities(model, design, draws, seed) {
    try {
      return { ok: true, result: orderingProbabilities(model, design, { draws, seed }) };
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
  },
  async strengthAdvice(model, links, options) {
    try {
      const r = adviceUnderStrengthRanges(model, links, options);
      if (!r.ok) return r;
      const { samples: _samples, ...rest } = r;
      void _samples;
      return rest;
    } catch (e) {
      return { ok: false, reason: (e as Error).message };
    }
  },
};
