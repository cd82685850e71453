// Power benchmark: Monte Carlo replications of a 4-state study, 50 persons × 70 prompts, each
// simulated exactly (Φ(Δ), Q(Δ)) and analysed by the VAR(1) fit of the Data pane (person-mean
// centred, cluster-robust SE), beside the same design in NumPy (exact discrete simulation and
// least squares per replication, tests/reference/power_bench.py) timed in the same run.
// `npm run bench -- power`; `--replications K` (default 1000).
import { spawnSync } from 'node:child_process';
import { fromRows } from '../src/core/numeric/dense';
import { runReplications, summarizeTally, type RehearsalSetup } from '../src/core/rehearse/montecarlo';
import type { PersonPrompts } from '../src/core/rehearse/simulate';
import { PYTHON } from '../tests/helpers/python';

const DRIFT = [[-0.9, 0.2, 0, 0], [0, -0.6, 0.3, 0], [0, 0, -0.5, -0.2], [0.25, 0, 0, -0.7]];
const NOISE = [1, 0.8, 0.6, 0.5];

export async function benchPower(): Promise<void> {
  const arg = process.argv.indexOf('--replications');
  const K = arg > 0 ? Number(process.argv[arg + 1]) : 1000;
  const persons = 50, prompts = 70;
  const plan: PersonPrompts[] = Array.from({ length: persons }, (_, p) => ({ id: `p${p + 1}`, times: Float64Array.from({ length: prompts }, (_, k) => k) }));
  const setup: RehearsalSetup = {
    process: { states: ['a', 'b', 'c', 'd'], base: { drift: fromRows(DRIFT), noise: NOISE, mean: new Float64Array(4) }, inputs: [], links: [], warnings: [] },
    prompts: () => plan,
    errorVariance: [0, 0, 0, 0],
    timeUnit: 'h',
    links: [{ from: 'b', to: 'a' }, { from: 'd', to: 'c' }],
    analysis: {},
    alpha: 0.05,
    seed: 1,
  };
  const t0 = performance.now();
  const tally = runReplications(setup, 0, K);
  const ms = performance.now() - t0;
  const s = summarizeTally(setup, tally);
  console.log(`Loopfold (Node, one thread): ${K} replications of 4 states × ${persons} persons × ${prompts} prompts, simulate + VAR fit: ${(ms / 1000).toFixed(2)} s (${(ms / K).toFixed(1)} ms each; goal ≤ 20 s for 1,000 on two cores)`);
  for (const l of s.links) console.log(`  ${l.from} -> ${l.to}: mean effect ${l.effect.toFixed(4)}, SD ${l.se.toFixed(4)}, power ${l.power.toFixed(3)} ± ${l.mcError.toFixed(3)}`);
  const r = spawnSync(PYTHON, ['tests/reference/power_bench.py'], { input: JSON.stringify({ drift: DRIFT, noise: NOISE, persons, prompts, replications: K, links: [[0, 1], [2, 3]] }), encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`NumPy reference failed: ${r.stderr}`);
  const py = JSON.parse(r.stdout) as { seconds: number; power: number[]; mean: number[] };
  console.log(`NumPy (least squares per replication): ${py.seconds.toFixed(2)} s; power ${py.power.map((p) => p.toFixed(3)).join(', ')}, mean effect ${py.mean.map((m) => m.toFixed(4)).join(', ')}`);
  console.log(`ratio Loopfold / NumPy: ${(ms / 1000 / py.seconds).toFixed(2)}`);
}
