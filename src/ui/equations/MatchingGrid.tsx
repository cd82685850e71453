import type { EquationMatching } from '../../core/ordering/index';
import { selectionStore } from '../../state/selection';
import { nodeOfEquation } from '../diagnostics/collect';

const GRID_LIMIT = 28;

/** Equations × unknowns: a dot where an equation involves a variable, a ringed dot where the matching assigns it. */
export function MatchingGrid({ matching }: { matching: EquationMatching }) {
  const pick = (eq: string) => selectionStore.getState().select({ nodes: [nodeOfEquation(eq)] });
  const unmatched = matching.equations.filter((e) => !e.determines).length;
  const matched = new Set(matching.equations.map((e) => e.determines).filter(Boolean));
  const free = matching.variables.filter((v) => !matched.has(v));
  const summary = (
    <p className="lf-hint">
      {matching.equations.length} equations, {matching.variables.length} unknowns.{' '}
      {unmatched > 0 && <strong className="lf-bad">{unmatched} equation{unmatched > 1 ? 's' : ''} left over (over-determined). </strong>}
      {free.length > 0 && <strong className="lf-bad">Not determined by any equation: {free.join(', ')} (under-determined).</strong>}
    </p>
  );
  if (matching.variables.length > GRID_LIMIT) {
    return (
      <>
        {summary}
        <table>
          <thead><tr><th scope="col">Equation</th><th scope="col">Determines</th><th scope="col">Involves</th></tr></thead>
          <tbody>
            {matching.equations.map((e) => (
              <tr key={e.id} className={e.determines ? undefined : 'is-bad'}>
                <td><button type="button" className="lf-linkish lf-mono" onClick={() => pick(e.id)}>{e.id}</button></td>
                <td>{e.determines ?? '—'}</td>
                <td className="lf-mono">{e.variables.join(', ')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </>
    );
  }
  return (
    <>
      {summary}
      <div className="lf-grid-wrap">
        <table className="lf-grid" aria-label="Which equation involves which unknown; ringed = the variable the equation determines">
          <thead>
            <tr>
              <th scope="col">Equation</th>
              {matching.variables.map((v) => <th key={v} scope="col" className="lf-grid-col"><span>{v}</span></th>)}
            </tr>
          </thead>
          <tbody>
            {matching.equations.map((e) => {
              const inv = new Set(e.variables);
              return (
                <tr key={e.id} className={e.determines ? undefined : 'is-bad'}>
                  <th scope="row"><button type="button" className="lf-linkish lf-mono" onClick={() => pick(e.id)}>{e.id}</button></th>
                  {matching.variables.map((v) => (
                    <td key={v} className={e.determines === v ? 'is-match' : undefined}>
                      {e.determines === v ? <span aria-label={`determines ${v}`}>◉</span> : inv.has(v) ? <span aria-label={`involves ${v}`}>•</span> : ''}
                    </td>
                  ))}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </>
  );
}
