/**
 * Integer-step mode benchmark: the causal-step graphs behind a measured graph.
 * Random causal graphs (seeded) are measured at u = 2 and 3 and searched back:
 * 5 variables by the pruned search and by the solver, 8 variables by the
 * solver. The reference is exhaustive enumeration measured in the same run:
 * all 2^16 graphs on 4 variables timed here, and the 2^25 graphs on 5 variables
 * extrapolated from the measured cost per graph (running it takes minutes).
 * Run alone: `npx tsx bench/undersample.ts`.
 */
import { loadavg } from 'node:os';
import { causalGraphsFor, measureInto, measuredGraph, type InverseMethod } from '../src/core/undersample/index';
import { seededRandom } from '../src/core/stats/random';
import { ms, stats } from './common';

function randomGraph(n: number, density: number, rnd: () => number): number[] {
  return Array.from({ length: n }, (_, i) => {
    let r = rnd() < 0.5 ? 1 << i : 0;
    for (let j = 0; j < n; j++) if (j !== i && rnd() < density) r |= 1 << j;
    return r >>> 0;
  });
}

/** One set of seeded random graphs searched back; prints its line and returns what it found (for the test of the bench). */
export function runSet(n: number, method: InverseMethod, cases: number, seed: number, print = true): { median: number; solutions: number; incomplete: number; graphs: { directed: number[]; bidirected: number[]; rate: number; count: number; complete: boolean }[] } {
  const rnd = seededRandom(seed).uniform;
  const times: number[] = [];
  const nodes: number[] = [];
  let incomplete = 0;
  let solutions = 0;
  const graphs: { directed: number[]; bidirected: number[]; rate: number; count: number; complete: boolean }[] = [];
  for (let k = 0; k < cases; k++) {
    const names = Array.from({ length: n }, (_, i) => `x${i + 1}`);
    const u = 2 + (k % 2);
    const h = measuredGraph({ names, directed: randomGraph(n, 1.6 / n + 0.2 * rnd(), rnd) }, u);
    const t0 = performance.now();
    const r = causalGraphsFor(h, [u], { method, maxSolutions: 0, maxNodes: 2_000_000 });
    times.push(performance.now() - t0);
    nodes.push(r.byRate[0].nodes);
    solutions += r.count;
    graphs.push({ directed: h.directed.slice(), bidirected: h.bidirected.slice(), rate: u, count: r.count, complete: r.complete });
    if (!r.complete) incomplete++;
  }
  const t = stats(times), v = stats(nodes);
  if (print) console.log(`  ${n} variables, ${method.padEnd(6)}: median ${ms(t.median)}, p95 ${ms(t.p95)}, max ${ms(Math.max(...times))}; nodes median ${v.median}, p95 ${v.p95}; ${cases} graphs (u = 2, 3), ${solutions} causal graphs found${incomplete ? `, ${incomplete} stopped at 2 M nodes (very large classes: millions of causal graphs)` : ''}`);
  return { median: t.median, solutions, incomplete, graphs };
}

/** Time per causal graph of exhaustive enumeration at u = 2 (all 2^(n²) graphs, each measured and compared). */
function enumerationCost(n: number): number {
  const d = new Int32Array(n), b = new Int32Array(n), p = new Int32Array(n), q = new Int32Array(n);
  const rows = new Int32Array(n);
  const total = 2 ** (n * n);
  let hits = 0;
  const t0 = performance.now();
  for (let code = 0; code < total; code++) {
    for (let i = 0; i < n; i++) rows[i] = Math.floor(code / 2 ** (i * n)) % 2 ** n;
    measureInto(rows, n, 2, d, b, p, q);
    if (d[0] === 1) hits++;
  }
  const perGraph = (performance.now() - t0) / total;
  if (hits < 0) console.log(hits);
  return perGraph;
}

export async function benchUndersample(): Promise<void> {
  console.log(`load ${loadavg()[0].toFixed(2)} (2 cores shared)`);
  const per4 = enumerationCost(4);
  console.log(`reference, exhaustive enumeration: 4 variables (2^16 graphs) ${ms(per4 * 2 ** 16)} per measured graph; 5 variables (2^25 graphs) ≈ ${(per4 * 1.4 * 2 ** 25 / 1000).toFixed(0)} s (extrapolated: measured cost per graph × 1.4 for the larger rows)`);
  const search5 = runSet(5, 'search', 30, 5);
  const s5 = search5.median;
  // the 5-variable graphs the bench's 2 M-node budget stopped, searched again at the default budget (50 M per rate)
  const stopped = new Map<string, (typeof search5.graphs)[number]>();
  for (const g of search5.graphs) if (!g.complete) stopped.set(`${g.rate}|${g.directed.join(',')}|${g.bidirected.join(',')}`, g);
  for (const g of stopped.values()) {
    const h = { names: Array.from({ length: 5 }, (_, i) => `x${i + 1}`), directed: g.directed, bidirected: g.bidirected };
    const t0 = performance.now();
    const r = causalGraphsFor(h, [g.rate], { method: 'search', maxSolutions: 0 });
    console.log(`  5 variables, stopped at 2 M, again at the default budget (search): ${r.complete ? 'complete' : 'stopped again'}, ${r.count} causal graphs, ${r.byRate[0].nodes} nodes, ${ms(performance.now() - t0)} (u = ${g.rate}; ${search5.graphs.filter((x) => x.rate === g.rate && x.directed.join() === g.directed.join() && x.bidirected.join() === g.bidirected.join()).length} of 30 graphs)`);
  }
  const v5 = runSet(5, 'solver', 30, 5).median;
  console.log(`  5 variables: search ${(per4 * 1.4 * 2 ** 25 / s5).toFixed(0)}× faster than enumeration, solver ${(per4 * 1.4 * 2 ** 25 / v5).toFixed(0)}×`);
  runSet(8, 'solver', 12, 8);
}

if (import.meta.url === `file://${process.argv[1]}`) await benchUndersample();
