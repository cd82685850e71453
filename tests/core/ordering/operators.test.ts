/**
 * The operators of Iwasaki & Simon (1994), "Causality and model
 * abstraction", Artificial Intelligence 67 — equilibration (§3) and
 * exogenization (§4) — and the do-operator (Pearl, "Causality", 2000,
 * §3.2.1: the equation of the intervened variable is replaced by x = value).
 * Structures are abstract with neutral names.
 */
import { describe, expect, it } from 'vitest';
import { equilibrate, exogenize, hold } from '../../../src/core/ordering/operators';
import { orderStructure } from '../../../src/core/ordering/order';
import type { EquationStructure } from '../../../src/core/ordering/structure';

const eq = (id: string, ...variables: string[]) => ({ id, variables });
const base = (): EquationStructure => ({
  // u1 input; x1 a dynamic state (rate over x1', x1, y1); y1 = formula(x1); y2, y3 coupled by relations r1, r2 with y1
  equations: [eq('rate(x1)', "x1'", 'x1', 'y1'), eq('formula(y1)', 'y1', 'x1', 'u1'), eq('r1', 'y2', 'y3', 'y1'), eq('r2', 'y2', 'y3')],
  exogenous: ['u1', 'x1'],
  variables: ['u1', 'x1', 'y1', 'y2', 'y3'],
  derivatives: { x1: 'rate(x1)' },
});
const blocks = (s: EquationStructure) => orderStructure(s).blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}`);

describe('equilibrate', () => {
  it("x' disappears and the rate becomes a balance equation over the rest of its variables; x becomes an unknown", () => {
    const { structure, change } = equilibrate(base(), 'x1');
    expect(structure.equations.find((e) => e.id === 'rate(x1)')!.variables).toEqual(['x1', 'y1']);
    expect(structure.exogenous).toEqual(['u1']);
    expect(structure.derivatives).toEqual({});
    expect(change).toMatchObject({ operator: 'equilibrate', variable: 'x1', changed: ['rate(x1)'], removed: [], added: [] });
    // x1 and y1 now determine each other (rate(x1) and formula(y1) form one block)
    expect(blocks(structure)).toEqual(['0:u1/', '1:x1,y1/formula(y1),rate(x1)', '2:y2,y3/r1,r2']);
  });

  it('refuses what is not a dynamic state, naming it', () => {
    expect(() => equilibrate(base(), 'y1')).toThrow('equilibrate: "y1" is not a dynamic state, so it cannot settle');
    expect(() => equilibrate(base(), 'zz')).toThrow('equilibrate: no variable "zz" in this structure');
  });
});

describe('exogenize', () => {
  it('a dynamic state: its rate is dropped and it stays given', () => {
    const { structure, change } = exogenize(base(), 'x1');
    expect(change.removed).toEqual(['rate(x1)']);
    expect(structure.derivatives).toEqual({});
    expect(orderStructure(structure).integrations).toEqual([]);
  });

  it('a derived variable: its formula is dropped and it becomes exogenous', () => {
    const { structure, change } = exogenize(base(), 'y1');
    expect(change.removed).toEqual(['formula(y1)']);
    expect(structure.exogenous).toEqual(['u1', 'x1', 'y1']);
    expect(blocks(structure)).toEqual(['0:u1/', '0:x1/', '0:y1/', '1:y2,y3/r1,r2']);
  });
});

describe('hold (do-operator)', () => {
  it('records the value and replaces the determining equation by hold(x)', () => {
    const { structure, change } = hold(base(), 'y1', 3);
    expect(change).toMatchObject({ operator: 'hold', variable: 'y1', value: 3, removed: ['formula(y1)'], added: ['hold(y1)'] });
    expect(blocks(structure)).toEqual(['0:u1/', '0:x1/', '0:y1/hold(y1)', '1:y2,y3/r1,r2']);
    expect(change.ambiguous).toBeUndefined();
  });

  it('a variable of a simultaneous block: the choice is recorded as ambiguous with its candidates', () => {
    const { structure, change } = hold(base(), 'y2', 0);
    // Either r1 or r2 may be the one the intervention replaces: both leave y3 determined.
    expect(change.ambiguous).toEqual({ candidates: ['r1', 'r2'] });
    expect(change.removed).toEqual(['r1']);
    expect(change.note).toContain('any of r1, r2 could be the one dropped');
    expect(blocks(structure)).toEqual(['0:u1/', '0:x1/', '0:y2/hold(y2)', '1:y1/formula(y1)', '1:y3/r2']);
  });

  it('in an irreducible block every equation containing x is a candidate (full indecomposability; Brualdi & Ryser 1991, §4.2, from memory)', () => {
    // a cycle of three equations over three unknowns: r1{a,b}, r2{b,c}, r3{c,a}
    const s: EquationStructure = {
      equations: [eq('r1', 'a', 'b'), eq('r2', 'b', 'c'), eq('r3', 'c', 'a')],
      exogenous: [],
      variables: ['a', 'b', 'c'],
      derivatives: {},
    };
    expect(blocks(s)).toEqual(['0:a,b,c/r1,r2,r3']);
    const { structure, change } = hold(s, 'a', 0);
    expect(change.ambiguous).toEqual({ candidates: ['r1', 'r3'] });
    expect(blocks(structure)).toEqual(['0:a/hold(a)', '1:c/r3', '2:b/r2']);
  });

  it('an input held: it is determined by hold(x) instead of being given', () => {
    const { structure } = hold(base(), 'u1', 2);
    expect(structure.exogenous).toEqual(['x1']);
    expect(blocks(structure)[0]).toBe('0:u1/hold(u1)');
  });
});
