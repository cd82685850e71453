import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LABEL_GAP_PX, placeLabels, unitMarks } from '../../../src/ui/interval/scale';

// A stand-in for the 11 px interface font: 6.6 px per character (common practice: about 0.6 em per character).
const measure = (s: string) => [...s].length * 6.6;

const overlaps = (a: { left: number; width: number }, b: { left: number; width: number }) => a.left < b.left + b.width + LABEL_GAP_PX && b.left < a.left + a.width + LABEL_GAP_PX;

describe('unit labels under the interval track', () => {
  it('lists the round units inside the range, in the model unit', () => {
    expect(unitMarks({ min: 0.5, max: 400 }, 'day').map((m) => m.label)).toEqual(['1 day', '1 week', '1 month', '1 year']);
    expect(unitMarks({ min: 0.5, max: 400 }, 'day')[1].at).toBe(7);
  });

  it('drops the finer of two labels that would overlap ("1 week" and "1 month" on a narrow track) and keeps its tick', () => {
    // a track from 1 day to 10 years, 250 px wide: a week and a month are 250·log(30.4/7)/log(3650) ≈ 45 px apart, less than their half widths and the gap
    const range = { min: 1, max: 3650 };
    const placed = placeLabels(unitMarks(range, 'day'), range, 250, measure);
    const week = placed.find((m) => m.label === '1 week')!, month = placed.find((m) => m.label === '1 month')!;
    expect(month.x - week.x).toBeLessThan((measure('1 week') + measure('1 month')) / 2 + LABEL_GAP_PX);
    expect([week.shown, month.shown]).toEqual([false, true]);
    expect(placed.map((m) => m.label)).toContain('1 week');
  });

  it('shows every label on a wide track', () => {
    const range = { min: 1, max: 3650 };
    expect(placeLabels(unitMarks(range, 'day'), range, 1200, measure).every((m) => m.shown)).toBe(true);
  });

  it('moves a label at an end of the track inwards instead of letting it run past', () => {
    const range = { min: 1, max: 400 };
    const first = placeLabels(unitMarks(range, 'day'), range, 500, measure)[0];
    expect(first.label).toBe('1 day');
    expect(first.x).toBe(0);
    expect(first.shown).toBe(true);
    expect(first.left).toBe(0);
  });

  it('never shows two overlapping labels, nor one past an end, at any width and range', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e3, noNaN: true }), fc.double({ min: 1.5, max: 1e7, noNaN: true }), fc.integer({ min: 20, max: 2000 }), fc.constantFrom('s', 'min', 'h', 'day'), (min, ratio, width, unit) => {
        const range = { min, max: min * ratio };
        const shown = placeLabels(unitMarks(range, unit as 's'), range, width, measure).filter((m) => m.shown);
        for (const m of shown) {
          expect(m.left).toBeGreaterThanOrEqual(0);
          expect(m.left + m.width).toBeLessThanOrEqual(width + 1e-9);
        }
        for (let i = 0; i < shown.length; i++) for (let j = i + 1; j < shown.length; j++) expect(overlaps(shown[i], shown[j])).toBe(false);
      }),
      { numRuns: 300, seed: 12 },
    );
  });
});
