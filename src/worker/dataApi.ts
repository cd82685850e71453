/**
 * The Data pane's questions as plain functions over plain data: read a
 * table's header (and a first guess of the column mapping), import it, and
 * fit the VAR and continuous-time models, each held against the sketch. The
 * same object runs in the data worker and on the main thread (lane.ts).
 * Failures come back as a reason, never as an exception.
 */
import type { Model, TimeUnit } from '../core/model/types';
import { importText, readHeader, type ColumnMapping, type ImportResult } from '../core/data/import';
import { suggestMapping } from '../core/data/importMapping';
import { intervalHistogram, missingness, type IntervalHistogram, type Missingness } from '../core/data/overview';
import type { Panel } from '../core/data/panel';
import { fitVar, type VarFit, type VarOptions } from '../core/fit/var';
import { ctSpec, ctStartFrom, fitCt, type CtFit } from '../core/fit/ct';
import { compareDrift, compareLagged, likelihoodRatio, sketchFreePattern, sketchStates, type LinkComparison } from '../core/fit/compare';
import { dataInterval } from '../core/fit/lagCurve';
import { readColumns } from '../core/data/columns';
import { cointegrationReport, pooledCointegration, type CointegrationReport, type EngleGrangerResult } from '../core/fit/coint';
import Papa from 'papaparse';

export type Failed = { ok: false; reason: string };

export interface HeaderAnswer {
  ok: true;
  fields: string[];
  delimiter: string;
  /** A first guess of the mapping from the header and the model's variables. */
  suggestion: ColumnMapping;
  /** The first data rows as read (for the mapper to show what a column holds). */
  preview: string[][];
}

/**
 * The import, and the overview's data computed where the import ran (the interval histogram and the
 * missing cells: a second or more of work on a million rows, kept off the main thread).
 */
export type ImportAnswer = ({ ok: true; overview?: { histogram: IntervalHistogram; missing: Missingness[] } } & ImportResult) | Failed;

export interface VarRequest {
  sameDay?: boolean;
  skipRule?: VarOptions['skipRule'];
}
export type VarAnswer = { ok: true; fit: VarFit; interval: number; comparison: LinkComparison[] } | Failed;

export interface CtRequest {
  initial?: 'free' | 'stationary';
  intercepts?: 'random' | 'common';
  maxIterations?: number;
}
export type CtAnswer =
  | { ok: true; confirmatory: CtFit; open: CtFit; lr: { chi2: number; df: number; p: number }; comparison: LinkComparison[] }
  | Failed;

export interface CointRequest {
  /** The file's columns to test, 2 to 6; the first is regressed on the others (Engle–Granger). */
  columns: string[];
  /** Test each person's rows separately (the column naming the person). */
  person?: string;
  missing?: string[];
  trend?: 'c' | 'ct';
  lags?: number;
}
/** One set of series' tests, without the long residual array. */
export type CointReport = Omit<CointegrationReport, 'engleGranger'> & { engleGranger: Omit<CointegrationReport['engleGranger'], 'residuals'> & Partial<Pick<EngleGrangerResult, 'residuals'>> };
export type CointAnswer =
  | {
    ok: true;
    columns: string[];
    person?: string;
    /** Without a person column: one report over every row. */
    all?: CointReport;
    /** With a person column: the tests per person and their summary. */
    pooled?: { persons: number; tested: number; skipped: { id: string; reason: string }[]; adf: { series: string; rejected: number; fisherP: number }[]; engleGranger: { rejected: number; fisherP: number }; johansenRank: number[]; trackers: { series: string; persons: number }[] };
    perPerson?: { id: string; report: CointReport }[];
  }
  | (Failed & { problems?: { row: number; column: string; message: string }[]; moreProblems?: number });

export interface DataApi {
  /** The header and a first guess of the mapping; from the text or a File/Blob (then only its first MiB is read, where this runs). */
  header(text: string | Blob, variables: Pick<Model['variables'][number], 'id' | 'label'>[], unit: TimeUnit, delimiter?: string): Promise<HeaderAnswer | Failed>;
  importData(text: string, mapping: ColumnMapping, delimiter?: string): Promise<ImportAnswer>;
  /**
   * The same from a File or Blob: read where this runs (in the worker, so the main thread neither
   * reads nor copies the text; a Blob crosses to the worker by reference). The worker sends the
   * panel's typed arrays back by transfer (`panelBuffers`), not by copy.
   */
  importBlob(blob: Blob, mapping: ColumnMapping, delimiter?: string): Promise<ImportAnswer>;
  fitVar(model: Model, panel: Panel, request: VarRequest, onProgress?: (fraction: number) => void): Promise<VarAnswer>;
  fitCt(model: Model, panel: Panel, request: CtRequest, onProgress?: (fraction: number) => void): Promise<CtAnswer>;
  /** Unit roots, cointegration and who tracks whom, on the file's columns in file order (as `loopfold coint`). */
  coint(text: string | Blob, request: CointRequest, delimiter?: string): Promise<CointAnswer>;
}

const lean = (r: CointegrationReport): CointReport => {
  const { residuals: _r, ...eg } = r.engleGranger;
  void _r;
  return { ...r, engleGranger: eg };
};

const reason = (e: unknown): Failed => ({ ok: false, reason: (e as Error)?.message ?? String(e) });

/** The mapped variables must be states of the sketch (the fits compare drift entries). */
function checkStates(model: Model, panel: Panel): void {
  const states = sketchStates(model);
  const not = panel.variables.filter((v) => !states.includes(v));
  if (not.length) throw new Error(`${not.join(', ')} ${not.length > 1 ? 'are' : 'is'} mapped to data but not ${not.length > 1 ? 'states' : 'a state'} of the sketch; map data columns to states (${states.join(', ')})`);
  if (panel.variables.length === 0) throw new Error('no data column is mapped to a variable of the sketch');
}

