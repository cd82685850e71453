/**
 * The column mapper for wide files (one row per person, columns per wave):
 * which columns are the waves of which variable, and when each wave was —
 * typed as times since the first wave, typed as intervals from the wave
 * before (waves may be unequal years apart), or read from a column per wave
 * holding each person's own time. Every typed time stays as typed; a typed
 * time that is not a number is named beside its field and keeps the import
 * from starting.
 */
import { useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { TIME_UNITS } from '../../core/model/types';
import type { ColumnMapping, WaveColumns } from '../../core/data/import';
import { labelOf, numText, significant, timeUnitWord } from '../../present/index';

export type WaveTimeMode = 'times' | 'intervals' | 'columns';

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A typed number, or null when the text is not one. */
export function typedNumber(text: string): number | null {
  const t = text.trim().replace(/\u2212/g, '-');
  return NUMBER.test(t) ? Number(t) : null;
}

/** Times of the waves from typed intervals (the first wave at 0); null where an interval is not a number. */
export function timesFromIntervals(intervals: string[]): (number | null)[] {
  let t: number | null = 0;
  return intervals.map((s, k) => {
    if (k === 0) return 0;
    const d = typedNumber(s);
    t = t === null || d === null ? null : t + d;
    return t;
  });
}

/** Years at the end of each wave's first column name (e.g. fish_2014), when every wave has one and they increase. */
export function yearsInNames(waves: WaveColumns[]): number[] | null {
  const ys = waves.map((w) => {
    const m = /(\d{4})$/.exec(w.cells[0]?.column ?? '');
    const y = m ? Number(m[1]) : NaN;
    return y >= 1800 && y <= 2200 ? y : NaN;
  });
  if (ys.length < 2 || ys.some((y) => !Number.isFinite(y)) || ys.some((y, k) => k > 0 && y <= ys[k - 1])) return null;
  return ys;
}

/** What keeps wide waves from being imported, naming the wave and field (null: nothing). */
export function wavesProblem(m: ColumnMapping): string | null {
  const waves = m.waves ?? [];
  if (waves.length < 2) return 'Wide format needs at least two waves: add waves and choose their columns.';
  const used = new Map<string, string>();
  let last: number | null = null;
  for (let k = 0; k < waves.length; k++) {
    const w = waves[k];
    const name = `Wave ${k + 1}`;
    if ('value' in w.time) {
      if (!Number.isFinite(w.time.value)) return `${name}: its time is not a number; type it as a number in ${m.timeInputUnit ?? m.timeUnit}.`;
      if (last !== null && w.time.value <= last) return `${name}: its time (${numText(w.time.value)}) is not after wave ${k}'s (${numText(last)}); waves go in time order.`;
      last = w.time.value;
    } else if (!w.time.column) return `${name}: choose the column that holds each person's time of this wave.`;
    if (w.cells.length === 0) return `${name}: no column is chosen for any variable.`;
    for (const c of w.cells) {
      if (c.column === m.person) return `${name}, ${c.variable}: column “${c.column}” names the person; choose the wave's column for ${c.variable}.`;
      const other = used.get(c.column);
      if (other) return `Column “${c.column}” is chosen twice (${other} and ${name} ${c.variable}); each cell of the file belongs to one wave and one variable.`;
      used.set(c.column, `${name} ${c.variable}`);
    }
  }
  return null;
}

function initialMode(waves: WaveColumns[]): WaveTimeMode {
  return waves.some((w) => 'column' in w.time) ? 'columns' : 'times';
}

function typedOf(waves: WaveColumns[], mode: WaveTimeMode): string[] {
  const t = waves.map((w) => ('value' in w.time && Number.isFinite(w.time.value) ? w.time.value : NaN));
  return waves.map((_, k) => {
    const v = mode === 'intervals' ? (k === 0 ? 0 : t[k] - t[k - 1]) : t[k];
    return Number.isFinite(v) ? String(significant(v, 12)) : '';
  });
}

export function WaveMapper({ model, fields, mapping, onChange }: { model: Model; fields: string[]; mapping: ColumnMapping; onChange: (m: ColumnMapping) => void }) {
  const waves = mapping.waves ?? [];
  const [mode, setMode] = useState<WaveTimeMode>(() => initialMode(waves));
  const [typed, setTyped] = useState<string[]>(() => typedOf(waves, initialMode(waves)));
  const unit = mapping.timeInputUnit ?? mapping.timeUnit;
  const columns = fields.filter((f) => f !== '' && f !== mapping.person);
  const variables: VariableId[] = [];
  for (const w of waves) for (const c of w.cells) if (!variables.includes(c.variable)) variables.push(c.variable);
  const [extra, setExtra] = useState<VariableId[]>([]);
  const shown = [...variables, ...extra.filter((v) => !variables.includes(v))];
  const addable = model.variables.filter((v) => v.kind === 'state' && !shown.includes(v.id));

  /** Typed texts to wave times (NaN where a text is not a number, so the import waits). */
  const withTimes = (ws: WaveColumns[], texts: string[], md: WaveTimeMode): WaveColumns[] => {
    if (md === 'columns') return ws;
    const times = md === 'intervals' ? timesFromIntervals(texts) : texts.map(typedNumber);
    return ws.map((w, k) => ({ ...w, time: { value: times[k] ?? NaN } }));
  };
  const setWaves = (ws: WaveColumns[], texts = typed, md = mode, patch: Partial<ColumnMapping> = {}) => onChange({ ...mapping, ...patch, waves: withTimes(ws, texts, md) });

  const changeMode = (md: WaveTimeMode) => {
    if (md === 'columns') {
      setMode(md);
      onChange({ ...mapping, timeFormat: mapping.timeFormat === 'iso' ? 'iso' : 'number', waves: waves.map((w) => ({ ...w, time: { column: 'column' in w.time ? w.time.column : '' } })) });
      return;
    }
    // Keep the times the waves have (typed or, from columns, 0, 1, 2, …) and show them in the new form.
    const base = waves.map((w, k) => ({ ...w, time: 'value' in w.time && Number.isFinite(w.time.value) ? w.time : { value: k } }));
    const texts = typedOf(base, md);
    setMode(md); setTyped(texts);
    setWaves(base, texts, md, { timeFormat: 'number' });
  };
  const type = (k: number, text: string) => {
    const texts = typed.map((t, i) => (i === k ? text : t));
    setTyped(texts);
    setWaves(waves, texts);
  };
  const setCell = (k: number, variable: VariableId, column: string) => {
    const ws = waves.map((w, i) => {
      if (i !== k) return w;
      const rest = w.cells.filter((c) => c.variable !== variable);
      const cells = column ? [...rest, { column, variable }] : rest;
      cells.sort((a, b) => shown.indexOf(a.variable) - shown.indexOf(b.variable));
      return { ...w, cells };
    });
    setWaves(ws);
  };
  const addWave = () => {
    const texts = [...typed, mode === 'intervals' ? '1' : String(significant((typedNumber(typed[typed.length - 1] ?? '') ?? waves.length - 1) + 1, 12))];
    setTyped(texts);
    setWaves([...waves, { time: mode === 'columns' ? { column: '' } : { value: NaN }, cells: [] }], texts);
  };
  const removeWave = (k: number) => {
    const texts = typed.filter((_, i) => i !== k);
    setTyped(texts);
    setWaves(waves.filter((_, i) => i !== k), texts);
  };
  const years = yearsInNames(waves);
  const useYears = () => {
    if (!years) return;
    const texts = years.map((y) => String(y - years[0]));
    setMode('times'); setTyped(texts);
    setWaves(waves, texts, 'times', { timeFormat: 'number', timeInputUnit: 'year' });
  };

  return (
    <div data-testid="wave-mapper">
      <div className="lf-data-grid">
        <label>
          Wave times given as{' '}
          <select aria-label="Wave times given as" value={mode} onChange={(e) => changeMode(e.target.value as WaveTimeMode)}>
            <option value="times">typed: each wave's time since the first</option>
            <option value="intervals">typed: each wave's interval from the wave before</option>
            <option value="columns">from a column per wave (each person's own time)</option>
          </select>
        </label>
        {mode === 'columns' && (
          <label>
            Times written as{' '}
            <select aria-label="Wave times written as" value={mapping.timeFormat === 'iso' ? 'iso' : 'number'} onChange={(e) => onChange({ ...mapping, timeFormat: e.target.value as 'iso' | 'number' })}>
              <option value="number">numbers in a unit</option>
              <option value="iso">ISO date-times (2026-03-02T09:15+01:00)</option>
            </select>
          </label>
        )}
        {(mode !== 'columns' || mapping.timeFormat !== 'iso') && (
          <label>
            Unit of the wave times{' '}
            <select aria-label="Unit of the wave times" value={unit} onChange={(e) => onChange({ ...mapping, timeInputUnit: e.target.value as ColumnMapping['timeUnit'] })}>
              {TIME_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </label>
        )}
        {years && mode !== 'columns' && (
          <button type="button" onClick={useYears}>Times from the years in the column names ({years.join(', ')})</button>
        )}
      </div>
      <table className="lf-data-table" aria-label="Waves: their times and the column of each variable">
        <thead>
          <tr>
            <th scope="col">wave</th>
            <th scope="col">{mode === 'columns' ? 'time column' : mode === 'intervals' ? `interval from the wave before (${unit})` : `time since the first wave (${unit})`}</th>
            {shown.map((v) => <th key={v} scope="col">{labelOf(model, v)}</th>)}
            <th scope="col"><span className="lf-sr">remove</span></th>
          </tr>
        </thead>
        <tbody>
          {waves.map((w, k) => {
            const bad = mode !== 'columns' && !(mode === 'intervals' && k === 0) && typedNumber(typed[k] ?? '') === null;
            const errId = `wave-${k}-time-error`;
            return (
              <tr key={k} data-wave={k + 1}>
                <th scope="row">{k + 1}</th>
                <td>
                  {mode === 'columns' ? (
                    <select aria-label={`Time column of wave ${k + 1}`} value={'column' in w.time ? w.time.column : ''} onChange={(e) => setWaves(waves.map((x, i) => (i === k ? { ...x, time: { column: e.target.value } } : x)))}>
                      <option value="">choose…</option>
                      {columns.map((f) => <option key={f} value={f}>{f}</option>)}
                    </select>
                  ) : mode === 'intervals' && k === 0 ? (
                    <span>start</span>
                  ) : (
                    <>
                      <input type="text" inputMode="decimal" size={6} aria-label={mode === 'intervals' ? `Interval from wave ${k} to wave ${k + 1}` : `Time of wave ${k + 1}`} aria-invalid={bad} aria-describedby={bad ? errId : undefined} value={typed[k] ?? ''} onChange={(e) => type(k, e.target.value)} />
                      {bad && <span id={errId} className="lf-data-error"> “{typed[k] ?? ''}” is not a number</span>}
                    </>
                  )}
                </td>
                {shown.map((v) => (
                  <td key={v}>
                    <select aria-label={`Column of ${labelOf(model, v)} in wave ${k + 1}`} value={w.cells.find((c) => c.variable === v)?.column ?? ''} onChange={(e) => setCell(k, v, e.target.value)}>
                      <option value="">not measured</option>
                      {columns.map((f) => <option key={f} value={f}>{f}</option>)}
                    </select>
                  </td>
                ))}
                <td><button type="button" aria-label={`Remove wave ${k + 1}`} onClick={() => removeWave(k)}>×</button></td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className="lf-data-row">
        <button type="button" onClick={addWave}>Add a wave</button>
        {addable.length > 0 && (
          <label>
            Add a variable{' '}
            <select aria-label="Add a variable" value="" onChange={(e) => { if (e.target.value) setExtra((x) => [...x, e.target.value as VariableId]); }}>
              <option value="">choose…</option>
              {addable.map((v) => <option key={v.id} value={v.id}>{labelOf(model, v.id)} ({v.id})</option>)}
            </select>
          </label>
        )}
      </div>
      {waves.length >= 2 && mode !== 'columns' && (
        <p className="lf-data-note" data-testid="wave-times">
          Waves at {waves.map((w) => ('value' in w.time && Number.isFinite(w.time.value) ? numText(w.time.value) : '?')).join(', ')} {timeUnitWord(unit, 2)} since the first{intervalsText(waves)}.
        </p>
      )}
    </div>
  );
}

function intervalsText(waves: WaveColumns[]): string {
  const t = waves.map((w) => ('value' in w.time ? w.time.value : NaN));
  if (t.some((x) => !Number.isFinite(x))) return '';
  const d = t.slice(1).map((x, k) => x - t[k]);
  return d.every((x) => Math.abs(x - d[0]) < 1e-9 * Math.max(1, Math.abs(d[0]))) ? ' (equally spaced)' : ` (intervals ${d.map(numText).join(', ')}: unequal)`;
}
