/**
 * Roles at a sampling interval Δ and study length W. The rule (common
 * practice for timescale separation by a factor k; Loopfold's settings
 * document it): settled when k·τ ≤ Δ, frozen when τ ≥ k·W, else dynamic.
 * Expected values below are worked by hand from that rule.
 */
import { describe, expect, it } from 'vitest';
import { bands, breakpoints, rolesAt } from '../../../src/core/ordering/timescales';
import type { Model } from '../../../src/core/model/types';

const model: Model = {
  format: 'loopfold-model',
  version: 1,
  name: 'roles',
  timeUnit: 'h',
  variables: [
    { id: 'a', kind: 'input' },
    { id: 'fast', kind: 'state', timescale: '40 min' }, // τ = 2/3 h
    { id: 'slow', kind: 'state', timescale: 24 }, // τ = 1 day
    { id: 'loose', kind: 'state' }, // no timescale
    { id: 'y', kind: 'derived' },
  ],
  links: [],
};

/** The neighbouring doubles of x (IEEE 754 binary64): the exact edges of a breakpoint. */
function nextUp(x: number): number {
  const b = new DataView(new ArrayBuffer(8));
  b.setFloat64(0, x);
  b.setBigUint64(0, b.getBigUint64(0) + 1n);
  return b.getFloat64(0);
}
function nextDown(x: number): number {
  const b = new DataView(new ArrayBuffer(8));
  b.setFloat64(0, x);
  b.setBigUint64(0, b.getBigUint64(0) - 1n);
  return b.getFloat64(0);
}

describe('rolesAt', () => {
  it('without an interval: the mechanism, every state dynamic, no warnings', () => {
    const r = rolesAt(model, {});
    expect(r.roles).toEqual({ a: 'input', fast: 'state', loose: 'state', slow: 'state', y: 'derived' });
    expect(r.diagnostics).toEqual([]);
  });

  it('Δ = 4 h, 50 samples: fast settles (5 × 2/3 h ≤ 4 h); slow stays dynamic (24 h < 5 × 200 h)', () => {
    const r = rolesAt(model, { interval: 4 });
    expect(r.roles.fast).toBe('settled');
    expect(r.roles.slow).toBe('state');
    expect(r.window).toBe(200);
  });

  it('a state without a timescale stays dynamic, with one warning that says so', () => {
    const r = rolesAt(model, { interval: 4 });
    expect(r.roles.loose).toBe('state');
    expect(r.diagnostics).toEqual([
      {
        level: 'warning',
        code: 'no-timescale',
        message: 'loose has no timescale, so it stays dynamic at every interval: give it a timescale (such as "30 min") to let it settle or freeze',
        variables: ['loose'],
        equations: [],
      },
    ]);
  });

  it('a fixed window W = 2 h at Δ = 1 h: slow is frozen (24 h ≥ 5 × 2 h), fast is dynamic (5 × 2/3 h > 1 h)', () => {
    const r = rolesAt(model, { interval: 1, window: 2 });
    expect(r.roles.slow).toBe('frozen');
    expect(r.roles.fast).toBe('state');
  });

  it('a very short interval freezes both: Δ = 0.001 h, W = 0.05 h, k·W = 0.25 h ≤ both timescales', () => {
    const r = rolesAt(model, { interval: 0.001 });
    expect([r.roles.fast, r.roles.slow]).toEqual(['frozen', 'frozen']);
  });

  it('Δ > W is an error worded for the modeller', () => {
    const r = rolesAt(model, { interval: 3, window: 2 });
    const d = r.diagnostics.find((x) => x.code === 'interval-exceeds-window')!;
    expect(d.level).toBe('error');
    expect(d.message).toBe('the sampling interval (3 h) is longer than the study (2 h): no two samples fit in it; shorten the interval or lengthen the study');
  });

  it('settleAll settles every state; a hold overrides any role; the separation and samples settings are read', () => {
    expect(rolesAt(model, { settleAll: true }).roles).toMatchObject({ fast: 'settled', slow: 'settled', loose: 'settled' });
    expect(rolesAt(model, { interval: 4, hold: { fast: 0, y: 1 } }).roles).toMatchObject({ fast: 'held', y: 'held' });
    const k10: Model = { ...model, settings: { separation: 10, samples: 10 } };
    // k = 10: fast settles only when Δ ≥ 10 × 2/3 h; slow frozen when 24 ≥ 10 × 10 Δ, i.e. Δ ≤ 0.24 h
    expect(rolesAt(k10, { interval: 4 }).roles.fast).toBe('state');
    expect(rolesAt(k10, { interval: 0.24 }).roles.slow).toBe('frozen');
    expect(rolesAt(k10, { interval: 0.25 }).roles.slow).toBe('state');
  });

  it('a bad interval or an unknown held variable is reported', () => {
    expect(rolesAt(model, { interval: -1 }).diagnostics.map((d) => d.code)).toEqual(['bad-interval']);
    expect(rolesAt(model, { hold: { nothere: 1 } }).diagnostics[0].message).toBe('cannot hold "nothere": no such variable in this model');
  });
});

