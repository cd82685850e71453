import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';
import { runPython } from '../../helpers/python';

const SCRIPT = 'tests/reference/undersample_unrolled.py';
const graph = (x: unknown) => JSON.stringify(x);

async function run(argv: string[], files: Record<string, string>) {
  const m = memoryIo(files, { disk: false });
  const code = await runCli(argv, m.io);
  return { code, out: m.out.join('\n'), err: m.err.join('\n') };
}

describe('undersample and unsample commands', () => {
  it('undersample --json: the measured graph of NetworkX\'s latent projection', async () => {
    // sleep → stress → mood, mood → sleep, stress carries over
    const names = ['sleep', 'stress', 'mood'];
    const files = { 'g.json': graph({ format: 'loopfold-graph', version: 1, variables: names, directed: [['sleep', 'stress'], ['stress', 'mood'], ['mood', 'sleep'], ['stress', 'stress']] }) };
    const rows = [[0, 1, 0], [0, 1, 1], [1, 0, 0]];
    for (const u of [2, 3, 4]) {
      const r = await run(['undersample', 'g.json', '--rate', String(u), '--json'], files);
      expect(r.code, r.err).toBe(0);
      const j = JSON.parse(r.out) as { directed: [string, string][]; bidirected: [string, string][]; reasons: string[] };
      const [ref] = runPython<{ directed: [number, number][]; bidirected: [number, number][] }[]>(SCRIPT, [{ n: 3, rows, u }]);
      const idx = (p: [string, string]) => [names.indexOf(p[0]), names.indexOf(p[1])];
      expect(j.directed.map(idx).sort()).toEqual(ref.directed);
      expect(j.bidirected.map(idx).map((p) => [...p].sort()).sort()).toEqual(ref.bidirected);
      expect(j.reasons.length).toBe(j.directed.length + j.bidirected.length);
    }
  });

  it('unsample --json lists the causal graphs; each one gives the measured graph again', async () => {
    const files = { 'h.json': graph({ format: 'loopfold-graph', version: 1, variables: 3, directed: [[1, 3]], rate: 2 }) };
    const r = await run(['unsample', 'h.json', '--json'], files);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { solutions: { rate: number; directed: [string, string][] }[]; count: number; consistent: boolean };
    expect(j.consistent).toBe(true);
    expect(j.count).toBe(j.solutions.length);
    // 1 → 3 only, at u = 2: the chain 1 → 2 → 3 is one such graph (Danks & Plis 2013, definition; worked by hand)
    expect(j.solutions.map((s) => s.directed.map((e) => e.join('>')).join(','))).toContain('1>2,2>3');
    for (const s of j.solutions) {
      const back = await run(['undersample', 'g.json', '--rate', '2', '--json'], { 'g.json': graph({ format: 'loopfold-graph', version: 1, variables: 3, directed: s.directed }) });
      expect(JSON.parse(back.out)).toMatchObject({ directed: [['1', '3']], bidirected: [] });
    }
  });

  it('unsample says when no causal graph at any u ≤ U gives the graph, and offers the nearest', async () => {
    const files = { 'h.json': graph({ format: 'loopfold-graph', version: 1, variables: ['a', 'b', 'c'], directed: [['a', 'a']], bidirected: [['a', 'b'], ['b', 'c'], ['a', 'c']] }) };
    const r = await run(['unsample', 'h.json', '--max-rate', '3'], files);
    expect(r.code).toBe(0);
    expect(r.out).toContain('No causal graph at any u ≤ 3 gives this measured graph.');
    expect(r.out).toContain('common for graphs estimated from data');
    const j = JSON.parse((await run(['unsample', 'h.json', '--max-rate', '3', '--json'], files)).out) as { count: number; consistent: boolean; nearest: { distance: number; graphs: unknown[] } };
    expect(j).toMatchObject({ count: 0, consistent: false });
    expect(j.nearest.graphs.length).toBeGreaterThan(0);
  });

  it('bad input: one line naming the field, non-zero exit', async () => {
    const bad = await run(['undersample', 'b.json', '--rate', '2'], { 'b.json': graph({ format: 'loopfold-graph', version: 1, variables: ['a'], directed: [['a', 'z']] }) });
    expect(bad.code).toBe(1);
    expect(bad.err).toBe('loopfold undersample: b.json is not a valid graph: directed[0][1] no variable "z" (the variables are a)');
    const noRate = await run(['undersample', 'b.json'], { 'b.json': graph({ format: 'loopfold-graph', version: 1, variables: 1 }) });
    expect(noRate.code).toBe(2);
    expect(noRate.err).toMatch(/--rate is required/);
    const both = await run(['unsample', 'b.json', '--rate', '2', '--max-rate', '3'], { 'b.json': graph({ format: 'loopfold-graph', version: 1, variables: 1 }) });
    expect(both.err).toMatch(/not both/);
    const bi = await run(['undersample', 'b.json', '--rate', '2'], { 'b.json': graph({ format: 'loopfold-graph', version: 1, variables: 2, bidirected: [[1, 2]] }) });
    expect(bi.err).toMatch(/a causal-step graph has none/);
  });

  it('undersample --svg draws every edge it lists', async () => {
    const files = { 'g.json': graph({ format: 'loopfold-graph', version: 1, variables: ['x', 'y', 'z'], directed: [['x', 'y'], ['x', 'z'], ['y', 'y']] }) };
    const r = await run(['undersample', 'g.json', '--rate', '2', '--svg', '-'], files);
    expect(r.code, r.err).toBe(0);
    const edges = [...r.out.matchAll(/data-edge="([^"]+)"/g)].map((m) => m[1]).sort();
    // x → y → y, x → y (self-loop path), y → y; y ↔ z through x at one step
    expect(edges).toEqual(['x&gt;y', 'y&gt;y', 'y&lt;&gt;z'].sort());
    // the print options of every figure command: one column in greyscale, the file's size in bytes reported
    const p = await run(['undersample', 'g.json', '--rate', '2', '--out', '-', '--width', 'column', '--palette', 'greyscale', '--no-title'], files);
    expect(p.code, p.err).toBe(0);
    expect(p.out).toMatch(/<svg[^>]* width="85mm"/);
    expect(p.out).not.toContain('data-part="title"');
    const colours = [...new Set([...p.out.matchAll(/#[0-9a-f]{6}\b/gi)].map((m) => m[0].toLowerCase()))];
    expect(colours.filter((c) => !(c.slice(1, 3) === c.slice(3, 5) && c.slice(3, 5) === c.slice(5, 7)))).toEqual([]);
  });
});
