/**
 * Importing intensive longitudinal data (CSV / TSV) into a `Panel`.
 *
 * Rows arrive one at a time (`createImporter`), so the app can feed them from
 * a streaming parser in a worker and the command line from a file; `importText`
 * does both steps for text in memory. Nothing is dropped silently: every
 * refused row and every cell set to missing is counted by reason and column,
 * and the first of them are listed by row and column.
 *
 * Row numbers are record numbers in the file, the header being row 1.
 */
import Papa from 'papaparse';
import type { TimeUnit, VariableId } from '../model/types';
import { SECONDS_PER_UNIT } from '../model/units';
import type { Panel, PersonSeries } from './panel';

export interface VariableColumn {
  column: string;
  variable: VariableId;
}

/** How a table maps onto persons, times and model variables. */
export interface ColumnMapping {
  format: 'long' | 'wide';
  /** Column with the person's id. */
  person: string;
  /** Long format: the time column. */
  time?: string;
  /** 'iso': ISO 8601 date-times (with a zone offset, or read as written); 'number': numbers in `timeInputUnit`; 'auto' (default): decided from the first cells. */
  timeFormat?: 'iso' | 'number' | 'auto';
  /** Unit of numeric times in the file (default: `timeUnit`). */
  timeInputUnit?: TimeUnit;
  /** Unit of the panel's times (the model's unit). */
  timeUnit: TimeUnit;
  /** Long format: day number column (optional; derived from ISO dates when absent). */
  day?: string;
  /** Long format: prompt number within the day (optional). */
  prompt?: string;
  /** Long format: data columns and the model variable each one measures. */
  variables: VariableColumn[];
  /** Wide format: one entry per wave. */
  waves?: WaveColumns[];
  /** Extra missing-value codes beside empty cells and NA (e.g. "-99"). */
  missing?: string[];
}

export interface WaveColumns {
  /** The wave's time: a column holding each person's time of that wave, or one number (in `timeInputUnit`) for all. */
  time: { column: string } | { value: number };
  cells: VariableColumn[];
}

export type IssueAction = 'row refused' | 'cell set missing' | 'file refused' | 'note';

export interface ImportIssue {
  /** Record number in the file (header = 1); 0 for the file as a whole. */
  row: number;
  column?: string;
  message: string;
  action: IssueAction;
}

export interface ImportSummary {
  /** Data rows read (header excluded). */
  rows: number;
  /** Occasions kept (wide format: person × wave). */
  kept: number;
  /** Rows (or occasions) refused. */
  refused: number;
  persons: number;
  /** Why rows were refused or cells set missing, with counts and the first rows. */
  reasons: { reason: string; column?: string; action: IssueAction; count: number; rows: number[] }[];
  /** Cells missing per variable among kept occasions (given as missing, or set missing). */
  missing: { variable: VariableId; missing: number; total: number }[];
  /** Persons whose rows were not in time order (sorted). */
  unsortedPersons: number;
  notes: string[];
}

export interface ImportResult {
  /** Null when the file is refused as a whole. */
  panel: Panel | null;
  summary: ImportSummary;
  /** The first `MAX_LISTED` issues by row and column. */
  issues: ImportIssue[];
  /** Issues beyond those listed. */
  moreIssues: number;
}

export const MAX_LISTED = 1000;
const MAX_ROWS_PER_REASON = 10;

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/;
const DEFAULT_MISSING = ['', 'NA', 'N/A', 'NaN', 'na', 'nan'];

export type TimeParse = { ok: true; seconds: number; localDay: number; zoned: boolean } | { ok: false; message: string };

function daysInMonth(y: number, m: number): number {
  return new Date(Date.UTC(y, m, 0)).getUTCDate();
}

/**
 * An ISO 8601 date or date-time, e.g. `2026-03-02T09:15:00+01:00`: seconds since
 * 1970 (UTC) and the local calendar day as written (days since 1970-01-01).
 */
