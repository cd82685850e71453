import { useState } from 'react';
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { SampledAnswer } from '../../worker/numericApi';
import { NetworkDiagram } from './NetworkDiagram';

/** The lagged and same-interval networks a study sampling every Δ would estimate (in expectation). */
export function SampledNetworks({ model, answer, onPick }: { model: Model; answer: SampledAnswer; onPick?: (from: string, to: string) => void }) {
  const [standardized, setStandardized] = useState(false);
  const u = model.timeUnit;
  const lagged = standardized && answer.phiStandardized ? answer.phiStandardized : answer.phi;
  return (
    <>
      <div className="lf-num-row" role="radiogroup" aria-label="Scale of the lagged effects">
        <label><input type="radio" checked={!standardized} onChange={() => setStandardized(false)} /> raw</label>
        <label><input type="radio" checked={standardized} disabled={!answer.phiStandardized} onChange={() => setStandardized(true)} /> standardized (per standard deviation)</label>
      </div>
      <h4>Lagged effects: from one sample to the next ({formatDuration(answer.interval, u)} later)</h4>
      <NetworkDiagram model={model} states={answer.states} matrix={lagged} directed onPick={onPick} title={`Lagged network at ${formatDuration(answer.interval, u)}`} />
      <h4>Same-interval links: partial correlations of what changes within one interval</h4>
      {answer.innovationPartial ? (
        <NetworkDiagram model={model} states={answer.states} matrix={answer.innovationPartial} directed={false} title={`Same-interval network at ${formatDuration(answer.interval, u)}`} />
      ) : (
        <p className="lf-num-note">Not defined here: some states receive no noise.</p>
      )}
      <p className="lf-num-note">Solid lines: positive, dashed: negative; thicker lines are stronger. Links below 2% of the strongest are left out.{onPick ? ' Click a lagged link to see it against the interval below.' : ''}</p>
      {answer.aliasing.length > 0 && (
        <p className="lf-num-warn" role="alert" data-aliasing="true">
          Sampled effects of this oscillating mode alias and can change sign: it swings with period {formatDuration((2 * Math.PI) / answer.aliasing[0].im, u)}, and sampling slower than every {formatDuration(answer.aliasing[0].limit, u)} cannot follow it.
        </p>
      )}
      {answer.warnings.filter((w) => !w.includes('aliasing')).map((w, i) => <p key={i} className="lf-num-note">{w}</p>)}
    </>
  );
}
