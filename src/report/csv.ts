/**
 * CSV as RFC 4180 describes it: records end with CRLF; a field is quoted
 * when it contains a comma, a double quote, CR or LF, and a double quote
 * inside a quoted field is written twice. Numbers are written in the
 * shortest form that reads back to the same value; null/undefined become
 * an empty field.
 *
 * Example: `toCsv([['a', 'b'], [1, 'x,y']])` → `a,b\r\n1,"x,y"\r\n`.
 */
export type CsvValue = string | number | boolean | null | undefined;

/** One field, quoted only when RFC 4180 requires it. */
export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  const text = typeof value === 'number' ? numberText(value) : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function numberText(x: number): string {
  if (Number.isNaN(x)) return 'NaN';
  if (x === Infinity) return 'Infinity';
  if (x === -Infinity) return '-Infinity';
  return String(x);
}

/** The whole table: every record ends with CRLF (the final one too, which RFC 4180 allows). */
export function toCsv(rows: readonly (readonly CsvValue[])[]): string {
  return rows.map((r) => r.map(csvField).join(',') + '\r\n').join('');
}

/** A table from objects: a header row of the given columns, then one record per object. */
export function recordsToCsv<T extends Record<string, CsvValue>>(columns: readonly (keyof T & string)[], records: readonly T[]): string {
  return toCsv([columns, ...records.map((r) => columns.map((c) => r[c]))]);
}
