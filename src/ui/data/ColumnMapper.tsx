/**
 * The column mapper: which column names the person, which the time (ISO
 * date-times, or numbers in a unit), the optional day and prompt columns,
 * and which model variable each data column measures (first guessed by id
 * or label, editable). Variables no column measures stay latent.
 */
import { useId } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { TIME_UNITS } from '../../core/model/types';
import type { ColumnMapping } from '../../core/data/import';
import { matchVariables } from '../../core/data/importMapping';
import type { HeaderAnswer } from '../../worker/dataApi';
import { labelOf } from '../../present/index';
import { WaveMapper, wavesProblem } from './WaveMapper';

/** What keeps a mapping from being imported, in words naming the field (null: nothing). */
export function mappingProblem(m: ColumnMapping): string | null {
  if (!m.person) return 'Choose the column that names the person.';
  if (m.format === 'long') {
    if (!m.time) return 'Choose the column that holds the time of each occasion.';
    if (m.variables.length === 0) return 'Map at least one data column to a variable of the model.';
    const seen = new Map<string, string>();
    for (const v of m.variables) {
      const other = seen.get(v.variable);
      if (other) return `Columns “${other}” and “${v.column}” are both mapped to ${v.variable}; map each variable to one column.`;
      seen.set(v.variable, v.column);
    }
  } else return wavesProblem(m);
  return null;
}

