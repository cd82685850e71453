/**
 * A first guess of the column mapping from a header and the model's
 * variables, for the column mapper to show and the modeller to edit.
 */
import type { Variable, VariableId } from '../model/types';
import type { ColumnMapping, VariableColumn, WaveColumns } from './import';

const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');

const PERSON = ['person', 'personid', 'participant', 'participantid', 'pid', 'id', 'subject', 'subjectid', 'subj', 'respondent', 'case'];
const TIME = ['time', 'timestamp', 'datetime', 'answered', 'answeredat', 'responsetime', 'date', 't', 'hours', 'minutes', 'days'];
const DAY = ['day', 'daynr', 'daynumber', 'studyday'];
const PROMPT = ['prompt', 'promptnr', 'beep', 'beepnr', 'occasion', 'signal', 'promptnumber'];

function pick(fields: string[], names: string[]): string | undefined {
  for (const n of names) { const f = fields.find((x) => norm(x) === n); if (f) return f; }
  return undefined;
}

/** Data columns matched to model variables by id or label (case, spaces and punctuation ignored). */
export function matchVariables(fields: string[], variables: Pick<Variable, 'id' | 'label'>[], taken: Set<string>): VariableColumn[] {
  const out: VariableColumn[] = [];
  for (const v of variables) {
    const f = fields.find((x) => !taken.has(x) && (norm(x) === norm(v.id) || (v.label !== undefined && norm(x) === norm(v.label))));
    if (f) { out.push({ column: f, variable: v.id }); taken.add(f); }
  }
  return out;
}

/**
 * Example: `suggestMapping(['pid', 'when', 'stress'], model.variables, 'h')`.
 * Long format unless the header has columns `name_1, name_2, …` for model variables.
 */
export function suggestMapping(fields: string[], variables: Pick<Variable, 'id' | 'label'>[], timeUnit: ColumnMapping['timeUnit']): ColumnMapping {
  const person = pick(fields, PERSON) ?? fields[0] ?? '';
  const wide = suggestWaves(fields, variables);
  if (wide.length >= 2) return { format: 'wide', person, timeUnit, variables: [], waves: wide };
  const time = pick(fields, TIME);
  const day = pick(fields, DAY);
  const prompt = pick(fields, PROMPT);
  const taken = new Set([person, time, day, prompt].filter((x): x is string => !!x));
  return { format: 'long', person, ...(time ? { time } : {}), ...(day ? { day } : {}), ...(prompt ? { prompt } : {}), timeFormat: 'auto', timeUnit, variables: matchVariables(fields, variables, taken) };
}

const WAVE = /^(.*?)[_.\-\s]?(?:w|t|wave)?(\d+)$/i;

/** Wide-format waves from columns like `stress_1, stress_2` and optional `time_1, time_2`; without time columns wave k is at time k − 1 (in the file's unit). */
export function suggestWaves(fields: string[], variables: Pick<Variable, 'id' | 'label'>[]): WaveColumns[] {
  const byWave = new Map<number, { time?: string; cells: VariableColumn[] }>();
  for (const f of fields) {
    const m = WAVE.exec(f);
    if (!m || m[1] === '') continue;
    const stem = norm(m[1]), k = Number(m[2]);
    let w = byWave.get(k);
    if (!w) { w = { cells: [] }; byWave.set(k, w); }
    if (['time', 'date', 't', 'when', 'years', 'months'].includes(stem)) { w.time = f; continue; }
    const v = variables.find((x) => norm(x.id) === stem || (x.label !== undefined && norm(x.label) === stem));
    if (v) w.cells.push({ column: f, variable: v.id as VariableId });
  }
  const ks = [...byWave.keys()].filter((k) => byWave.get(k)!.cells.length > 0).sort((a, b) => a - b);
  return ks.map((k, i) => { const w = byWave.get(k)!; return { time: w.time ? { column: w.time } : { value: i }, cells: w.cells }; });
}
