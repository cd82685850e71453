import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { orderingAt } from '../../../src/core/ordering/index';
import type { Ordering } from '../../../src/core/ordering/types';
import { blockKey, mechanismView, orderingView } from '../../../src/core/view/derive';
import { EXAMPLES } from '../../../src/examples/index';
import { runPython } from '../../helpers/python';

const QUOTIENT = new URL('./quotient.py', import.meta.url).pathname;

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error('bad example');
  return r.model;
}

/** A hand-built model and ordering: a, b form a block fed by input u; c follows; s is a dynamic state read by c. */
const model: Model = {
  format: 'loopfold-model', version: 1, name: 'hand-built', timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input' }, { id: 'a', kind: 'derived' }, { id: 'b', kind: 'state', timescale: 1 },
    { id: 'c', kind: 'derived', label: 'C <&> "q"' }, { id: 's', kind: 'state', timescale: 100 },
  ],
  links: [{ from: 'u', to: 'a', kind: 'instantaneous', sign: '+' }],
};
const ordering: Ordering = {
  roles: { u: 'input', a: 'derived', b: 'settled', c: 'derived', s: 'state' },
  blocks: [
    { variables: ['s'], equations: [], level: 0, determination: 'well' },
    { variables: ['u'], equations: [], level: 0, determination: 'well' },
    { variables: ['a', 'b'], equations: ['formula(a)', 'rate(b)'], level: 1, determination: 'well' },
    { variables: ['c'], equations: ['formula(c)'], level: 2, determination: 'well' },
  ],
  edges: [
    { from: 'u', to: 'a', kind: 'instantaneous', equation: 'formula(a)' },
    { from: 'a', to: 'b', kind: 'instantaneous', simultaneous: true, equation: 'rate(b)' },
    { from: 'b', to: 'a', kind: 'instantaneous', simultaneous: true, equation: 'formula(a)' },
    { from: 'b', to: 'c', kind: 'instantaneous', equation: 'formula(c)' },
    { from: 's', to: 'c', kind: 'instantaneous', equation: 'formula(c)' },
    { from: 'c', to: 's', kind: 'integrating', equation: 'rate(s)' },
  ],
  integrations: [{ state: 's', equation: 'rate(s)', sources: ['c'] }],
  diagnostics: [],
};

