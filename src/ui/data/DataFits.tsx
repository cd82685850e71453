/**
 * Fits held against the sketch: the VAR at the data's interval (quick) and
 * the continuous-time model (slow; progress and Cancel), the comparison link
 * by link with a verdict in words, the likelihood-ratio test, the comparison
 * as CSV, and the lagged effect against the interval from fit and sketch.
 */
import { useId, useMemo, useRef, useState } from 'react';
import type { Model } from '../../core/model/types';
import type { Panel } from '../../core/data/panel';
import type { LinkComparison } from '../../core/fit/compare';
import { sketchDrift } from '../../core/fit/compare';
import { dataInterval, dataIntervals, lagCurves } from '../../core/fit/lagCurve';
import { medianSpan } from '../../core/fit/roles';
import { eigenvalues, fromRows } from '../../core/numeric/dense';
import { lagCurveChart } from '../../export/dataCharts';
import { svgDocument } from '../../export/svg';
import { labelOf, numText, significant, timeUnitWord } from '../../present/index';
import { comparisonCsv } from '../../present/comparisonCsv';
import { appDataClient, type FitAnswer } from '../../worker/dataClient';
import type { CtAnswer, VarAnswer } from '../../worker/dataApi';
import type { CancellableRun } from '../../worker/lane';
import { elToReact } from '../elReact';
import { fileStem } from '../figureFiles';
import { downloadBlob } from '../download';
import { ExportButtons } from '../numbers/ExportButtons';
import { PersonVar } from './PersonVar';
import { OrderingBeside } from './OrderingBeside';

const n3 = (x: number) => (Number.isFinite(x) ? numText(significant(x, 3)) : '—');

