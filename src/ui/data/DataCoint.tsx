/**
 * Drifting series: for states the sketch does not let settle (not
 * self-regulating), or any columns on request, the unit-root test per
 * series, Engle–Granger and Johansen cointegration, the error-correction
 * loadings, and in words which series tracks which and the ordering a long
 * interval gives. Runs the core's tests on the data lane over the kept
 * file's columns in file order, exactly as `loopfold coint` does.
 */
import { useId, useMemo, useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import type { ColumnMapping } from '../../core/data/import';
import type { Dataset } from '../../state/dataset';
import { labelOf, numText, significant } from '../../present/index';
import { appDataClient } from '../../worker/dataClient';
import type { CointAnswer, CointReport } from '../../worker/dataApi';

const n4 = (x: number) => (Number.isFinite(x) ? numText(significant(x, 4)) : '—');
const pText = (p: number) => (!Number.isFinite(p) ? '—' : p < 0.001 ? '< 0.001' : n4(p));

function Num({ x, p }: { x: number; p?: boolean }) {
  return <td className="lf-data-num" data-value={x}>{p ? pText(x) : n4(x)}</td>;
}

function list(xs: string[]): string {
  return xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`;
}

/** One set of series' tests, with a plain reading beside each number. */
function ReportView({ r, who }: { r: CointReport; who: string }) {
  const eg = r.engleGranger;
  const j = r.johansen;
  const ec = r.errorCorrection;
  return (
    <div data-testid="coint-report" data-who={who}>
      <p className="lf-data-note">{r.nobs} occasions{who ? ` of ${who}` : ''}, in file order, read as equally spaced.</p>
      <table className="lf-data-table" aria-label={`Unit-root tests${who ? `, ${who}` : ''}`} data-testid="coint-adf">
        <thead><tr><th scope="col">series</th><th scope="col">ADF τ</th><th scope="col">p</th><th scope="col">5 % critical</th><th scope="col">lag</th><th scope="col">reading</th></tr></thead>
        <tbody>
          {r.adf.map((a) => (
            <tr key={a.series} data-series={a.series}>
              <th scope="row">{a.series}</th>
              <Num x={a.statistic} /><Num x={a.pValue} p /><Num x={a.critical?.['5%'] ?? NaN} />
              <td className="lf-data-num">{a.usedLag}</td>
              <td>{a.unitRoot ? 'drifts: a unit root is not rejected' : 'settles: no unit root at 5 %'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p data-testid="coint-eg" data-statistic={eg.statistic} data-p={eg.pValue}>
        Engle–Granger ({r.names[0]} on {r.names.slice(1).join(', ')}): τ {n4(eg.statistic)}, p {pText(eg.pValue)} (5 % critical {n4(eg.critical['5%'])}) — {eg.cointegrated ? 'the series keep a balance (cointegrated at 5 %).' : 'no balance shown at 5 % (the series may drift apart).'}
      </p>
      <table className="lf-data-table" aria-label={`Johansen tests${who ? `, ${who}` : ''}`} data-testid="coint-johansen">
        <thead><tr><th scope="col">balances at most</th><th scope="col">trace</th><th scope="col">5 % critical</th><th scope="col">max. eigenvalue</th><th scope="col">5 % critical</th></tr></thead>
        <tbody>
          {j.trace.map((t, i) => (
            <tr key={i} data-rank={i}>
              <th scope="row">{i}</th>
              <Num x={t} /><Num x={j.traceCritical[i][1]} /><Num x={j.maxEig[i]} /><Num x={j.maxEigCritical[i][1]} />
            </tr>
          ))}
        </tbody>
      </table>
      <p className="lf-data-note">Johansen ({j.lagDiff} lagged difference{j.lagDiff === 1 ? '' : 's'}): {j.rank.trace === 0 ? 'no balance among the series' : `${j.rank.trace} balance${j.rank.trace === 1 ? '' : 's'} among the series`} by the trace test, {j.rank.maxEig} by the maximum-eigenvalue test (5 %).</p>
      {ec && (
        <table className="lf-data-table" aria-label={`Error-correction loadings${who ? `, ${who}` : ''}`} data-testid="coint-loadings">
          <thead><tr><th scope="col">series</th><th scope="col">loading α</th><th scope="col">SE</th><th scope="col">p</th><th scope="col">reading</th></tr></thead>
          <tbody>
            {ec.loadings.map((l) => (
              <tr key={l.series} data-series={l.series}>
                <th scope="row">{l.series}</th>
                <Num x={l.alpha} /><Num x={l.se} /><Num x={l.pValue} p />
                <td>{l.corrects ? 'pulled back toward the balance: it tracks' : l.pull < 0 ? 'pulled back, but not distinguishably from zero' : 'not pulled back: it moves on its own'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {ec && ec.trackers.length > 0 && ec.leaders.length > 0 && (
        <p data-testid="coint-ordering"><strong>Ordering at a long interval:</strong> {list(ec.leaders)} → {list(ec.trackers)} (settled: its balance follows {list(ec.leaders)}).</p>
      )}
      <p data-testid="coint-sentence">{r.sentence}</p>
      {r.notes.map((n) => <p key={n} className="lf-data-warn">Note: {n}</p>)}
    </div>
  );
}

/** States the sketch does not let settle: marked not self-regulating. */
export function driftingStates(model: Model): Set<VariableId> {
  return new Set(model.variables.filter((v) => v.kind === 'state' && v.selfRegulating === false).map((v) => v.id));
}

/** The columns tested first: those mapped to states that do not self-regulate, when there are two to six of them (else none: on request). */
export function defaultCointColumns(model: Model, mapping: ColumnMapping, columns: string[]): string[] {
  const drifting = driftingStates(model);
  const picked = columns.filter((c) => { const v = mapping.variables.find((x) => x.column === c)?.variable; return v !== undefined && drifting.has(v); });
  return picked.length >= 2 ? picked.slice(0, 6) : [];
}

export function DataCoint({ model, dataset, fields }: { model: Model; dataset: Dataset; fields: string[] }) {
  const id = useId();
  const m = dataset.mapping;
  const roles = [m.person, m.time, m.day, m.prompt].filter((x): x is string => !!x);
  const columns = fields.filter((f) => f !== '' && !roles.includes(f));
  const variableOf = (col: string) => m.variables.find((v) => v.column === col)?.variable;
  const drifting = useMemo(() => driftingStates(model), [model]);
  const [chosen, setChosen] = useState<string[]>(() => defaultCointColumns(model, m, columns));
  const [perPerson, setPerPerson] = useState(true);
  const [trend, setTrend] = useState<'c' | 'ct'>('c');
  const [lagsText, setLagsText] = useState('1');
  const [answer, setAnswer] = useState<CointAnswer | null>(null);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const [shown, setShown] = useState('');

  const toggle = (col: string, on: boolean) => setChosen((c) => (on ? [...c.filter((x) => x !== col), col] : c.filter((x) => x !== col)));
  const run = async () => {
    const lags = Number(lagsText);
    if (chosen.length < 2 || chosen.length > 6) { setProblem(`Series to test: choose 2 to 6 columns (now ${chosen.length}).`); return; }
    if (lagsText.trim() === '' || !Number.isInteger(lags) || lags < 0 || lags > 24) { setProblem(`Lagged differences: a whole number from 0 to 24, not “${lagsText}”.`); return; }
    setProblem(null);
    setBusy(true);
    const c = await appDataClient();
    const a = await c.coint(dataset.text, { columns: chosen, ...(perPerson && m.person ? { person: m.person } : {}), missing: m.missing, trend, lags }, dataset.delimiter);
    setBusy(false);
    if (a) { setAnswer(a); setShown(''); }
  };

  const ok = answer?.ok ? answer : null;
  const person = ok?.perPerson?.find((p) => p.id === shown) ?? ok?.perPerson?.[0];
  return (
    <section className="lf-data-section" aria-labelledby={`${id}-h`} data-testid="data-coint">
      <h3 id={`${id}-h`}>Drifting series: unit roots and cointegration</h3>
      <p className="lf-data-note">
        {drifting.size > 0
          ? `In the sketch, ${list([...drifting].map((v) => labelOf(model, v)))} ${drifting.size === 1 ? 'does' : 'do'} not self-regulate: such a state can drift without a level to return to, and the fits above presume it returns. These tests ask whether each series drifts and whether drifting series keep a balance, and which one tracks which.`
          : 'Every state of the sketch self-regulates. On request, test whether series of the file drift and keep a balance with each other, and which one tracks which.'}
        {' '}The rows are read in file order as equally spaced occasions, as the command <code>loopfold coint</code> reads them.
      </p>
      <fieldset className="lf-data-fieldset">
        <legend>Series to test (the first chosen is regressed on the others)</legend>
        <div className="lf-data-row">
          {columns.map((c) => {
            const v = variableOf(c);
            return (
              <label key={c}>
                <input type="checkbox" checked={chosen.includes(c)} onChange={(e) => toggle(c, e.target.checked)} /> {c}{v ? ` (${labelOf(model, v)}${drifting.has(v) ? ', does not self-regulate' : ''})` : ''}
              </label>
            );
          })}
        </div>
        {chosen.length > 0 && <p className="lf-data-note" data-testid="coint-order">Order: {chosen.join(', ')}.</p>}
      </fieldset>
      <div className="lf-data-row">
        {m.person && <label><input type="checkbox" checked={perPerson} onChange={(e) => setPerPerson(e.target.checked)} /> Each {m.person} separately</label>}
        <label>
          Deterministic terms{' '}
          <select value={trend} onChange={(e) => setTrend(e.target.value as 'c' | 'ct')}>
            <option value="c">a constant</option>
            <option value="ct">a constant and a trend</option>
          </select>
        </label>
        <label>Lagged differences <input type="text" inputMode="numeric" size={3} value={lagsText} onChange={(e) => setLagsText(e.target.value)} /></label>
        <button type="button" className="lf-primary" disabled={busy} onClick={() => void run()}>Test the series</button>
      </div>
      {busy && <p className="lf-data-note" role="status">Testing…</p>}
      {problem && <p className="lf-data-error" role="alert">{problem}</p>}
      {answer && !answer.ok && <p className="lf-data-error" role="alert">{dataset.fileName}: {answer.reason}</p>}
      {ok?.all && <ReportView r={ok.all} who="" />}
      {ok?.pooled && ok.perPerson && (
        <div data-testid="coint-pooled">
          <p>
            Tested {ok.pooled.tested} of {ok.pooled.persons} ({ok.person}).{' '}
            A unit root is rejected at 5 % {ok.pooled.adf.map((a) => `for ${a.series} in ${a.rejected} of ${ok.pooled!.tested}`).join(', ')}.{' '}
            A balance (Engle–Granger, 5 %) in {ok.pooled.engleGranger.rejected} of {ok.pooled.tested} (combined p {pText(ok.pooled.engleGranger.fisherP)}).
            {ok.pooled.trackers.filter((t) => t.persons > 0).map((t) => ` ${t.series} tracks the others in ${t.persons} of ${ok.pooled!.tested}.`).join('')}
          </p>
          {ok.pooled.skipped.map((s) => <p key={s.id} className="lf-data-warn">Not tested: {s.id}: {s.reason}</p>)}
          <table className="lf-data-table" aria-label="Cointegration per person" data-testid="coint-persons">
            <thead><tr><th scope="col">{ok.person}</th><th scope="col">Engle–Granger τ</th><th scope="col">p</th><th scope="col">who tracks whom</th></tr></thead>
            <tbody>
              {ok.perPerson.map((p) => {
                const ec = p.report.errorCorrection;
                return (
                  <tr key={p.id} data-person={p.id}>
                    <th scope="row">{p.id}</th>
                    <Num x={p.report.engleGranger.statistic} /><Num x={p.report.engleGranger.pValue} p />
                    <td>{!ec ? 'no balance shown' : ec.trackers.length && ec.leaders.length ? `${list(ec.trackers)} tracks ${list(ec.leaders)}` : ec.trackers.length ? 'each pulled back' : 'not told apart'}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <label>
            Show the tests of{' '}
            <select value={person?.id ?? ''} onChange={(e) => setShown(e.target.value)}>
              {ok.perPerson.map((p) => <option key={p.id} value={p.id}>{p.id}</option>)}
            </select>
          </label>
          {person && <ReportView r={person.report} who={person.id} />}
        </div>
      )}
      {ok && <p className="lf-data-note">Model-based tests, not findings: a balance in the data says the series move together over the study, not why.</p>}
    </section>
  );
}
