import { linkCurveChart, type LinkCurveInput } from '../../export/charts';
import { elToReact } from '../elReact';

const root = (e: { tag: string }) => (e.tag === 'svg' ? { className: 'lf-num-chart lf-num-curve' } : undefined);

/** One lagged link against the sampling interval, drawn by the exporter's builder. */
export function LinkCurveChart(props: LinkCurveInput) {
  return elToReact(linkCurveChart(props), root);
}
