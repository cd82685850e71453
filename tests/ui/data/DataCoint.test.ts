import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseModelText } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import type { ColumnMapping } from '../../../src/core/data/import';
import { defaultCointColumns, driftingStates } from '../../../src/ui/data/DataCoint';

const warehouse = (() => {
  const r = parseModelText(readFileSync('src/examples/warehouse.json', 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
})();
const mapping: ColumnMapping = { format: 'long', person: 'warehouse', time: 'week', timeUnit: 'day', variables: [{ column: 'stock', variable: 'inventory' }, { column: 'in_transit', variable: 'pipeline' }] };
const columns = ['orders', 'stock', 'in_transit', 'yard_temp'];
const marked = (m: Model, ids: string[]): Model => ({ ...m, variables: m.variables.map((v) => (ids.includes(v.id) ? { ...v, selfRegulating: false } : v)) });

describe('which columns the cointegration section tests first', () => {
  it('none while every state of the sketch self-regulates (tests on request)', () => {
    expect(driftingStates(warehouse).size).toBe(0);
    expect(defaultCointColumns(warehouse, mapping, columns)).toEqual([]);
  });
  it('the columns of the states marked not self-regulating, in file order, when two are mapped', () => {
    const m = marked(warehouse, ['inventory', 'pipeline']);
    expect([...driftingStates(m)].sort()).toEqual(['inventory', 'pipeline']);
    expect(defaultCointColumns(m, mapping, columns)).toEqual(['stock', 'in_transit']);
  });
  it('none when only one such state is measured (a test needs two series)', () => {
    expect(defaultCointColumns(marked(warehouse, ['inventory']), mapping, columns)).toEqual([]);
  });
});
