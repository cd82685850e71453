import { describe, expect, it } from 'vitest';
import { heldModel, startedAt, steppedModel } from '../../../src/core/interventions/transform';
import { orderingAt } from '../../../src/core/ordering/index';
import { parseModel } from '../../../src/core/model/schema';
import warehouse from '../../../src/examples/warehouse.json';
import { greenhouseIntegral } from './scenarios';

const load = (raw: unknown) => {
  const r = parseModel(raw);
  if (!r.ok) throw new Error('does not load');
  return r.model;
};

describe('interventions as model transforms', () => {
  it('a held variable becomes an input at its value; the model still validates and orders like the held ordering', () => {
    const m = heldModel(greenhouseIntegral, { heat: 0, comfort: 1 });
    expect(parseModel(m).ok).toBe(true);
    expect(m.variables.find((v) => v.id === 'heat')).toMatchObject({ kind: 'input', value: 0 });
    expect(m.variables.find((v) => v.id === 'comfort')).toMatchObject({ kind: 'input', value: 1 });
    expect(greenhouseIntegral.variables.find((v) => v.id === 'heat')!.kind).toBe('state');
    // Pearl 2000 §3.2.1: the held model's mechanism = the do-operator on the mechanism (same links and blocks).
    const a = orderingAt(m, {});
    const b = orderingAt(greenhouseIntegral, { hold: { heat: 0, comfort: 1 } });
    expect(a.edges).toEqual(b.edges);
  });

  it('drops the relation that determined a held variable in the mechanism (warehouse deliveries, fixed by the transit relation)', () => {
    const model = load(warehouse);
    const m = heldModel(model, { deliveries: 80 });
    expect(m.relations).toEqual([]);
    expect(parseModel(m).ok).toBe(true);
    expect(orderingAt(m, {}).diagnostics.filter((d) => d.level === 'error')).toEqual([]);
  });

  it('steps an input and restarts states, refusing what is not an input', () => {
    expect(steppedModel(greenhouseIntegral, 'outsideTemp', 9).variables.find((v) => v.id === 'outsideTemp')!.value).toBe(9);
    expect(() => steppedModel(greenhouseIntegral, 'heat', 1)).toThrow(/not an input/);
    expect(startedAt(greenhouseIntegral, { heat: 7 }).variables.find((v) => v.id === 'heat')!.initial).toBe(7);
    expect(() => heldModel(greenhouseIntegral, { nope: 1 })).toThrow(/"nope"/);
  });
});
