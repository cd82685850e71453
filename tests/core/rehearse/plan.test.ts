import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModelText } from '../../../src/core/model/schema';
import { planPersons, planPromptsPerDay, planStudy } from '../../../src/core/rehearse/plan';
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

describe('the design advisor over persons and prompts per day', () => {
  const r = rehearsalOf(model, { persons: 20, links: linksOfText(model, 'heat->damp') });
  const drift = [0, 1].map((i) => Array.from(r.process.base.drift.data.subarray(2 * i, 2 * i + 2)));
  const ask = (delta: number, pairs: number, persons: number) =>
    runPython<Ref>(REF, { drift, noise: Array.from(r.process.base.noise), delta, pairs, persons, target: r.process.states.indexOf('damp'), source: r.process.states.indexOf('heat'), alpha: 0.05, bounds: [0.05, 50] });

  it('over persons: each point is the textbook power for that many persons (SciPy), and the fewest persons that reach 80 % are recommended', () => {
    const values = [2, 3, 5, 8, 12, 20];
    const plan = planPersons(r, { values });
    expect(plan.points.map((p) => p.value)).toEqual(values);
    const ref = values.map((n) => ask(1, 119, n).power);
    plan.points.forEach((p, k) => expect(Math.abs(p.minPower - ref[k])).toBeLessThan(1e-8));
    const first = values[ref.findIndex((p) => p >= 0.8)];
    expect(first).toBeDefined();
    expect(plan.recommended?.value).toBe(first);
    expect(plan.statement).toContain(`${first} persons`);
  });

  it('over persons: says which link fails when even the most persons compared fall short', () => {
    const plan = planPersons(rehearsalOf(model, { links: linksOfText(model, 'heat->damp'), study: { length: 4 } }), { values: [1, 2] });
    expect(plan.recommended).toBeNull();
    expect(plan.statement).toMatch(/^No design with up to 2 persons reaches 80 % power: heat->damp fails/);
    expect(() => planPersons(r, { values: [0] })).toThrow(/persons: every value must be a whole number of at least 1, not 0/);
  });

  it('over prompts per day: the span is kept, prompts spread over the window, and one a day is the textbook daily VAR (SciPy)', () => {
    const window = { kind: 'daily-window' as const, promptsPerDay: 4, from: '08:00', to: '20:00', timing: 'fixed' as const };
    const daily = rehearsalOf(model, { persons: 20, links: linksOfText(model, 'heat->damp'), study: { schedule: window, length: '10 days', interval: '4 h' } });
    const plan = planPromptsPerDay(daily, { values: [1, 2, 3, 4, 7] });
    expect(plan.points.map((p) => p.prompts)).toEqual([10, 20, 30, 40, 70]); // k prompts on each of 10 days
    expect(plan.points.map((p) => p.interval)).toEqual([24, 12, 6, 4, 2]); // 12 h window over k − 1 spacings (one a day: a day)
    expect(Math.abs(plan.points[0].minPower - ask(24, 9, 20).power)).toBeLessThan(1e-8);
    const first = plan.points.find((p) => p.minPower >= 0.8);
    expect(plan.recommended).toBe(first ?? null);
    expect(() => planPromptsPerDay(r)).toThrow(/prompts per day can be compared only for a schedule with prompts in a daily window/);
  });
});
