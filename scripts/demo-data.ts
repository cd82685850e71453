/**
 * Demo data (invented, seeded): an evening-and-daytime diary of the
 * sleep–stress example. 30 persons, 14 days, five prompts a day between 09:00
 * and 21:00 at stratified-random times, about one prompt in ten skipped and a
 * few cells left empty; stress, sleep debt and mood measured, cortisol not.
 * Generated from the example's own drift (states in hours), so the sketch
 * should be supported. Run: npx tsx scripts/demo-data.ts > public/demo/sleep-stress-diary.csv
 */
import { readFileSync } from 'node:fs';
import { parseModelText } from '../src/core/model/schema';
import { sketchDrift } from '../src/core/fit/compare';
import { simulateCt } from '../src/core/fit/simulate';
import { seededRandom } from '../src/core/stats/random';

const r = parseModelText(readFileSync('src/examples/sleep-stress.json', 'utf8'));
if (!r.ok) throw new Error('the example does not load');
const states = ['stress', 'cortisol', 'sleepDebt', 'mood'];
const drift = sketchDrift(r.model, states);
const gen = seededRandom(20261204);
const rand = (): number => gen.uniform();
const persons = 30, days = 14, prompts = 5;
const promptTimes: number[][] = [], promptNo: number[][] = [];
for (let p = 0; p < persons; p++) {
  const ts: number[] = [], pn: number[] = [];
  for (let d = 0; d < days; d++)
    for (let k = 0; k < prompts; k++) {
      if (rand() < 0.1) continue; // skipped prompt
      ts.push(d * 24 + 9 + k * 2.4 + rand() * 2.4);
      pn.push(k + 1);
    }
  promptTimes.push(ts); promptNo.push(pn);
}
const panel = simulateCt({ states, measured: ['stress', 'sleepDebt', 'mood'], drift, diffusion: [[1, 0, 0, 0], [0, 0.5, 0, 0], [0, 0, 0.2, 0], [0, 0, 0, 0.05]], levels: [4, 2, 5], between: [[0.6, 0, 0], [0, 0.3, 0], [0, 0, 0.8]], error: [0.05, 0.05, 0.05] }, promptTimes, { seed: 7, missing: 0.03 });
const start = Date.UTC(2026, 2, 2); // a Monday; times written with the participants' offset +01:00
const pad = (x: number) => String(x).padStart(2, '0');
const lines = ['participant,answered,day,prompt,stress,sleep_debt,mood'];
panel.persons.forEach((p, i) => p.time.forEach((t, k) => {
  const local = new Date(start + t * 3600e3);
  const iso = `${local.getUTCFullYear()}-${pad(local.getUTCMonth() + 1)}-${pad(local.getUTCDate())}T${pad(local.getUTCHours())}:${pad(local.getUTCMinutes())}:${pad(local.getUTCSeconds())}+01:00`;
  const v = (j: number) => { const x = p.values[k * 3 + j]; return Number.isFinite(x) ? x.toFixed(2) : ''; };
  lines.push([`P${pad(i + 1)}`, iso, Math.floor(t / 24) + 1, promptNo[i][k], v(0), v(1), v(2)].join(','));
}));
process.stdout.write(lines.join('\n') + '\n');
