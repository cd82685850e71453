/**
 * Tables of the report as CSV (RFC 4180, see csv.ts): the bands of the
 * interval axis with each variable's role, and the breakpoints with their
 * reasons. One row per (band, variable) or (breakpoint, change), so the
 * tables load into any spreadsheet or data frame without reshaping.
 */
import type { Model } from '../core/model/types';
import { bands, breakpoints, type AxisOptions } from '../core/ordering/index';
import { toCsv, type CsvValue } from '../present/csv';
import type { Trajectories } from '../core/interventions/effects';

/** `band,from,to,from_included,to_included,variable,label,role` — intervals in the model's time unit, "Infinity" for the open end. */
export function bandsCsv(model: Model, axis: AxisOptions = {}): string {
  const rows: CsvValue[][] = [['band', 'from', 'to', 'from_included', 'to_included', 'variable', 'label', 'role']];
  bands(model, axis).forEach((b, i) => {
    for (const v of model.variables) rows.push([i + 1, b.from, b.to, !b.excludesFrom, Boolean(b.includesTo), v.id, v.label ?? v.id, b.roles[v.id]]);
  });
  return toCsv(rows);
}

/** `interval,exclusive,variable,from_role,to_role,reason`. */
export function breakpointsCsv(model: Model, axis: AxisOptions = {}): string {
  const rows: CsvValue[][] = [['interval', 'exclusive', 'variable', 'from_role', 'to_role', 'reason']];
  for (const b of breakpoints(model, axis)) for (const c of b.changes) rows.push([b.interval, Boolean(b.exclusive), c.variable, c.from, c.to, c.reason]);
  return toCsv(rows);
}

/** `time,variable,without,with` — the runs without and with an intervention, one row per time and variable (long format). */
export function trajectoriesCsv(t: Trajectories, variables: readonly string[]): string {
  const rows: CsvValue[][] = [['time', 'variable', 'without', 'with']];
  t.times.forEach((time, k) => {
    for (const v of variables) rows.push([time, v, t.without[v]?.[k], t.with[v]?.[k]]);
  });
  return toCsv(rows);
}
