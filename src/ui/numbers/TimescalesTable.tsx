import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { editDocument } from '../../state/document';
import type { TimescalesAnswer } from '../../worker/numericApi';
import { labelOf, numText, quantityText } from '../../present/index';

/** Eigenvalues of the linearized mechanism and each state's timescale, given and derived. */
export function TimescalesTable({ model, answer }: { model: Model; answer: TimescalesAnswer }) {
  const u = model.timeUnit;
  const dur = (x: number) => (Number.isFinite(x) ? formatDuration(x, u) : 'never settles');
  const { report } = answer;
  return (
    <>
      <table className="lf-num-table lf-num-timescales">
        <thead>
          <tr><th scope="col">State</th><th scope="col">Given</th><th scope="col">Derived</th><th scope="col" /></tr>
        </thead>
        <tbody>
          {report.perState.map((p) => (
            <tr key={p.state} data-state={p.state}>
              <th scope="row">{labelOf(model, p.state)}</th>
              <td>{p.given !== undefined ? dur(p.given) : '—'}</td>
              <td title={`${Math.round(p.share * 100)}% of this state's movement is in that mode`}>{dur(p.derived)} <span className="lf-num-tag">derived</span></td>
              <td>
                {p.given === undefined && Number.isFinite(p.derived) && (
                  <button
                    type="button"
                    className="lf-num-small"
                    onClick={() => editDocument({ type: 'updateVariable', id: p.state, patch: { timescale: timescaleText(p.derived, u) } })}
                  >
                    use derived timescale
                  </button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <details className="lf-num-modes">
        <summary>Modes (eigenvalues of the linearized mechanism, per {u})</summary>
        <ul>
          {report.modes.map((m, i) => (
            <li key={i}>
              {numText(m.re)}
              {m.im !== 0 ? ` ${m.im > 0 ? '+' : '−'} ${numText(Math.abs(m.im))}i` : ''}:{' '}
              {m.re < 0 ? `settles over ${dur(m.time)}` : m.re > 0 ? `grows, doubling every ${dur(Math.LN2 / m.re)} — unstable: it does not settle` : 'neither grows nor decays'}
              {m.period !== undefined ? `, swings with period ${dur(m.period)}` : ''}
            </li>
          ))}
        </ul>
      </details>
      {answer.warnings.length > 0 && (
        <ul className="lf-num-warnings">
          {answer.warnings.map((w, i) => <li key={i}>{w}</li>)}
        </ul>
      )}
    </>
  );
}

/** The derived timescale in the model's own unit, three significant digits: "20 days", "6.12 min". */
export function timescaleText(x: number, unit: Model['timeUnit']): string {
  return quantityText(x, unit, { digits: 3 });
}
