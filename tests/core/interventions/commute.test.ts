import { describe, expect, it } from 'vitest';
import { commutation, commutesByCriterion, feedbackSet, holdThenSettle, sameStructure, settleThenHold } from '../../../src/core/interventions/commute';
import { chainRegulated, mech, rolesOf, selfRegulated, simultaneous } from './systems';
import { seededRandom } from '../../../src/core/stats/random';

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

/*
 * The verdict against brute force. An independent recomputation of both orders straight from the system's
 * description (no code of src/core/ordering): the do-operator removes a variable's own equation (formula or
 * rate) in the running system; settling turns a rate equation into a balance (its derivative gone), freezing
 * drops it; in the equilibrium model the hold removes the equation a complete matching of equations to
 * unknowns pairs with the variable (Simon's causal ordering: each equation determines the variable it is
 * matched with; the matchings are enumerated exhaustively, and when they disagree the pairing is not
 * determined by the equilibrium model). The two resulting equation sets are compared as sets of
 * (equation, variables). Cases whose equilibrium model has no complete matching (under- or
 * over-determined) are left out: there the pairing is not defined by matchings alone.
 */
describe('the commutation verdict against exhaustive recomputation on random small systems', () => {
  type Eqs = Map<string, Set<string>>;
  interface Sys { inputs: string[]; states: Record<string, string[]>; derived: Record<string, string[]> }
  interface Side { eqs: Eqs; exogenous: Set<string>; dynamic: Set<string> }

  function randomSystem(r: () => number): { sys: Sys; settle: string[]; freeze: string[] } {
    const inputs = Array.from({ length: 1 + Math.floor(r() * 2) }, (_, i) => `u${i}`);
    const states = Array.from({ length: 1 + Math.floor(r() * 3) }, (_, i) => `x${i}`);
    const derived = Array.from({ length: Math.floor(r() * 4) }, (_, i) => `y${i}`);
    const all = [...inputs, ...states, ...derived];
    const sys: Sys = { inputs, states: {}, derived: {} };
    for (const x of states) sys.states[x] = all.filter((v) => v !== x && r() < 0.35).concat(r() < 0.5 ? [x] : []);
    // derived formulas read earlier derived variables only (no algebraic loop in the mechanism)
    derived.forEach((y, i) => { sys.derived[y] = [...inputs, ...states, ...derived.slice(0, i)].filter(() => r() < 0.45); });
    const settle = states.filter(() => r() < 0.6);
    const freeze = states.filter((x) => !settle.includes(x) && r() < 0.4);
    return { sys, settle, freeze };
  }

  function mechanism(sys: Sys): Side {
    const eqs: Eqs = new Map();
    for (const [x, reads] of Object.entries(sys.states)) eqs.set(`rate(${x})`, new Set([`${x}'`, ...reads]));
    for (const [y, reads] of Object.entries(sys.derived)) eqs.set(`formula(${y})`, new Set([y, ...reads]));
    return { eqs, exogenous: new Set([...sys.inputs, ...Object.keys(sys.states)]), dynamic: new Set(Object.keys(sys.states)) };
  }

  const copy = (s: Side): Side => ({ eqs: new Map([...s.eqs].map(([k, v]) => [k, new Set(v)])), exogenous: new Set(s.exogenous), dynamic: new Set(s.dynamic) });

  function settleAndFreeze(s: Side, settle: string[], freeze: string[], held: Set<string>): Side {
    const o = copy(s);
    for (const x of settle) if (!held.has(x) && o.dynamic.has(x)) { o.eqs.get(`rate(${x})`)!.delete(`${x}'`); o.dynamic.delete(x); o.exogenous.delete(x); }
    for (const x of freeze) if (!held.has(x) && o.dynamic.has(x)) { o.eqs.delete(`rate(${x})`); o.dynamic.delete(x); }
    return o;
  }

  /** Every complete matching of equations to the unknowns (variables not given), by backtracking; null when none is complete. */
  function matchings(s: Side): Map<string, string>[] | null {
    const ids = [...s.eqs.keys()];
    const unknowns = new Set([...s.eqs.values()].flatMap((vs) => [...vs]).filter((v) => !s.exogenous.has(v)));
    if (unknowns.size !== ids.length) return null;
    const out: Map<string, string>[] = [];
    const used = new Set<string>();
    const cur = new Map<string, string>();
    const go = (i: number) => {
      if (i === ids.length) { out.push(new Map(cur)); return; }
      for (const v of s.eqs.get(ids[i])!) {
        if (s.exogenous.has(v) || used.has(v)) continue;
        used.add(v); cur.set(ids[i], v);
        go(i + 1);
        used.delete(v); cur.delete(ids[i]);
      }
    };
    go(0);
    return out.length ? out : null;
  }

  /** Hold then settle, recomputed: the held variable's own equation goes, then the interval's settling and freezing. */
  function holdFirst(sys: Sys, settle: string[], freeze: string[], holds: string[]): Side {
    const o = copy(mechanism(sys));
    for (const v of holds) {
      o.eqs.delete(v in sys.states ? `rate(${v})` : `formula(${v})`);
      o.eqs.set(`hold(${v})`, new Set([v]));
      o.exogenous.delete(v);
      o.dynamic.delete(v);
    }
    return settleAndFreeze(o, settle, freeze, new Set(holds));
  }

  /** Settle then hold, recomputed; 'undefined' when an equilibrium model has no complete matching, 'ambiguous' when matchings pair a held variable differently. */
  function settleFirst(sys: Sys, settle: string[], freeze: string[], holds: string[]): Side | 'undefined' | 'ambiguous' {
    let o = settleAndFreeze(mechanism(sys), settle, freeze, new Set());
    for (const v of [...holds].sort()) {
      o = copy(o);
      if (o.dynamic.has(v)) { o.eqs.delete(`rate(${v})`); o.dynamic.delete(v); }
      else if (!o.exogenous.has(v)) {
        const ms = matchings(o);
        if (ms === null) return 'undefined';
        const paired = new Set(ms.map((m) => [...m].find(([, w]) => w === v)![0]));
        if (paired.size > 1) return 'ambiguous';
        o.eqs.delete([...paired][0]);
      }
      o.exogenous.delete(v);
      o.eqs.set(`hold(${v})`, new Set([v]));
    }
    return o;
  }

  const key = (s: Side) => JSON.stringify([[...s.eqs].map(([k, v]) => `${k}{${[...v].sort().join(',')}}`).sort(), [...s.exogenous].sort(), [...s.dynamic].sort()]);

  it('agrees with the exhaustive recomputation for single and paired holds on 200 random systems', () => {
    const r = seededRandom(20260105).uniform;
    let compared = 0, disagreeing = 0, ambiguous = 0;
    for (let n = 0; n < 200; n++) {
      const { sys, settle, freeze } = randomSystem(r);
      const all = [...sys.inputs, ...Object.keys(sys.states), ...Object.keys(sys.derived)];
      const holdSets = [...all.map((v) => [v]), ...all.flatMap((a, i) => all.slice(i + 1).map((b) => [a, b]))];
      const m = mech({ inputs: sys.inputs, states: sys.states, derived: sys.derived });
      for (const holds of holdSets) {
        const b = settleFirst(sys, settle, freeze, holds);
        if (b === 'undefined') continue;
        const brute = b !== 'ambiguous' && key(holdFirst(sys, settle, freeze, holds)) === key(b);
        const c = commutation({ mechanism: m, plan: { settle, freeze }, hold: Object.fromEntries(holds.map((v) => [v, 1])), roles: rolesOf(sys, settle, freeze) });
        expect(c.agree, `hold ${holds} in ${JSON.stringify(sys)}, settle ${settle}, freeze ${freeze}`).toBe(brute);
        if (holds.length === 1) expect(commutesByCriterion(m, { settle, freeze }, holds[0]), `criterion for ${holds[0]} in ${JSON.stringify(sys)}, settle ${settle}`).toBe(brute);
        compared++;
        if (!brute) disagreeing++;
        if (b === 'ambiguous') ambiguous++;
      }
    }
    // the sample holds both verdicts in number, and ambiguous pairings, so neither side is checked vacuously
    // (measured with this seed at 400 systems: 4744 compared, 1323 not commuting, 854 of them ambiguous)
    expect(compared).toBeGreaterThan(1500);
    expect(disagreeing).toBeGreaterThan(300);
    expect(compared - disagreeing).toBeGreaterThan(1000);
    expect(ambiguous).toBeGreaterThan(100);
  });
});
