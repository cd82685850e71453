import type { Model, VariableId } from '../../core/model/types';
import { isFailed, useNumeric } from './useNumeric';
import type { EquilibriumAnswer } from '../../worker/numericApi';
import { labelOf, numText } from '../../present/index';

const KIND_WORDS = { input: 'input', state: 'state', derived: 'derived' } as const;

/** The values every variable settles at, with held values marked and the unheld balance beside them. */
export function EquilibriumTable({ model, hold }: { model: Model; hold: Record<VariableId, number> | undefined }) {
  const held = hold && Object.keys(hold).length > 0 ? hold : undefined;
  const asked = useNumeric<EquilibriumAnswer>((c) => c.ask('equilibrium', model, held), [model, held]);
  if (asked.status !== 'done') return <p className="lf-num-wait">Solving for the balance…</p>;
  const a = asked.answer;
  if (isFailed(a)) return <p className="lf-num-error" role="alert">No equilibrium: {a.reason}</p>;
  const errors = a.diagnostics.filter((d) => d.level === 'error');
  // Variables of a block that could not be balanced keep their starting values: say so in their row.
  const unsettled = new Set(errors.flatMap((d) => d.variables));
  return (
    <>
      <table className="lf-num-table lf-num-equilibrium">
        <thead>
          <tr>
            <th scope="col">Variable</th>
            <th scope="col">{held ? 'With holds' : 'At balance'}</th>
            {held && <th scope="col">Without holds</th>}
          </tr>
        </thead>
        <tbody>
          {model.variables.map((v) => {
            const x = a.values[v.id];
            const isHeld = held !== undefined && v.id in held;
            return (
              <tr key={v.id} data-variable={v.id} className={isHeld ? 'lf-num-held' : undefined}>
                <th scope="row">
                  {labelOf(model, v.id)} <span className="lf-num-kind">{KIND_WORDS[v.kind]}</span>
                </th>
                <td>
                  {Number.isFinite(x) ? numText(x) : '—'}
                  {v.unit ? <span className="lf-num-unit"> {v.unit}</span> : null}
                  {isHeld && <span className="lf-num-tag"> held</span>}
                  {!isHeld && unsettled.has(v.id) && <span className="lf-num-tag lf-num-unsettled" title="no balance found: the starting value is shown"> not balanced</span>}
                </td>
                {held && <td>{a.unheld && Number.isFinite(a.unheld[v.id]) ? numText(a.unheld[v.id]) : '—'}</td>}
              </tr>
            );
          })}
        </tbody>
      </table>
      {errors.length > 0 && (
        <ul className="lf-num-problems" role="alert">
          {errors.map((d, i) => <li key={i}>{d.message}</li>)}
        </ul>
      )}
      {!a.ok && errors.length === 0 && <p className="lf-num-error">Some blocks could not be balanced; their values are shown as —.</p>}
    </>
  );
}
