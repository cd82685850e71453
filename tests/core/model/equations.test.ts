/**
 * Model → equation structure. The expected structures follow Loopfold's
 * model semantics (DEVELOPERS.md; the Model type's documentation): a sketch
 * reads its links, formulas decide when present; the derivative of a state
 * is the unknown of its rate equation (Iwasaki & Simon 1994, dynamic
 * equations dx/dt = f(…)).
 */
import { describe, expect, it } from 'vitest';
import { buildStructure } from '../../../src/core/model/equations';
import type { Link, Model, Relation, Variable } from '../../../src/core/model/types';

function model(variables: Variable[], links: Link[] = [], relations?: Relation[]): Model {
  return { format: 'loopfold-model', version: 1, name: 'test', timeUnit: 'h', variables, links, relations };
}
const eqs = (m: Model) => Object.fromEntries(buildStructure(m).structure.equations.map((e) => [e.id, e.variables]));
const codes = (m: Model) => buildStructure(m).diagnostics.map((d) => d.code).sort();

describe('sketch semantics (no formulas)', () => {
  const m = model(
    [
      { id: 'a', kind: 'input' },
      { id: 'p', kind: 'state' },
      { id: 'q', kind: 'state', selfRegulating: false },
      { id: 'y', kind: 'derived' },
    ],
    [
      { from: 'a', to: 'p', kind: 'integrating' },
      { from: 'y', to: 'q', kind: 'integrating' },
      { from: 'p', to: 'y', kind: 'instantaneous' },
    ],
  );

  it('a derived variable: formula(v) over v and the sources of its instantaneous links', () => {
    expect(eqs(m)['formula(y)']).toEqual(['p', 'y']);
  });

  it("a state: rate(x) over x', its integrating sources, and x itself unless selfRegulating is false", () => {
    expect(eqs(m)['rate(p)']).toEqual(['a', 'p', "p'"]);
    expect(eqs(m)['rate(q)']).toEqual(["q'", 'y']);
  });

  it('inputs and dynamic states are given from outside; every state has a derivative; inputs have no equation', () => {
    const s = buildStructure(m).structure;
    expect(s.exogenous).toEqual(['a', 'p', 'q']);
    expect(s.derivatives).toEqual({ p: 'rate(p)', q: 'rate(q)' });
    expect(s.equations.map((e) => e.id).sort()).toEqual(['formula(y)', 'rate(p)', 'rate(q)']);
    expect(buildStructure(m).diagnostics).toEqual([]);
  });
});

describe('formula semantics (the formulas win over the links)', () => {
  it('variables come from the symbols of formulas, rates and relations', () => {
    const m = model(
      [
        { id: 'k', kind: 'input' },
        { id: 's', kind: 'state', rate: 'k * (y - s)' },
        { id: 'y', kind: 'derived', formula: 'exp(-k) + w' },
        { id: 'w', kind: 'derived' },
      ],
      [],
      [{ id: 'r1', equation: 'w * w = s + k' }],
    );
    const e = eqs(m);
    expect(e['rate(s)']).toEqual(['k', 's', "s'", 'y']);
    expect(e['formula(y)']).toEqual(['k', 'w', 'y']);
    expect(e['r1']).toEqual(['k', 's', 'w']);
    // w has neither a formula nor links and is named in r1: the relation determines it, with no equation of its own
    expect(e['formula(w)']).toBeUndefined();
  });

  it('a derived variable with neither formula nor links, and in no relation, is a constant of its own equation', () => {
    expect(eqs(model([{ id: 'w', kind: 'derived' }]))['formula(w)']).toEqual(['w']);
  });

  it('a rate that omits the state leaves it out, whatever selfRegulating says (with a warning when it says true)', () => {
    const m = model([{ id: 'u', kind: 'input' }, { id: 's', kind: 'state', rate: '2*u', selfRegulating: true }]);
    expect(eqs(m)['rate(s)']).toEqual(['s\'', 'u']);
    const d = buildStructure(m).diagnostics.find((x) => x.code === 'self-regulation')!;
    expect(d.message).toBe('s is marked self-regulating, but its rate does not use s: the rate wins; add s to the rate or clear the mark');
  });

  it('a drawn link the formula does not use is reported, and left out', () => {
    const m = model(
      [{ id: 'a', kind: 'input' }, { id: 'b', kind: 'input' }, { id: 'y', kind: 'derived', formula: '2*a' }],
      [{ from: 'b', to: 'y', kind: 'instantaneous' }],
    );
    expect(eqs(m)['formula(y)']).toEqual(['a', 'y']);
    const d = buildStructure(m).diagnostics;
    expect(d.map((x) => x.message)).toEqual(['the link b → y is drawn, but the formula of y does not use b: the formula wins; remove the link or add b to the formula']);
    expect(d[0].variables).toEqual(['b', 'y']);
    expect(d[0].equations).toEqual(['formula(y)']);
  });
});

