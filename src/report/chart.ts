/**
 * The report's chart of one variable without and with an intervention: the
 * one chart builder of `src/export/charts.ts`, written as an SVG string.
 */
import type { Trajectories } from '../core/interventions/effects';
import { runsChart, settledIndex } from '../export/charts';
import { serialize } from '../export/svg';

export { settledIndex };

export interface ChartOptions {
  /** Time unit shown on the axis. */
  timeUnit?: string;
  /** Show the run only until both lines are within 1% of their final range (plus half as long again). */
  crop?: boolean;
}

/** `trajectoryChart(t, 'airTemp', 'Air temperature')` → '<svg …>…</svg>'. */
export function trajectoryChart(t: Trajectories, variable: string, label: string, options: ChartOptions = {}): string {
  return serialize(runsChart({ times: t.times, without: t.without[variable] ?? [], with: t.with[variable] ?? [], label, timeUnit: options.timeUnit ?? '' }, { crop: options.crop }));
}
