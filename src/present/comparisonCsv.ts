/**
 * The sketch-against-data comparison as a CSV table, written through the one
 * CSV writer (csv.ts: RFC 4180, text cells a spreadsheet would run as
 * formulas defused). Variable names are the model's labels, which the user
 * typed: a label such as "=HYPERLINK(…)" reaches the file as text.
 */
import type { Model } from '../core/model/types';
import { toCsv } from './csv';
import { labelOf } from './labels';

/** One row of the comparison (the shape of the core's link comparison). */
export interface ComparisonRow {
  from: string;
  to: string;
  sketch: number;
  estimate: number;
  low: number;
  high: number;
  verdict: string;
  words: string;
}

/** Example: `comparisonCsv(model, rows, 'VAR')` → "method,from,to,…\r\nVAR,Stress,Mood,…". */
export function comparisonCsv(model: Pick<Model, 'variables'>, rows: readonly ComparisonRow[], method: string): string {
  return toCsv([
    ['method', 'from', 'to', 'sketch', 'estimate', 'low 95 %', 'high 95 %', 'verdict', 'in words'],
    ...rows.map((r) => [method, labelOf(model, r.from), labelOf(model, r.to), r.sketch, r.estimate, r.low, r.high, r.verdict, r.words]),
  ]);
}