export const localData: DataApi = {
  async header(source, variables, unit, delimiter) {
    try {
      const text = typeof source === 'string' ? source : await source.slice(0, 1 << 20).text();
      const h = readHeader(text, delimiter ? { delimiter } : {});
      if (h.fields.length === 0 || h.fields.every((f) => f === '')) return { ok: false, reason: 'the file has no header row (the first line should name the columns)' };
      const dup = h.fields.find((f, i) => f !== '' && h.fields.indexOf(f) !== i);
      if (dup !== undefined) return { ok: false, reason: `the header names column "${dup}" twice; rename one of them` };
      const rows = Papa.parse<string[]>(text.slice(0, 65536).replace(/^\uFEFF/, ''), { delimiter: h.delimiter, preview: 6 }).data.slice(1);
      return { ok: true, fields: h.fields, delimiter: h.delimiter, suggestion: suggestMapping(h.fields, variables, unit), preview: rows };
    } catch (e) {
      return reason(e);
    }
  },
  async importData(text, mapping, delimiter) {
    try {
      const r = importText(text, mapping, delimiter ? { delimiter } : {});
      return { ok: true, ...r, ...(r.panel ? { overview: { histogram: intervalHistogram(r.panel), missing: missingness(r.panel) } } : {}) };
    } catch (e) {
      return reason(e);
    }
  },
  async importBlob(blob, mapping, delimiter) {
    let text: string;
    try { text = await blob.text(); } catch (e) { return { ok: false, reason: `the file could not be read: ${(e as Error)?.message ?? String(e)}` }; }
    return localData.importData(text, mapping, delimiter);
  },
  async fitVar(model, panel, request, onProgress) {
    try {
      checkStates(model, panel);
      onProgress?.(0);
      const fit = fitVar(panel, { sameDay: request.sameDay, skipRule: request.skipRule, perPerson: true });
      const interval = dataInterval(panel, !!request.sameDay);
      const comparison = compareLagged(model, fit, interval);
      onProgress?.(1);
      return { ok: true, fit, interval, comparison };
    } catch (e) {
      return reason(e);
    }
  },
  async fitCt(model, panel, request, onProgress) {
    try {
      checkStates(model, panel);
      const states = panel.variables;
      const maxIterations = request.maxIterations ?? 400;
      const base = { states, initial: request.initial ?? 'free', intercepts: request.intercepts ?? 'random', maxIterations } as const;
      // Two fits, each about half the work: progress is the share of iterations used so far (a fit that converges early jumps ahead).
      const open = fitCt(panel, { ...base, onIteration: (k) => onProgress?.(Math.min(0.49, (0.5 * k) / Math.min(maxIterations, 60))) });
      onProgress?.(0.5);
      const free = sketchFreePattern(model, states);
      // The sketch's fit starts from the open fit's estimates (far fewer iterations).
      const confirmatory = fitCt(panel, { ...base, free, start: ctStartFrom(panel, ctSpec(panel, { ...base, free }), open), onIteration: (k) => onProgress?.(Math.min(0.99, 0.5 + (0.5 * k) / Math.min(maxIterations, 60))) });
      onProgress?.(1);
      return { ok: true, open, confirmatory, lr: likelihoodRatio(confirmatory, open), comparison: compareDrift(model, open) };
    } catch (e) {
      return reason(e);
    }
  },
  async coint(source, request, delimiter) {
    try {
      const text = typeof source === 'string' ? source : await source.text();
      const { columns, person } = request;
      if (columns.length < 2 || columns.length > 6) return { ok: false, reason: `choose 2 to 6 columns to test, not ${columns.length}` };
      const read = readColumns(text, columns, { ...(person ? { person } : {}), ...(delimiter ? { delimiter } : {}), ...(request.missing?.length ? { missing: request.missing } : {}) });
      if (read.problems.length) {
        const more = read.problems.length - Math.min(read.problems.length, 5) + read.moreProblems;
        const list = read.problems.slice(0, 5).map((p) => `row ${p.row}, column ${p.column}: ${p.message}`).join('; ');
        return { ok: false, reason: `the tests need complete numeric series; ${list}${more > 0 ? `; and ${more} more` : ''}. Nothing was tested.`, problems: read.problems, moreProblems: read.moreProblems };
      }
      const options = { trend: request.trend ?? 'c', lags: request.lags ?? 1 };
      if (!person) {
        const g = read.groups[0];
        if (!g) return { ok: false, reason: 'the file has no data rows' };
        return { ok: true, columns, all: lean(cointegrationReport(g.series, columns, options)) };
      }
      const p = pooledCointegration(read.groups, columns, options);
      if (p.tested === 0) return { ok: false, reason: `no ${person} could be tested (${p.skipped.slice(0, 3).map((s) => `${s.id}: ${s.reason}`).join('; ')})` };
      const { perPerson, ...pooled } = p;
      return { ok: true, columns, person, pooled, perPerson: perPerson.map((x) => ({ id: x.id, report: lean(x.report) })) };
    } catch (e) {
      return reason(e);
    }
  },
};

/** The buffers of an import's panel (times, values, days, prompts of every person), to send by transfer. */
export function panelBuffers(answer: ImportAnswer): ArrayBuffer[] {
  if (!answer.ok || !answer.panel) return [];
  const out: ArrayBuffer[] = [];
  for (const p of answer.panel.persons) for (const a of [p.time, p.values, p.day, p.prompt]) if (a && a.buffer instanceof ArrayBuffer && !out.includes(a.buffer)) out.push(a.buffer);
  return out;
}
