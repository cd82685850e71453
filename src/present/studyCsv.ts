/**
 * A simulated (or imported) study as a long CSV: person, day, prompt, time, one column per state,
 * through `toCsv` (text cells a spreadsheet would run as formulas are defused). The app's download
 * and `loopfold simulate-study` write the same table.
 */
import { toCsv, type CsvValue } from './csv';

export interface LongStudy {
  variables: readonly string[];
  persons: readonly { id: string; time: ArrayLike<number>; day?: ArrayLike<number>; prompt?: ArrayLike<number>; values: ArrayLike<number> }[];
}

/** The long CSV of a simulated study (what `simulateStudy` in the core returns), as the importer reads it back. */
export function studyCsv(study: LongStudy): string {
  const n = study.variables.length;
  const rows: CsvValue[][] = [['person', 'day', 'prompt', 'time', ...study.variables]];
  for (const p of study.persons)
    for (let k = 0; k < p.time.length; k++) {
      const row: CsvValue[] = [p.id, p.day ? p.day[k] : null, p.prompt ? p.prompt[k] : null, p.time[k]];
      for (let i = 0; i < n; i++) row.push(p.values[k * n + i]);
      rows.push(row);
    }
  return toCsv(rows);
}
