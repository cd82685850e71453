/**
 * The Rehearse tab: before a study runs, what it can detect. The session's study (the Study tab
 * edits it), the links of interest picked by name or from the canvas selection, analytic power
 * (stated as an approximation, with its warning for short series), Monte Carlo power over
 * parallel workers with progress and Cancel, the simulated study as CSV, and the design advisor
 * (power against the interval under a budget, the persons and the prompts a day) whose
 * recommended design "Use this design" writes through the session owner (one undo step).
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Model, Study, VariableId } from '../../core/model/types';
import { exactDuration } from '../../core/study/convert';
import { studyPrompts } from '../../core/study/schedule';
import { formatDuration } from '../../core/model/units';
import type { LinkOfInterest } from '../../core/rehearse/montecarlo';
import type { AxisPlan, Budget, PlanResult } from '../../core/rehearse/plan';
import { ANALYTIC_OCCASIONS, trustSentence } from '../../core/rehearse/power';
import { powerChart } from '../../export/rehearseCharts';
import { svgDocument } from '../../export/svg';
import { labelOf, numText, significant } from '../../present/index';
import { useValidatedModel } from '../../state/document';
import { useSelection } from '../../state/selection';
import { editStudy, useSessionStudy, type SessionStudy } from '../../state/session';
import { appRehearseClient, workerCount, type CsvRun, type McOutcome, type McRun } from '../../worker/rehearseClient';
import type { AdvisorAnswer, AnalyticAnswer, Failed, Ok, RehearseRequest } from '../../worker/rehearseApi';
import { downloadBlob } from '../download';
import { elToReact } from '../elReact';
import { fileStem } from '../figureFiles';
import { ExportButtons } from '../numbers/ExportButtons';
import './rehearse.css';

const key = (l: LinkOfInterest) => `${l.from}>${l.to}`;
const pct = (x: number) => (Number.isFinite(x) ? `${Math.round(x * 100)} %` : '–');
const n3 = (x: number) => (Number.isFinite(x) ? numText(significant(x, 3)) : '–');

export default function RehearsePane() {
  const model = useValidatedModel();
  const s = useSessionStudy();
  if (!model || !s) return <p className="lf-rehearse lf-hint">The study can be rehearsed once the model has no problems left (see the Edit tab).</p>;
  const states = model.variables.filter((v) => v.kind === 'state');
  if (states.length < 1) return <p className="lf-rehearse lf-hint">Rehearsal needs at least one state: lagged links run between states.</p>;
  return <RehearseFor model={model} s={s} />;
}

/** The modelled links between two states, the first choices offered. */
function modelledLinks(model: Model): LinkOfInterest[] {
  const isState = (id: VariableId) => model.variables.some((v) => v.id === id && v.kind === 'state');
  const out: LinkOfInterest[] = [];
  for (const l of model.links) if (isState(l.from) && isState(l.to) && !out.some((o) => key(o) === key(l))) out.push({ from: l.from, to: l.to });
  return out;
}

