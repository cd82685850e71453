// Power benchmark: Monte Carlo replications of a 4-state study, 50 persons × 70 prompts, each
// simulated exactly (Φ(Δ), Q(Δ)) and analysed by the VAR(1) fit of the Data pane (person-mean
// centred, cluster-robust SE), beside the same design in NumPy (exact discrete simulation and
// least squares per replication, tests/reference/power_bench.py) timed in the same run.
// The replications are split over worker threads, one per core (`workerCount` and
// `splitReplications`, the app's rule for its web workers), and their tallies added up.
// `npm run bench -- power`; `--replications K` (default 1000); `--threads T` (default: the cores).
import { spawnSync } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { fromRows } from '../src/core/numeric/dense';
import { emptyTally, mergeTallies, summarizeTally, type RehearsalSetup, type Tally } from '../src/core/rehearse/montecarlo';
import { splitReplications, workerCount } from '../src/worker/rehearseClient';
import type { PersonPrompts } from '../src/core/rehearse/simulate';
import { PYTHON } from '../tests/helpers/python';

const DRIFT = [[-0.9, 0.2, 0, 0], [0, -0.6, 0.3, 0], [0, 0, -0.5, -0.2], [0.25, 0, 0, -0.7]];
const NOISE = [1, 0.8, 0.6, 0.5];

const PERSONS = 50, PROMPTS = 70;

/** The benchmark's study: 4 states, 50 persons × 70 hourly prompts, two links of interest. */
export function benchSetup(): RehearsalSetup {
  const plan: PersonPrompts[] = Array.from({ length: PERSONS }, (_, p) => ({ id: `p${p + 1}`, times: Float64Array.from({ length: PROMPTS }, (_, k) => k) }));
  return {
    process: { states: ['a', 'b', 'c', 'd'], base: { drift: fromRows(DRIFT), noise: NOISE, mean: new Float64Array(4) }, inputs: [], links: [], warnings: [] },
    prompts: () => plan,
    errorVariance: [0, 0, 0, 0],
    timeUnit: 'h',
    links: [{ from: 'b', to: 'a' }, { from: 'd', to: 'c' }],
    analysis: {},
    alpha: 0.05,
    seed: 1,
  };
}

function part(from: number, to: number): Promise<{ tally: Tally; ms: number }> {
  return new Promise((resolve, reject) => {
    // The thread loads the TypeScript part through tsx's loader (tsx/esm/api), as `npm run bench` does.
    const entry = new URL('./powerPart.ts', import.meta.url).href;
    const boot = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(entry)}, ${JSON.stringify(import.meta.url)}))`;
    const w = new Worker(boot, { eval: true, workerData: { from, to } });
    w.once('message', (m: { tally: Tally; ms: number }) => {
      resolve(m);
      void w.terminate();
    });
    w.once('error', reject);
  });
}

export async function benchPower(): Promise<void> {
  const arg = process.argv.indexOf('--replications');
  const K = arg > 0 ? Number(process.argv[arg + 1]) : 1000;
  const targ = process.argv.indexOf('--threads');
  const threads = workerCount(targ > 0 ? Number(process.argv[targ + 1]) : availableParallelism());
  const persons = PERSONS, prompts = PROMPTS;
  const setup = benchSetup();
  const parts = splitReplications(K, threads);
  const t0 = performance.now();
  const answers = await Promise.all(parts.map(([a, b]) => part(a, b)));
  const ms = performance.now() - t0;
  const tally = answers.map((a) => a.tally).reduce(mergeTallies, emptyTally(setup.links.length));
  const s = summarizeTally(setup, tally);
  const compute = Math.max(...answers.map((a) => a.ms));
  console.log(`Loopfold (Node, ${parts.length} worker thread${parts.length === 1 ? '' : 's'}): ${K} replications of 4 states × ${persons} persons × ${prompts} prompts, simulate + VAR fit: ${(compute / 1000).toFixed(2)} s computing (the slowest part; parts ${answers.map((a) => `${(a.ms / 1000).toFixed(2)} s`).join(', ')}), ${(ms / 1000).toFixed(2)} s wall with the threads' start-up (tsx compiling the core in each); goal ≤ 20 s for 1,000 on two cores`);
  for (const l of s.links) console.log(`  ${l.from} -> ${l.to}: mean effect ${l.effect.toFixed(4)}, SD ${l.se.toFixed(4)}, power ${l.power.toFixed(3)} ± ${l.mcError.toFixed(3)}`);
  const r = spawnSync(PYTHON, ['tests/reference/power_bench.py'], { input: JSON.stringify({ drift: DRIFT, noise: NOISE, persons, prompts, replications: K, links: [[0, 1], [2, 3]] }), encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`NumPy reference failed: ${r.stderr}`);
  const py = JSON.parse(r.stdout) as { seconds: number; power: number[]; mean: number[] };
  console.log(`NumPy (least squares per replication): ${py.seconds.toFixed(2)} s; power ${py.power.map((p) => p.toFixed(3)).join(', ')}, mean effect ${py.mean.map((m) => m.toFixed(4)).join(', ')}`);
  console.log(`ratio Loopfold / NumPy: ${(compute / 1000 / py.seconds).toFixed(2)} computing, ${(ms / 1000 / py.seconds).toFixed(2)} wall`);
}
