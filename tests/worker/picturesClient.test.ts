import { describe, expect, it } from 'vitest';
import { createPicturesClient } from '../../src/worker/picturesClient';
import { localPictures, type PicturesApi } from '../../src/worker/picturesApi';
import { chainModel, SYMPTOMS } from '../core/pictures/fixtures';
import { adviceUnderStrengthRanges } from '../../src/core/pictures/strengthRanges';
import type { Model } from '../../src/core/model/types';

describe('pictures client', () => {
  it('answers from the main thread when the worker fails, with the same answer as the core', async () => {
    const broken = (): PicturesApi => ({
      pictures: () => Promise.reject(new Error('the pictures worker could not start')),
      probabilities: () => Promise.reject(new Error('the pictures worker could not start')),
      strengthAdvice: () => Promise.reject(new Error('the pictures worker could not start')),
    });
    const c = createPicturesClient(broken, () => localPictures);
    const a = await c.pictures(chainModel(0.5, 1), { interval: 3, samples: 20, persons: 50, observed: SYMPTOMS });
    expect(a?.ok).toBe(true);
    expect(c.where()).toBe('main thread');
    const direct = await localPictures.pictures(chainModel(0.5, 1), { interval: 3, samples: 20, persons: 50, observed: SYMPTOMS });
    expect(a).toEqual(direct);
    c.dispose();
  });

  it('a bad question comes back as a reason, not an exception', async () => {
    const c = createPicturesClient(null, () => localPictures);
    const a = await c.probabilities(chainModel(0, 1), { interval: 3 }, 0, 1);
    expect(a).toEqual({ ok: false, reason: expect.stringMatching(/number of draws/) });
  });

  it('gives the advice under strength ranges of the core, without the draws themselves, also from the main thread', async () => {
    const base = chainModel(0.5, 1);
    const k = base.links.findIndex((l) => l.from === SYMPTOMS[0] && l.to === SYMPTOMS[1]);
    const model: Model = { ...base, links: base.links.map((l, i) => (i === k ? { ...l, strengthRange: { low: 0.2, high: 0.9 } } : l)) };
    const links = [{ from: model.links[k].from, to: model.links[k].to }];
    const c = createPicturesClient(null, () => localPictures);
    const a = await c.strengthAdvice(model, links, { draws: 30, seed: 5 });
    const core = adviceUnderStrengthRanges(model, links, { draws: 30, seed: 5 });
    expect(core.ok).toBe(true);
    if (!core.ok || !a || !a.ok) throw new Error('no answer');
    const { samples, ...rest } = core;
    expect(samples).toHaveLength(30);
    expect(a).toEqual(rest);
    expect('samples' in a).toBe(false);
    const bad = await c.strengthAdvice(model, links, { draws: 0, seed: 5 });
    expect(bad).toEqual({ ok: false, reason: expect.stringMatching(/draws must be a whole number/) });
    c.dispose();
  });
});
