/**
 * `npm run bench -- cli`: the command line's start. Wall time of `order` on a generated 60-variable sketch
 * through bin/loopfold.mjs (the bundle), beside the same command run from the sources by tsx and beside
 * `node -e 0` (Node's own start), all measured in the same run; then a batch of 8 figures in one process
 * against the same 8 figures as separate commands. Goal: `order` on 60 variables under 0.5 s wall.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { generatedSketch } from '../tests/helpers/sketches';
import { ms, stats, verdict } from './common';

function wall(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env): number {
  const t0 = performance.now();
  const r = spawnSync(cmd, args, { encoding: 'utf8', env });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed: ${r.stderr}`);
  return performance.now() - t0;
}

export async function benchCli(runs = 7): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'lf-bench-cli-'));
  const model = join(dir, 'm60.json');
  writeFileSync(model, JSON.stringify(generatedSketch(60)));
  const order = ['order', model, '--interval', '1h'];
  wall('node', ['bin/loopfold.mjs', ...order]); // makes the bundle if the sources changed
  const rows: [string, number[]][] = [
    ['node -e 0 (reference: Node starting)', []],
    ['loopfold order, 60 variables (bundle)', []],
    ['loopfold order, 60 variables (tsx, sources)', []],
  ];
  for (let i = 0; i < runs; i++) {
    rows[0][1].push(wall('node', ['-e', '0']));
    rows[1][1].push(wall('node', ['bin/loopfold.mjs', ...order]));
    rows[2][1].push(wall('node', ['bin/loopfold.mjs', ...order], { ...process.env, LOOPFOLD_NO_BUNDLE: '1' }));
  }
  console.log(`load average ${loadavg()[0].toFixed(1)} on this machine while measuring`);
  for (const [name, xs] of rows) { const s = stats(xs); console.log(`${name.padEnd(46)} median ${ms(s.median)}, p95 ${ms(s.p95)}`); }
  const bundle = stats(rows[1][1]).median, node = stats(rows[0][1]).median;
  console.log(`bundle start over Node's own: ${ms(bundle - node)}; ratio to tsx ${(bundle / stats(rows[2][1]).median).toFixed(2)}`);
  console.log(`goal (order on 60 variables under 500 ms wall): ${verdict(bundle < 500)}`);
  // 8 figures: one batch against 8 commands
  const jobs = ['10 min', '3h', '1 day', '4 weeks'].flatMap((d, k) => [
    ['render', 'src/examples/sleep-stress.json', '--interval', d, '--width', 'column', '--out', join(dir, `f${k}.svg`)],
    ['order', 'src/examples/sleep-stress.json', '--interval', d, '--json'],
  ]);
  writeFileSync(join(dir, 'batch.json'), JSON.stringify({ jobs: jobs.map((j) => j.map((w) => (w.startsWith('src/') ? join(process.cwd(), w) : w))) }));
  const batch = wall('node', ['bin/loopfold.mjs', 'batch', join(dir, 'batch.json')]);
  let separate = 0;
  for (const j of jobs) separate += wall('node', ['bin/loopfold.mjs', ...j]);
  console.log(`8 jobs (4 figures, 4 orderings): batch ${ms(batch)}, separate commands ${ms(separate)} (ratio ${(separate / batch).toFixed(1)})`);
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!)) void benchCli();
