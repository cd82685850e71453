import { describe, expect, it } from 'vitest';
import { commutation, commutesByCriterion, feedbackSet, holdThenSettle, sameStructure, settleThenHold } from '../../../src/core/interventions/commute';
import { chainRegulated, mech, rolesOf, selfRegulated, simultaneous } from './systems';

// Sources: the cases below are rebuilt from memory of Dash (2005), whose text was not available here.
// What they test — that holding a variable and letting the fast states settle need not commute, that
// the failures come with feedback, and that some holds leave no equilibrium — is as stated in the
// abstracts of Dash's 2003 thesis ("Caveats for causal reasoning with equilibrium models") and of
// Dash & Druzdzel's paper on the manipulation postulate, read from stored public pages.
const eqs = (s: { equations: { id: string; variables: string[] }[] }) => Object.fromEntries(s.equations.map((e) => [e.id, e.variables]));
const edges = (o: { edges: { from: string; to: string; kind: string }[] }) => o.edges.map((e) => `${e.from}->${e.to}`).sort();

describe('a stock regulated through a chain (Dash 2005, §2–3, rebuilt from memory)', () => {
  const m = mech(chainRegulated);
  const plan = { settle: ['x'], freeze: [] };
  const roles = rolesOf(chainRegulated, ['x']);

  it('holding the stock: the equilibrium model replaces p = f(x) read backwards, the running system replaces the rate', () => {
    // Dash 2005, §3: manipulating the equilibrated variable in the equilibrium model removes the equation
    // that the equilibrium ordering associates with it (here formula(p)), which is not its own mechanism.
    expect(eqs(holdThenSettle(m, plan, { x: 1 }).structure)).toEqual({ 'formula(p)': ['p', 'x'], 'formula(q)': ['k', 'p', 'q'], 'hold(x)': ['x'] });
    expect(eqs(settleThenHold(m, plan, { x: 1 }).structure)).toEqual({ 'formula(q)': ['k', 'p', 'q'], 'hold(x)': ['x'], 'rate(x)': ['q', 'u'] });
    const c = commutation({ mechanism: m, plan, hold: { x: 1 }, roles });
    expect(c.agree).toBe(false);
    // Hand-derived: held, x drives p and p drives q; the equilibrium model says u fixes q and q fixes p.
    expect(edges(c.holdThenSettle)).toEqual(['k->q', 'p->q', 'x->p']);
    expect(edges(c.settleThenHold)).toEqual(['k->p', 'q->p', 'u->q']);
    expect(c.differences.filter((d) => d.kind === 'edge').map((d) => `${d.only}:${d.edge!.from}->${d.edge!.to}`).sort()).toEqual([
      'holdThenSettle:k->q', 'holdThenSettle:p->q', 'holdThenSettle:x->p', 'settleThenHold:k->p', 'settleThenHold:q->p', 'settleThenHold:u->q',
    ]);
    expect(c.drift).toBeNull();
    expect(commutesByCriterion(m, plan, 'x')).toBe(false);
  });

  it('holding a variable on the loop: the held system has no equilibrium (Dash 2005, §3: the stock never settles)', () => {
    const c = commutation({ mechanism: m, plan, hold: { p: 2 }, roles });
    expect(c.agree).toBe(false);
    // Hand-derived (coarse Dulmage–Mendelsohn, Pothen & Fan 1990): hold(p), formula(q), rate(x) are three
    // equations for the two unknowns p, q — rate(x) = 0 reads only u and q; and nothing fixes x.
    expect(c.drift).not.toBeNull();
    expect(c.drift!.equations).toEqual(['formula(q)', 'hold(p)', 'rate(x)']);
    expect(c.drift!.variables).toEqual(['x']);
    expect(c.drift!.states).toEqual(['x']);
    expect(c.explanation.join(' ')).toMatch(/breaks the feedback through which x settles/);
    expect(c.explanation.join(' ')).toMatch(/drifts/);
  });

  it('the loop through which x settles is x → p → q → x′ (Dash 2005 feedback set, from memory)', () => {
    expect(feedbackSet(m, 'x')).toEqual(['p', 'q']);
  });

  it('holding an input commutes; with x dynamic at the interval every hold commutes (common practice: nothing settles, nothing to conflict)', () => {
    for (const u of ['u', 'k']) {
      const c = commutation({ mechanism: m, plan, hold: { [u]: 3 }, roles });
      expect(c.agree, u).toBe(true);
      expect(c.holdThenSettle).toEqual(c.settleThenHold);
    }
    for (const v of ['x', 'p', 'q', 'u']) {
      const c = commutation({ mechanism: m, plan: { settle: [], freeze: [] }, hold: { [v]: 1 }, roles: rolesOf(chainRegulated, []) });
      expect(c.agree, v).toBe(true);
      expect(commutesByCriterion(m, { settle: [], freeze: [] }, v)).toBe(true);
    }
  });
});

describe('a self-regulating stock (Dash 2005, §4, from memory: equilibration and manipulation commute)', () => {
  const m = mech(selfRegulated);
  const plan = { settle: ['x'], freeze: [] };
  it('holding the stock or what it drives gives the same structure in either order', () => {
    for (const v of ['x', 'y', 'u']) {
      const c = commutation({ mechanism: m, plan, hold: { [v]: 0.5 }, roles: rolesOf(selfRegulated, ['x']) });
      expect(c.agree, v).toBe(true);
      expect(sameStructure(holdThenSettle(m, plan, { [v]: 0.5 }).structure, settleThenHold(m, plan, { [v]: 0.5 }).structure)).toBe(true);
      expect(c.holdThenSettle).toEqual(c.settleThenHold);
      expect(commutesByCriterion(m, plan, v)).toBe(true);
    }
  });
});

describe('a held variable inside a simultaneous block of the equilibrium model', () => {
  const m = mech(simultaneous);
  const plan = { settle: ['x'], freeze: [] };
  it('is ambiguous, and names the equations the hold could replace', () => {
    const c = commutation({ mechanism: m, plan, hold: { y: 1 }, roles: rolesOf(simultaneous, ['x']) });
    expect(c.agree).toBe(false);
    // Hand-derived: at equilibrium {x, y} are fixed together by rate(x) and formula(y); dropping either leaves the other able to fix x.
    expect(c.ambiguous).toHaveLength(1);
    expect(c.ambiguous[0].variable).toBe('y');
    expect(c.ambiguous[0].candidates).toEqual(['formula(y)', 'rate(x)']);
    expect(c.explanation.join(' ')).toMatch(/ambiguous/);
  });
});

describe('checks on the input', () => {
  it('refuses a variable the system does not have', () => {
    const m = mech(selfRegulated);
    expect(() => commutation({ mechanism: m, plan: { settle: ['x'], freeze: [] }, hold: { nope: 1 }, roles: rolesOf(selfRegulated, ['x']) })).toThrow(/no variable "nope"/);
  });
});
