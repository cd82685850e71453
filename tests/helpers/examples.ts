/**
 * The shipped examples as checked models, and one interval inside each band of
 * a model's interval axis, and a cache of their layouts: shared by the
 * figure-geometry and print tests.
 */
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { breakpoints } from '../../src/core/ordering/index';
import { cutsOf } from '../../src/core/view/interval';
import type { ViewModel } from '../../src/core/view/types';
import { EXAMPLES } from '../../src/examples/index';
import { layoutInNode } from '../../src/layout/node';
import type { Layout } from '../../src/layout/types';

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

/**
 * ELK in Node with one layout per view model (the same mode, node widths and
 * edges give the same layout), so the presets and palettes of a test share it.
 */
export function cachedLayouts(): (vm: ViewModel) => Promise<Layout> {
  const layouts = new Map<string, Promise<Layout>>();
  return (vm) => {
    const key = JSON.stringify([vm.mode, vm.nodes.map((n) => [n.id, n.width]), vm.edges.map((e) => e.id)]);
    let l = layouts.get(key);
    if (!l) { l = layoutInNode(vm); layouts.set(key, l); }
    return l;
  };
}
