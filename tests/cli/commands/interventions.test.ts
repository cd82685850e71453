import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { runCli } from '../../../src/cli/run';
import { runPython } from '../../helpers/python';
import type { Model } from '../../../src/core/model/types';
import { greenhouseIntegral, warehouseIntegral } from '../../core/interventions/scenarios';
import { memoryIo } from '../../helpers/cli';
import { decimals, expectClose } from '../../helpers/tolerance';

/** The chain-regulated stock of Dash 2005 (§2, rebuilt from memory) as a sketch with neutral names: x′ = u − q, p = f(x), q = g(p, k). */
const chain: Model = {
  format: 'loopfold-model',
  version: 1,
  name: 'Chain-regulated stock',
  timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input' },
    { id: 'k', kind: 'input' },
    { id: 'x', kind: 'state', timescale: 2, selfRegulating: false },
    { id: 'p', kind: 'derived' },
    { id: 'q', kind: 'derived' },
  ],
  links: [
    { from: 'u', to: 'x', kind: 'integrating' },
    { from: 'q', to: 'x', kind: 'integrating' },
    { from: 'x', to: 'p', kind: 'instantaneous' },
    { from: 'p', to: 'q', kind: 'instantaneous' },
    { from: 'k', to: 'q', kind: 'instantaneous' },
  ],
};

const files = () => ({ 'chain.json': JSON.stringify(chain), 'warehouse.json': JSON.stringify(warehouseIntegral), 'greenhouse.json': JSON.stringify(greenhouseIntegral) });

describe('loopfold commute', () => {
  it('prints one JSON object with agree, both orderings in the Ordering shape, and the differences', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'chain.json', '--hold', 'p=2', '--interval', '1 day', '--json'], m.io)).toBe(0);
    expect(m.out).toHaveLength(1);
    const r = JSON.parse(m.out[0]);
    expect(r.agree).toBe(false);
    for (const side of ['holdThenSettle', 'settleThenHold']) {
      expect(Object.keys(r[side]).sort()).toEqual(['blocks', 'diagnostics', 'edges', 'integrations', 'roles']);
      expect(r[side].roles.p).toBe('held');
      expect(r[side].roles.x).toBe('settled');
    }
    expect(r.differences.length).toBeGreaterThan(0);
    // Dash 2005 §3 (from memory): holding a variable on the loop of a non-self-regulating stock leaves it no equilibrium.
    expect(r.drift.states).toEqual(['x']);
  });

  it('agrees when nothing settles at the interval (x: 2 h timescale, sampled every 10 min)', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'chain.json', '--hold', 'p=2', '--interval', '10 min', '--json'], m.io)).toBe(0);
    expect(JSON.parse(m.out[0]).agree).toBe(true);
  });

  it('prints readable text without --json', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'chain.json', '--hold', 'x=1', '--interval', '1 day'], m.io)).toBe(0);
    expect(m.out.join('\n')).toMatch(/DIFFER/);
    expect(m.out.join('\n')).toMatch(/settle then hold/);
  });

  it('refuses bad input with a one-line reason and a non-zero exit', async () => {
    const cases: [string[], RegExp][] = [
      [['commute', 'chain.json', '--hold', 'nope=1', '--interval', '1 day'], /no variable "nope"/],
      [['commute', 'chain.json', '--hold', 'p=lots', '--interval', '1 day'], /"lots" is not a number \(for p\)/],
      [['commute', 'chain.json', '--hold', 'p', '--interval', '1 day'], /"p" is not VARIABLE=VALUE/],
      [['commute', 'chain.json', '--hold', 'p=1'], /name the sampling interval/],
      [['commute', 'chain.json', '--interval', '1 day'], /--hold needs VARIABLE=VALUE/],
      [['commute', 'chain.json', '--hold', 'p=1', '--interval', 'soon'], /--interval/],
      [['commute', 'missing.json', '--hold', 'p=1', '--interval', '1 day'], /cannot read missing.json/],
    ];
    for (const [argv, msg] of cases) {
      const m = memoryIo(files(), { disk: false });
      const code = await runCli(argv, m.io);
      expect(code, argv.join(' ')).not.toBe(0);
      expect(m.err).toHaveLength(1);
      expect(m.err[0]).toMatch(msg);
      expect(m.err[0]).not.toMatch(/\n/);
    }
  });
});

