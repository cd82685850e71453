import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitText, fontMeasure } from '../../../src/ui/canvas/textFit';
import { decimals, expectClose } from '../../helpers/tolerance';

// A fixed-pitch stand-in for a font: 7 px per character (the ellipsis too).
const mono = (s: string) => [...s].length * 7;

describe('labels fitted to their variable', () => {
  it('leaves a label that fits as it is', () => {
    expect(fitText('Stress', 100, mono)).toBe('Stress');
    expect(fitText('Stress', 42, mono)).toBe('Stress');
  });

  it('shortens a label that does not fit to the longest start that does, with an ellipsis', () => {
    // 8 characters + "…" = 63 px ≤ 64
    expect(fitText('Perceived workload at home', 64, mono)).toBe('Perceive…');
    // no space left before the ellipsis
    expect(fitText('Sleep debt tonight', 50, mono)).toBe('Sleep…');
  });

  it('for any label and width: the result fits (or is one character and the ellipsis) and starts the label', () => {
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 60 }), fc.integer({ min: 0, max: 400 }), (label, max) => {
        const out = fitText(label, max, mono);
        if (out === label) {
          expect(mono(label)).toBeLessThanOrEqual(max);
          return;
        }
        expect(out.endsWith('…')).toBe(true);
        const kept = out.slice(0, -1);
        expect(label.startsWith(kept)).toBe(true);
        if ([...kept].length > 1) expect(mono(out)).toBeLessThanOrEqual(max);
        // one more character would not have fitted
        const next = [...label].slice(0, [...kept].length + 1).join('').trimEnd() + '…';
        if (next !== out && [...label].length > [...kept].length + 1) expect(mono(next)).toBeGreaterThan(max);
      }),
      { numRuns: 300 },
    );
  });

  it('measures by an estimate per character where the page has no canvas (tests, the command line)', () => {
    const m = fontMeasure('600 13.5px sans-serif', 13.5);
    expectClose(m('abcd'), 4 * 13.5 * 0.62, decimals(6));
    expect(m('')).toBe(0);
  });
});
