import { useModel } from '../../state/document';
import { useAnalysisState } from '../../state/analysis';
import { selectionStore } from '../../state/selection';
import { nodeOfEquation } from '../diagnostics/collect';
import { MatchingGrid } from './MatchingGrid';
import { labeller } from '../../present/index';

/** Why a block needs no equation at this instant, in the modeller's words. */
function givenWords(roles: readonly (string | undefined)[]): string {
  const words = new Set(roles.map((r) => (r === 'state' ? 'given by its past: it carries over from the instant before' : r === 'frozen' ? 'held constant over the study' : r === 'held' ? 'held by an intervention' : 'set from outside')));
  return [...words].join('; ');
}

/** The equation–variable structure: which equations determine which variables, block by block, in causal order. */
export function EquationsView() {
  const model = useModel();
  const ordering = useAnalysisState((s) => s.analysis?.ordering);
  const matching = useAnalysisState((s) => s.analysis?.matching);
  const status = useAnalysisState((s) => s.status);
  const message = useAnalysisState((s) => s.message);
  const label = labeller(model);
  if (!ordering) return <section className="lf-equations" aria-label="Equations"><p className="lf-hint">{status === 'running' ? 'Working…' : message ?? 'No analysis yet.'}</p></section>;
  const blocks = [...ordering.blocks].sort((a, b) => a.level - b.level);
  return (
    <section className="lf-equations" aria-labelledby="lf-eq-title">
      <h2 id="lf-eq-title">Equations and unknowns</h2>
      {matching && <MatchingGrid matching={matching} />}
      <h2>Blocks in causal order</h2>
      <p className="lf-hint">Each row is a block of the causal ordering: its equations are matched to the variables they determine. Level 0 blocks depend on nothing else.</p>
      <table>
        <thead>
          <tr><th scope="col">Level</th><th scope="col">Equations</th><th scope="col">Determine</th><th scope="col">Status</th></tr>
        </thead>
        <tbody>
          {blocks.map((b, i) => (
            <tr key={i} className={b.determination !== 'well' ? 'is-bad' : undefined}>
              <td>{b.level}</td>
              <td>
                {b.equations.length === 0 ? <span className="lf-hint">({givenWords(b.variables.map((v) => ordering.roles[v]))})</span> : b.equations.map((e) => (
                  <button key={e} type="button" className="lf-linkish lf-mono" onClick={() => selectionStore.getState().select({ nodes: [nodeOfEquation(e)] })}>{e}</button>
                ))}
              </td>
              <td>{b.variables.map((v) => <button key={v} type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ nodes: [v] })}>{label(v)}</button>)}</td>
              <td>{b.determination === 'well' ? (b.variables.length > 1 ? 'together' : 'ok') : b.determination === 'over' ? 'over-determined' : 'under-determined'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
