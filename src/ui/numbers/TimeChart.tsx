import type { VariableId } from '../../core/model/types';
import { DASHES, extent, linear, niceTicks, tickText, valueAt } from './chart';

export interface ChartSeries {
  id: VariableId;
  name: string;
  unit?: string;
  values: readonly number[];
}

const W = 360, PH = 92, L = 50, R = 10, GAP = 22, AXIS = 34;

/**
 * Time series as SVG, one panel per variable with its own value axis (values
 * of different size stay readable), a shared time axis, one dash pattern per
 * series (tells them apart in grayscale too), and the samples a study would
 * take drawn as open circles.
 */
export function TimeChart({ times, series, samples, timeUnit }: { times: readonly number[]; series: ChartSeries[]; samples: number[] | null; timeUnit: string }) {
  const t1 = times[times.length - 1] ?? 1;
  const x = linear(0, t1, L, W - R);
  const xt = niceTicks(0, t1, 5);
  // Draw at most about 1500 points per line: more cannot be told apart at this size.
  const stride = Math.max(1, Math.ceil(times.length / 1500));
  const drawn = times.map((_, k) => k).filter((k) => k % stride === 0 || k === times.length - 1);
  const top = (i: number) => 4 + i * (PH + GAP) + 14;
  const height = top(series.length - 1) + PH + AXIS;
  return (
    <svg className="lf-num-chart" viewBox={`0 0 ${W} ${height}`} role="img" aria-label={`Simulated ${series.map((s) => s.name).join(', ')} over time`}>
      {series.map((s, i) => {
        const y0p = top(i), y1p = y0p + PH;
        const [lo, hi] = extent(s.values);
        const y = linear(lo, hi, y1p, y0p);
        const dash = DASHES[i % DASHES.length] || undefined;
        return (
          <g key={s.id} data-panel={s.id}>
            <line x1={L} x2={L + 24} y1={y0p - 8} y2={y0p - 8} className="lf-chart-line" strokeDasharray={dash} />
            <text x={L + 30} y={y0p - 4} className="lf-chart-title">{s.name}{s.unit ? ` (${s.unit})` : ''}</text>
            <rect x={L} y={y0p} width={W - L - R} height={PH} className="lf-chart-frame" />
            {niceTicks(lo, hi, 5).filter((v) => v >= lo && v <= hi).map((v) => (
              <g key={v}>
                <line x1={L - 4} x2={L} y1={y(v)} y2={y(v)} className="lf-chart-axis" />
                <line x1={L} x2={W - R} y1={y(v)} y2={y(v)} className="lf-chart-grid" />
                <text x={L - 6} y={y(v) + 3.5} textAnchor="end" className="lf-chart-tick">{tickText(v)}</text>
              </g>
            ))}
            {xt.map((v) => <line key={v} x1={x(v)} x2={x(v)} y1={y1p} y2={y1p + 3} className="lf-chart-axis" />)}
            <polyline data-series={s.id} className="lf-chart-line" strokeDasharray={dash} points={drawn.map((k) => `${x(times[k]).toFixed(1)},${y(s.values[k]).toFixed(1)}`).join(' ')} />
            {samples?.map((t) => <circle key={t} className="lf-chart-sample" cx={x(t)} cy={y(valueAt(times, s.values, t))} r={2.4} />)}
          </g>
        );
      })}
      {xt.map((v) => (
        <text key={v} x={x(v)} y={height - AXIS + 14} textAnchor="middle" className="lf-chart-tick">{tickText(v)}</text>
      ))}
      <text x={(L + W - R) / 2} y={height - 6} textAnchor="middle" className="lf-chart-label">time since the start ({timeUnit})</text>
    </svg>
  );
}
