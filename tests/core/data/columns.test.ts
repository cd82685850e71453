import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { readColumns } from '../../../src/core/data/columns';

describe('readColumns', () => {
  it('reads quoted cells, a byte-order mark and tabs as Python\'s csv module does, split by person in file order', () => {
    const text = '\uFEFFwho\t"level a"\tb\nx\t1.5\t"2e3"\ny\t-3\t4\nx\t.25\t+6\n';
    // Reference: Python's csv module (common practice for reading CSV) with the same delimiter.
    const py = spawnSync('/usr/bin/python3', ['-c', `
import csv, io, json, sys
rows = list(csv.reader(io.StringIO(sys.stdin.read().lstrip('\\ufeff')), delimiter='\\t'))
out = {}
for r in rows[1:]: out.setdefault(r[0], [[], []]); out[r[0]][0].append(float(r[1])); out[r[0]][1].append(float(r[2]))
print(json.dumps(out))
`], { input: text, encoding: 'utf8' });
    expect(py.status, py.stderr).toBe(0);
    const ref = JSON.parse(py.stdout) as Record<string, number[][]>;
    const r = readColumns(text, ['level a', 'b'], { person: 'who', delimiter: '\t' });
    expect(r.problems).toEqual([]);
    expect(r.groups.map((g) => g.id)).toEqual(Object.keys(ref));
    for (const g of r.groups) expect(g.series.map((s) => Array.from(s))).toEqual(ref[g.id]);
    expect(r.groups[0].rows).toEqual([2, 4]);
  });

  it('names every refused cell by row and column and keeps counting past the first 100', () => {
    const lines = ['a,b', '1,2', 'NA,3', '4,-99', '5', '6,seven'];
    for (let k = 0; k < 120; k++) lines.push('x,1');
    const r = readColumns(lines.join('\n'), ['a', 'b'], { missing: ['-99'] });
    expect(r.problems.slice(0, 4)).toEqual([
      { row: 3, column: 'a', message: 'missing value; the tests need complete series' },
      { row: 4, column: 'b', message: 'missing value; the tests need complete series' },
      { row: 5, column: 'b', message: "the row has 1 cells, fewer than the header's 2" },
      { row: 6, column: 'b', message: '"seven" is not a number' },
    ]);
    expect(r.problems.length + r.moreProblems).toBe(124);
    expect(() => readColumns('a,b\n1,2', ['a', 'c'])).toThrow('column "c" is not in the file\'s header (columns: a, b)');
    expect(() => readColumns('a,b\n1,2', ['a', 'a'])).toThrow(/named twice/);
  });
});
