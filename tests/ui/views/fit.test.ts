import { describe, expect, it } from 'vitest';
import { fitScaleFor, MAX_FIT_SCALE } from '../../../src/ui/views/fit';

// Fitting a rectangle into another keeping its proportions: the smaller of the two side ratios (common practice).
describe('fitScaleFor', () => {
  it('is limited by the height when the figure is taller than the box in proportion', () => {
    // 560 × 642 into 453 × 440: 453/560 = 0.809, 440/642 = 0.685
    expect(fitScaleFor({ width: 560, height: 642 }, { width: 453, height: 440 }, 0.3)).toBe(440 / 642);
  });
  it('is limited by the width when the figure is wider in proportion', () => {
    expect(fitScaleFor({ width: 1000, height: 200 }, { width: 500, height: 400 }, 0.3)).toBe(0.5);
  });
  it('never goes below the legible floor: the box scrolls instead', () => {
    expect(fitScaleFor({ width: 2000, height: 2000 }, { width: 400, height: 400 }, 0.6)).toBe(0.6);
  });
  it('does not blow a small figure up past the largest fitted scale', () => {
    expect(fitScaleFor({ width: 100, height: 100 }, { width: 1000, height: 1000 }, 0.6)).toBe(MAX_FIT_SCALE);
  });
  it('gives the floor for a box or figure without a size (not yet measured)', () => {
    expect(fitScaleFor({ width: 560, height: 642 }, { width: 0, height: 0 }, 0.6)).toBe(0.6);
    expect(fitScaleFor({ width: 0, height: 642 }, { width: 400, height: 400 }, 0.6)).toBe(0.6);
  });
});
