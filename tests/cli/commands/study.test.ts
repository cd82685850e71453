import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { parseModelText } from '../../../src/core/model/schema';
import { memoryIo } from '../../helpers/cli';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

// An experience-sampling sketch of our own: stress (3 h) drives mood (8 h), 5 prompts a day 09:00–21:00 for 14 days.
const esm = {
  format: 'loopfold-model', version: 2, name: 'Stress and mood', timeUnit: 'h',
  variables: [{ id: 'load', kind: 'input' }, { id: 'stress', kind: 'state', timescale: '3 h' }, { id: 'mood', kind: 'state', timescale: '8 h' }],
  links: [{ from: 'load', to: 'stress', kind: 'integrating' }, { from: 'stress', to: 'mood', kind: 'integrating', sign: '-' }],
  study: { interval: '3h', length: '14 days', schedule: { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'fixed' }, holds: { load: 1 } },
};
const files = { 'esm.json': JSON.stringify(esm) };

describe('loopfold design', () => {
  it('--json: the study, the gaps with shares counted by hand, Φ per gap and the pooled limit as SciPy computes them', async () => {
    const m = memoryIo({ ...files });
    expect(await runCli(['design', 'esm.json', '--json'], m.io)).toBe(0);
    expect(m.out).toHaveLength(1);
    const r = JSON.parse(m.out[0]);
    expect(r.study).toEqual(esm.study);
    expect(r.states).toEqual(['stress', 'mood']);
    // 14 days × 5 prompts = 70 prompts, 69 pairs: 4 × 14 = 56 of 3 h within days, 13 nights of 12 h
    expect(r.gaps.map((g: { gap: number }) => g.gap)).toEqual([3, 12]);
    expectClose(r.gaps.map((g: { share: number }) => g.share), [56 / 69, 13 / 69]);
    const s = await (async () => { const t = memoryIo({ ...files }); await runCli(['sampled', 'esm.json', '--json'], t.io); return JSON.parse(t.out[0]); })();
    const ref = runPython<{ pooled: number[][]; phi: number[][][] }>(new URL('../../reference/study_pooled.py', import.meta.url).pathname, { a: s.drift, gaps: r.gaps.map((g: { gap: number; share: number }) => [g.gap, g.share]) });
    expectClose(r.pooled, ref.pooled, { relTol: 1e-12, absTol: 1e-14 });
    expectClose(r.gaps[0].phi, ref.phi[0], { relTol: 1e-12, absTol: 1e-14 });
    expectClose(r.gaps[1].phi, ref.phi[1], { relTol: 1e-12, absTol: 1e-14 });
    // same-day pairs are all 3 h apart: their limit is Φ(3 h)
    expectClose(r.sameDay, ref.phi[0], { relTol: 1e-12, absTol: 1e-14 });
    expectClose(r.nominal, ref.phi[0], { relTol: 1e-12, absTol: 1e-14 });
    expect(r.shrinkage[0]).toMatch(/night-gap shrinkage/);
  });
  it('reads a version-1 file (migrated) and says what the night gaps do in words', async () => {
    const m = memoryIo();
    expect(await runCli(['design', 'tests/fixtures/model-v1/sleep-stress.json'], m.io)).toBe(0);
    expect(m.out[0]).toMatch(/study design/);
    expect(m.out[0]).toMatch(/one prompt every interval, day and night/);
    expect(m.out[0]).toMatch(/50 prompts/);
  });
});

describe('every command reads the file\'s study; flags override it', () => {
  it('order: the study\'s interval, length and holds', async () => {
    const a = memoryIo({ ...files });
    expect(await runCli(['order', 'esm.json'], a.io)).toBe(0);
    expect(a.out[0]).toMatch(/^Stress and mood: causal ordering at sampling every 3 h, over a study of 2 weeks/);
    const j = memoryIo({ ...files });
    await runCli(['order', 'esm.json', '--json'], j.io);
    expect(JSON.parse(j.out[0]).roles.load).toBe('held');
    const b = memoryIo({ ...files });
    expect(await runCli(['order', 'esm.json', '--interval', 'every 2 h', '--samples', '10'], b.io)).toBe(0);
    expect(b.out[0]).toMatch(/sampling every 2 h, over a study of 20 h/);
  });
  it('--interval takes the words the app shows', async () => {
    for (const [text, label] of [['daily', '1 day'], ['5 a day', '4.8 h'], ['every 90 min', '1.5 h'], ['weekly', '1 week']]) {
      const m = memoryIo({ ...files });
      expect(await runCli(['order', 'esm.json', '--interval', text, '--window', '30 days'], m.io)).toBe(0);
      expect(m.out[0]).toContain(`sampling every ${label},`);
    }
  });
  it('sampled: the study\'s interval when --interval is absent', async () => {
    const a = memoryIo({ ...files });
    expect(await runCli(['sampled', 'esm.json', '--json'], a.io)).toBe(0);
    expect(JSON.parse(a.out[0]).interval).toBe(3);
  });
});

describe('loopfold migrate', () => {
  it('writes a version-1 file as version 2 with the same meaning', async () => {
    const m = memoryIo();
    expect(await runCli(['migrate', 'tests/fixtures/model-v1/greenhouse.json', '--out', 'new.json'], m.io)).toBe(0);
    expect(m.out[0]).toBe('wrote new.json: version 1 → 2');
    const r = parseModelText(m.files['new.json']);
    expect(r.ok && r.model.version).toBe(2);
    expect(r.ok && r.migratedFrom).toBe(undefined);
    expect(r.ok && r.model.study?.length).toBe(50);
  });
  it('needs --out, and names a newer file\'s version', async () => {
    const m = memoryIo({ 'v9.json': JSON.stringify({ ...esm, version: 9 }) });
    expect(await runCli(['migrate', 'esm.json'], m.io)).toBe(2);
    expect(await runCli(['migrate', 'v9.json', '--out', 'x.json'], m.io)).toBe(1);
    expect(m.err.join('\n')).toMatch(/model file version 9/);
  });
});