function ComparisonTable({ model, rows, what, sketchHead }: { model: Model; rows: LinkComparison[]; what: string; sketchHead: string }) {
  return (
    <table className="lf-data-table" aria-label={`Sketch against data, ${what}`} data-testid="comparison">
      <thead><tr><th scope="col">link</th><th scope="col">{sketchHead}</th><th scope="col">fitted [95 % interval]</th><th scope="col">verdict</th></tr></thead>
      <tbody>
        {rows.map((r) => (
          <tr key={`${r.from}>${r.to}`} data-link={`${r.from}>${r.to}`} data-verdict={r.verdict}>
            <th scope="row">{r.from === r.to ? `${labelOf(model, r.from)} on itself` : `${labelOf(model, r.from)} → ${labelOf(model, r.to)}`}</th>
            <td className="lf-data-num">{r.sketchSign ? `${r.sketchSign === '+' ? '+' : '−'} ${n3(Math.abs(r.sketch))}` : 'no link'}</td>
            <td className="lf-data-num">{n3(r.estimate)} [{n3(r.low)}, {n3(r.high)}]</td>
            <td><strong>{r.verdict}</strong></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

type Running = { kind: 'var' | 'ct'; progress: number; run: CancellableRun<unknown> } | null;

export function DataFits({ model, panel }: { model: Model; panel: Panel }) {
  const id = useId();
  const [sameDay, setSameDay] = useState(false);
  const [skipPrompt, setSkipPrompt] = useState(false);
  const [initial, setInitial] = useState<'free' | 'stationary'>('free');
  const [varAnswer, setVar] = useState<FitAnswer<VarAnswer> | null>(null);
  const [ctAnswer, setCt] = useState<FitAnswer<CtAnswer> | null>(null);
  const [running, setRunning] = useState<Running>(null);
  const runRef = useRef<Running>(null);
  const hasDays = panel.persons.some((p) => p.day);
  const hasPrompts = panel.persons.some((p) => p.prompt);

  const start = async (kind: 'var' | 'ct') => {
    const c = await appDataClient();
    const onProgress = (f: number) => setRunning((r) => (r && r.kind === kind ? { ...r, progress: f } : r));
    const run = kind === 'var'
      ? c.fitVar(model, panel, { sameDay, skipRule: skipPrompt ? 'prompt' : 'none' }, onProgress)
      : c.fitCt(model, panel, { initial }, onProgress);
    const r: Running = { kind, progress: 0, run: run as CancellableRun<unknown> };
    runRef.current = r;
    setRunning(r);
    const a = await run.result;
    if (a) (kind === 'var' ? setVar : setCt)(a as never);
    if (runRef.current === r) { runRef.current = null; setRunning(null); }
  };

  const V = varAnswer?.ok ? varAnswer : null;
  const T = ctAnswer?.ok ? ctAnswer : null;
  const states = V?.fit.variables ?? T?.open.states ?? panel.variables;
  const links = states.flatMap((to) => states.filter((from) => from !== to).map((from) => ({ from, to })));
  const [link, setLink] = useState<string>('');
  const chosen = links.find((l) => `${l.from}>${l.to}` === link) ?? links[0];
  const sketch = useMemo(() => { try { return sketchDrift(model, states); } catch { return null; } }, [model, states.join(',')]); // eslint-disable-line react-hooks/exhaustive-deps
  // Every interval of the data (a million numbers for a big file): only once there is a fit to draw them with.
  const fitted = !!(V || T);
  const intervals = useMemo(() => (fitted ? dataIntervals(panel, sameDay) : []), [panel, sameDay, fitted]);
  const curves = useMemo(() => {
    if (!sketch || !chosen || (!V && !T)) return null;
    const i = states.indexOf(chosen.to), j = states.indexOf(chosen.from);
    const se = V ? (V.fit.se.phiCluster ?? V.fit.se.phi)[i][j] : NaN;
    const point = V ? { interval: V.interval, estimate: V.fit.phi[i][j], low: V.fit.phi[i][j] - 1.959963984540054 * se, high: V.fit.phi[i][j] + 1.959963984540054 * se } : null;
    try { return lagCurves(states, sketch, T ? T.open.drift : null, chosen.from, chosen.to, intervals, point); } catch { return null; }
  }, [sketch, chosen, V, T, intervals]); // eslint-disable-line react-hooks/exhaustive-deps
  const sketchScales = useMemo(() => {
    if (!sketch) return [];
    const ev = eigenvalues(fromRows(sketch));
    return Array.from(ev.re, (re) => (re !== 0 ? 1 / Math.abs(re) : Infinity)).sort((a, b) => a - b);
  }, [sketch]);
  const stem = fileStem(model.name);
  const u = panel.timeUnit;
  // The ordering is read at the median of every interval (as `loopfold fit --method ct`), whatever the VAR's pairs.
  const delta = useMemo(() => (fitted ? dataInterval(panel) : NaN), [panel, fitted]);
  const span = medianSpan(panel.persons);

  return (
    <section className="lf-data-section" aria-labelledby={`${id}-h`} data-testid="data-fits">
      <h3 id={`${id}-h`}>Sketch against data</h3>
      <p className="lf-data-note">Model-based comparisons: a fit says how well the sketch's links fit these data, not that the links are true.</p>
      <h4>VAR at the data's interval</h4>
      <div className="lf-data-row">
        <label><input type="checkbox" checked={sameDay} disabled={!hasDays} onChange={(e) => setSameDay(e.target.checked)} /> Same-day pairs only (the first prompt of a day is not regressed on the evening before)</label>
        <label><input type="checkbox" checked={skipPrompt} disabled={!hasPrompts} onChange={(e) => setSkipPrompt(e.target.checked)} /> Pairs only across one prompt (not across a skipped one)</label>
        <button type="button" className="lf-primary" disabled={running !== null} onClick={() => void start('var')}>Fit the VAR</button>
      </div>
      <h4>Continuous-time model from every actual interval</h4>
      <div className="lf-data-row">
        <label>
          Initial state{' '}
          <select value={initial} onChange={(e) => setInitial(e.target.value as 'free' | 'stationary')}>
            <option value="free">free (mean and covariance estimated)</option>
            <option value="stationary">stationary</option>
          </select>
        </label>
        <button type="button" disabled={running !== null} onClick={() => void start('ct')}>Fit the continuous-time model (slow)</button>
      </div>
      {running && (
        <p className="lf-data-row" role="status">
          {running.kind === 'var' ? 'Fitting the VAR…' : 'Fitting the continuous-time model (open, then the sketch\'s)…'}
          <progress className="lf-data-progress" max={1} value={running.progress} aria-label="Progress of the fit" />
          <button type="button" onClick={() => running.run.cancel()}>Cancel</button>
        </p>
      )}
      {varAnswer && !varAnswer.ok && ('cancelled' in varAnswer ? <p className="lf-data-note" role="status">The VAR fit was stopped.</p> : <p className="lf-data-error" role="alert">VAR: {varAnswer.reason}</p>)}
      {ctAnswer && !ctAnswer.ok && ('cancelled' in ctAnswer ? <p className="lf-data-note" role="status">The continuous-time fit was stopped.</p> : <p className="lf-data-error" role="alert">Continuous-time fit: {ctAnswer.reason}</p>)}
      {V && (
        <div data-testid="var-result">
          <h4>VAR(1) within persons, every {n3(V.interval)} {timeUnitWord(u, significant(V.interval, 3))} (median interval{sameDay ? ' within days' : ''})</h4>
          <p className="lf-data-note">
            {V.fit.n.persons} persons, {V.fit.n.pairs} pairs of occasions; person means taken out (people differ in their usual levels). Intervals: cluster-robust across persons.
            {V.fit.excluded.length > 0 && ` Pairs left out: ${V.fit.excluded.map((e) => `${e.pairs} ${e.reason}`).join('; ')}.`}
          </p>
          <ComparisonTable model={model} rows={V.comparison} what="VAR" sketchHead="sketch, lagged effect at this interval" />
          <button type="button" onClick={() => downloadBlob(new Blob([comparisonCsv(model, V.comparison, 'VAR')], { type: 'text/csv' }), `${stem}-var-comparison.csv`)}>Comparison as CSV</button>
          <p className="lf-data-note">Between persons (usual levels): variances {V.fit.between.cov.map((r, i) => `${labelOf(model, V.fit.variables[i])} ${n3(r[i])}`).join(', ')}.</p>
          {V.fit.warnings.map((w) => <p key={w} className="lf-data-warn">{w}</p>)}
        </div>
      )}
      {V && <PersonVar model={model} fit={V.fit} minPairs={20} />}
      {T && (
        <div data-testid="ct-result">
          <h4>Continuous-time fit ({T.open.n.persons} persons, {T.open.n.occasions} occasions)</h4>
          <p className="lf-data-note">
            Sketch's links only: −2LL {n3(T.confirmatory.minus2LL)}, AIC {n3(T.confirmatory.aic)}, BIC {n3(T.confirmatory.bic)}. Every link free: −2LL {n3(T.open.minus2LL)}, AIC {n3(T.open.aic)}, BIC {n3(T.open.bic)}.
          </p>
          <p data-testid="lr-test">
            Likelihood ratio, the sketch's links against every link free: χ² {n3(T.lr.chi2)} on {T.lr.df} df, p = {n3(T.lr.p)}
            {Number.isFinite(T.lr.p) ? (T.lr.p < 0.05 ? ' — the data need links the sketch does not have.' : ' — the sketch\'s links are enough for these data.') : ''}
          </p>
          <ComparisonTable model={model} rows={T.comparison} what="continuous-time" sketchHead="sketch, drift entry" />
          <button type="button" onClick={() => downloadBlob(new Blob([comparisonCsv(model, T.comparison, 'continuous-time')], { type: 'text/csv' }), `${stem}-ct-comparison.csv`)}>Comparison as CSV</button>
          <p className="lf-data-note">
            Timescales (1/|Re λ|, {u}): fitted {T.open.timescales.map((t) => n3(t.timescale)).join(', ')}; sketch {sketchScales.map(n3).join(', ')}.
            {T.open.between && ` Person differences as random intercepts; their variances: ${T.open.between.map((r, i) => `${labelOf(model, T.open.measured[i])} ${n3(r[i])}`).join(', ')}.`}
          </p>
          {[...new Set([...T.open.warnings, ...T.confirmatory.warnings])].map((w) => <p key={w} className="lf-data-warn">{w}</p>)}
        </div>
      )}
      {(V || T) && <OrderingBeside model={model} fit={T ? T.open : null} interval={delta} span={span} unit={u} />}
      {curves && chosen && (
        <>
          <h4>Lagged effect against the interval</h4>
          <label>
            Link{' '}
            <select value={`${chosen.from}>${chosen.to}`} onChange={(e) => setLink(e.target.value)}>
              {links.map((l) => <option key={`${l.from}>${l.to}`} value={`${l.from}>${l.to}`}>{labelOf(model, l.from)} → {labelOf(model, l.to)}</option>)}
            </select>
          </label>
          <div className="lf-data-figure">{elToReact(lagCurveChart(model, curves, u))}</div>
          <ExportButtons what="the lagged effect against the interval" name={`${stem}-lag-${chosen.from}-${chosen.to}`} svg={() => svgDocument(lagCurveChart(model, curves, u, { heading: true, caption: 'Sketch and fit; model-based, not a finding.' }))} />
        </>
      )}
    </section>
  );
}
