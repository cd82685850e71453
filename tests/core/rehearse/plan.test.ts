import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModelText } from '../../../src/core/model/schema';
import { planStudy } from '../../../src/core/rehearse/plan';
import { linksOfText, rehearsalOf } from '../../../src/core/rehearse/setup';
import { runPython } from '../../helpers/python';

// An invented two-state greenhouse sketch: air heat drives leaf damp, damp cools the air.
const parsed = parseModelText(readFileSync('tests/fixtures/rehearse/greenhouse-air.json', 'utf8'));
if (!parsed.ok) throw new Error('fixture does not load');
const model = parsed.model;
const REF = 'tests/reference/rehearse_design.py';

type Ref = { phi: number[][]; se: number; power: number; peak: number; best: number };

describe('the design advisor', () => {
  const r = rehearsalOf(model, { persons: 20, links: linksOfText(model, 'heat->damp') });
  const drift = [0, 1].map((i) => Array.from(r.process.base.drift.data.subarray(2 * i, 2 * i + 2)));
  const ask = (delta: number, pairs: number, persons: number) =>
    runPython<Ref>(REF, { drift, noise: Array.from(r.process.base.noise), delta, pairs, persons, target: r.process.states.indexOf('damp'), source: r.process.states.indexOf('heat'), alpha: 0.05, bounds: [0.05, 50] });

  it('with a fixed number of prompts, the best interval is shorter than where the lagged effect peaks (both found by SciPy\'s bounded minimiser)', () => {
    const ref = ask(1, 69, 20);
    expect(ref.best).toBeLessThan(ref.peak); // the outside fact the advisor must reproduce
    const grid = Array.from({ length: 121 }, (_, k) => 0.05 * 1000 ** (k / 120));
    const plan = planStudy(r, { kind: 'prompts', prompts: 70 }, { grid });
    const step = grid[1] / grid[0];
    expect(plan.recommended).not.toBeNull();
    expect(Math.abs(Math.log(plan.recommended!.interval / ref.best))).toBeLessThan(Math.log(step));
    expect(Math.abs(Math.log(plan.peaks[0].interval / ref.peak))).toBeLessThan(Math.log(step));
    expect(plan.recommended!.interval).toBeLessThan(plan.peaks[0].interval);
    // Every point's power is the textbook figure at its interval (SciPy), spot-checked at the recommended one.
    const at = ask(plan.recommended!.interval, 69, 20);
    expect(Math.abs(plan.recommended!.minPower - at.power)).toBeLessThan(1e-8);
  });

  it('with a fixed span, recommends the longest interval (fewest prompts) that still reaches 80 %', () => {
    const plan = planStudy(r, { kind: 'span', span: 72 });
    expect(plan.recommended).not.toBeNull();
    const rec = plan.recommended!;
    expect(rec.minPower).toBeGreaterThanOrEqual(0.8);
    expect(rec.prompts).toBe(Math.floor(72 / rec.interval + 1e-9));
    for (const p of plan.curve) if (p.interval > rec.interval) expect(p.minPower).toBeLessThan(0.8);
    // The power at the recommended design equals SciPy's textbook figure for its pairs (prompts − 1).
    expect(Math.abs(rec.minPower - ask(rec.interval, rec.prompts - 1, 20).power)).toBeLessThan(1e-8);
  });

  it('says plainly when no affordable design reaches 80 % and names the link that fails', () => {
    const two = rehearsalOf(model, { persons: 2, links: linksOfText(model, 'heat->damp, damp->heat') });
    const plan = planStudy(two, { kind: 'prompts', prompts: 10 });
    expect(plan.recommended).toBeNull();
    const worst = plan.curve.reduce((a, b) => (b.minPower > a.minPower ? b : a)).links.reduce((a, b) => (b.power < a.power ? b : a));
    expect(plan.statement).toContain(`${worst.from}->${worst.to} fails`);
    expect(() => planStudy(rehearsalOf(model, {}), { kind: 'prompts', prompts: 10 })).toThrow(/--link/);
  });
});
