import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';
import { runPython } from '../../helpers/python';

/** Savings and spending of a household that feed each other (invented): every strength 1, so the loop gain is 1.2 × 1. */
const household = {
  format: 'loopfold-model', version: 1, name: 'Household budget', timeUnit: 'week',
  variables: [
    { id: 'savings', label: 'Savings', kind: 'state', timescale: 4 },
    { id: 'confidence', label: 'Spending confidence', kind: 'state', timescale: 1 },
    { id: 'income', label: 'Income', kind: 'input', value: 1 },
  ],
  links: [
    { from: 'income', to: 'savings', kind: 'integrating', sign: '+', weight: 1 },
    { from: 'confidence', to: 'savings', kind: 'integrating', sign: '+', weight: 1.2 },
    { from: 'savings', to: 'confidence', kind: 'integrating', sign: '+', weight: 1 },
  ],
};

describe('loopfold check', () => {
  it('warns of a growing mode, with its rate and the states that carry it, and what usually fixes it', async () => {
    const m = memoryIo({ 'household.json': JSON.stringify(household) });
    // A warning is not an error: the exit status stays 0.
    expect(await runCli(['check', 'household.json'], m.io)).toBe(0);
    const text = m.out.join('\n');
    // Drift of the sketch: [[-1/4, 1.2/4], [1, -1]] per week; its largest eigenvalue from NumPy.
    const [ref] = runPython<{ re: number[] }[]>('tests/reference/sketch_stability.py', { cases: [household] });
    const rate = Math.max(...ref.re);
    expect(rate).toBeGreaterThan(0);
    expect(text).toContain('0 error(s), 1 warning(s)');
    expect(text).toContain(`growing mode (rate +${Number(rate.toPrecision(3))} per week`);
    expect(text).toMatch(/carried by (Savings|Spending confidence) \(\d+ %\) and (Savings|Spending confidence) \(\d+ %\)/);
    expect(text).toContain('loop Savings → Spending confidence → Savings has a gain of 1.2');
    expect(text).not.toContain('no problems found');
  });

  it('lists the growing mode in --json with the states it names', async () => {
    const m = memoryIo({ 'household.json': JSON.stringify(household) });
    expect(await runCli(['check', 'household.json', '--json'], m.io)).toBe(0);
    const o = JSON.parse(m.out[0]);
    const d = o.diagnostics.find((x: { code: string }) => x.code === 'growing-mode');
    expect(d.variables.sort()).toEqual(['confidence', 'savings']);
  });

  it('finds no problem once the loop is weaker than one', async () => {
    const calm = { ...household, links: household.links.map((l) => (l.from === 'confidence' ? { ...l, weight: 0.5 } : l)) };
    const m = memoryIo({ 'calm.json': JSON.stringify(calm) });
    expect(await runCli(['check', 'calm.json'], m.io)).toBe(0);
    expect(m.out.join('\n')).toBe('Household budget: no problems found');
  });
});