export function ColumnMapper({ model, fileName, header, mapping, onChange, onImport, busy, problem }: {
  model: Model; fileName: string; header: HeaderAnswer; mapping: ColumnMapping; onChange: (m: ColumnMapping) => void; onImport: () => void; busy: boolean;
  /** What keeps the mapping from being imported (shown beside the Import button). */
  problem?: string | null;
}) {
  const id = useId();
  const fields = header.fields;
  const example = (col: string) => {
    const k = fields.indexOf(col);
    const v = header.preview.map((r) => r[k]).find((x) => x !== undefined && x !== '');
    return v === undefined ? '' : v.length > 28 ? `${v.slice(0, 27)}…` : v;
  };
  const roles = [mapping.person, mapping.time, mapping.day, mapping.prompt].filter((x): x is string => !!x);
  const dataColumns = fields.filter((f) => f !== '' && !roles.includes(f));
  const mappedTo = (col: string) => mapping.variables.find((v) => v.column === col)?.variable ?? '';
  const setVariable = (col: string, variable: string) => {
    const rest = mapping.variables.filter((v) => v.column !== col);
    onChange({ ...mapping, variables: variable ? [...rest, { column: col, variable: variable as VariableId }].sort((a, b) => fields.indexOf(a.column) - fields.indexOf(b.column)) : rest });
  };
  const setRole = (role: 'person' | 'time' | 'day' | 'prompt', col: string) => {
    const next: ColumnMapping = { ...mapping, variables: mapping.variables.filter((v) => v.column !== col) };
    if (col) next[role] = col; else delete next[role];
    onChange(next);
  };
  const measured = new Set(mapping.format === 'long' ? mapping.variables.map((v) => v.variable) : (mapping.waves ?? []).flatMap((w) => w.cells.map((c) => c.variable)));
  const latent = model.variables.filter((v) => v.kind === 'state' && !measured.has(v.id));
  const select = (role: 'person' | 'time' | 'day' | 'prompt', label: string, optional: boolean) => (
    <label>
      {label}{' '}
      <select aria-label={label} value={mapping[role] ?? ''} onChange={(e) => setRole(role, e.target.value)}>
        {optional ? <option value="">none</option> : !mapping[role] && <option value="">choose…</option>}
        {fields.filter((f) => f !== '').map((f) => <option key={f} value={f}>{f}</option>)}
      </select>
    </label>
  );
  return (
    <section className="lf-data-section" aria-labelledby={`${id}-h`} data-testid="column-mapper">
      <h3 id={`${id}-h`}>Columns of {fileName}</h3>
      <p className="lf-data-note">{fields.length} columns, separated by {header.delimiter === '\t' ? 'tabs' : `“${header.delimiter}”`}. The first guess matches columns to the model's variables by id or label; change anything that is wrong.</p>
      <div className="lf-data-grid">
        <label>
          Layout{' '}
          <select aria-label="Layout" value={mapping.format} onChange={(e) => {
            const format = e.target.value as ColumnMapping['format'];
            if (format === 'long') onChange({ ...mapping, format, variables: mapping.variables.length ? mapping.variables : matchVariables(fields, model.variables, new Set(roles)) });
            else onChange({ ...mapping, format, timeFormat: 'number', waves: mapping.waves ?? header.suggestion.waves ?? [] });
          }}>
            <option value="long">long: one row per person and occasion</option>
            <option value="wide">wide: one row per person, columns per wave</option>
          </select>
        </label>
        {select('person', 'Person', false)}
        {mapping.format === 'long' && (
          <>
            {select('time', 'Time', false)}
            <label>
              Time written as{' '}
              <select aria-label="Time written as" value={mapping.timeFormat ?? 'auto'} onChange={(e) => onChange({ ...mapping, timeFormat: e.target.value as ColumnMapping['timeFormat'] })}>
                <option value="auto">decide from the cells</option>
                <option value="iso">ISO date-times (2026-03-02T09:15+01:00)</option>
                <option value="number">numbers in a unit</option>
              </select>
            </label>
            {mapping.timeFormat === 'number' && (
              <label>
                Unit of the numbers{' '}
                <select aria-label="Unit of the numbers" value={mapping.timeInputUnit ?? mapping.timeUnit} onChange={(e) => onChange({ ...mapping, timeInputUnit: e.target.value as ColumnMapping['timeUnit'] })}>
                  {TIME_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
                </select>
              </label>
            )}
            {select('day', 'Day (optional)', true)}
            {select('prompt', 'Prompt number (optional)', true)}
          </>
        )}
        <label>
          Missing-value codes{' '}
          <input type="text" aria-label="Missing-value codes" value={(mapping.missing ?? []).join(', ')} placeholder="e.g. -99" onChange={(e) => onChange({ ...mapping, missing: e.target.value.split(',').map((s) => s.trim()).filter((s) => s !== '') })} />
        </label>
      </div>
      <p className="lf-data-note">Empty cells and NA are always missing; add codes such as -99, separated by commas.</p>
      {mapping.format === 'long' ? (
        <table className="lf-data-table" aria-label="Data columns and model variables">
          <thead><tr><th scope="col">column</th><th scope="col">first value</th><th scope="col">measures</th></tr></thead>
          <tbody>
            {dataColumns.map((col) => (
              <tr key={col}>
                <th scope="row" className="lf-data-raw">{col}</th>
                <td className="lf-data-raw">{example(col)}</td>
                <td>
                  <select aria-label={`Variable measured by column ${col}`} value={mappedTo(col)} onChange={(e) => setVariable(col, e.target.value)}>
                    <option value="">not used</option>
                    {model.variables.map((v) => <option key={v.id} value={v.id}>{labelOf(model, v.id)} ({v.id})</option>)}
                  </select>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <>
          {(mapping.waves ?? []).length < 2 && <p className="lf-data-note">Fewer than two waves were recognised (wide files often name their columns like stress_1, stress_2 or fish_2014): add waves and choose the column of each variable in each wave.</p>}
          <WaveMapper key={header.fields.join('\u0001')} model={model} fields={fields} mapping={mapping} onChange={onChange} />
        </>
      )}
      {latent.length > 0 && <p className="lf-data-note">Not measured (latent in the fits): {latent.map((v) => labelOf(model, v.id)).join(', ')}.</p>}
      {problem && <p className="lf-data-error" role="alert">{problem}</p>}
      <button type="button" className="lf-primary" onClick={onImport} disabled={busy}>Import</button>
    </section>
  );
}