describe('ordering view', () => {
  it('draws one group per simultaneous block and the ordering edges one for one', () => {
    const vm = orderingView(model, ordering, { mode: 'ordering', interval: 2 });
    expect(vm.groups.map((g) => g.key)).toEqual(['a+b']);
    expect(vm.groups[0].members.sort()).toEqual(['a', 'b']);
    expect(vm.nodes.map((n) => [n.id, n.role])).toEqual([['u', 'input'], ['a', 'derived'], ['b', 'settled'], ['c', 'derived'], ['s', 'state']]);
    expect(vm.edges.map((e) => `${e.from}>${e.to}:${e.kind}`).sort()).toEqual(ordering.edges.map((e) => `${e.from}>${e.to}:${e.kind}`).sort());
    expect(vm.edges.filter((e) => e.simultaneous).length).toBe(2);
    expect(vm.rolesShown).toEqual(['input', 'state', 'derived', 'settled']);
    expect(vm.edges.find((e) => e.from === 'u')!.sign).toBe('+');
  });

  it('folding a block equals the quotient graph (reference: networkx.quotient_graph)', () => {
    const vm = orderingView(model, ordering, { mode: 'ordering', folded: ['a+b'], interval: 2 });
    const ref = runPython<{ nodes: string[]; edges: [string, string][] }>(QUOTIENT, {
      nodes: model.variables.map((v) => v.id), edges: ordering.edges.map((e) => [e.from, e.to]), folded: [['a', 'b']],
    });
    expect(vm.nodes.map((n) => n.id).sort()).toEqual(ref.nodes);
    expect(vm.edges.map((e) => [e.from, e.to]).sort()).toEqual(ref.edges);
    const f = vm.nodes.find((n) => n.id === 'block:a+b')!;
    expect(f.count).toBe(2);
    expect(vm.groups).toEqual([]);
  });

  it('folding random blocks of random graphs matches the quotient graph (seeded property; reference: NetworkX)', () => {
    const cases: { nodes: string[]; edges: [string, string][]; folded: string[][] }[] = [];
    fc.assert(fc.property(fc.integer({ min: 3, max: 12 }), fc.array(fc.tuple(fc.nat(11), fc.nat(11)), { maxLength: 30 }), fc.integer({ min: 1, max: 3 }), (n, raw, nb) => {
      const ids = Array.from({ length: n }, (_, i) => `v${i}`);
      const edges = raw.map(([a, b]) => [ids[a % n], ids[b % n]] as [string, string]).filter(([a, b]) => a !== b);
      const blocks: string[][] = [];
      for (let i = 0; i + 1 < n && blocks.length < nb; i += 3) blocks.push(ids.slice(i, i + 2));
      cases.push({ nodes: ids, edges, folded: blocks });
      return true;
    }), { seed: 4242, numRuns: 60 });
    const refs = runPython<{ nodes: string[]; edges: [string, string][] }[]>(QUOTIENT, cases);
    for (const [i, c] of cases.entries()) {
      const m: Model = { format: 'loopfold-model', version: 1, name: 'g', timeUnit: 'h', variables: c.nodes.map((id) => ({ id, kind: 'derived' as const })), links: [] };
      const inBlock = new Set(c.folded.flat());
      const o: Ordering = {
        roles: Object.fromEntries(c.nodes.map((id) => [id, 'derived'])),
        blocks: [...c.folded.map((vs) => ({ variables: vs, equations: [], level: 0, determination: 'well' as const })), ...c.nodes.filter((x) => !inBlock.has(x)).map((x) => ({ variables: [x], equations: [], level: 0, determination: 'well' as const }))],
        edges: c.edges.map(([from, to]) => ({ from, to, kind: 'instantaneous' as const, equation: `formula(${to})` })),
        integrations: [], diagnostics: [],
      };
      const vm = orderingView(m, o, { mode: 'ordering', folded: c.folded.map(blockKey) });
      const ref = refs[i];
      expect(vm.nodes.map((x) => x.id).sort(), `seed 4242, case ${JSON.stringify(c)}`).toEqual(ref.nodes);
      expect([...new Set(vm.edges.map((e) => `${e.from}>${e.to}`))].sort()).toEqual(ref.edges.map(([a, b]) => `${a}>${b}`).sort());
    }
  });

  it('the unrolled view: within-instant edges inside each instant, integrating edges to the next, dynamic states carried', () => {
    const vm = orderingView(model, ordering, { mode: 'unrolled', interval: 2 });
    expect(vm.nodes.length).toBe(3 * model.variables.length);
    expect(vm.groups.map((g) => g.id)).toEqual(['block:a+b@-1', 'block:a+b@0', 'block:a+b@1']);
    const inst = vm.edges.filter((e) => e.kind === 'instantaneous');
    expect(inst.length).toBe(3 * 5);
    for (const e of inst) expect(e.from.split('@')[1]).toBe(e.to.split('@')[1]);
    const lag = vm.edges.filter((e) => e.kind === 'integrating');
    for (const e of lag) expect(Number(e.to.split('@')[1]) - Number(e.from.split('@')[1])).toBe(1);
    expect(lag.filter((e) => !e.carry).map((e) => e.id).sort()).toEqual(['c@-1->s@0:integrating', 'c@0->s@1:integrating']);
    expect(lag.filter((e) => e.carry).map((e) => e.id).sort()).toEqual(['s@-1->s@0:integrating', 's@0->s@1:integrating']);
  });

  it('the mechanism view keeps every variable kind and link', () => {
    const m = example('sleep-stress');
    const vm = mechanismView(m);
    expect(vm.nodes.map((n) => n.role)).toEqual(m.variables.map((v) => v.kind));
    expect(vm.edges.map((e) => [e.from, e.to, e.kind])).toEqual(m.links.map((l) => [l.from, l.to, l.kind]));
  });

  it.each(EXAMPLES.map((e) => e.id))('%s: the view follows orderingAt at intervals across the axis', (id) => {
    const m = example(id);
    for (const interval of [0.01, 1, 24, 24 * 30, 24 * 365]) {
      const o = orderingAt(m, { interval, samples: 50 });
      const vm = orderingView(m, o, { mode: 'ordering', interval, samples: 50 });
      expect(vm.nodes.map((n) => [n.variable, n.role])).toEqual(m.variables.map((v) => [v.id, o.roles[v.id]]));
      expect(vm.groups.map((g) => g.variables)).toEqual(o.blocks.filter((b) => b.variables.length > 1).map((b) => b.variables));
      // the ordering's edges, and inside each block every link drawn between two of its members (both directions of a loop)
      const inBlock = (a: string, b: string) => o.blocks.some((k) => k.variables.length > 1 && k.variables.includes(a) && k.variables.includes(b));
      const want = new Set([...o.edges.map((e) => `${e.from}>${e.to}:${e.kind}`), ...m.links.filter((l) => l.from !== l.to && inBlock(l.from, l.to)).map((l) => `${l.from}>${l.to}:instantaneous`)]);
      expect(new Set(vm.edges.map((e) => `${e.from}>${e.to}:${e.kind}`))).toEqual(want);
      expect(vm.edges.length).toBe(want.size);
    }
  });
});
