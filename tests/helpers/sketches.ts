/**
 * Generated sketch models for tests and benchmarks (invented structure, no
 * meaning): `generatedSketch(500)` is the same model on every run.
 */
import type { Link, Model, Variable } from '../../src/core/model/types';
import { seededRandom } from '../../src/core/stats/random';

/** A sketch of n variables: 10 % inputs, 40 % states (timescales 1 min … 1 year), 50 % derived; two links into each non-input. */
export function generatedSketch(n: number, seed = 7): Model {
  const r = seededRandom(seed).uniform;
  const variables: Variable[] = [];
  for (let i = 0; i < n; i++) {
    const u = r();
    const kind = i < Math.max(1, Math.round(n * 0.1)) ? 'input' : u < 0.45 ? 'state' : 'derived';
    const v: Variable = { id: `v${i}`, kind, label: `Variable ${i}`, position: { x: (i % 40) * 160, y: Math.floor(i / 40) * 90 } };
    if (kind === 'state') v.timescale = (1 / 60) * Math.pow(8766 * 60, r());
    variables.push(v);
  }
  const links: Link[] = [];
  const seen = new Set<string>();
  for (const v of variables) {
    if (v.kind === 'input') continue;
    for (let k = 0; k < 2; k++) {
      const from = variables[Math.floor(r() * n)];
      if (from.id === v.id || seen.has(`${from.id}>${v.id}`)) continue;
      seen.add(`${from.id}>${v.id}`);
      links.push({ from: from.id, to: v.id, kind: v.kind === 'state' ? 'integrating' : 'instantaneous', sign: r() < 0.5 ? '+' : '-' });
    }
  }
  return { format: 'loopfold-model', version: 1, name: `generated ${n}`, timeUnit: 'h', variables, links, settings: { separation: 5, samples: 50 } };
}