export function parseIsoTime(text: string): TimeParse {
  const m = ISO.exec(text.trim());
  if (!m) return { ok: false, message: `"${clip(text)}" is not an ISO date-time (like 2026-03-02T09:15:00+01:00)` };
  const [y, mo, d, h = '0', mi = '0', s = '0', frac = '', zone] = m.slice(1);
  const Y = +y, MO = +mo, D = +d, H = +h, MI = +mi, S = +s;
  if (MO < 1 || MO > 12) return { ok: false, message: `impossible month ${mo} in "${clip(text)}"` };
  if (D < 1 || D > daysInMonth(Y, MO)) return { ok: false, message: `impossible day ${d} of month ${mo} in "${clip(text)}"` };
  if (H > 23 || MI > 59 || S > 59) return { ok: false, message: `impossible time of day in "${clip(text)}"` };
  let offset = 0;
  if (zone && zone !== 'Z') {
    const zh = +zone.slice(1, 3), zm = zone.length > 3 ? +zone.slice(-2) : 0;
    if (zh > 14 || zm > 59) return { ok: false, message: `impossible zone offset ${zone} in "${clip(text)}"` };
    offset = (zone[0] === '-' ? -1 : 1) * (zh * 3600 + zm * 60);
  }
  const localDay = Date.UTC(Y, MO - 1, D) / 86400000;
  const seconds = localDay * 86400 + H * 3600 + MI * 60 + S + (frac ? +`0.${frac}` : 0) - offset;
  return { ok: true, seconds, localDay, zoned: zone !== undefined };
}

function clip(s: string): string {
  return s.length > 40 ? `${s.slice(0, 37)}…` : s;
}

/** One person's occasions as read, in file order (columns of plain arrays: a million rows make no million objects). */
interface PersonRows {
  row: number[];
  time: number[]; // seconds (iso) or input units (number)
  localDay: number[]; // NaN when unknown
  day: number[]; // from the day column, NaN when absent
  prompt: number[];
  values: number[]; // row-major, NaN = missing
}

export interface Importer {
  /** The header row (column names). Throws nothing: problems become file-level issues. */
  header(fields: string[]): void;
  /** One data row with its record number (header = 1). */
  row(fields: string[], rowNumber: number): void;
  /** A parser's own complaint about a row (unclosed quote …). */
  parserIssue(rowNumber: number, message: string): void;
  finish(): ImportResult;
}

