/** The table of a simulated run, as the Numbers pane saves it. */
import type { VariableId } from '../core/model/types';
import { toCsv, type CsvValue } from './csv';

/** The run as a table: a header `time (unit)` and one column per chosen variable, named by its label. */
export function simulationCsv(times: readonly number[], series: Record<VariableId, readonly number[]>, columns: { id: VariableId; name: string }[], unit: string): string {
  const rows: CsvValue[][] = [[`time (${unit})`, ...columns.map((c) => c.name)]];
  times.forEach((t, k) => rows.push([t, ...columns.map((c) => series[c.id]?.[k])]));
  return toCsv(rows);
}
