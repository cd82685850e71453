import { describe, expect, it } from 'vitest';
import { classifyIntervals, intervalHistogram, missingness, personSeries } from '../../../src/core/data/overview';
import type { Panel } from '../../../src/core/data/panel';

// A hand-made diary: person a has prompts 0,1,3 on day 0 (prompt 2 skipped) and 0,1 on day 1;
// person b has no prompt numbers. All counts below are hand counts (common practice).
const panel: Panel = {
  variables: ['stress', 'mood'],
  timeUnit: 'h',
  persons: [
    { id: 'a', time: Float64Array.from([0, 3, 9, 24, 27]), day: Int32Array.from([0, 0, 0, 1, 1]), prompt: Int32Array.from([0, 1, 3, 0, 1]), values: Float64Array.from([1, 2, NaN, 3, 4, NaN, 5, 6, 7, NaN]) },
    { id: 'b', time: Float64Array.from([0, 3, 6]), day: Int32Array.from([0, 0, 0]), values: Float64Array.from([1, NaN, 2, NaN, 3, NaN]) },
  ],
};

describe('data overview', () => {
  it('tells overnight intervals and skipped prompts from regular ones', () => {
    expect(classifyIntervals(panel).map((x) => `${x.interval}:${x.kind}`)).toEqual([
      '3:within a day', '6:skipped prompt', '15:overnight', '3:within a day', '3:within a day', '3:within a day',
    ]);
  });

  it('a histogram on log-spaced bins counts every interval once, by kind', () => {
    const h = intervalHistogram(panel, 4);
    expect(h.edges[0]).toBe(3);
    expect(h.edges[4]).toBe(15);
    expect(h.totals).toEqual({ 'within a day': 4, 'skipped prompt': 1, overnight: 1 });
    // log-spaced edges 3, 3·5^¼, 3·5^½, 3·5^¾, 15: 3 falls in bin 0, 6 in bin 1 (3·5^¼ ≈ 4.49 ≤ 6 < 6.71), 15 in bin 3.
    expect(h.counts['within a day']).toEqual([4, 0, 0, 0]);
    expect(h.counts['skipped prompt']).toEqual([0, 1, 0, 0]);
    expect(h.counts.overnight).toEqual([0, 0, 0, 1]);
    expect(h.median).toBe(3);
  });

  it('counts missing cells per variable and persons without any value', () => {
    expect(missingness(panel)).toEqual([
      { variable: 'stress', missing: 1, total: 8, personsWithout: 0 },
      { variable: 'mood', missing: 5, total: 8, personsWithout: 1 },
    ]);
  });

  it('one person\'s series with the nights marked', () => {
    const s = personSeries(panel, 0);
    expect(s.times).toEqual([0, 3, 9, 24, 27]);
    expect(s.nights).toEqual([3]);
    expect(s.values.mood.map(Number.isNaN)).toEqual([false, false, true, false, true]);
    expect(() => personSeries(panel, 5)).toThrow(/no person 6 \(the data have 2\)/);
  });

  it('without day numbers an interval over three times the median counts as a night', () => {
    const p: Panel = { variables: ['x'], timeUnit: 'h', persons: [{ id: 'c', time: Float64Array.from([0, 2, 4, 20, 22]), values: new Float64Array(5) }] };
    expect(classifyIntervals(p).map((x) => x.kind)).toEqual(['within a day', 'within a day', 'overnight', 'within a day']);
  });
});
