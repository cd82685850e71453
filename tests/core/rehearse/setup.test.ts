import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModelText } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { expectClose } from '../../helpers/tolerance';
import { linksOfText, rehearsalOf, simulateStudy } from '../../../src/core/rehearse/setup';

function load(path: string): Model {
  const r = parseModelText(readFileSync(path, 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
}

describe('from a model file to a rehearsal', () => {
  const model = load('src/examples/sleep-stress.json');

  it('reads links by id or label, and names the unknown variable', () => {
    expect(linksOfText(model, 'stress->mood, Sleep debt → mood')).toEqual([{ from: 'stress', to: 'mood' }, { from: 'sleepDebt', to: 'mood' }]);
    expect(() => linksOfText(model, 'stress->joy')).toThrow(/"joy" is not a variable of the model/);
    expect(() => linksOfText(model, 'stress')).toThrow(/from->to/);
    expect(() => rehearsalOf(model, { links: linksOfText(model, 'workload->stress') })).toThrow(/"Workload \(workload\)" is not a state/);
  });

  it('turns reliability into error variance: r = true variance / observed variance (classical test theory, common practice)', () => {
    const m: Model = { ...model, variables: model.variables.map((v) => (v.id === 'mood' ? { ...v, reliability: 0.8 } : v)) };
    const r = rehearsalOf(m, { persons: 3 });
    const i = r.process.states.indexOf('mood'), n = r.process.states.length;
    const truth = r.stationary.data[i * n + i];
    expectClose(truth / (truth + r.errorVariance[i]), 0.8, { relTol: 1e-12 }, 'reliability');
    expect(() => rehearsalOf({ ...m, variables: m.variables.map((v) => (v.id === 'mood' ? { ...v, reliability: 0 } : v)) })).toThrow(/reliability of "Mood \(mood\)"/);
  });

  it('simulates every person on the study\'s prompts, reproducibly for a seed', () => {
    // with no missed prompts every planned prompt is answered
    const full = simulateStudy(rehearsalOf(model, { persons: 2, seed: 7, study: { missedPrompts: 0 } }));
    expect(full.persons[0].time.length).toBe(rehearsalOf(model, { study: { missedPrompts: 0 } }).plannedPerPerson);
    const r = rehearsalOf(model, { persons: 4, seed: 7 });
    const a = simulateStudy(r), b = simulateStudy(r);
    expect(a.persons.length).toBe(4);
    // the example's study misses a share of prompts: each person answers fewer than planned, about (1 − share) of them over four persons
    const answered = a.persons.map((p) => p.time.length);
    for (const k of answered) expect(k).toBeLessThanOrEqual(r.plannedPerPerson);
    const mean = answered.reduce((s, k) => s + k, 0) / answered.length;
    expect(Math.abs(mean - r.answeredPerPerson)).toBeLessThan(4 * Math.sqrt(r.plannedPerPerson * 0.25));
    expect(Array.from(a.persons[2].values)).toEqual(Array.from(b.persons[2].values));
    expect(Array.from(simulateStudy(rehearsalOf(model, { persons: 4, seed: 8 })).persons[2].values)).not.toEqual(Array.from(a.persons[2].values));
  });
});
