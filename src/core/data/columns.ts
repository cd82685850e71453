/**
 * Read named numeric columns from CSV/TSV text as time series in file order,
 * optionally split by a person column. For the unit-root and cointegration
 * tests, which need complete, equally spaced series: a missing or
 * non-numeric cell is refused with its row and column, never skipped
 * silently.
 */
import Papa from 'papaparse';

export interface SeriesGroup {
  /** Person id, or "" when the file has no person column. */
  id: string;
  /** One series per requested column, in the requested order. */
  series: Float64Array[];
  /** File row (header = row 1) of each occasion. */
  rows: number[];
}

export interface ColumnsProblem {
  row: number;
  column: string;
  message: string;
}

export interface ColumnsResult {
  groups: SeriesGroup[];
  /** Refused cells, first 100 (the read fails when there are any). */
  problems: ColumnsProblem[];
  moreProblems: number;
}

const MISSING = new Set(['', 'na', 'n/a', 'nan', '.']);

/**
 * Example: `readColumns('t,a,b\n1,2,3\n2,4,5', ['a', 'b']).groups[0].series` → [[2, 4], [3, 5]].
 * Throws with a message naming the columns when a requested column is not in the header.
 */
export function readColumns(text: string, columns: string[], options: { person?: string; delimiter?: string; missing?: string[] } = {}): ColumnsResult {
  const clean = text.replace(/^\uFEFF/, '');
  const first = Papa.parse<string[]>(clean.slice(0, 65536), { delimiter: options.delimiter ?? '', preview: 1 });
  const header = (first.data[0] ?? []).map((h) => h.trim());
  if (header.length === 0 || (header.length === 1 && header[0] === '')) throw new Error('the file is empty: no header row');
  const index = (name: string, what: string): number => {
    const i = header.indexOf(name);
    if (i < 0) throw new Error(`${what} "${name}" is not in the file's header (columns: ${header.join(', ')})`);
    return i;
  };
  const dup = columns.find((c, i) => columns.indexOf(c) !== i);
  if (dup) throw new Error(`column "${dup}" is named twice in --columns`);
  const cols = columns.map((c) => index(c, 'column'));
  const personCol = options.person !== undefined ? index(options.person, 'person column') : -1;
  const missingCodes = new Set((options.missing ?? []).map((m) => m.trim().toLowerCase()));
  const groups = new Map<string, { series: number[][]; rows: number[] }>();
  const problems: ColumnsProblem[] = [];
  let more = 0;
  const problem = (p: ColumnsProblem): void => { if (problems.length < 100) problems.push(p); else more++; };
  const numeric = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
  let record = 0;
  // Row by row (papaparse's step), so a large file is never held as a table of strings.
  Papa.parse<string[]>(clean, {
    delimiter: first.meta.delimiter,
    step: (res) => {
      const rec = res.data;
      if (rec.length <= 1 && (rec[0] ?? '').trim() === '') return; // an empty line: not a record
      record++;
      if (record === 1) return;
      const row = record;
      const id = personCol >= 0 ? (rec[personCol] ?? '').trim() : '';
      if (personCol >= 0 && id === '') { problem({ row, column: options.person!, message: 'empty person id' }); return; }
      let g = groups.get(id);
      if (!g) groups.set(id, (g = { series: columns.map(() => []), rows: [] }));
      g.rows.push(row);
      for (let k = 0; k < cols.length; k++) {
        const ci = cols[k];
        let v = NaN;
        if (ci >= rec.length) problem({ row, column: columns[k], message: `the row has ${rec.length} cells, fewer than the header's ${header.length}` });
        else {
          const raw = rec[ci].trim();
          if (numeric.test(raw) && !(missingCodes.size > 0 && missingCodes.has(raw.toLowerCase()))) v = Number(raw);
          else {
            const low = raw.toLowerCase();
            if (MISSING.has(low) || missingCodes.has(low)) problem({ row, column: columns[k], message: 'missing value; the tests need complete series' });
            else problem({ row, column: columns[k], message: `"${raw.length > 20 ? `${raw.slice(0, 20)}…` : raw}" is not a number` });
          }
          if (!Number.isFinite(v)) v = NaN;
        }
        g.series[k].push(v);
      }
    },
  });
  return {
    groups: [...groups].map(([id, g]) => ({ id, series: g.series.map((s) => Float64Array.from(s)), rows: g.rows })),
    problems,
    moreProblems: more,
  };
}