function RehearseFor({ model, s }: { model: Model; s: SessionStudy }) {
  const states = model.variables.filter((v) => v.kind === 'state');
  const offered = useMemo(() => modelledLinks(model), [model]);
  const [links, setLinks] = useState<LinkOfInterest[]>(() => offered.slice(0, 1));
  const validLinks = links.filter((l) => states.some((v) => v.id === l.from) && states.some((v) => v.id === l.to));
  const [from, setFrom] = useState<VariableId>(states[0].id);
  const [to, setTo] = useState<VariableId>(states[Math.min(1, states.length - 1)].id);
  const selected = useSelection((x) => x.links);
  const selectedLink = selected.length === 1 ? model.links.find((l) => l.id === selected[0]) : undefined;
  const selectedUsable = selectedLink && states.some((v) => v.id === selectedLink.from) && states.some((v) => v.id === selectedLink.to) ? { from: selectedLink.from, to: selectedLink.to } : null;
  const add = (l: LinkOfInterest) => setLinks((xs) => (xs.some((x) => key(x) === key(l)) ? xs : [...xs, l]));
  const name = (l: LinkOfInterest) => `${labelOf(model, l.from)} → ${labelOf(model, l.to)}`;
  const req: RehearseRequest = useMemo(() => ({ model, study: s.study, links: validLinks }), [model, s.study, validLinks.map(key).join(',')]); // eslint-disable-line react-hooks/exhaustive-deps
  const caution = model.caution;
  const analytic = useAnswer<Ok<AnalyticAnswer> | Failed>(() => (req.links.length > 0 ? appRehearseClient().then((c) => c.analytic(req)) : Promise.resolve({ ok: false, reason: 'no link' })), [req]);

  return (
    <div className="lf-rehearse" aria-label="Rehearse the study">
      <p className="lf-hint">Before the study runs: simulate it from the model, analyse each simulated study as the real data will be analysed (the VAR of the Data tab), and see how often each link would be found. Model-based hypotheses about a design, not findings.</p>
      {caution && <p className="lf-rehearse-caution" role="note"><strong>Caution</strong> {caution}</p>}
      <section className="lf-rehearse-section" aria-labelledby="lf-rh-study">
        <h3 id="lf-rh-study">The study</h3>
        <p data-testid="rehearse-study">{s.study.persons ?? 1} persons, {s.study.schedule.kind === 'daily-window' ? `${s.study.schedule.promptsPerDay} prompts a day (${s.study.schedule.from}–${s.study.schedule.to})` : `every ${formatDuration(s.interval, model.timeUnit)}`}, {typeof s.study.length === 'number' ? `${s.study.length} prompts` : s.study.length}{s.study.missedPrompts ? `, ${pct(s.study.missedPrompts)} missed` : ''}. <span className="lf-hint">Change it in the Study tab.</span></p>
      </section>
      <section className="lf-rehearse-section" aria-labelledby="lf-rh-links">
        <h3 id="lf-rh-links">Links to detect</h3>
        {links.length === 0 && <p className="lf-hint">Pick at least one link below.</p>}
        <ul className="lf-rehearse-links" aria-label="Links to detect">
          {links.map((l) => (
            <li key={key(l)} data-link={key(l)}>
              {name(l)}{' '}
              <button type="button" className="lf-num-small" aria-label={`Remove ${name(l)}`} onClick={() => setLinks((xs) => xs.filter((x) => key(x) !== key(l)))}>Remove</button>
            </li>
          ))}
        </ul>
        <div className="lf-rehearse-pick">
          <label>From <select aria-label="Link from" value={from} onChange={(e) => setFrom(e.target.value)}>{states.map((v) => <option key={v.id} value={v.id}>{labelOf(model, v.id)}</option>)}</select></label>
          <label>to <select aria-label="Link to" value={to} onChange={(e) => setTo(e.target.value)}>{states.map((v) => <option key={v.id} value={v.id}>{labelOf(model, v.id)}</option>)}</select></label>
          <button type="button" onClick={() => add({ from, to })}>Add link</button>
          <button type="button" disabled={!selectedUsable} title={selectedUsable ? '' : 'Select a link between two states on the canvas'} onClick={() => selectedUsable && add(selectedUsable)}>Add the selected link</button>
        </div>
        {offered.length > links.length && <p className="lf-hint">Modelled links between states: {offered.filter((o) => !links.some((l) => key(l) === key(o))).map((o, i) => <span key={key(o)}>{i > 0 && ', '}<button type="button" className="lf-link-button" onClick={() => add(o)}>{name(o)}</button></span>)}</p>}
      </section>
      {validLinks.length > 0 && <Analytic a={analytic} name={name} />}
      {validLinks.length > 0 && <MonteCarlo model={model} req={req} name={name} s={s} analytic={analytic} />}
      <SimulatedCsv model={model} req={req} />
      {validLinks.length > 0 && <Advisor model={model} req={req} s={s} planned={analytic} />}
    </div>
  );
}

function useAnswer<T>(ask: () => Promise<T>, deps: unknown[]): T | null {
  const [answer, setAnswer] = useState<T | null>(null);
  useEffect(() => {
    let live = true;
    setAnswer(null);
    ask().then((a) => { if (live) setAnswer(a); }, (e: unknown) => { if (live) setAnswer({ ok: false, reason: String(e) } as T); });
    return () => { live = false; };
  }, deps); // eslint-disable-line react-hooks/exhaustive-deps
  return answer;
}

