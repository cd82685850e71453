/**
 * The causal ordering at the data's interval: the sketch's whole ordering
 * (every variable's role, its order, what acts on it within the instant or
 * across time) beside the ordering of the model the fitted drift gives
 * (`fittedOrdering`: its links are the drift entries whose 95 % interval
 * excludes zero, its timescales 1/|A_ii|), both from the ordering core at the
 * data's median interval and a person's median span.
 */
import { useMemo } from 'react';
import type { Model } from '../../core/model/types';
import type { CtFit } from '../../core/fit/ct';
import { fittedOrdering, orderingRows, sketchOrderingRows, type FittedLink, type OrderingPlace } from '../../core/fit/fittedOrdering';
import { labelOf, numText, significant } from '../../present/index';

const n3 = (x: number) => (Number.isFinite(x) ? numText(significant(x, 3)) : '—');

const ROLE_WORDS: Record<string, string> = {
  settled: 'settles within an interval (a balance)',
  state: 'changes from occasion to occasion',
  frozen: 'constant over the study',
  held: 'held',
  input: 'an input, set from outside',
  derived: 'follows within the instant (a formula)',
};

function Place({ model, place, links, to }: { model: Model; place: OrderingPlace; links?: FittedLink[]; to: string }) {
  const est = (from: string) => links?.find((l) => l.from === from && l.to === to)?.estimate;
  const over = place.from.filter((f) => f.kind === 'integrating');
  const within = place.from.filter((f) => f.kind === 'instantaneous');
  const name = (id: string) => { const e = est(id); return e === undefined ? labelOf(model, id) : `${labelOf(model, id)} (${n3(e)})`; };
  return (
    <>
      <span data-role={place.role}>{ROLE_WORDS[place.role] ?? place.role}</span>
      {place.level > 0 && <>; order {place.level}</>}
      {place.together.length > 0 && <>; determined together with {place.together.map((v) => labelOf(model, v)).join(', ')}</>}
      {within.length > 0 && <><br />within the instant from {within.map((f) => name(f.id)).join(', ')}</>}
      {over.length > 0 && <><br />over time from {over.map((f) => name(f.id)).join(', ')}</>}
      {place.from.length === 0 && place.role !== 'input' && <><br />nothing else acts on it</>}
    </>
  );
}

export function OrderingBeside({ model, fit, interval, span, unit }: { model: Model; fit: CtFit | null; interval: number; span: number; unit: string }) {
  const answer = useMemo(() => {
    const design = { interval, window: span };
    try {
      if (!fit) return { rows: sketchOrderingRows(model, design), links: [] as FittedLink[], error: null };
      const o = fittedOrdering(model, fit, design);
      return { rows: orderingRows(model, o), links: o.links, error: null };
    } catch (e) {
      return { rows: [], links: [] as FittedLink[], error: (e as Error).message };
    }
  }, [model, fit, interval, span]);
  if (answer.error) return <p className="lf-data-note">The ordering at the data's interval could not be found: {answer.error}</p>;
  const differ = answer.rows.filter((r) => r.fitted && (r.roleDiffers || r.onlySketch.length || r.onlyFitted.length));
  return (
    <section data-testid="data-ordering">
      <h4>Causal ordering at the data's interval ({n3(interval)} {unit}; a person's data span about {n3(span)} {unit})</h4>
      <p className="lf-data-note">
        {fit
          ? 'Beside the sketch, the model the open continuous-time fit gives: a link where the 95 % interval of its drift entry excludes zero (the estimate in brackets), a state self-regulating when its own entry is below zero, with timescale 1/|A_ii|. Both are ordered by the same rule at the same interval and span.'
          : 'The sketch\'s ordering at the data\'s interval; fit the continuous-time model to see the ordering the data give beside it.'}
      </p>
      <table className="lf-data-table" aria-label="Causal ordering at the data's interval, sketch and fit" data-testid="data-roles">
        <thead><tr><th scope="col">variable</th><th scope="col">in the sketch</th><th scope="col">in the fitted model</th></tr></thead>
        <tbody>
          {answer.rows.map((r) => (
            <tr key={r.variable} data-state={r.variable} data-differs={r.fitted && (r.roleDiffers || r.onlySketch.length || r.onlyFitted.length) ? 'yes' : 'no'}>
              <th scope="row">{labelOf(model, r.variable)}</th>
              <td data-side="sketch">{r.sketch ? <Place model={model} place={r.sketch} to={r.variable} /> : 'not in the sketch'}</td>
              <td data-side="fitted">{r.fitted ? <Place model={model} place={r.fitted} links={answer.links} to={r.variable} /> : fit ? 'not in the data' : 'not fitted yet'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {fit && (
        <ul className="lf-data-note" data-testid="ordering-differences">
          {differ.length === 0 && <li>The fitted model orders the measured states as the sketch does.</li>}
          {differ.map((r) => (
            <li key={r.variable} data-state={r.variable}>
              {labelOf(model, r.variable)}:
              {r.roleDiffers && r.sketch && r.fitted && ` ${ROLE_WORDS[r.sketch.role] ?? r.sketch.role} in the sketch, ${ROLE_WORDS[r.fitted.role] ?? r.fitted.role} in the fit.`}
              {r.onlySketch.length > 0 && ` The sketch has ${r.onlySketch.map((v) => labelOf(model, v)).join(', ')} acting on it; the data do not show it.`}
              {r.onlyFitted.length > 0 && ` The data show ${r.onlyFitted.map((v) => labelOf(model, v)).join(', ')} acting on it; the sketch does not.`}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
