import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';
import { memoryIo } from '../../helpers/cli';

const REF = 'tests/reference/link_curves.py';
const GREENHOUSE = 'src/examples/greenhouse.json';

interface Ref { links: { effect: number[]; peak: { interval: number; effect: number } | null; range: [number, number] | null }[]; best: number | null; score?: number }

async function json<T>(argv: string[]): Promise<T> {
  const m = memoryIo();
  expect(await runCli(argv, m.io), m.err.join('\n')).toBe(0);
  return JSON.parse(m.out[0]) as T;
}

/** The drift at equilibrium as the `sampled` command prints it (the interval does not matter for A). */
async function drift(model: string): Promise<{ drift: number[][]; states: string[] }> {
  return json(['sampled', model, '--interval', '1h', '--json']);
}

describe('curves and advise commands', () => {
  it('curves --json: each value is SciPy expm(A·Δ)[to, from]; the peak matches scipy.optimize.minimize_scalar', async () => {
    const { drift: A, states } = await drift(GREENHOUSE);
    const c = await json<{ intervals: number[]; effect: number[]; peak: { interval: number; effect: number } | null }>(['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--json']);
    const ref = runPython<Ref>(REF, { drift: A, states, intervals: c.intervals, links: [{ from: 'soilWater', to: 'humidity' }], fraction: 0.5 });
    // Padé-13 scaling and squaring against SciPy's expm: agreement to ~1e-12 relative is common practice for well-scaled A.
    expectClose(c.effect, ref.links[0].effect, { relTol: 1e-9, absTol: 1e-14 }, 'effect');
    expect(c.peak).not.toBeNull();
    expectClose(c.peak!.interval, ref.links[0].peak!.interval, { relTol: 1e-5 }, 'peak interval');
    expectClose(c.peak!.effect, ref.links[0].peak!.effect, { relTol: 1e-9 }, 'peak effect');
    // Soil water reaches humidity only through transpiration: a rise-then-fade curve, whose peak lies between the
    // two states' timescales (1 h and 1 day in the example file): common practice for a two-stage chain.
    expect(c.peak!.interval).toBeGreaterThan(60);
    expect(c.peak!.interval).toBeLessThan(1440);
  });

  it('advise --json: ranges and the best interval are those SciPy finds on the same grid', async () => {
    const { drift: A, states } = await drift(GREENHOUSE);
    const links = [{ from: 'soilWater', to: 'humidity' }, { from: 'airTemp', to: 'humidity' }];
    const grid = (await json<{ intervals: number[] }>(['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--json'])).intervals;
    const a = await json<{ links: { peak: { interval: number } | null; range: [number, number] | null }[]; best: number | null; score: number; explanation: string }>(
      ['advise', GREENHOUSE, '--links', 'soilWater>humidity,airTemp>humidity', '--fraction', '0.6', '--json'],
    );
    const ref = runPython<Ref>(REF, { drift: A, states, intervals: grid, links, fraction: 0.6 });
    a.links.forEach((l, k) => {
      expectClose(l.peak!.interval, ref.links[k].peak!.interval, { relTol: 1e-5 }, `peak ${k}`);
      expectClose(l.range!, ref.links[k].range!, { relTol: 1e-12 }, `range ${k}`);
    });
    expectClose(a.best!, ref.best!, { relTol: 1e-12 }, 'best');
    expectClose(a.score, ref.score!, { relTol: 1e-6 }, 'score');
    expect(a.explanation).toContain('60%');
  });

  it('bad input gets a one-line reason naming the field and a non-zero exit', async () => {
    const cases: [string[], RegExp][] = [
      [['curves', GREENHOUSE, '--to', 'humidity'], /--from is required/],
      [['curves', GREENHOUSE, '--from', 'light', '--to', 'humidity'], /light is not a state/],
      [['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--points', '2'], /--points/],
      [['advise', GREENHOUSE, '--links', 'soilWater-humidity'], /"soilWater-humidity" is not a link/],
      [['advise', GREENHOUSE, '--links', 'soilWater>humidity', '--fraction', '1.5'], /--fraction must be/],
      [['advise', GREENHOUSE, '--links', 'soilWater>nowhere'], /nowhere is not a state/],
    ];
    for (const [argv, reason] of cases) {
      const m = memoryIo();
      expect(await runCli(argv, m.io)).not.toBe(0);
      const text = m.err.join('\n');
      expect(text).toMatch(reason);
      expect(text.trim().split('\n').length).toBe(1);
    }
  });
});

describe('advise --uncertain (strength ranges)', () => {
  it('adds the share of draws the advice holds in; degenerate ranges give the point advice in every draw', async () => {
    const { mkdtempSync, readFileSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const dir = mkdtempSync(join(tmpdir(), 'lf-advise-'));
    const base = JSON.parse(readFileSync(GREENHOUSE, 'utf8')) as { links: { from: string; to: string; weight?: number; strengthRange?: { low: number; high: number } }[] };
    const withRanges = (k: number) => {
      const m = structuredClone(base);
      // Every link keeps its strength as written (its default share when the file gives none: 0.8 / links into its target).
      const into = new Map<string, number>();
      for (const l of m.links) into.set(l.to, (into.get(l.to) ?? 0) + 1);
      for (const l of m.links) { const w = l.weight ?? 0.8 / into.get(l.to)!; l.strengthRange = { low: w * (1 - k), high: w * (1 + k) }; }
      const f = join(dir, `gh-${k}.json`);
      writeFileSync(f, JSON.stringify(m));
      return f;
    };
    const argv = (f: string) => ['advise', f, '--links', 'soilWater>humidity,airTemp>humidity', '--uncertain', '--draws', '12', '--seed', '5', '--points', '41', '--json'];
    type Out = { best: number | null; uncertain: { draws: number; holds: number; best: { q10: number; median: number; q90: number } | null; readings: string[] } };
    const point = await json<Out>(argv(withRanges(0)));
    expect(point.uncertain.draws).toBe(12);
    expect(point.uncertain.holds).toBe(1);
    expect(point.uncertain.best).toEqual({ q10: point.best, median: point.best, q90: point.best });
    const wide = await json<Out>(argv(withRanges(0.9)));
    expect(wide.uncertain.readings[0]).toMatch(/of 12 draws of the strengths/);
    const m = memoryIo();
    expect(await runCli(['advise', GREENHOUSE, '--links', 'soilWater>humidity', '--uncertain', '--draws', 'x'], m.io)).toBe(2);
    expect(m.err.join('\n')).toMatch(/--draws must be a whole number/);
  });
});
