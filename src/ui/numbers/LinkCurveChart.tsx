import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { LinkCurve } from '../../core/numeric/index';
import { extent, linear, logScale, logTicks, niceTicks, tickText } from './chart';
import { nameOf, numText } from './format';

const W = 360, H = 230, L = 52, R = 10, T = 14, B = 40;

/**
 * The lagged effect of one state on another against the sampling interval
 * (log axis), with its peak, the ordering's breakpoints and the current Δ marked.
 */
export function LinkCurveChart({ model, curve, breakpoints, current }: { model: Model; curve: LinkCurve; breakpoints: number[]; current: number | undefined }) {
  const d0 = curve.intervals[0], d1 = curve.intervals[curve.intervals.length - 1];
  const x = logScale(d0, d1, L, W - R);
  const [y0, y1] = extent([...curve.effect, 0]);
  const y = linear(y0, y1, H - B, T);
  const u = model.timeUnit;
  const peak = curve.peaks.length > 0 ? curve.peaks.reduce((a, b) => (Math.abs(b.effect) > Math.abs(a.effect) ? b : a)) : null;
  const inside = (d: number) => d >= d0 && d <= d1;
  const title = `Lagged effect of ${nameOf(model, curve.from)} on ${nameOf(model, curve.to)} against the sampling interval`;
  return (
    <svg className="lf-num-chart lf-num-curve" viewBox={`0 0 ${W} ${H + 42}`} role="img" aria-label={title}>
      <rect x={L} y={T} width={W - L - R} height={H - T - B} className="lf-chart-frame" />
      {logTicks(d0, d1).map((v) => (
        <g key={`x${v}`}>
          <line x1={x(v)} x2={x(v)} y1={H - B} y2={H - B + 4} className="lf-chart-axis" />
          <text x={x(v)} y={H - B + 15} textAnchor="middle" className="lf-chart-tick">{tickText(v)}</text>
        </g>
      ))}
      {niceTicks(y0, y1, 5).map((v) => (
        <g key={`y${v}`}>
          <line x1={L - 4} x2={L} y1={y(v)} y2={y(v)} className="lf-chart-axis" />
          <line x1={L} x2={W - R} y1={y(v)} y2={y(v)} className={v === 0 ? 'lf-chart-zero' : 'lf-chart-grid'} />
          <text x={L - 6} y={y(v) + 4} textAnchor="end" className="lf-chart-tick">{tickText(v)}</text>
        </g>
      ))}
      <text x={(L + W - R) / 2} y={H - 8} textAnchor="middle" className="lf-chart-label">sampling interval Δ ({u}, log scale)</text>
      <text x={12} y={(T + H - B) / 2} textAnchor="middle" transform={`rotate(-90 12 ${(T + H - B) / 2})`} className="lf-chart-label">effect one interval later</text>
      {breakpoints.filter(inside).map((b, i) => (
        <line key={`b${i}`} data-breakpoint={b} x1={x(b)} x2={x(b)} y1={T} y2={H - B} className="lf-chart-breakpoint" />
      ))}
      {current !== undefined && inside(current) && (
        <g data-current={current}>
          <line x1={x(current)} x2={x(current)} y1={T} y2={H - B} className="lf-chart-current" />
        </g>
      )}
      <polyline className="lf-chart-line" points={curve.intervals.map((d, k) => `${x(d).toFixed(1)},${y(curve.effect[k]).toFixed(1)}`).join(' ')} />
      {peak && (
        <g data-peak={peak.interval}>
          <path d={`M${x(peak.interval)},${y(peak.effect) - 6} l5,6 l-5,6 l-5,-6 z`} className="lf-chart-peak" />
        </g>
      )}
      <g transform={`translate(${L}, ${H + 6})`} className="lf-chart-legend">
        <line x1={0} x2={16} y1={6} y2={6} className="lf-chart-breakpoint" />
        <text x={20} y={10} className="lf-chart-tick">the causal ordering changes</text>
        <line x1={170} x2={186} y1={6} y2={6} className="lf-chart-current" />
        <text x={190} y={10} className="lf-chart-tick">current Δ</text>
        {peak && (
          <>
            <path d="M8,16 l5,6 l-5,6 l-5,-6 z" className="lf-chart-peak" />
            <text x={20} y={26} className="lf-chart-tick">strongest: {numText(Number(peak.effect.toPrecision(3)))} at Δ = {formatDuration(peak.interval, u)}</text>
          </>
        )}
      </g>
    </svg>
  );
}
