import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseModelText } from '../../../src/core/model/schema';
import { dataRoles, medianSpan } from '../../../src/core/fit/roles';

const sleepStress = (() => {
  const r = parseModelText(readFileSync('src/examples/sleep-stress.json', 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
})();

describe('roles at the data\'s interval', () => {
  it('the fitted diagonal read with the rule Δ ≥ kτ settled, τ ≥ kW frozen (k = 5; hand calculation)', () => {
    // τ = 0.5 h: 3 ≥ 2.5 settled; τ = 10 h: dynamic; τ = 10⁴ h ≥ 5·300: frozen; A_ii = 0: τ infinite, frozen.
    const A = [[-2, 0.1, 0, 0], [0, -0.1, 0, 0], [0, 0, -1e-4, 0], [0, 0, 0, 0]];
    const r = dataRoles(sleepStress, ['stress', 'sleepDebt', 'coping', 'mood'], A, 3, 300);
    expect(r.map((x) => x.fitted)).toEqual(['settled', 'state', 'frozen', 'frozen']);
    expect(r[0].fittedTimescale).toBe(0.5);
  });

  it('the sketch\'s roles: coping skill (τ 4 months ≈ 2922 h ≥ 5 × 300 h) frozen, stress (τ 40 min) dynamic at 3 h (5 × 0.67 h > 3 h)', () => {
    const r = dataRoles(sleepStress, ['stress', 'coping'], null, 3, 300);
    expect(r).toEqual([
      { state: 'stress', sketch: 'state', fitted: null, fittedTimescale: null },
      { state: 'coping', sketch: 'frozen', fitted: null, fittedTimescale: null },
    ]);
  });

  it('the median span over persons', () => {
    expect(medianSpan([{ time: [0, 5] }, { time: [2, 30] }, { time: [1, 11] }])).toBe(10);
  });
});
