import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { chiSquareSurvival, compareDrift, likelihoodRatio, safeCsv, sketchFreePattern } from '../../../src/core/fit/compare';
import type { CtFit } from '../../../src/core/fit/ct';
import { parseModelText } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

const model = (() => { const r = parseModelText(readFileSync('src/examples/sleep-stress.json', 'utf8')); if (!r.ok) throw new Error('example'); return r.model as Model; })();

describe('sketch against data', () => {
  it('χ² survival agrees with scipy.stats.chi2.sf', () => {
    // Reference: scipy.stats.chi2.sf.
    const xs = [0.1, 1, 3.84, 7.5, 20, 55.3, 150], dfs = [1, 2, 3, 7, 12, 30];
    const pairs = xs.flatMap((x) => dfs.map((d) => [x, d]));
    const ref = runPython<number[]>('tests/reference/chi2_sf.py', pairs);
    expectClose(pairs.map(([x, d]) => chiSquareSurvival(x, d)), ref, { relTol: 1e-9, absTol: 1e-15 }, 'chi2 sf');
    const lr = likelihoodRatio({ minus2LL: 110, parameters: 8 }, { minus2LL: 100, parameters: 12 });
    expect(lr.df).toBe(4);
    expect(lr.chi2).toBe(10);
  });

  it('frees the drift entries the sketch has (links through derived variables too) and the self-regulation', () => {
    const free = sketchFreePattern(model, ['stress', 'cortisol', 'sleepDebt', 'mood']);
    // stress → cortisol (integrating), rumination (derived from stress and mood) → sleepDebt, sleepDebt → mood, mood → stress via rumination.
    expect(free).toEqual([
      [true, false, false, true],
      [true, true, false, false],
      [true, true, true, true],
      [true, false, true, true],
    ]);
  });

  it('gives a verdict per link in words', () => {
    const states = ['stress', 'mood'];
    const fit = { states, drift: [[-1.4, -0.2], [-0.1, -0.3]], se: { drift: [[0.1, 0.05], [0.2, 0.02]] }, spec: { free: [[true, true], [true, true]] } } as unknown as CtFit;
    const rows = compareDrift(model, fit);
    const at = (f: string, t: string) => rows.find((r) => r.from === f && r.to === t)!;
    expect(at('mood', 'stress').verdict).toBe('supported'); // sketch: mood lowers rumination, which raises stress: negative
    expect(at('stress', 'mood').verdict).toBe('not detectable with these data');
    expect(at('stress', 'stress').verdict).toBe('supported');
    expect(at('stress', 'mood').words).toMatch(/cannot tell it from zero/);
  });

  it('CSV escapes text cells a spreadsheet would run as formulas, keeps numbers', () => {
    // OWASP "CSV Injection": cells starting with = + - @ are prefixed (common practice).
    expect(safeCsv([['=SUM(A1)', '+1', '-x', '@cmd', 'ok, fine', -0.5]])).toBe(`'=SUM(A1),'+1,'-x,'@cmd,"ok, fine",-0.5\r\n`);
  });
});
