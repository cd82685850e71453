import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';

const SLEEP = 'src/examples/sleep-stress.json';

describe('loopfold order', () => {
  it('prints exactly one JSON object with roles, blocks, edges and diagnostics', async () => {
    const m = memoryIo();
    expect(await runCli(['order', SLEEP, '--interval', '1 day', '--samples', '50', '--json'], m.io)).toBe(0);
    expect(m.out).toHaveLength(1);
    const o = JSON.parse(m.out[0]);
    expect(Object.keys(o)).toEqual(expect.arrayContaining(['roles', 'blocks', 'edges', 'diagnostics']));
    // Settling rule (k·τ ≤ Δ with k = 5): stress τ = 40 min and cortisol τ = 90 min settle when
    // sampled daily; sleep debt (τ = 1 day) stays dynamic; over 50 daily samples (the flag
    // overrides the file's two-week study), coping (τ = 4 months ≈ 2922 h < 5 × 1200 h) is not frozen.
    expect(o.roles).toMatchObject({ workload: 'input', stress: 'settled', cortisol: 'settled', sleepDebt: 'state', mood: 'state', coping: 'state', rumination: 'derived' });
  });
  it('freezes the slow state over a two-week study', async () => {
    const m = memoryIo();
    expect(await runCli(['order', SLEEP, '--interval', '1 day', '--window', '2 weeks', '--json'], m.io)).toBe(0);
    // coping τ ≈ 2922 h ≥ 5 × 336 h: exogenized (frozen).
    expect(JSON.parse(m.out[0]).roles.coping).toBe('frozen');
  });
  it('holds a variable with --hold', async () => {
    const m = memoryIo();
    expect(await runCli(['order', SLEEP, '--interval', '1 day', '--hold', 'mood=0', '--json'], m.io)).toBe(0);
    expect(JSON.parse(m.out[0]).roles.mood).toBe('held');
  });
  it('gives readable text without --json', async () => {
    const m = memoryIo();
    expect(await runCli(['order', SLEEP, '--interval', '3h'], m.io)).toBe(0);
    expect(m.out[0]).toContain('blocks, in causal order');
    expect(m.out[0]).toContain('every 3 h');
  });
});

describe('loopfold breakpoints and check', () => {
  it('lists the settling interval of each state (k·τ)', async () => {
    const m = memoryIo();
    expect(await runCli(['breakpoints', SLEEP, '--json'], m.io)).toBe(0);
    const r = JSON.parse(m.out[0]);
    const at = r.breakpoints.map((b: { interval: number }) => b.interval);
    // stress settles at 5 × 40 min = 10/3 h, cortisol at 5 × 90 min = 7.5 h, sleep debt at 5 × 24 h.
    expect(at).toEqual(expect.arrayContaining([expect.closeTo(10 / 3, 9), expect.closeTo(7.5, 9), expect.closeTo(120, 9)]));
    expect([...at].sort((a: number, b: number) => a - b)).toEqual(at);
  });
  it('check exits 0 on a sound example and 1 on a model with errors', async () => {
    expect(await runCli(['check', SLEEP], memoryIo().io)).toBe(0);
    const broken = JSON.stringify({ format: 'loopfold-model', version: 1, name: 'b', timeUnit: 'h', variables: [{ id: 'x', kind: 'derived', formula: 'y +' }, { id: 'y', kind: 'input' }], links: [] });
    const m = memoryIo({ 'b.json': broken });
    expect(await runCli(['check', 'b.json'], m.io)).toBe(1);
    expect(m.out.join('\n')).toMatch(/error/);
  });
});

describe('command-line errors are one line with a non-zero exit', () => {
  it.each([
    [['frobnicate', SLEEP], /unknown command "frobnicate"/],
    [['order', SLEEP, '--speed', '3'], /unknown option --speed/],
    [['order', 'no-such-file.json'], /cannot read no-such-file.json: no such file/],
    [['order', SLEEP, '--interval', '3 parsecs'], /--interval: .*parsecs/],
    [['order', SLEEP, '--hold', 'nobody=1'], /no variable "nobody"/],
    [['order', SLEEP, '--window', '1 day', '--samples', '5'], /either --window or --samples/],
  ])('%j', async (argv, message) => {
    const m = memoryIo();
    expect(await runCli(argv as string[], m.io)).not.toBe(0);
    expect(m.err).toHaveLength(1);
    expect(m.err[0]).toMatch(message);
    expect(m.err[0]).not.toContain('\n');
  });
  it('an invalid model names the JSON path', async () => {
    const m = memoryIo({ 'bad.json': '{"format":"loopfold-model","version":1,"name":"x","timeUnit":"fortnight","variables":[],"links":[]}' });
    expect(await runCli(['order', 'bad.json'], m.io)).toBe(1);
    expect(m.err[0]).toMatch(/timeUnit must be one of/);
  });
});

describe('npm run -s loopfold', () => {
  it('works as a process and prints one JSON document', () => {
    const r = spawnSync('npx', ['tsx', 'src/cli/main.ts', 'order', SLEEP, '--interval', '2 days', '--json'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).roles.sleepDebt).toBe('state');
  });
});