function Analytic({ a, name }: { a: Ok<AnalyticAnswer> | Failed | null; name: (l: LinkOfInterest) => string }) {
  return (
    <section className="lf-rehearse-section" aria-labelledby="lf-rh-analytic">
      <h3 id="lf-rh-analytic">Power, analytic</h3>
      <p className="lf-hint">Approximation: the asymptotic variance of the pooled VAR(1) least-squares estimate over the schedule's gaps, SE = √(Σu,ii (Γ₀⁻¹)jj / T) with T the answered pairs of all persons, plus the between-person variance of the effect; two-sided test at α = .05.</p>
      {!a && <p className="lf-hint">Working…</p>}
      {a && !a.ok && <p className="lf-field-error" role="alert">{a.reason}</p>}
      {a && a.ok && (
        <>
          <table className="lf-rehearse-table" data-testid="rehearse-analytic">
            <caption className="lf-hint">{a.persons} persons, about {Math.round(a.answeredPerPerson)} answered prompts each</caption>
            <thead><tr><th scope="col">Link</th><th scope="col">Effect</th><th scope="col">SE</th><th scope="col">Power</th><th scope="col">Bias of centring</th><th scope="col">Expected estimate</th></tr></thead>
            <tbody>
              {a.power.links.map((l) => (
                <tr key={`${l.from}>${l.to}`} data-link={`${l.from}>${l.to}`} data-effect={l.effect} data-se={l.se} data-power={l.power} data-bias={l.centringBias} data-expected={l.expectedEstimate}>
                  <th scope="row">{name(l)}</th><td>{n3(l.effect)}</td><td>{n3(l.se)}</td><td>{pct(l.power)}</td><td>{n3(l.centringBias ?? NaN)}</td><td>{n3(l.expectedEstimate ?? NaN)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="lf-hint">Bias of centring: with about {Math.round(a.answeredPerPerson)} occasions per person, removing each person's mean shifts the estimate (an autoregression down, by about −(1+φ)/(T−1); a cross-lagged effect a little either way); the expected estimate is what the analysis should give on average, to compare with the Monte Carlo mean below.</p>
          {a.answeredPerPerson < ANALYTIC_OCCASIONS
            ? <p className="lf-rehearse-warn" role="note" data-testid="rehearse-short">Short series: about {Math.round(a.answeredPerPerson)} answered prompts per person, below about {ANALYTIC_OCCASIONS}. Here the analytic figure overstates power (it understates the SE, and its effect leaves out the bias of centring shown beside it): trust the Monte Carlo figure below.</p>
            : <p data-testid="rehearse-trust">{trustSentence(a.answeredPerPerson)}</p>}
        </>
      )}
    </section>
  );
}

function MonteCarlo({ model, req, name, s, analytic }: { model: Model; req: RehearseRequest; name: (l: LinkOfInterest) => string; s: SessionStudy; analytic: Ok<AnalyticAnswer> | Failed | null }) {
  const [reps, setReps] = useState('200');
  const [seed, setSeed] = useState(String(s.study.seed ?? 1));
  const [method, setMethod] = useState<'var' | 'ct'>('var');
  const [ranWith, setRanWith] = useState<'var' | 'ct'>('var');
  const [done, setDone] = useState(0);
  const [running, setRunning] = useState<{ run: McRun; k: number } | null>(null);
  const [outcome, setOutcome] = useState<McOutcome | null>(null);
  const runRef = useRef<McRun | null>(null);
  useEffect(() => () => runRef.current?.cancel(), []);
  const k = Number(reps), sd = Number(seed);
  const problem = !(Number.isInteger(k) && k >= 10 && k <= 100000) ? 'Replications: a whole number from 10 to 100000' : !Number.isInteger(sd) ? 'Seed: a whole number' : null;
  const cores = workerCount(typeof navigator !== 'undefined' ? navigator.hardwareConcurrency : undefined);
  const start = async () => {
    if (problem) return;
    runRef.current?.cancel();
    setOutcome(null);
    setDone(0);
    const c = await appRehearseClient();
    const run = c.monteCarlo({ ...req, seed: sd, method }, k, cores, setDone);
    setRanWith(method);
    runRef.current = run;
    setRunning({ run, k });
    const o = await run.result;
    if (runRef.current === run) {
      setOutcome(o);
      setRunning(null);
    }
  };
  const sum = outcome && outcome.status !== 'failed' ? outcome.summary : null;
  void model;
  return (
    <section className="lf-rehearse-section" aria-labelledby="lf-rh-mc">
      <h3 id="lf-rh-mc">Power, Monte Carlo</h3>
      <p className="lf-hint">Simulate the study many times (each person's schedule, missed prompts, person differences and measurement error), analyse each as chosen (the VAR of the Data tab, or its continuous-time fit), and count how often each link is found. Replications run on up to {cores} parallel worker{cores === 1 ? '' : 's'}.</p>
      <div className="lf-rehearse-pick">
        <label>Replications <input aria-label="Replications" value={reps} size={6} inputMode="numeric" onChange={(e) => setReps(e.target.value)} aria-invalid={problem?.startsWith('Repl') ? true : undefined} /></label>
        <label>Analysis <select aria-label="Analysis of each simulated study" value={method} onChange={(e) => setMethod(e.target.value === 'ct' ? 'ct' : 'var')}><option value="var">VAR (lagged effect)</option><option value="ct">continuous-time (drift; slower)</option></select></label>
        <label>Seed <input aria-label="Seed" value={seed} size={6} inputMode="numeric" onChange={(e) => setSeed(e.target.value)} aria-invalid={problem?.startsWith('Seed') ? true : undefined} /></label>
        <button type="button" disabled={!!problem || !!running} onClick={() => void start()}>Run Monte Carlo</button>
        {running && <button type="button" onClick={() => running.run.cancel()}>Cancel</button>}
      </div>
      {problem && <p className="lf-field-error" role="alert">{problem}</p>}
      {running && <p><progress aria-label="Progress of the Monte Carlo run" max={running.k} value={done} /> {done} of {running.k}</p>}
      {outcome?.status === 'failed' && <p className="lf-field-error" role="alert">{outcome.reason}</p>}
      {outcome?.status === 'cancelled' && <p className="lf-hint" data-testid="rehearse-mc-cancelled">Cancelled{sum ? ` after ${sum.replications} replications (shown below)` : ''}.</p>}
      {sum && sum.replications > 0 && (
        <table className="lf-rehearse-table" data-testid="rehearse-mc">
          <caption className="lf-hint">{sum.replications} simulated studies on {sum.workers} worker{sum.workers === 1 ? '' : 's'}{sum.failed ? `, ${sum.failed} analyses failed (counted as not found: ${sum.failure})` : ''}; ± is the Monte Carlo error √(p(1−p)/K){ranWith === 'ct' ? '; continuous-time fit: estimates are drift entries (effect on the rate per unit of time), not comparable with the analytic lagged effect' : ''}</caption>
          <thead><tr><th scope="col">Link</th><th scope="col">Mean estimate</th><th scope="col">Expected (analytic)</th><th scope="col">SD of estimates</th><th scope="col">Power</th><th scope="col">Analytic power</th></tr></thead>
          <tbody>
            {sum.links.map((l) => {
              const an = analytic?.ok && ranWith === 'var' ? analytic.power.links.find((x) => x.from === l.from && x.to === l.to) : undefined;
              return (
                <tr key={`${l.from}>${l.to}`} data-link={`${l.from}>${l.to}`} data-power={l.power} data-effect={l.effect}>
                  <th scope="row">{name(l)}</th><td>{n3(l.effect)}</td><td>{n3(an?.expectedEstimate ?? NaN)}</td><td>{n3(l.se)}</td><td>{pct(l.power)} ± {pct(l.mcError)}</td><td>{pct(an?.power ?? NaN)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {sum && sum.replications > 0 && analytic?.ok && <p data-testid="rehearse-mc-trust">{trustSentence(analytic.answeredPerPerson)}</p>}
    </section>
  );
}

function SimulatedCsv({ model, req }: { model: Model; req: RehearseRequest }) {
  const [msg, setMsg] = useState<{ error: boolean; text: string } | null>(null);
  const [running, setRunning] = useState<CsvRun | null>(null);
  const [done, setDone] = useState(0);
  const runRef = useRef<CsvRun | null>(null);
  useEffect(() => () => runRef.current?.cancel(), []);
  const persons = req.study.persons ?? 1;
  const save = async () => {
    setMsg(null);
    setDone(0);
    const c = await appRehearseClient();
    const run = c.csv(req, setDone);
    runRef.current = run;
    setRunning(run);
    const a = await run.result;
    if (runRef.current !== run) return;
    setRunning(null);
    if (!a.ok) return setMsg({ error: !('cancelled' in a), text: 'cancelled' in a ? 'Cancelled: no file was saved.' : a.reason });
    downloadBlob(new Blob([a.csv], { type: 'text/csv' }), `${fileStem(model.name)}-simulated-study.csv`);
    setMsg({ error: false, text: `Saved: ${a.persons} persons, ${a.rows} answered prompts, simulated by ${a.simulator} (synthetic data from the model, not observations).` });
  };
  return (
    <section className="lf-rehearse-section" aria-labelledby="lf-rh-csv">
      <h3 id="lf-rh-csv">Simulated study</h3>
      <p className="lf-hint">A linear mechanism is simulated by the exact discrete model of each gap between prompts; a nonlinear one by Euler–Maruyama on its own rates, with steps of 1/20 of its fastest timescale. Power above uses the linearization at equilibrium.</p>
      <p>
        <button type="button" disabled={!!running} onClick={() => void save()}>Download a simulated study (CSV)</button>
        {running && <> <button type="button" onClick={() => running.cancel()}>Cancel the simulated study</button></>}
      </p>
      {running && <p><progress aria-label="Persons simulated" max={persons} value={done} /> {done} of {persons} persons</p>}
      {msg && <p className={msg.error ? 'lf-field-error' : 'lf-hint'} role={msg.error ? 'alert' : 'status'} data-testid="rehearse-csv-message">{msg.text}</p>}
    </section>
  );
}

function Advisor({ model, req, s, planned }: { model: Model; req: RehearseRequest; s: SessionStudy; planned: Ok<AnalyticAnswer> | Failed | null }) {
  const unit = model.timeUnit;
  const [kind, setKind] = useState<Budget['kind']>('prompts');
  const prompts = planned && planned.ok ? planned.plannedPerPerson : null;
  const span = s.length.by === 'window' ? s.length.window : (prompts ?? studyPrompts(s.study, unit)) * s.interval;
  const budget: Budget | null = kind === 'prompts' ? (prompts ? { kind: 'prompts', prompts: Math.max(3, prompts) } : null) : { kind: 'span', span };
  const a = useAnswer<Ok<AdvisorAnswer> | Failed | null>(() => (budget ? appRehearseClient().then((c) => c.advisor(req, budget)) : Promise.resolve(null)), [req, JSON.stringify(budget)]);
  const stem = fileStem(model.name);
  const name = (l: { from: string; to: string }) => `${labelOf(model, l.from)} → ${labelOf(model, l.to)}`;
  const use = (patch: Partial<Study>) => editStudy(patch);
  return (
    <section className="lf-rehearse-section" aria-labelledby="lf-rh-advisor">
      <h3 id="lf-rh-advisor">Design advisor</h3>
      <p className="lf-hint">Analytic power of every design compared (optimistic below about {ANALYTIC_OCCASIONS} answered prompts per person: check the chosen design with Monte Carlo). The recommended design gives 80 % power for every link at the least burden.</p>
      <div className="lf-field">
        <label htmlFor="lf-rh-budget">Budget</label>
        <select id="lf-rh-budget" value={kind} onChange={(e) => setKind(e.target.value as Budget['kind'])}>
          <option value="prompts">a fixed number of prompts ({prompts ?? '…'} per person)</option>
          <option value="span">a fixed span ({formatDuration(span, unit)})</option>
        </select>
      </div>
      {!a && <p className="lf-hint">Working…</p>}
      {a && !a.ok && <p className="lf-field-error" role="alert">{a.reason}</p>}
      {a && a.ok && (
        <>
          <IntervalPlan model={model} plan={a.interval} stem={stem} name={name} use={use} />
          <AxisPart plan={a.persons} stem={stem} name={name} use={(p) => use({ persons: p.persons })} />
          {a.promptsPerDay && s.study.schedule.kind === 'daily-window' && (() => {
            const sch = s.study.schedule;
            const length = typeof s.study.length === 'number' ? `${Math.ceil(s.study.length / sch.promptsPerDay)} day` : s.study.length;
            return <AxisPart plan={a.promptsPerDay} stem={stem} name={name} use={(p) => use({ schedule: { ...sch, promptsPerDay: p.value }, interval: exactDuration(p.interval, unit), length })} />;
          })()}
        </>
      )}
    </section>
  );
}

function IntervalPlan({ model, plan, stem, name, use }: { model: Model; plan: PlanResult; stem: string; name: (l: { from: string; to: string }) => string; use: (p: Partial<Study>) => void }) {
  const unit = model.timeUnit;
  const label = `Power against the interval, ${plan.budget.kind === 'prompts' ? `${plan.budget.prompts} prompts per person` : `a span of ${formatDuration(plan.budget.span, unit)}`}, ${plan.persons} persons`;
  const chart = (heading: boolean) => powerChart({ label, xs: plan.curve.map((p) => p.interval), series: plan.curve[0].links.map((l, k) => ({ name: name(l), power: plan.curve.map((p) => p.links[k].power) })), xLabel: `interval between prompts (${unit}, log scale)`, log: true, target: plan.target, recommended: plan.recommended?.interval ?? null }, heading ? { heading: true, caption: 'Analytic power; model-based, not a finding.' } : {});
  const rec = plan.recommended;
  return (
    <div className="lf-rehearse-plan" data-testid="rehearse-plan-interval">
      <h4>{label}</h4>
      <div className="lf-rehearse-figure">{elToReact(chart(false))}</div>
      <ExportButtons what="power against the interval" name={`${stem}-power-interval`} svg={() => svgDocument(chart(true))} />
      <p data-testid="rehearse-statement">{plan.statement.replace(/->/g, ' → ')}</p>
      {rec && <button type="button" onClick={() => use({ interval: exactDuration(rec.interval, unit), length: rec.prompts, schedule: { kind: 'fixed' } })}>Use this design (every {formatDuration(rec.interval, unit)}, {rec.prompts} prompts)</button>}
    </div>
  );
}

function AxisPart({ plan, stem, name, use }: { plan: AxisPlan; stem: string; name: (l: { from: string; to: string }) => string; use: (p: AxisPlan['points'][number]) => void }) {
  const what = plan.axis === 'persons' ? 'the persons' : 'the prompts a day';
  const label = `Power against ${what}`;
  const chart = (heading: boolean) => powerChart({ label, xs: plan.points.map((p) => p.value), series: plan.points[0].links.map((l, k) => ({ name: name(l), power: plan.points.map((p) => p.links[k].power) })), xLabel: plan.axis === 'persons' ? 'persons' : 'prompts a day', log: plan.axis === 'persons', target: plan.target, recommended: plan.recommended?.value ?? null }, heading ? { heading: true, caption: 'Analytic power; model-based, not a finding.' } : {});
  const rec = plan.recommended;
  return (
    <div className="lf-rehearse-plan" data-testid={`rehearse-plan-${plan.axis}`}>
      <h4>{label}</h4>
      <div className="lf-rehearse-figure">{elToReact(chart(false))}</div>
      <ExportButtons what={`power against ${what}`} name={`${stem}-power-${plan.axis}`} svg={() => svgDocument(chart(true))} />
      <p>{plan.statement.replace(/->/g, ' → ')}</p>
      {rec && <button type="button" onClick={() => use(rec)}>Use this design ({plan.axis === 'persons' ? `${rec.persons} persons` : `${rec.value} prompts a day`})</button>}
    </div>
  );
}