/** Build a panel row by row. Example: `const imp = createImporter(mapping); imp.header(h); rows.forEach((r, i) => imp.row(r, i + 2)); imp.finish()`. */
export function createImporter(mapping: ColumnMapping): Importer {
  const missingCodes = new Set([...DEFAULT_MISSING, ...(mapping.missing ?? []).map((s) => s.trim())]);
  const issues: ImportIssue[] = [];
  let more = 0;
  const reasons = new Map<string, ImportSummary['reasons'][number]>();
  const notes: string[] = [];
  let fileRefused: string | null = null;
  let width = 0;
  let rows = 0;
  let refused = 0;
  const persons = new Map<string, PersonRows>();
  const waves = mapping.format === 'wide' ? mapping.waves ?? [] : [];
  const varIds: VariableId[] = [];
  let idx: { person: number; time: number; day: number; prompt: number; vars: number[]; waves: { time: number; value?: number; cells: number[] }[] } | null = null;
  let timeFormat: 'iso' | 'number' | null = mapping.timeFormat && mapping.timeFormat !== 'auto' ? mapping.timeFormat : null;
  let unzoned = 0, zoned = 0;
  const pendingAuto: { fields: string[]; row: number }[] = [];

  function report(row: number, column: string | undefined, reason: string, message: string, action: IssueAction) {
    const key = `${action}|${column ?? ''}|${reason}`;
    let r = reasons.get(key);
    if (!r) { r = { reason, ...(column !== undefined ? { column } : {}), action, count: 0, rows: [] }; reasons.set(key, r); }
    r.count++;
    if (r.rows.length < MAX_ROWS_PER_REASON) r.rows.push(row);
    if (issues.length < MAX_LISTED) issues.push({ row, ...(column !== undefined ? { column } : {}), message, action });
    else more++;
  }

  function refuseFile(message: string) {
    if (fileRefused) return;
    fileRefused = message;
    issues.unshift({ row: 0, message, action: 'file refused' });
  }

  function header(fieldsIn: string[]) {
    const fields = fieldsIn.map((f, i) => (i === 0 ? f.replace(/^\uFEFF/, '') : f).trim());
    width = fields.length;
    const seen = new Map<string, number>();
    fields.forEach((f, i) => { if (f && seen.has(f)) notes.push(`column "${f}" appears twice (columns ${seen.get(f)! + 1} and ${i + 1}): the first is used`); else seen.set(f, i); });
    const col = (name: string | undefined, what: string, required: boolean): number => {
      if (name === undefined || name === '') {
        if (required) refuseFile(`no column is chosen for the ${what}`);
        return -1;
      }
      const i = seen.get(name.trim());
      if (i === undefined) {
        const hint = fields.length === 1 && /[;,\t|]/.test(fields[0]) ? ` (the header was read as one column, "${clip(fields[0])}": is the delimiter right?)` : ` (columns: ${fields.slice(0, 12).map((f) => `"${clip(f)}"`).join(', ')}${fields.length > 12 ? ', …' : ''})`;
        refuseFile(`the ${what} column "${name}" is not in the file${hint}`);
        return -1;
      }
      return i;
    };
    const person = col(mapping.person, 'person', true);
    if (mapping.format === 'long') {
      const time = col(mapping.time, 'time', true);
      const day = col(mapping.day, 'day', false);
      const prompt = col(mapping.prompt, 'prompt', false);
      if (mapping.variables.length === 0) refuseFile('no data column is mapped to a model variable');
      const used = new Set<VariableId>();
      const vars = mapping.variables.map((v) => {
        if (used.has(v.variable)) refuseFile(`variable "${v.variable}" is mapped to two columns`);
        used.add(v.variable);
        varIds.push(v.variable);
        return col(v.column, `"${v.variable}"`, true);
      });
      idx = { person, time, day, prompt, vars, waves: [] };
    } else {
      if (waves.length === 0) refuseFile('wide format: no waves are defined (columns per wave)');
      const order: VariableId[] = [];
      for (const w of waves) for (const c of w.cells) if (!order.includes(c.variable)) order.push(c.variable);
      varIds.push(...order);
      const ws = waves.map((w, k) => ({
        time: 'column' in w.time ? col(w.time.column, `wave ${k + 1} time`, true) : -1,
        ...('value' in w.time ? { value: w.time.value } : {}),
        cells: order.map((v) => { const c = w.cells.find((x) => x.variable === v); return c ? col(c.column, `wave ${k + 1} "${v}"`, true) : -1; }),
      }));
      idx = { person, time: -1, day: -1, prompt: -1, vars: [], waves: ws };
    }
    if (mapping.format === 'wide' && !timeFormat) timeFormat = 'number';
  }

  function parseValue(text: string, row: number, column: string): number {
    if (missingCodes.has(text)) return NaN;
    const direct = +text;
    if (text !== '' && Number.isFinite(direct) && NUMBER.test(text)) return direct;
    const t = text.trim();
    if (missingCodes.has(t)) return NaN;
    if (NUMBER.test(t)) return Number(t);
    report(row, column, 'not a number', `"${clip(t)}" is not a number: set missing`, 'cell set missing');
    return NaN;
  }

  function parseTime(text: string, row: number, column: string): { time: number; localDay: number } | null {
    const t = text.trim();
    if (t === '' || missingCodes.has(t)) { report(row, column, 'no time', 'the time is empty: row refused', 'row refused'); return null; }
    if (timeFormat === 'iso') {
      const r = parseIsoTime(t);
      if (!r.ok) { report(row, column, 'impossible or unreadable time', `${r.message}: row refused`, 'row refused'); return null; }
      if (r.zoned) zoned++; else unzoned++;
      return { time: r.seconds, localDay: r.localDay };
    }
    if (!NUMBER.test(t)) { report(row, column, 'impossible or unreadable time', `"${clip(t)}" is not a number (times in this file are numbers): row refused`, 'row refused'); return null; }
    const v = Number(t);
    if (!Number.isFinite(v)) { report(row, column, 'impossible or unreadable time', `"${clip(t)}" is not a finite time: row refused`, 'row refused'); return null; }
    return { time: v, localDay: NaN };
  }

  function parseInt32(text: string, row: number, column: string, what: string): number | null {
    const t = text.trim();
    if (t === '' || missingCodes.has(t)) return NaN;
    if (!/^[+-]?\d{1,9}$/.test(t)) { report(row, column, `${what} is not a whole number`, `${what} "${clip(t)}" is not a whole number: row refused`, 'row refused'); return null; }
    return Number(t);
  }

  function add(personId: string, row: number, time: number, localDay: number, day: number, prompt: number): number[] {
    let acc = persons.get(personId);
    if (!acc) { acc = { row: [], time: [], localDay: [], day: [], prompt: [], values: [] }; persons.set(personId, acc); }
    acc.row.push(row); acc.time.push(time); acc.localDay.push(localDay); acc.day.push(day); acc.prompt.push(prompt);
    return acc.values;
  }

  function processRow(fields: string[], rowNumber: number) {
    const ix = idx!;
    const colName = (i: number) => (i >= 0 ? names[i] : undefined);
    const personId = (fields[ix.person] ?? '').trim();
    if (personId === '') { report(rowNumber, colName(ix.person), 'no person id', 'the person id is empty: row refused', 'row refused'); refused += mapping.format === 'wide' ? waves.length : 1; return; }
    if (mapping.format === 'long') {
      const t = parseTime(fields[ix.time], rowNumber, names[ix.time]);
      if (!t) { refused++; return; }
      const day = ix.day >= 0 ? parseInt32(fields[ix.day], rowNumber, names[ix.day], 'the day') : NaN;
      const prompt = ix.prompt >= 0 ? parseInt32(fields[ix.prompt], rowNumber, names[ix.prompt], 'the prompt number') : NaN;
      if (day === null || prompt === null) { refused++; return; }
      const values = add(personId, rowNumber, t.time, t.localDay, day, prompt);
      for (const c of ix.vars) values.push(parseValue(fields[c], rowNumber, names[c]));
    } else {
      ix.waves.forEach((w, k) => {
        let time: number;
        if (w.time >= 0) {
          const t = parseTime(fields[w.time], rowNumber, names[w.time]);
          if (!t) { refused++; return; }
          time = t.time;
        } else time = w.value!;
        const values = add(personId, rowNumber, time, NaN, NaN, k);
        for (const c of w.cells) values.push(c >= 0 ? parseValue(fields[c], rowNumber, names[c]) : NaN);
      });
    }
  }

  let names: string[] = [];

  function row(fields: string[], rowNumber: number) {
    if (fileRefused) return;
    rows++;
    if (fields.length === 1 && fields[0].trim() === '') { rows--; return; } // blank line
    if (fields.length !== width) {
      report(rowNumber, undefined, 'wrong number of cells', `${fields.length} cells where the header has ${width}: row refused`, 'row refused');
      refused += mapping.format === 'wide' ? waves.length : 1;
      return;
    }
    if (!timeFormat) {
      pendingAuto.push({ fields, row: rowNumber });
      if (pendingAuto.length >= 200) decideTimeFormat();
      return;
    }
    processRow(fields, rowNumber);
  }

  function decideTimeFormat() {
    let iso = 0, num = 0;
    for (const p of pendingAuto) {
      const t = (p.fields[idx!.time] ?? '').trim();
      if (NUMBER.test(t)) num++;
      else if (/^\d{4}-\d{2}-\d{2}/.test(t)) iso++;
    }
    timeFormat = iso > num ? 'iso' : 'number';
    notes.push(`times read as ${timeFormat === 'iso' ? 'ISO date-times' : `numbers in ${mapping.timeInputUnit ?? mapping.timeUnit}`} (${iso} of the first ${pendingAuto.length} rows look like dates, ${num} like numbers)`);
    const rowsToDo = pendingAuto.splice(0);
    for (const p of rowsToDo) processRow(p.fields, p.row);
  }

  function finish(): ImportResult {
    if (!fileRefused && !timeFormat) decideTimeFormat();
    const summaryBase = (kept: number, np: number, missing: ImportSummary['missing'], unsortedPersons: number): ImportSummary => ({
      rows, kept, refused, persons: np, reasons: [...reasons.values()], missing, unsortedPersons, notes,
    });
    if (fileRefused) return { panel: null, summary: summaryBase(0, 0, [], 0), issues, moreIssues: more };
    if (unzoned > 0 && zoned > 0) notes.push(`${unzoned} times carry no zone offset and ${zoned} do: those without were read as UTC; give every time a zone`);
    else if (unzoned > 0) notes.push('times carry no zone offset: read as clock time as written (intervals across a clock change may be off by an hour)');
    const unitSeconds = SECONDS_PER_UNIT[mapping.timeUnit];
    const inFactor = timeFormat === 'iso' ? 1 / unitSeconds : SECONDS_PER_UNIT[mapping.timeInputUnit ?? mapping.timeUnit] / unitSeconds;
    let origin = Infinity;
    if (timeFormat === 'iso') for (const acc of persons.values()) for (const t of acc.time) origin = Math.min(origin, t);
    if (!Number.isFinite(origin)) origin = 0;
    const nv = varIds.length;
    const out: PersonSeries[] = [];
    const miss = new Array<number>(nv).fill(0);
    let kept = 0, unsortedPersons = 0;
    let promptBase = Infinity;
    for (const acc of persons.values()) for (const p of acc.prompt) if (Number.isFinite(p)) promptBase = Math.min(promptBase, p);
    const hasDay = timeFormat === 'iso' || idx!.day >= 0;
    const hasPrompt = idx!.prompt >= 0 || mapping.format === 'wide';
    for (const [id, acc] of persons) {
      const n0 = acc.time.length;
      let order = Array.from({ length: n0 }, (_, k) => k);
      let sorted = true;
      for (let k = 1; k < n0; k++) if (acc.time[k] < acc.time[k - 1]) { sorted = false; break; }
      if (!sorted) { unsortedPersons++; order.sort((a, b) => acc.time[a] - acc.time[b] || acc.row[a] - acc.row[b]); }
      const keep: number[] = [];
      for (const o of order) {
        const prev = keep[keep.length - 1];
        if (prev !== undefined && acc.time[prev] === acc.time[o]) {
          report(acc.row[o], mapping.format === 'long' ? mapping.time : undefined, 'duplicate time', `person "${clip(id)}" already has an occasion at this time (row ${acc.row[prev]}): row refused`, 'row refused');
          refused++;
          continue;
        }
        keep.push(o);
      }
      order = keep;
      const T = order.length;
      const time = new Float64Array(T), values = new Float64Array(T * nv);
      const dayArr = hasDay ? new Int32Array(T) : undefined;
      const promptArr = hasPrompt ? new Int32Array(T) : undefined;
      let firstDay = Infinity;
      for (const o of order) firstDay = Math.min(firstDay, idx!.day >= 0 ? (Number.isFinite(acc.day[o]) ? acc.day[o] : Infinity) : acc.localDay[o]);
      let dayGaps = false;
      order.forEach((o, k) => {
        time[k] = (acc.time[o] - origin) * inFactor;
        for (let j = 0; j < nv; j++) { const v = acc.values[o * nv + j]; values[k * nv + j] = v; if (!Number.isFinite(v)) miss[j]++; }
        if (dayArr) {
          const d = (idx!.day >= 0 ? acc.day[o] : acc.localDay[o]) - firstDay;
          if (!Number.isFinite(d)) dayGaps = true;
          dayArr[k] = Number.isFinite(d) ? d : -1;
        }
        if (promptArr) promptArr[k] = Number.isFinite(acc.prompt[o]) ? acc.prompt[o] - promptBase : -1;
      });
      if (dayGaps) notes.push(`person "${clip(id)}": some rows have no day number (stored as −1)`);
      kept += T;
      out.push({ id, time, ...(dayArr ? { day: dayArr } : {}), ...(promptArr ? { prompt: promptArr } : {}), values });
    }
    if (promptBase > 0 && Number.isFinite(promptBase) && idx!.prompt >= 0) notes.push(`prompt numbers start at ${promptBase} in the file; stored from 0`);
    if (out.length === 0) refuseFile(rows === 0 ? 'the file has no data rows' : 'no row could be imported (see the reasons)');
    const panel: Panel | null = out.length === 0 ? null : { variables: varIds, timeUnit: mapping.timeUnit, persons: out, ...(timeFormat === 'iso' ? { origin: new Date(origin * 1000).toISOString() } : {}) };
    return { panel, summary: summaryBase(kept, out.length, varIds.map((variable, j) => ({ variable, missing: miss[j], total: kept })), unsortedPersons), issues, moreIssues: more };
  }

  return {
    header(fields) { names = fields.map((f, i) => (i === 0 ? f.replace(/^\uFEFF/, '') : f).trim()); header(fields); },
    row,
    parserIssue(rowNumber, message) { report(rowNumber, undefined, 'unreadable quoting', message, 'note'); },
    finish,
  };
}

