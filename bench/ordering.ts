/**
 * Ordering benchmark: causal ordering (matching + Dulmage–Mendelsohn + SCC +
 * levels + edges) of random sparse square systems with about 3 variables per
 * equation, against SciPy's maximum_bipartite_matching + strong
 * connected_components on the same systems, timed inside Python in the same
 * run. Run alone: `npx tsx bench/ordering.ts`.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { causalOrder } from '../src/core/ordering/causal';
import type { EquationSystem } from '../src/core/ordering/structure';

/** Small seeded generator (mulberry32), so every run orders the same systems. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** n equations over n unknowns: a planted perfect matching plus two random variables each. */
export function randomSquareSystem(n: number, seed: number): { system: EquationSystem; eq: number[]; var: number[] } {
  const r = rng(seed);
  const perm = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [perm[i], perm[j]] = [perm[j], perm[i]];
  }
  const eq: number[] = [];
  const vr: number[] = [];
  const equations = [];
  for (let i = 0; i < n; i++) {
    const vs = new Set<number>([perm[i], Math.floor(r() * n), Math.floor(r() * n)]);
    for (const v of vs) {
      eq.push(i);
      vr.push(v);
    }
    equations.push({ id: `f${i}`, variables: [...vs].map((v) => `x${v}`) });
  }
  return { system: { equations, exogenous: [] }, eq, var: vr };
}

const PYTHON = process.env.LOOPFOLD_PYTHON ?? 'python3';
const SCRIPT = fileURLToPath(new URL('../tests/reference/ordering_bench.py', import.meta.url));

export async function benchOrdering(): Promise<void> {
  const sizes = [1_000, 10_000, 100_000];
  const systems = sizes.map((n, i) => randomSquareSystem(n, 1234 + i));
  const ours: { ms: number; blocks: number; matched: number }[] = [];
  for (const s of systems) {
    causalOrder(s.system); // warm-up (JIT)
    let best = Infinity;
    let last = causalOrder(s.system);
    for (let k = 0; k < 5; k++) {
      const t0 = performance.now();
      last = causalOrder(s.system);
      best = Math.min(best, performance.now() - t0);
    }
    ours.push({ ms: best, blocks: last.blocks.length, matched: last.matchingSize });
  }
  const py = spawnSync(PYTHON, [SCRIPT], {
    input: JSON.stringify({ systems: systems.map((s, i) => ({ rows: sizes[i], cols: sizes[i], eq: s.eq, var: s.var })) }),
    encoding: 'utf8',
    maxBuffer: 1 << 30,
  });
  const ref: { ms: number; matched: number; components: number }[] | null = py.status === 0 ? (JSON.parse(py.stdout) as { results: { ms: number; matched: number; components: number }[] }).results : null;
  console.log('ordering: causal order of random sparse square systems (~3 variables per equation), best of 5');
  console.log('equations  loopfold ms  scipy ms  scipy/loopfold  matched (ours/scipy)  blocks/components');
  sizes.forEach((n, i) => {
    const o = ours[i];
    const r = ref?.[i];
    const ratio = r ? (r.ms / o.ms).toFixed(2) : 'n/a';
    console.log(
      `${String(n).padStart(9)}  ${o.ms.toFixed(1).padStart(11)}  ${(r ? r.ms.toFixed(1) : 'n/a').padStart(8)}  ${ratio.padStart(14)}  ${`${o.matched}/${r?.matched ?? '?'}`.padStart(20)}  ${`${o.blocks}/${r?.components ?? '?'}`}`,
    );
  });
  if (!ref) console.log(`(SciPy reference unavailable: ${py.stderr.trim().split('\n').pop()})`);
  const big = ours[ours.length - 1];
  console.log(`goal: 10^5 equations under 300 ms — ${big.ms < 300 ? 'met' : 'not met'} (${big.ms.toFixed(1)} ms)`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) void benchOrdering();
