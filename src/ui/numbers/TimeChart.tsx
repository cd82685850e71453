import { timeSeriesChart, type TimeChartInput } from '../../export/charts';
import { elToReact } from '../elReact';

export type { ChartSeries } from '../../export/charts';

const root = (e: { tag: string }) => (e.tag === 'svg' ? { className: 'lf-num-chart' } : undefined);

/** Time series of a run, drawn by the exporter's builder (one panel per variable, one dash pattern per series). */
export function TimeChart(props: TimeChartInput) {
  return elToReact(timeSeriesChart(props), root);
}
