import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { runPython } from '../../helpers/python';
import { decimals, expectClose } from '../../helpers/tolerance';
import { memoryIo } from '../../helpers/cli';

// A kettle on a stove (invented for this test): the water warms towards the plate, the room cools it.
const kettle = JSON.stringify({
  format: 'loopfold-model', version: 1, name: 'kettle', timeUnit: 'min',
  variables: [
    { id: 'plate', kind: 'input', value: 120 },
    { id: 'room', kind: 'input', value: 20 },
    { id: 'water', kind: 'state', initial: 20, rate: '0.1 * (plate - water) - loss' },
    { id: 'loss', kind: 'derived', formula: '0.02 * (water - room)' },
  ],
  links: [],
});
const REF = 'tests/reference/numeric_cli.py';
const SLEEP = 'src/examples/sleep-stress.json';

describe('numeric commands', () => {
  it('equilibrium --json prints values that solve the balance by hand: 0.1(120 − w) = 0.02(w − 20) → w = 103.33… (common practice)', async () => {
    const m = memoryIo({ 'k.json': kettle });
    expect(await runCli(['equilibrium', 'k.json', '--json'], m.io)).toBe(0);
    const r = JSON.parse(m.out[0]) as { values: Record<string, number>; diagnostics: unknown[] };
    expectClose(r.values.water, 12.4 / 0.12, decimals(10));
    expectClose(r.values.loss, 0.02 * (12.4 / 0.12 - 20), decimals(10));
    expect(r.diagnostics).toEqual([]);
  });

  it('simulate --csv writes RFC 4180 CSV that Python\'s csv module reads back, with the header the app saves (time (unit), then the labels)', async () => {
    const m = memoryIo({ 'k.json': kettle });
    expect(await runCli(['simulate', 'k.json', '--until', '1h', '--every', '15min', '--csv'], m.io)).toBe(0);
    const { rows } = runPython<{ rows: string[][] }>(REF, { csv: m.out[0] });
    // the kettle's variables have no labels: they are named by their ids
    expect(rows[0]).toEqual(['time (min)', 'plate', 'room', 'water', 'loss']);
    expect(rows.slice(1).map((r) => Number(r[0]))).toEqual([0, 15, 30, 45, 60]);
    // Closed form: w(t) = w* + (20 − w*) e^{−0.12 t} (linear first-order response, common practice).
    const ws = 12.4 / 0.12;
    // The default integration tolerance is rtol 1e-8.
    for (const r of rows.slice(1)) expectClose(Number(r[3]), ws + (20 - ws) * Math.exp(-0.12 * Number(r[0])), { relTol: 1e-7 }, `water at ${r[0]} min`);
  });

  it('sampled --json: Φ is SciPy\'s expm of the printed drift; timescales --json eigenvalues are NumPy\'s', async () => {
    const m = memoryIo();
    expect(await runCli(['sampled', SLEEP, '--interval', '6h', '--json'], m.io)).toBe(0);
    const s = JSON.parse(m.out[0]) as { states: string[]; drift: number[][]; phi: number[][]; innovation: number[][]; stationary: number[][] | null };
    expect(s.states).toEqual(['stress', 'cortisol', 'sleepDebt', 'mood', 'coping']);
    const ref = runPython<{ phi: number[][]; eig_re: number[] }>(REF, { drift: s.drift, interval: 6 });
    expectClose(s.phi, ref.phi, { relTol: 1e-10, absTol: 1e-12 }, 'Φ(6 h)');
    expect(s.stationary).not.toBeNull();
    const t = memoryIo();
    expect(await runCli(['timescales', SLEEP, '--json'], t.io)).toBe(0);
    const ts = JSON.parse(t.out[0]) as { eigenvalues: { re: number }[]; timescales: { state: string; given: number | null; derived: number }[] };
    expectClose(ts.eigenvalues.map((e) => e.re).sort((a, b) => a - b), ref.eig_re, { relTol: 1e-9 }, 'eigenvalues');
    expectClose(ts.timescales.find((x) => x.state === 'stress')!.given!, 40 / 60, decimals(12));
  });

  it('human-readable output without --json', async () => {
    const m = memoryIo();
    expect(await runCli(['timescales', SLEEP], m.io)).toBe(0);
    expect(m.out[0]).toMatch(/given 40 min/);
    expect(m.out[0]).toMatch(/derived/);
  });

  it('bad input: one line, non-zero exit', async () => {
    const bad = JSON.stringify({ ...JSON.parse(kettle), variables: [...JSON.parse(kettle).variables.slice(0, 3), { id: 'loss', kind: 'derived', formula: '0.02 * (water - roomm)' }] });
    for (const [argv, files, code, pattern] of [
      [['simulate', 'k.json'], { 'k.json': kettle }, 2, /--until is required/],
      [['sampled', 'k.json'], { 'k.json': kettle }, 2, /--interval is required/],
      [['simulate', 'k.json', '--until', 'soon'], { 'k.json': kettle }, 2, /--until/],
      [['simulate', 'bad.json', '--until', '1h'], { 'bad.json': bad }, 1, /roomm/],
      [['timescales', 'missing.json'], {}, 1, /no such file/],
    ] as [string[], Record<string, string>, number, RegExp][]) {
      const m = memoryIo(files);
      expect(await runCli(argv, m.io), argv.join(' ')).toBe(code);
      expect(m.err).toHaveLength(1);
      expect(m.err[0]).not.toContain('\n');
      expect(m.err[0]).toMatch(pattern);
    }
  });
});
