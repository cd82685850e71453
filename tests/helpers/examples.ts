/**
 * The shipped examples as checked models, and one interval inside each band of
 * a model's interval axis: shared by the figure-geometry tests.
 */
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { breakpoints } from '../../src/core/ordering/index';
import { cutsOf } from '../../src/core/view/interval';
import { EXAMPLES } from '../../src/examples/index';

/** The example with this id, parsed and checked (throws when it does not pass). */
export function exampleModel(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(`bad example ${id}`);
  return r.model;
}

/** One interval inside each band (the geometric middle of each band; half the first cut below it, four times the last above it). */
export function bandIntervals(m: Model): number[] {
  const cuts = cutsOf(breakpoints(m, { samples: 50 }));
  if (!cuts.length) return [1];
  return [cuts[0].at / 2, ...cuts.map((c, i) => Math.sqrt(c.at * (cuts[i + 1]?.at ?? c.at * 4)))];
}
