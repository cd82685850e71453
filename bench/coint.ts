// Cointegration benchmark (runs with `npm run bench -- data`): reading 10^6 rows × 8
// columns for `loopfold coint` (two columns split by 2,000 persons), the per-person
// tests pooled over 200 persons, and one long pair (10^4 occasions) beside statsmodels'
// adfuller + coint + coint_johansen on the same series, timed in the same run.
// Run alone with `npx tsx bench/coint.ts`.
import { spawnSync } from 'node:child_process';
import { readColumns } from '../src/core/data/columns';
import { cointegrationReport, pooledCointegration } from '../src/core/fit/coint';
import { seededRandom } from '../src/core/stats/random';

function ms(t0: number): number {
  return performance.now() - t0;
}

export async function benchCoint(): Promise<void> {
  const r = seededRandom(7);
  const persons = 2000;
  const level = new Float64Array(persons);
  const rows = ['pid,t,a,b,c,d,e,f'];
  for (let k = 0; k < 1_000_000; k++) {
    const p = k % persons;
    level[p] += r.normal();
    const b = 2 * level[p] + 1 + 0.5 * r.normal();
    rows.push(`p${p},${Math.floor(k / persons)},${level[p].toFixed(4)},${b.toFixed(4)},${Array.from({ length: 4 }, () => r.uniform().toFixed(3)).join(',')}`);
  }
  const text = rows.join('\n');
  let t0 = performance.now();
  const read = readColumns(text, ['a', 'b'], { person: 'pid' });
  console.log(`coint read 10^6 rows × 8 columns (${(text.length / 1e6).toFixed(0)} MB; 2 columns by ${read.groups.length} persons): ${(ms(t0) / 1000).toFixed(2)} s; ${read.problems.length} refused cells`);

  t0 = performance.now();
  const pooled = pooledCointegration(read.groups.slice(0, 200), ['a', 'b']);
  console.log(`coint per person, 200 persons × 500 occasions (ADF ×2, Engle–Granger, Johansen, loadings): ${(ms(t0) / 1000).toFixed(2)} s; cointegrated at 5 % in ${pooled.engleGranger.rejected} of ${pooled.tested}`);

  const n = 10_000;
  const a = new Float64Array(n), b = new Float64Array(n);
  for (let t = 1; t < n; t++) { a[t] = a[t - 1] + r.normal(); b[t] = 2 * a[t] + 1 + 0.5 * r.normal(); }
  t0 = performance.now();
  const rep = cointegrationReport([a, b], ['a', 'b']);
  const oursMs = ms(t0);
  const py = spawnSync('/usr/bin/python3', ['-c', `
import json, sys, time, numpy as np
from statsmodels.tsa.stattools import adfuller, coint
from statsmodels.tsa.vector_ar.vecm import coint_johansen
d = json.load(sys.stdin); a, b = np.array(d['a']), np.array(d['b'])
t0 = time.perf_counter()
adfuller(a, autolag='AIC'); adfuller(b, autolag='AIC'); s = coint(a, b)[0]; coint_johansen(np.column_stack([a, b]), 0, 1)
print(json.dumps({'seconds': time.perf_counter() - t0, 'eg': float(s)}))
`], { input: JSON.stringify({ a: Array.from(a), b: Array.from(b) }), encoding: 'utf8', maxBuffer: 1 << 28 });
  if (py.status !== 0) throw new Error(py.stderr);
  const ref = JSON.parse(py.stdout) as { seconds: number; eg: number };
  console.log(`coint one pair, 10^4 occasions (ADF ×2, Engle–Granger, Johansen${rep.errorCorrection ? ', loadings' : ''}): ${oursMs.toFixed(0)} ms; statsmodels (without loadings) ${(ref.seconds * 1000).toFixed(0)} ms (ratio ${(ref.seconds * 1000 / oursMs).toFixed(2)}×); Engle–Granger τ ${rep.engleGranger.statistic.toFixed(6)} vs ${ref.eg.toFixed(6)}`);
}

if (import.meta.url === `file://${process.argv[1]}`) await benchCoint();
