/**
 * The interval advice when link strengths are only roughly known: the links
 * whose strength carries a range (`strengthRange`) draw their strength in it,
 * seeded, and the pictures worker gives how often the advised interval of the
 * model as written still holds, the spread of each draw's own advice and of
 * each link's peak, and which range decides most. The same numbers as
 * `loopfold advise MODEL.json --links … --uncertain --draws K --seed S --json`.
 */
import { useEffect, useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { fixedText, labelOf, significant } from '../../present/index';
import { appPicturesClient } from '../../worker/picturesClient';
import type { StrengthAdviceAnswer } from '../../worker/picturesApi';
import './pictures.css';

type Pair = { from: VariableId; to: VariableId };

const pct = (x: number) => `${Math.round(100 * x)} %`;

/** Shown under the advisor's answer when at least one link carries a strength range. */
export function RangedAdvice({ model, links, fraction }: { model: Model; links: Pair[]; fraction: number }) {
  const ranged = model.links.filter((l) => l.strengthRange);
  const [draws, setDraws] = useState(200);
  const [seed, setSeed] = useState(1);
  const [answer, setAnswer] = useState<(StrengthAdviceAnswer & { key: string }) | null>(null);
  const key = JSON.stringify([links, fraction, draws, seed]);
  useEffect(() => {
    if (ranged.length === 0 || links.length === 0) return;
    let live = true;
    void appPicturesClient()
      .then((c) => c.strengthAdvice(model, links, { draws, seed, fraction }))
      .then((a) => { if (live && a) setAnswer({ ...a, key }); });
    return () => { live = false; };
  }, [model, key]); // eslint-disable-line react-hooks/exhaustive-deps
  if (ranged.length === 0 || links.length === 0) return null;
  const u = model.timeUnit;
  const dur = (x: number) => formatDuration(x, u);
  const a = answer && answer.key === key ? answer : null;
  return (
    <section className="lf-pic-ranged" aria-label="Advice under the strength ranges" data-section="ranged-advice">
      <h4>Under the strength ranges</h4>
      <p className="lf-pic-note">
        {ranged.length} link{ranged.length === 1 ? '' : 's'} carr{ranged.length === 1 ? 'ies' : 'y'} a strength range (set in the link’s inspector). Each draw takes every ranged strength uniformly in its range and asks for the advice again.
      </p>
      <div className="lf-pic-controls">
        <label>Draws <input type="number" min={1} max={100000} step={50} value={draws} onChange={(e) => { const n = Number(e.target.value); if (Number.isInteger(n) && n >= 1 && n <= 100000) setDraws(n); }} /></label>
        <label>Seed <input type="number" min={0} step={1} value={seed} onChange={(e) => { const n = Number(e.target.value); if (Number.isInteger(n) && n >= 0) setSeed(n); }} /></label>
      </div>
      {!a && <p className="lf-pic-note">Drawing the strengths…</p>}
      {a && !a.ok && <p className="lf-pic-error" role="alert">{a.reason}</p>}
      {a?.ok && (
        <div data-ranged="ready" data-draws={a.draws} data-seed={a.seed} data-holds={a.holds} data-no-advice={a.noAdvice} data-best={a.best ? [a.best.q10, a.best.median, a.best.q90].join(' ') : ''}>
          <ul className="lf-pic-summary" aria-label="Readings under the strength ranges">{a.readings.map((r) => <li key={r}>{r}</li>)}</ul>
          <table className="lf-pic-table" aria-label="Advice over the draws of the strengths">
            <tbody>
              <tr><th scope="row">Advised interval, strengths as written</th><td>{a.point.best === null ? 'none' : dur(a.point.best)}</td></tr>
              <tr><th scope="row">It keeps every chosen link at {Math.round(a.fraction * 100)} % of its peak in</th><td>{pct(a.holds)} of {a.draws} draws</td></tr>
              <tr><th scope="row">Each draw’s own advice (10 % · median · 90 %)</th><td>{a.best ? `${dur(a.best.q10)} · ${dur(a.best.median)} · ${dur(a.best.q90)}` : 'none'}</td></tr>
              {a.noAdvice > 0 && <tr><th scope="row">No single interval to advise</th><td>{pct(a.noAdvice)} of draws</td></tr>}
            </tbody>
          </table>
          <table className="lf-pic-table" aria-label="Each chosen link over the draws">
            <thead><tr><th scope="col">Link</th><th scope="col">Strongest at (10 % · median · 90 %)</th><th scope="col">Advised interval within its strong range</th></tr></thead>
            <tbody>
              {a.links.map((l) => (
                <tr key={`${l.from}>${l.to}`} data-link={`${l.from}>${l.to}`} data-in-range={l.inRange}>
                  <th scope="row">{labelOf(model, l.from)} → {labelOf(model, l.to)}</th>
                  <td>{l.peak ? `${dur(l.peak.q10)} · ${dur(l.peak.median)} · ${dur(l.peak.q90)}` : 'no peak'}</td>
                  <td>{pct(l.inRange)} of draws</td>
                </tr>
              ))}
            </tbody>
          </table>
          <table className="lf-pic-table" aria-label="The ranged strengths">
            <thead><tr><th scope="col">Ranged strength</th><th scope="col">Range</th><th scope="col">As written</th><th scope="col">Rank correlation with the advised interval</th></tr></thead>
            <tbody>
              {a.ranged.map((r) => (
                <tr key={`${r.from}>${r.to}`} data-ranged-link={`${r.from}>${r.to}`} data-decides={r.decides}>
                  <th scope="row">{labelOf(model, r.from)} → {labelOf(model, r.to)}</th>
                  <td>{r.low}..{r.high}</td>
                  <td>{significant(r.point, 3)}</td>
                  <td>{fixedText(r.decides, 2, { ascii: true })}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="lf-pic-note">Model-based: how sure the advice is if the mechanism and the ranges are right; command line: loopfold advise MODEL.json --links {links.map((l) => `${l.from}>${l.to}`).join(',')} --uncertain --draws {a.draws} --seed {a.seed}{a.fraction !== 0.5 ? ` --fraction ${a.fraction}` : ''}</p>
        </div>
      )}
    </section>
  );
}