export interface ParseOptions {
  /** ',' '\t' ';' '|', or undefined to detect. */
  delimiter?: string;
}

/**
 * Parse CSV/TSV text and import it. Example: `importText(csv, { format: 'long', person: 'id', time: 'when', timeUnit: 'h', variables: [{ column: 'stress', variable: 'stress' }] })`.
 */
export function importText(text: string, mapping: ColumnMapping, options: ParseOptions = {}): ImportResult {
  const imp = createImporter(mapping);
  feedText(text, imp, options);
  return imp.finish();
}

/** Parse text with papaparse and feed it, header first, to an importer. */
export function feedText(text: string, imp: Importer, options: ParseOptions = {}): void {
  let rowNumber = 0;
  let gotHeader = false;
  Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), {
    delimiter: options.delimiter ?? '',
    skipEmptyLines: false,
    step: (res) => {
      rowNumber++;
      for (const e of res.errors) if (e.type === 'Quotes') imp.parserIssue(rowNumber, `${e.message} (row ${rowNumber})`);
      if (!gotHeader) { gotHeader = true; imp.header(res.data); return; }
      imp.row(res.data, rowNumber);
    },
  });
  if (!gotHeader) imp.header([]);
}

/** The header of a table (first record), for the column mapper. */
export function readHeader(text: string, options: ParseOptions = {}): { fields: string[]; delimiter: string } {
  const firstChunk = text.slice(0, 65536).replace(/^\uFEFF/, '');
  const res = Papa.parse<string[]>(firstChunk, { delimiter: options.delimiter ?? '', preview: 1 });
  return { fields: (res.data[0] ?? []).map((f) => f.trim()), delimiter: res.meta.delimiter };
}
