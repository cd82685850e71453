/**
 * Demo data (invented, seeded) for `loopfold coint`: three warehouses, 160
 * weeks each. Weekly orders drift (a random walk); the stock kept on hand
 * tracks them, closing a quarter of the gap to 1.5 × orders + 20 each week;
 * the yard temperature wanders around its own level and tracks nothing.
 * Run: npx tsx scripts/demo-coint.ts > public/demo/warehouse-weeks.csv
 */
import { seededRandom } from '../src/core/stats/random';

const r = seededRandom(20261205);
const lines = ['warehouse,week,orders,stock,yard_temp'];
for (const w of ['north', 'harbour', 'ridge']) {
  let orders = 100 + 20 * r.normal();
  let stock = 1.5 * orders + 20;
  let temp = 12;
  for (let week = 1; week <= 200; week++) {
    const gap = stock - (1.5 * orders + 20);
    stock = stock - 0.25 * gap + 3 * r.normal();
    orders = orders + 4 * r.normal();
    temp = 12 + 0.6 * (temp - 12) + 2 * r.normal();
    lines.push(`${w},${week},${orders.toFixed(2)},${stock.toFixed(2)},${temp.toFixed(1)}`);
  }
}
process.stdout.write(`${lines.join('\n')}\n`);
