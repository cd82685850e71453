/**
 * CSV as RFC 4180 describes it: records end with CRLF; a field is quoted
 * when it contains a comma, a double quote, CR or LF, and a double quote
 * inside a quoted field is written twice. Numbers are written in the
 * shortest form that reads back to the same value; null/undefined become
 * an empty field.
 *
 * A text cell that a spreadsheet would run as a formula (it starts with
 * =, +, -, @, a tab or a carriage return) gets a leading apostrophe, which
 * spreadsheets show as text: the OWASP advice on CSV injection ("CSV
 * Injection", owasp.org; from memory). A number is never changed, and
 * neither is a text that is a plain number ("-1.5", "+2e-3"): those run as
 * nothing but themselves.
 *
 * Example: `toCsv([['a', 'b'], [1, 'x,y']])` → `a,b\r\n1,"x,y"\r\n`;
 * `csvField('=SUM(A1)')` → `'=SUM(A1)`.
 */
import type { VariableId } from '../core/model/types';

export type CsvValue = string | number | boolean | null | undefined;

/** A plain decimal number, signed or not, with an optional exponent. */
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
/** What a spreadsheet reads as the start of a formula. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** A text cell made safe to open in a spreadsheet (see the module comment). */
export function defuseFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** One field, quoted only when RFC 4180 requires it. */
export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  const text = typeof value === 'number' ? numberText(value) : defuseFormula(String(value));
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

/**
 * The table of a simulated run, as the app saves it and `simulate --csv`
 * prints it: a header `time (unit)` and one column per variable, named by
 * its label.
 */
export function simulationCsv(times: readonly number[], series: Record<VariableId, readonly number[]>, columns: { id: VariableId; name: string }[], unit: string): string {
  const rows: CsvValue[][] = [[`time (${unit})`, ...columns.map((c) => c.name)]];
  times.forEach((t, k) => rows.push([t, ...columns.map((c) => series[c.id]?.[k])]));
  return toCsv(rows);
}
