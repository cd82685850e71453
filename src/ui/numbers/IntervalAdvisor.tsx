import { useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { AdviceAnswer } from '../../worker/numericApi';
import { numText } from '../../present/index';
import { labelOf } from '../../present/index';
import { isFailed, useNumeric } from './useNumeric';
import { UseInterval } from '../study/UseInterval';
import { RangedAdvice } from '../pictures/RangedAdvice';

type Pair = { from: VariableId; to: VariableId };
const key = (p: Pair) => `${p.from}>${p.to}`;

/** Pick the lagged links a study must see; get the interval range for each and one interval for all. */
export function IntervalAdvisor({ model, states, reach }: { model: Model; states: VariableId[]; reach?: boolean[][] }) {
  const [picked, setPicked] = useState<Pair[]>([]);
  const [percent, setPercent] = useState('50');
  const fraction = Number(percent) / 100;
  const okFraction = fraction > 0 && fraction < 1;
  const asked = useNumeric<AdviceAnswer>(picked.length > 0 && okFraction ? (c) => c.ask('advise', model, picked, fraction) : null, [model, picked, fraction]);
  const u = model.timeUnit;
  // Pairs with no chain of links between them have no lagged effect at any interval: they are not offered.
  const connected = (p: Pair) => !reach || reach[states.indexOf(p.to)]?.[states.indexOf(p.from)] !== false;
  const all: Pair[] = states.flatMap((f) => states.filter((t) => t !== f).map((t) => ({ from: f, to: t })));
  const pairs = all.filter(connected);
  const unreachable = all.length - pairs.length;
  const toggle = (p: Pair, on: boolean) => setPicked((xs) => (on ? [...xs, p] : xs.filter((x) => key(x) !== key(p))));
  const a = asked.status === 'done' ? asked.answer : null;
  return (
    <div className="lf-num-advisor">
      <fieldset className="lf-num-choose">
        <legend>Links the study must see</legend>
        {pairs.map((p) => (
          <label key={key(p)}>
            <input type="checkbox" data-link={key(p)} checked={picked.some((x) => key(x) === key(p))} onChange={(e) => toggle(p, e.target.checked)} /> {labelOf(model, p.from)} → {labelOf(model, p.to)}
          </label>
        ))}
      </fieldset>
      {unreachable > 0 && <p className="lf-num-note">{unreachable} pair{unreachable === 1 ? '' : 's'} of states with no chain of links between them {unreachable === 1 ? 'is' : 'are'} not listed: no interval shows an effect there.</p>}
      <label className="lf-num-row">
        Strong enough at{' '}
        <input aria-label="Share of the peak" type="number" min={1} max={99} value={percent} onChange={(e) => setPercent(e.target.value)} style={{ width: '4em' }} />
        % of its peak
      </label>
      {!okFraction && <p className="lf-num-error">The share must be between 1 and 99%.</p>}
      {picked.length === 0 && <p className="lf-num-note">Tick one or more links to get advice.</p>}
      {a && isFailed(a) && <p className="lf-num-error">{a.reason}</p>}
      {a && !isFailed(a) && (
        <div className="lf-num-advice" role="status">
          <table className="lf-num-table">
            <thead><tr><th scope="col">Link</th><th scope="col">Strongest at</th><th scope="col">Effect there</th><th scope="col">Strong enough from … to</th>{a.advice.best !== null && <th scope="col">Effect at the advised interval</th>}</tr></thead>
            <tbody>
              {a.advice.links.map((l) => (
                <tr key={key(l)}>
                  <th scope="row">{labelOf(model, l.from)} → {labelOf(model, l.to)}</th>
                  <td>{l.noPath ? 'no path: left out' : l.peak ? formatDuration(l.peak.interval, u) : 'no peak'}</td>
                  <td title={`change in ${labelOf(model, l.to)} one interval later per unit of ${labelOf(model, l.from)}`}>{l.peak ? numText(l.peak.effect) : '—'}</td>
                  <td>{l.range ? `${formatDuration(l.range[0], u)} – ${formatDuration(l.range[1], u)}` : '—'}</td>
                  {a.advice.best !== null && <td>{l.atBest !== undefined ? numText(l.atBest) : '—'}</td>}
                </tr>
              ))}
            </tbody>
          </table>
          <p>
            {a.advice.best !== null
              ? `Best single interval: every ${formatDuration(a.advice.best, u)}. There each chosen link is at least ${Math.round(a.advice.score * 100)}% as strong as at its own best interval; the table gives each effect's size there, per unit of its source.`
              : 'No single interval can be recommended for these links: at least one of them only grows or only fades over the range looked at.'}
          </p>
          {a.advice.best !== null && <p><UseInterval value={a.advice.best} unit={u} what="the advised interval" /></p>}
          <details><summary>In detail</summary><p>{a.advice.explanation}</p></details>
          <RangedAdvice model={model} links={picked} fraction={fraction} />
        </div>
      )}
    </div>
  );
}