describe('breakpoints and bands (N samples)', () => {
  const bps = breakpoints(model);

  it('each state thaws at τ/(k·N) (exclusive) and settles at k·τ (inclusive), in interval order', () => {
    expect(bps.map((b) => [b.interval, b.exclusive === true, b.changes.map((c) => `${c.variable}:${c.from}→${c.to}`).join(' ')])).toEqual([
      [(40 / 60) / (5 * 50), true, 'fast:frozen→state'],
      [24 / (5 * 50), true, 'slow:frozen→state'],
      [5 * (40 / 60), false, 'fast:state→settled'],
      [5 * 24, false, 'slow:state→settled'],
    ]);
  });

  it('reasons say why, in the modeller\'s units', () => {
    expect(bps[2].changes[0].reason).toBe('fast settles: timescale 40 min × 5 ≤ interval');
    expect(bps[0].changes[0].reason).toBe('fast becomes dynamic: timescale 40 min < 5 × study length (50 samples × interval)');
    expect(bps[3].changes[0].reason).toBe('slow settles: timescale 1 day × 5 ≤ interval');
  });

  it('the roles change exactly at each breakpoint: inclusive ones at the value, exclusive ones at the next double', () => {
    for (const b of bps) {
      for (const c of b.changes) {
        const at = rolesAt(model, { interval: b.interval }).roles[c.variable];
        const below = rolesAt(model, { interval: nextDown(b.interval) }).roles[c.variable];
        const above = rolesAt(model, { interval: nextUp(b.interval) }).roles[c.variable];
        if (b.exclusive) {
          expect([below, at, above]).toEqual([c.from, c.from, c.to]);
        } else {
          expect([below, at, above]).toEqual([c.from, c.to, c.to]);
        }
      }
    }
  });

  it('bands cover (0, ∞) without gaps, each with the roles that rolesAt gives inside it', () => {
    const bs = bands(model);
    expect(bs[0].from).toBe(0);
    expect(bs[bs.length - 1].to).toBe(Infinity);
    for (let i = 1; i < bs.length; i++) {
      expect(bs[i].from).toBe(bs[i - 1].to);
      expect(Boolean(bs[i].excludesFrom)).toBe(Boolean(bs[i - 1].includesTo));
    }
    expect(bs).toHaveLength(bps.length + 1);
    for (const b of bs) {
      const probes = [b.to === Infinity ? b.from * 3 : (b.from + b.to) / 2];
      if (!b.excludesFrom && b.from > 0) probes.push(b.from);
      if (b.includesTo) probes.push(b.to);
      else if (b.to !== Infinity) probes.push(nextDown(b.to));
      if (b.excludesFrom) probes.push(nextUp(b.from));
      for (const p of probes) expect(rolesAt(model, { interval: p }).roles).toEqual(b.roles);
    }
    expect(bs.map((b) => `${b.roles.fast}/${b.roles.slow}`)).toEqual(['frozen/frozen', 'state/frozen', 'state/state', 'settled/state', 'settled/settled']);
  });
});

describe('breakpoints and bands (fixed window)', () => {
  it('W = 30 h: slow stays dynamic on the whole axis (24 h < 5 × 30 h), fast settles at 10/3 h; the axis ends at W', () => {
    const bps = breakpoints(model, { window: 30 });
    // τ_slow = 24 h < k·W = 150 h: dynamic for every Δ; it would settle at 120 h > W, outside the axis.
    expect(bps.map((b) => [b.interval, b.changes.map((c) => `${c.variable}:${c.from}→${c.to}`)])).toEqual([[5 * (40 / 60), ['fast:state→settled']]]);
    const bs = bands(model, { window: 30 });
    expect(bs.map((b) => [b.from, b.to, b.includesTo === true, b.roles.fast, b.roles.slow])).toEqual([
      [0, 5 * (40 / 60), false, 'state', 'state'],
      [5 * (40 / 60), 30, true, 'settled', 'state'],
    ]);
  });

  it('W = 4 h: slow is frozen throughout (24 h ≥ 5 × 4 h); fast settles at 10/3 h ≤ W', () => {
    const bs = bands(model, { window: 4 });
    expect(bs.map((b) => `${b.roles.fast}/${b.roles.slow}`)).toEqual(['state/frozen', 'settled/frozen']);
    expect(breakpoints(model, { window: 4 })[0].changes).toEqual([{ variable: 'fast', from: 'state', to: 'settled', reason: 'fast settles: timescale 40 min × 5 ≤ interval' }]);
  });
});

describe('breakpoints: coinciding changes', () => {
  const twin: Model = {
    format: 'loopfold-model',
    version: 1,
    name: 'twin',
    timeUnit: 'h',
    variables: [
      { id: 'p', kind: 'state', timescale: 1 },
      { id: 'q', kind: 'state', timescale: 1 },
      { id: 'r', kind: 'state', timescale: 1250 },
    ],
    links: [],
  };

  it('two states with one timescale change together: one breakpoint, changes sorted by variable', () => {
    const bps = breakpoints(twin);
    const at5 = bps.filter((b) => b.interval === 5);
    // p, q settle at 5 × 1 h (inclusive); r thaws at 1250 h / (5 × 50) = 5 h (exclusive): two breakpoints at 5 h
    expect(at5.map((b) => [b.exclusive === true, b.changes.map((c) => c.variable)])).toEqual([
      [false, ['p', 'q']],
      [true, ['r']],
    ]);
  });

  it('an inclusive and an exclusive breakpoint at the same interval make a one-point band [5, 5]', () => {
    const bs = bands(twin);
    const point = bs.filter((b) => b.from === 5 && b.to === 5);
    expect(point).toHaveLength(1);
    expect(point[0].includesTo).toBe(true);
    expect(point[0].excludesFrom).toBeUndefined();
    expect(point[0].roles).toEqual({ p: 'settled', q: 'settled', r: 'frozen' });
    expect(rolesAt(twin, { interval: 5 }).roles).toEqual(point[0].roles);
    expect(rolesAt(twin, { interval: nextUp(5) }).roles.r).toBe('state');
    expect(rolesAt(twin, { interval: nextDown(5) }).roles.p).toBe('state');
  });
});
