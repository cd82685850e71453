import { describe, expect, it } from 'vitest';
import { parse } from 'mathjs';
import { applyChange, emptyModel, idFromLabel, preparePaste, renameInFormula, withLinkIds, type Change } from '../../src/state/changes';
import { isReservedName, parseExpression } from '../../src/core/expr/parse';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';

// Symbols of a formula as read by mathjs itself, an independent parser (not our whitelist).
function mathjsSymbols(text: string): string[] {
  const names = new Set<string>();
  parse(text).traverse((n) => {
    if (n.type === 'SymbolNode') names.add((n as unknown as { name: string }).name);
  });
  return [...names].sort();
}

function base(): Model {
  return withLinkIds({
    ...emptyModel('test'),
    variables: [
      { id: 'a', kind: 'input', value: 1, position: { x: 0, y: 0 } },
      { id: 'b', kind: 'state', timescale: '2 h', rate: 'a - b', noise: 0.5, position: { x: 100, y: 0 } },
      { id: 'c', kind: 'derived', formula: 'b*2 + a1', position: { x: 200, y: 0 } },
      { id: 'a1', kind: 'input', value: 3 },
    ],
    links: [
      { from: 'a', to: 'b', kind: 'integrating', sign: '+' },
      { from: 'b', to: 'c', kind: 'instantaneous' },
    ],
    relations: [{ id: 'r', equation: 'a*c = b' }],
    study: { interval: '1h', length: 50, schedule: { kind: 'fixed' }, holds: { a: 2 } },
  });
}

describe('document edits reducer', () => {
  it('never mutates its input and returns the same object for a no-op', () => {
    const m = base();
    const frozen = JSON.stringify(m);
    const changes: Change[] = [
      { type: 'addVariable', variable: { id: 'd', kind: 'derived' } },
      { type: 'updateVariable', id: 'a', patch: { label: 'A' } },
      { type: 'setKind', id: 'b', kind: 'derived' },
      { type: 'renameVariable', id: 'a', newId: 'z' },
      { type: 'remove', variables: ['c'] },
      { type: 'move', positions: { a: { x: 5, y: 6 } } },
    ];
    for (const c of changes) applyChange(m, c);
    expect(JSON.stringify(m)).toBe(frozen);
    expect(applyChange(m, { type: 'updateVariable', id: 'missing', patch: { label: 'x' } })).toBe(m);
    expect(applyChange(m, { type: 'addVariable', variable: { id: 'r', kind: 'input' } })).toBe(m); // id taken by the relation
    expect(applyChange(m, { type: 'addLink', link: { from: 'a', to: 'a', kind: 'instantaneous' } })).toBe(m);
  });

  it('every edit keeps the document a valid model file (checked by the schema)', () => {
    let m = base();
    const steps: Change[] = [
      { type: 'setKind', id: 'b', kind: 'input' },
      { type: 'setKind', id: 'b', kind: 'state' },
      { type: 'setKind', id: 'c', kind: 'state' },
      { type: 'updateVariable', id: 'a', patch: { rate: 'x' } }, // an input has no rate: ignored
      { type: 'renameVariable', id: 'b', newId: 'bee' },
      { type: 'remove', variables: ['a'] },
    ];
    for (const s of steps) {
      m = applyChange(m, s);
      const r = parseModel(m);
      expect(r.ok, JSON.stringify(!r.ok && r.issues)).toBe(true);
    }
    expect(m.variables.find((v) => v.id === 'a1')?.rate).toBeUndefined();
  });

  it('changing the kind drops the fields only the old kind has', () => {
    const m = applyChange(base(), { type: 'setKind', id: 'b', kind: 'input' });
    const b = m.variables.find((v) => v.id === 'b')!;
    expect(b).toEqual({ id: 'b', kind: 'input', position: { x: 100, y: 0 } });
    expect(b.noise).toBeUndefined(); // noise applies to states only
  });

  it('renaming rewrites links, formulas, relations and noise; mathjs reads the new names', () => {
    const m = applyChange(base(), { type: 'renameVariable', id: 'a', newId: 'load' });
    expect(m.links[0].from).toBe('load');
    const c = m.variables.find((v) => v.id === 'c')!;
    // "a1" is a different name and must survive the rename of "a"
    expect(mathjsSymbols(c.formula!)).toEqual(['a1', 'b']);
    expect(mathjsSymbols(m.variables.find((v) => v.id === 'b')!.rate!)).toEqual(['b', 'load']);
    expect(m.relations![0].equation).toBe('load*c = b');
    const n = applyChange(base(), { type: 'renameVariable', id: 'b', newId: 'stock' });
    expect(n.variables.find((v) => v.id === 'stock')?.noise).toBe(0.5);
    expect(m.study?.holds).toEqual({ load: 2 }); // a hold follows its variable
  });

  it('renameInFormula leaves numbers with exponents alone', () => {
    expect(renameInFormula('2e3*e + e1', 'e', 'q')).toBe('2e3*q + e1');
    expect(mathjsSymbols(renameInFormula('1.5e-3*x + x2', 'x', 'y'))).toEqual(['x2', 'y']);
  });

  it('removing a variable removes its links and nothing else', () => {
    const m = applyChange(base(), { type: 'remove', variables: ['b'] });
    expect(m.variables.map((v) => v.id)).toEqual(['a', 'c', 'a1']);
    expect(m.links).toEqual([]);
    expect(m.relations).toHaveLength(1);
  });

  it('paste gives clashing ids fresh names and rewrites formulas and links to them', () => {
    const m = base();
    const clip = { variables: m.variables.filter((v) => v.id === 'b' || v.id === 'c'), links: m.links.filter((l) => l.from === 'b'), relations: [] };
    const change = preparePaste(m, clip, { x: 40, y: 40 });
    const out = applyChange(m, change);
    const r = parseModel(out);
    expect(r.ok).toBe(true);
    const [nb, nc] = change.variables;
    expect(nb.id).not.toBe('b');
    expect(mathjsSymbols(nc.formula!)).toEqual(['a1', nb.id].sort());
    expect(change.links[0]).toMatchObject({ from: nb.id, to: nc.id });
    expect(nb.position).toEqual({ x: 140, y: 40 });
    expect(nb.label).toBe('b (copy)');
  });

  it('makes names for formulas from labels that the formula parser accepts as single names', () => {
    const taken = new Set(['soilWater']);
    const cases: [string, string | null][] = [
      ['Soil water', 'soilWater_2'],
      ['Leaf wetness (%)', 'leafWetness'],
      ['2nd harvest', 'v_2ndHarvest'],
      ['Café crème', 'cafeCreme'],
      ['exp', 'exp_2'],
      ['!!!', null],
    ];
    for (const [label, want] of cases) {
      const id = idFromLabel(label, taken, isReservedName);
      expect(id).toBe(want);
      if (id) {
        // mathjs, through our restricted parser, reads the name as exactly one symbol
        const r = parseExpression(id);
        expect(r.ok && r.symbols).toEqual([id]);
      }
    }
  });
});
