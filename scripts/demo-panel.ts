/**
 * Demo panel data (invented, seeded): a survey of 40 lakes, one row per lake,
 * visited in 2014, 2016, 2019 and 2020 (waves unequal years apart), with the
 * planktivorous fish stock and the sediment phosphorus of the lake example
 * measured at each visit; a few cells left empty. Generated from a small
 * continuous-time model in years (fish settle in about 3 years, sediment in
 * about 1; more sediment phosphorus feeds the fish a little).
 * Run: npx tsx scripts/demo-panel.ts > public/demo/lake-survey-waves.csv
 */
import { simulateCt } from '../src/core/fit/simulate';

const years = [2014, 2016, 2019, 2020];
const times = years.map((y) => y - years[0]);
const lakes = 40;
const panel = simulateCt({
  states: ['fish', 'sediment'],
  drift: [[-1 / 3, 0.15], [0, -1]],
  diffusion: [[0.4, 0], [0, 0.6]],
  levels: [12, 5],
  between: [[4, 0.5], [0.5, 1]],
  error: [0.1, 0.05],
}, Array.from({ length: lakes }, () => times), { seed: 20261205, missing: 0.04, timeUnit: 'year' });
const names = ['Alder', 'Birch', 'Cedar', 'Dune', 'Elm', 'Fern', 'Gull', 'Heron', 'Iris', 'Juniper', 'Kestrel', 'Larch', 'Moss', 'Nettle', 'Otter', 'Pike', 'Quill', 'Reed', 'Sedge', 'Teal'];
const header = ['lake', ...years.flatMap((y) => [`fish_${y}`, `sediment_${y}`])];
const lines = [header.join(',')];
panel.persons.forEach((p, i) => {
  const id = `${names[i % names.length]} ${i < names.length ? 'Pond' : 'Mere'}`;
  const cells = times.flatMap((_, k) => [0, 1].map((j) => { const x = p.values[k * 2 + j]; return Number.isFinite(x) ? x.toFixed(2) : ''; }));
  lines.push([id, ...cells].join(','));
});
process.stdout.write(lines.join('\n') + '\n');
