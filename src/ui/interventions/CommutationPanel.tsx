/**
 * The commutation panel: at the current sampling interval, does holding the
 * chosen variables and letting the fast states settle give the same
 * structure in either order? Shows the verdict with a glyph and words (not
 * colour alone), the reasons, ambiguity and drift, and the differing links.
 */
import { useMemo } from 'react';
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { StudyDesign } from '../../core/ordering/types';
import { commutationAt, hasFormulas, type Commutation } from '../../core/interventions/index';
import { solveEquilibrium } from '../../core/numeric/equilibrium';
import { useAnalysisState } from '../../state/analysis';
import { useValidatedModel } from '../../state/document';
import './interventions.css';
import { formatNumber, labelOf, labeller } from '../../present/index';

/** An equation id in the modeller's words: rate(x) → "the rate equation of X", a relation → its text. */
export function equationWords(model: Model, id: string): string {
  const label = (v: string) => labelOf(model, v);
  const m = /^(rate|formula|hold)\((.+)\)$/.exec(id);
  if (m) return m[1] === 'rate' ? `the rate equation of ${label(m[2])}` : m[1] === 'formula' ? `the formula of ${label(m[2])}` : `the hold on ${label(m[2])}`;
  const r = (model.relations ?? []).find((x) => x.id === id);
  return r ? `the relation ${r.equation}` : id;
}

function orWords(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}

/** Words of the core's sentences never read as variable names. */
const PLAIN_WORDS = new Set('a an and any are as at be by each either equation for from give held holding if in is it its keeps let loop model no none not of on or order own replaced running settle settles system that the their them then this through to with'.split(' '));

/** A core sentence with equation ids and variable ids put in words and labels. */
export function inWords(model: Model, text: string): string {
  const name = labeller(model);
  const rel = new Set((model.relations ?? []).map((r) => r.id));
  return text
    .replace(/d\(([A-Za-z_]\w*)\)\/dt/g, (_, v: string) => `the change of ${name(v)}`)
    .replace(/\b(rate|formula|hold)\(([A-Za-z_]\w*)\)/g, (e: string) => equationWords(model, e))
    .replace(/\b[A-Za-z_]\w*\b/g, (w) => (PLAIN_WORDS.has(w.toLowerCase()) ? w : rel.has(w) ? equationWords(model, w) : name(w)));
}

export function CommutationPanel() {
  const model = useValidatedModel();
  const design = useAnalysisState((s) => s.design);
  if (!model) return <section className="lf-commute" aria-label="Hold and settle"><p>Fix the model's problems first.</p></section>;
  return <CommutationPanelFor model={model} design={design} />;
}

type Shift = { variable: string; before: number; after: number };
type Outcome = { ok: true; result: Commutation; shifts: Shift[] | null; noEquilibrium?: string } | { ok: false; message: string };

/** Equilibrium without and with the holds (the running system held), when the model has formulas. */
function equilibriumShifts(model: Model, hold: Record<string, number>): { shifts: Shift[] | null; noEquilibrium?: string } {
  if (!hasFormulas(model)) return { shifts: null };
  const before = solveEquilibrium(model);
  const after = solveEquilibrium(model, { hold });
  if (!before.ok) return { shifts: null };
  if (!after.ok) return { shifts: null, noEquilibrium: after.diagnostics.find((d) => d.level === 'error')?.message ?? 'no equilibrium with the hold' };
  return { shifts: model.variables.map((v) => ({ variable: v.id, before: before.values[v.id], after: after.values[v.id] })).filter((r) => Math.abs(r.after - r.before) > 1e-9 * (1 + Math.abs(r.before))) };
}

const r4 = (x: number) => formatNumber(x, { digits: 4 });

export function CommutationPanelFor({ model, design }: { model: Model; design: StudyDesign }) {
  const holds = design.hold ?? {};
  const held = Object.keys(holds);
  const outcome = useMemo<Outcome | null>(() => {
    if (held.length === 0 || design.interval === undefined) return null;
    try {
      return { ok: true, result: commutationAt(model, design), ...equilibriumShifts(model, design.hold ?? {}) };
    } catch (e) {
      return { ok: false, message: (e as Error).message };
    }
  }, [model, design]); // eslint-disable-line react-hooks/exhaustive-deps
  const label = labeller(model);
  if (held.length === 0) return <section className="lf-commute" aria-label="Hold and settle"><p>Hold a variable to compare holding it before and after the fast states settle.</p></section>;
  if (design.interval === undefined || !outcome) return <section className="lf-commute" aria-label="Hold and settle"><p>Choose a sampling interval to compare the two orders.</p></section>;
  if (!outcome.ok) return <section className="lf-commute" aria-label="Hold and settle"><p role="alert">{outcome.message}</p></section>;
  const c = outcome.result;
  return (
    <section className="lf-commute" aria-label="Hold and settle">
      <h3>Hold then settle, or settle then hold?</h3>
      <p className="lf-commute-where">Holding {held.map((h) => `${label(h)} = ${holds[h]}`).join(', ')}, sampled every {formatDuration(design.interval, model.timeUnit)}.</p>
      <p className={c.agree ? 'lf-commute-verdict lf-agree' : 'lf-commute-verdict lf-differ'} data-agree={c.agree}>
        <span aria-hidden="true">{c.agree ? '=' : '≠'}</span> {c.agree ? 'The two orders agree.' : 'The two orders differ.'}
      </p>
      <ul className="lf-commute-why">{c.explanation.map((l, i) => <li key={i}>{inWords(model, l)}</li>)}</ul>
      {c.ambiguous.length > 0 && (
        <div className="lf-commute-ambiguous">
          <h4>Ambiguous in the equilibrium model</h4>
          <ul>
            {c.ambiguous.map((a) => (
              <li key={a.variable}>
                {label(a.variable)} is determined together with other variables, so a hold on it could take the place of {orWords(a.candidates.map((e) => equationWords(model, e)))}. The equilibrium model alone cannot say which; the figures show {equationWords(model, a.chosen)} replaced.
              </li>
            ))}
          </ul>
        </div>
      )}
      {c.drift && <p className="lf-commute-drift" role="note"><span aria-hidden="true">↗</span> {c.drift.message}</p>}
      {outcome.shifts && (
        <div className="lf-commute-numbers">
          <h4>With the formulas: the equilibrium held</h4>
          {outcome.shifts.length === 0 ? <p>The equilibrium values do not change.</p> : (
            <ul>{outcome.shifts.map((r) => <li key={r.variable}>{label(r.variable)}: {r4(r.before)} → {r4(r.after)}</li>)}</ul>
          )}
        </div>
      )}
      {outcome.noEquilibrium && <p className="lf-commute-drift" role="note">With the formulas, held: {outcome.noEquilibrium}</p>}
      {c.differences.some((d) => d.kind === 'edge') && (
        <table className="lf-commute-diff">
          <caption>Links that differ</caption>
          <thead><tr><th>link</th><th>only in</th><th>why</th></tr></thead>
          <tbody>
            {c.differences.filter((d) => d.kind === 'edge').map((d, i) => (
              <tr key={i}>
                <td>{label(d.edge!.from)} {d.edge!.kind === 'integrating' ? '⇒' : '→'} {label(d.edge!.to)}</td>
                <td>{d.only === 'holdThenSettle' ? 'hold then settle (the running system)' : 'settle then hold (the equilibrium model)'}</td>
                <td>{d.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
