import { useModel } from '../../state/document';
import { useAnalysisState } from '../../state/analysis';
import { selectionStore } from '../../state/selection';
import { useProblems } from './useProblems';

/** Everything to look at, errors first; a click selects what an item names. */
export function DiagnosticsList() {
  const problems = useProblems();
  const model = useModel();
  const status = useAnalysisState((s) => s.status);
  const message = useAnalysisState((s) => s.message);
  const nodeIds = new Set([...model.variables.map((v) => v.id), ...(model.relations ?? []).map((r) => r.id)]);
  const sorted = [...problems].sort((a, b) => (a.level === b.level ? 0 : a.level === 'error' ? -1 : 1));
  return (
    <section className="lf-diagnostics" aria-labelledby="lf-diag-title">
      <div className="lf-section-head">
        <h2 id="lf-diag-title">Checks</h2>
        <span className="lf-hint" aria-live="polite">
          {status === 'running' ? 'checking…' : problems.length === 0 ? (status === 'failed' && message ? message : 'no problems found') : `${problems.length} item${problems.length > 1 ? 's' : ''}`}
        </span>
      </div>
      {sorted.length > 0 && (
        <ul>
          {sorted.map((p) => {
            const targets = p.targets.filter((t) => nodeIds.has(t));
            return (
              <li key={p.key} className={`lf-diag is-${p.level}`}>
                <span className="lf-diag-level">{p.level === 'error' ? 'Problem' : 'Warning'}</span>
                {targets.length > 0 ? (
                  <button type="button" className="lf-diag-text" onClick={() => selectionStore.getState().select({ nodes: targets })} title="Select what this names">
                    {p.message}
                  </button>
                ) : (
                  <span className="lf-diag-text">{p.message}</span>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