describe('loopfold commute with formulas', () => {
  it('adds the numbers of the running system held: the integrating heater winds up at 0.02·(20 − 18) per minute', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'greenhouse.json', '--hold', 'airTemp=18', '--interval', '10h', '--json'], m.io)).toBe(0);
    const r = JSON.parse(m.out[0]);
    expect(r.agree).toBe(false);
    expect(r.drift.states).toEqual(['heat']);
    expect(r.effect.drifting.map((d: { variable: string }) => d.variable)).toEqual(['heat']);
    expectClose(r.effect.drifting[0].slope, 0.04, decimals(6));
    const t = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'greenhouse.json', '--hold', 'heat=50', '--interval', '10h'], t.io)).toBe(0);
    // Hand-derived: held heat 50 ⇒ 0 = (5 − T)/10 + 2.5 ⇒ T = 30; unheld, the integral balance puts T at the setpoint 20.
    expect(t.out.join('\n')).toMatch(/airTemp: 20 → 30 \(\+10\)/);
  });
});

describe('loopfold commute --trajectory', () => {
  it('writes both runs as RFC 4180 CSV that Python reads back, ending where the closed form says', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'greenhouse.json', '--hold', 'heat=50', '--interval', '10h', '--until', '200 min', '--trajectory', 'runs.csv'], m.io)).toBe(0);
    const script = fileURLToPath(new URL('../../present/csv_reference.py', import.meta.url));
    const [{ parsed }] = runPython<{ parsed: string[][] }[]>(script, [{ rows: [], text: m.files['runs.csv'] }]);
    expect(parsed[0]).toEqual(['time', 'variable', 'without', 'with']);
    expect((parsed.length - 1) % greenhouseIntegral.variables.length).toBe(0);
    const last = parsed.filter((r) => r[1] === 'airTemp').pop()!;
    expect(Number(last[0])).toBe(200);
    // T′ = (5 − T)/10 + 0.05·50 from the unheld rest T = 20: T(200) = 30 − 10·e^(−20) (hand-derived).
    expectClose(Number(last[3]), 30 - 10 * Math.exp(-20), decimals(5));
    expectClose(Number(last[2]), 20, decimals(5));
  });

  it('refuses --trajectory for a sketch without formulas', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['commute', 'chain.json', '--hold', 'p=1', '--interval', '1 day', '--trajectory', 'x.csv'], m.io)).toBe(2);
    expect(m.err[0]).toMatch(/needs a model with formulas/);
  });
});

describe('loopfold adaptation', () => {
  it('prints { adapted: [{ variable, input }] }', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['adaptation', 'warehouse.json', '--json'], m.io)).toBe(0);
    // Hand-derived: at balance orders = demand and stock = target (integral correction).
    const adapted = JSON.parse(m.out[0]).adapted;
    expect(adapted.map((a: { variable: string; input: string }) => [a.variable, a.input])).toEqual([['orders', 'target'], ['stock', 'demand']]);
    // With formulas each pair is confirmed by a simulated step: orders return to demand (100), the stock to the target (500).
    expect(adapted.every((a: { confirmed: boolean }) => a.confirmed)).toBe(true);
    expectClose(adapted[0].before, 100, decimals(6));
    expectClose(adapted[1].before, 500, decimals(6));
  });

  it('says so in words without --json', async () => {
    const m = memoryIo(files(), { disk: false });
    expect(await runCli(['adaptation', 'warehouse.json'], m.io)).toBe(0);
    expect(m.out.join('\n')).toMatch(/stock adapts to demand/);
  });
});
