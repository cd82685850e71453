import { describe, expect, it } from 'vitest';
import { simulationCsv } from '../../src/present/csv';
import { runPython } from '../helpers/python';

describe('the CSV of a simulated run', () => {
  it('reads back with Python\'s csv module (RFC 4180), labels with commas quoted', () => {
    const csv = simulationCsv([0, 0.5, 1], { a: [1, 2, 3], b: [0.1, 0.2, 1e-20] }, [{ id: 'a', name: 'Soil water, top' }, { id: 'b', name: 'Say "hi"' }], 'min');
    const { rows } = runPython<{ rows: string[][] }>('tests/reference/numeric_cli.py', { csv });
    expect(rows[0]).toEqual(['time (min)', 'Soil water, top', 'Say "hi"']);
    expect(rows.slice(1).map((r) => r.map(Number))).toEqual([[0, 1, 0.1], [0.5, 2, 0.2], [1, 3, 1e-20]]);
  });
});
