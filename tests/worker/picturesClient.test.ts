import { describe, expect, it } from 'vitest';
import { createPicturesClient } from '../../src/worker/picturesClient';
import { localPictures, type PicturesApi } from '../../src/worker/picturesApi';
import { chainModel, SYMPTOMS } from '../core/pictures/fixtures';

describe('pictures client', () => {
  it('answers from the main thread when the worker fails, with the same answer as the core', async () => {
    const broken = (): PicturesApi => ({
      pictures: () => Promise.reject(new Error('the pictures worker could not start')),
      probabilities: () => Promise.reject(new Error('the pictures worker could not start')),
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
});