describe('diagnostics, worded for the modeller', () => {
  it('a formula that cannot be read: the message and the position, and the links are used instead', () => {
    const m = model([{ id: 'a', kind: 'input' }, { id: 'y', kind: 'derived', formula: 'a + * 2' }], [{ from: 'a', to: 'y', kind: 'instantaneous' }]);
    const d = buildStructure(m).diagnostics;
    const err = d.find((x) => x.code === 'formula-error')!;
    expect(err.level).toBe('error');
    expect(err.message).toMatch(/^the formula of y: syntax error: .* \(at character \d+\)$/);
    expect(err.equations).toEqual(['formula(y)']);
    expect(eqs(m)['formula(y)']).toEqual(['a', 'y']);
  });

  it('unknown names are named, and the known ones still count', () => {
    const m = model([{ id: 'a', kind: 'input' }, { id: 'y', kind: 'derived', formula: 'a * gain + offset' }]);
    const err = buildStructure(m).diagnostics.find((x) => x.code === 'unknown-name')!;
    expect(err.message).toBe('the formula of y uses "gain", "offset", which are not variables of this model: add them or correct the spelling');
    expect(eqs(m)['formula(y)']).toEqual(['a', 'y']);
  });

  it('a derived variable defined by itself is an error', () => {
    const m = model([{ id: 'y', kind: 'derived', formula: 'y / 2 + 1' }]);
    const err = buildStructure(m).diagnostics.find((x) => x.code === 'self-reference')!;
    expect(err.level).toBe('error');
    expect(err.message).toContain('the formula of y uses y itself');
  });

  it('mixed incoming links: say how to fix it (make it a state, or mark the links instantaneous)', () => {
    const m = model(
      [{ id: 'a', kind: 'input' }, { id: 'b', kind: 'input' }, { id: 'y', kind: 'derived' }],
      [{ from: 'a', to: 'y', kind: 'instantaneous' }, { from: 'b', to: 'y', kind: 'integrating' }],
    );
    const d = buildStructure(m).diagnostics;
    expect(d.map((x) => x.code)).toEqual(['mixed-links']);
    expect(d[0].message).toBe(
      'the links into y are of mixed kind (instantaneous from a; integrating from b): make y a state, or mark the links instantaneous; the integrating ones are left out for now',
    );
    expect(eqs(m)['formula(y)']).toEqual(['a', 'y']);
  });

  it('an instantaneous link into a state and an integrating link into a derived variable contradict the kinds', () => {
    const m = model(
      [{ id: 'a', kind: 'input' }, { id: 's', kind: 'state' }, { id: 'y', kind: 'derived' }],
      [{ from: 'a', to: 's', kind: 'instantaneous' }, { from: 'a', to: 'y', kind: 'integrating' }],
    );
    const d = buildStructure(m).diagnostics;
    expect(d.map((x) => x.code)).toEqual(['link-kind', 'link-kind']);
    expect(d[0].message).toContain('the link a → s is drawn instantaneous, but s is a state');
    expect(d[1].message).toContain('the link a → y is integrating, but y is derived');
    expect(eqs(m)['rate(s)']).toEqual(['s', "s'"]);
    expect(eqs(m)['formula(y)']).toEqual(['y']);
  });

  it('links into an input are ignored, and the message says so', () => {
    const m = model([{ id: 'a', kind: 'input' }, { id: 'b', kind: 'input' }], [{ from: 'b', to: 'a', kind: 'instantaneous' }]);
    const d = buildStructure(m).diagnostics;
    expect(d).toHaveLength(1);
    expect(d[0].message).toBe('the link from b into the input a is ignored: an input is set from outside; make a derived or a state if it depends on them');
    expect(buildStructure(m).structure.equations).toEqual([]);
  });

  it('a relation that cannot be read is reported with its id and left out', () => {
    const m = model([{ id: 'a', kind: 'input' }], [], [{ id: 'r1', equation: 'a + 1' }]);
    expect(codes(m)).toEqual(['formula-error', 'relation-ignored']);
    expect(buildStructure(m).diagnostics.find((x) => x.code === 'formula-error')!.message).toMatch(/^relation r1: a relation needs one "="/);
  });

  it('the structure does not depend on the order of variables, links and relations in the file', () => {
    const vars: Variable[] = [
      { id: 'a', kind: 'input' },
      { id: 's', kind: 'state' },
      { id: 'y', kind: 'derived' },
      { id: 'z', kind: 'derived', formula: 'y + s' },
    ];
    const links: Link[] = [
      { from: 'a', to: 's', kind: 'integrating' },
      { from: 'y', to: 's', kind: 'integrating' },
      { from: 's', to: 'y', kind: 'instantaneous' },
    ];
    const rels: Relation[] = [{ id: 'r2', equation: 'z = a' }, { id: 'r1', equation: 'y = 2' }];
    const one = JSON.stringify(buildStructure(model(vars, links, rels)));
    const two = JSON.stringify(buildStructure(model([...vars].reverse(), [...links].reverse(), [...rels].reverse())));
    expect(two).toBe(one);
  });
});
