/**
 * One person at a time (N = 1): a picker of the persons with enough lag
 * pairs and that person's own VAR(1) with a constant (the core's per-person
 * fit, `fitVar(…, { perPerson: true })`), link by link beside the pooled
 * within-person estimate.
 */
import { useId, useState } from 'react';
import type { Model } from '../../core/model/types';
import type { VarFit } from '../../core/fit/var';
import { labelOf, numText, significant } from '../../present/index';

const n3 = (x: number) => (Number.isFinite(x) ? numText(significant(x, 3)) : '—');
/** Two-sided 95 % normal quantile (common practice for the interval shown). */
const Z95 = 1.959963984540054;

export function PersonVar({ model, fit, minPairs }: { model: Model; fit: VarFit; minPairs: number }) {
  const id = useId();
  const fits = fit.perPerson;
  const [chosen, setChosen] = useState('');
  const one = fits.find((p) => p.person === chosen) ?? fits[0];
  const vars = fit.variables;
  const name = (v: string) => labelOf(model, v);
  return (
    <section aria-labelledby={`${id}-h`} data-testid="person-var">
      <h4 id={`${id}-h`}>One person at a time (N = 1)</h4>
      <p className="lf-data-note">
        {fits.length} of {fit.n.persons} persons have at least {minPairs} pairs of occasions (and more pairs than coefficients); each gets a VAR(1) of their own, with a constant, from their pairs alone. Few pairs give wide intervals: read a person's fit beside the pooled one.
      </p>
      {fits.length === 0 ? (
        <p className="lf-data-note">No person has enough pairs for a fit of their own.</p>
      ) : one && (
        <>
          <label>
            Person{' '}
            <select aria-label="Person for an N = 1 fit" value={one.person} onChange={(e) => setChosen(e.target.value)}>
              {fits.map((p) => <option key={p.person} value={p.person}>{p.person} ({p.pairs} pairs)</option>)}
            </select>
          </label>
          <table className="lf-data-table" aria-label={`VAR of person ${one.person}`} data-testid="person-var-table" data-person={one.person}>
            <thead><tr><th scope="col">link</th><th scope="col">{one.person} [95 % interval]</th><th scope="col">SE</th><th scope="col">all persons, pooled</th></tr></thead>
            <tbody>
              {vars.flatMap((to, i) => vars.map((from, j) => {
                const phi = one.phi[i][j], se = one.se[i][j];
                return (
                  <tr key={`${from}>${to}`} data-link={`${from}>${to}`}>
                    <th scope="row">{from === to ? `${name(from)} on itself` : `${name(from)} → ${name(to)}`}</th>
                    <td className="lf-data-num" data-value={phi}>{n3(phi)} [{n3(phi - Z95 * se)}, {n3(phi + Z95 * se)}]</td>
                    <td className="lf-data-num" data-value={se}>{n3(se)}</td>
                    <td className="lf-data-num">{n3(fit.phi[i][j])}</td>
                  </tr>
                );
              }))}
            </tbody>
          </table>
          <p className="lf-data-note">
            {one.pairs} pairs. Constants: {vars.map((v, i) => `${name(v)} ${n3(one.intercept[i])}`).join(', ')}. Residual variances: {vars.map((v, i) => `${name(v)} ${n3(one.residualCov[i][i])}`).join(', ')}.
          </p>
        </>
      )}
    </section>
  );
}
