/**
 * The Steps tab: a process that moves in whole steps, measured every u-th
 * step. Shows the measured graph for u = 1 … U (drawn by
 * `src/export/undersample.ts`, explained edge by edge) and searches, in a
 * worker, for the causal-step graphs behind the measured graph shown.
 * Loaded on demand (React.lazy).
 */
import { useEffect, useMemo, useRef, useState, type ChangeEvent } from 'react';
import {
  edgeList, editMeasuredGraph, explainMeasured, graphFileText, has, inverseLimit, measuredGraph, parseGraphText, SEARCH_MAX_VARIABLES, stepGraphOfModel,
  type EdgeKind, type InverseProgress, type MeasuredGraph, type StepGraph,
} from '../../core/undersample/index';
import { useValidatedModel } from '../../state/document';
import { stepsStore, useSteps } from '../../state/steps';
import { measuredGraphFigure, measuredLabel } from '../../export/undersample';
import { svgDocument } from '../../export/svg';
import { elToReact } from '../elReact';
import { fileStem } from '../figureFiles';
import { ExportButtons } from '../numbers/ExportButtons';
import { appUndersampleClient, type InverseOutcome, type InverseRun } from '../../worker/undersampleClient';
import { downloadBlob } from '../download';
import './steps.css';

const CAPTION = 'A model-based reading: the edges an analysis of data taken at this rate would show, if the causal-step graph is right.';

interface Source {
  name: string;
  /** The causal-step graph, when known (the sketch, or a causal-step graph file). */
  causal: StepGraph | null;
  /** A measured graph read from a file (shown as it is; no forward step). */
  measured: MeasuredGraph | null;
  notes: string[];
  from: 'sketch' | 'file';
}

function useSource(): Source | null {
  const model = useValidatedModel();
  const file = useSteps((s) => s.file);
  return useMemo(() => {
    if (file) {
      const g = file.graph.graph;
      return file.as === 'measured'
        ? { name: file.graph.name ?? file.fileName, causal: null, measured: g, notes: file.graph.notes, from: 'file' as const }
        : { name: file.graph.name ?? file.fileName, causal: { names: g.names, directed: g.directed }, measured: null, notes: file.graph.notes, from: 'file' as const };
    }
    if (!model) return null;
    const r = stepGraphOfModel(model);
    if (r.graph.names.length === 0 || r.graph.names.length > 30) return null;
    return { name: model.name, causal: { names: r.graph.names, directed: r.graph.directed }, measured: null, notes: r.notes, from: 'sketch' as const };
  }, [model, file]);
}

function edgesText(names: readonly string[], rows: readonly number[]): string {
  const out: string[] = [];
  for (let i = 0; i < rows.length; i++) for (let j = 0; j < rows.length; j++) if (has(rows[i], j)) out.push(`${names[i]} → ${names[j]}`);
  return out.join(', ') || 'none';
}

export default function StepsPane() {
  const source = useSource();
  const rate = useSteps((s) => s.rate);
  const maxRate = useSteps((s) => s.maxRate);
  const [error, setError] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);

  const open = (ev: ChangeEvent<HTMLInputElement>) => {
    const f = ev.target.files?.[0];
    ev.target.value = '';
    if (!f) return;
    f.text().then((text) => {
      const r = parseGraphText(text);
      if (!r.ok) { setError(`${f.name} was not opened: ${r.issues.slice(0, 3).map((i) => `${i.path} ${i.message}`).join('; ')}`); return; }
      setError(null);
      const measured = r.file.graph.bidirected.some((x) => x !== 0) || r.file.rate !== undefined;
      stepsStore.getState().set({ file: { graph: r.file, as: measured ? 'measured' : 'causal', fileName: f.name }, ...(r.file.rate ? { rate: Math.min(r.file.rate, 30), maxRate: Math.max(maxRate, Math.min(r.file.rate, 30)) } : {}) });
    }, (e: unknown) => setError(`The file could not be read: ${(e as Error).message}`));
  };

  return (
    <div className="lf-steps" data-testid="steps-pane">
      <p className="lf-steps-note">
        A process that moves in whole steps (a day, a census round), measured every u-th step: which links would an analysis of the measurements show,
        and which causal-step graphs could lie behind a graph found in data? Each state carries over from one step to the next; each integrating link acts in one step.
      </p>
      <div className="lf-steps-row">
        <span>Graph: {source ? <strong>{source.name}</strong> : '—'} {source && <span className="lf-steps-note">({source.from === 'sketch' ? 'from the sketch' : source.measured ? 'a measured graph from a file' : 'a causal-step graph from a file'})</span>}</span>
        <button type="button" onClick={() => input.current?.click()}>Open graph file…</button>
        {source?.from === 'file' && <button type="button" onClick={() => { setError(null); stepsStore.getState().set({ file: null }); }}>Use the sketch</button>}
        <input ref={input} type="file" accept=".json,application/json" hidden aria-label="Graph file" onChange={open} />
      </div>
      {error && <p className="lf-steps-error" role="alert">{error}</p>}
      {!source && <p className="lf-steps-note">The sketch has no state yet, or a problem to fix first (see the Edit tab); or open a graph file.</p>}
      {source?.notes.map((n) => <p key={n} className="lf-steps-note">· {n}</p>)}
      {source && <StepsView source={source} rate={rate} maxRate={maxRate} />}
      <p className="lf-steps-caution">Model-based hypotheses about what a study could show, not findings; no clinical advice.</p>
    </div>
  );
}

function RateControl({ rate, maxRate, disabled }: { rate: number; maxRate: number; disabled?: boolean }) {
  const set = (u: number) => stepsStore.getState().set({ rate: Math.max(1, Math.min(maxRate, u)) });
  return (
    <div>
      <div className="lf-steps-rate-label" aria-hidden="true">Measured every <strong>u</strong>-th step of the causal graph: <strong>u = {rate}</strong></div>
      <div className="lf-steps-rate">
        <button type="button" aria-label="Measure more often (u − 1)" disabled={disabled || rate <= 1} onClick={() => set(rate - 1)}>−</button>
        <input type="range" min={1} max={maxRate} step={1} value={rate} disabled={disabled} aria-label="Measured every u-th step" aria-valuetext={`u = ${rate}`} onChange={(e) => set(Number(e.target.value))} />
        <button type="button" aria-label="Measure less often (u + 1)" disabled={disabled || rate >= maxRate} onClick={() => set(rate + 1)}>+</button>
      </div>
      <div className="lf-steps-ticks" aria-hidden="true">
        {Array.from({ length: maxRate }, (_, k) => k + 1).map((u) => (
          <button key={u} type="button" tabIndex={-1} aria-pressed={u === rate} disabled={disabled} onClick={() => set(u)}>{u}</button>
        ))}
      </div>
      <div className="lf-steps-row">
        <label>
          Largest u{' '}
          <input type="number" min={2} max={30} value={maxRate} style={{ width: 52 }} onChange={(e) => {
            const v = Math.round(Number(e.target.value));
            if (Number.isFinite(v) && v >= 2 && v <= 30) stepsStore.getState().set({ maxRate: v, rate: Math.min(rate, v) });
          }} />
        </label>
      </div>
    </div>
  );
}

function StepsView({ source, rate, maxRate }: { source: Source; rate: number; maxRate: number }) {
  const causal = source.causal;
  const u = Math.min(rate, maxRate);
  const shown: MeasuredGraph = source.measured ?? measuredGraph(causal!, u);
  const reasons = useMemo(() => (causal ? explainMeasured(causal, u) : []), [causal, u]);
  const label = source.measured ? 'Measured graph from the file' : measuredLabel(u);
  const figureOf = (heading: boolean) => measuredGraphFigure({ causal: causal ?? { names: shown.names, directed: shown.directed }, rate: u, reasons, measured: shown }, { heading, label, caption: heading ? CAPTION : undefined });
  const figure = figureOf(false);
  const edges = edgeList(shown);
  return (
    <>
      {causal && <RateControl rate={u} maxRate={maxRate} />}
      <h3 id="lf-steps-figure-title">{label}</h3>
      <div data-testid="steps-figure" data-rate={source.measured ? undefined : u} data-directed={edges.directed.length} data-bidirected={edges.bidirected.length}>
        {elToReact(figure, (e) => (e.tag === 'svg' ? { className: 'lf-steps-figure' } : undefined))}
      </div>
      <ExportButtons
        what="the measured graph"
        name={`${fileStem(source.name)}-every-${u}`}
        svg={() => svgDocument(figureOf(true))}
        print={{ modelFile: `${fileStem(source.name)}.json`, source: () => ({ kind: 'chart', build: (o) => measuredGraphFigure({ causal: causal ?? { names: shown.names, directed: shown.directed }, rate: u, reasons, measured: shown }, { heading: o.heading, label, caption: o.caption }), caption: CAPTION }) }}
      />
      <p className="lf-steps-note" data-testid="steps-summary">
        {edges.directed.length} directed and {edges.bidirected.length} bidirected edge{edges.bidirected.length === 1 ? '' : 's'}
        {causal && !source.measured && u > 1 ? `; at u = 1 the causal-step graph has ${edgeList({ ...causal, bidirected: [] }).directed.length}.` : '.'}
      </p>
      {reasons.length > 0 && (
        <section aria-labelledby="lf-steps-why">
          <h3 id="lf-steps-why">Why each edge is there</h3>
          <ReasonList lines={reasons.map((r) => r.text)} />
        </section>
      )}
      <GraphEditor source={source} shown={shown} rate={u} />
      <InverseSection graph={shown} rate={u} maxRate={maxRate} fromFile={!!source.measured} />
    </>
  );
}

/**
 * Edit a measured graph by hand: add or remove directed and bidirected edges
 * between its variables. A causal-step source is first copied as the measured
 * graph shown (at the rate shown); the edited graph can be saved as a graph file.
 */
function GraphEditor({ source, shown, rate }: { source: Source; shown: MeasuredGraph; rate: number }) {
  const [from, setFrom] = useState(0);
  const [to, setTo] = useState(Math.min(1, shown.names.length - 1));
  const [kind, setKind] = useState<EdgeKind>('directed');
  const [message, setMessage] = useState<string | null>(null);
  const names = shown.names;
  const file = useSteps((s) => s.file);
  if (!source.measured || !file) {
    const copy = () => {
      setMessage(null);
      stepsStore.getState().set({ file: { graph: { name: `${source.name}, measured every ${rate === 1 ? 'step' : `${rate}. step`}`, graph: shown, rate, source: 'graph', notes: [] }, as: 'measured', fileName: 'edited graph' } });
    };
    return (
      <section className="lf-steps-section" aria-labelledby="lf-steps-edit">
        <h3 id="lf-steps-edit">Edit a measured graph</h3>
        <p className="lf-steps-note">Enter the graph an analysis found: start from the measured graph shown and add or remove edges, or open a graph file.</p>
        <button type="button" onClick={copy}>Edit this measured graph</button>
      </section>
    );
  }
  const apply = (op: 'add' | 'remove', k: EdgeKind, i: number, j: number) => {
    const r = editMeasuredGraph(shown, { op, kind: k, from: i, to: j });
    if (!r.ok) { setMessage(r.message); return; }
    setMessage(null);
    stepsStore.getState().set({ file: { ...file, graph: { ...file.graph, graph: r.graph } } });
  };
  const edges: { kind: EdgeKind; i: number; j: number }[] = [];
  for (let i = 0; i < names.length; i++)
    for (let j = 0; j < names.length; j++) {
      if (has(shown.directed[i], j)) edges.push({ kind: 'directed', i, j });
      if (j > i && has(shown.bidirected[i], j)) edges.push({ kind: 'bidirected', i, j });
    }
  const save = () => downloadBlob(new Blob([graphFileText(shown, { name: file.graph.name, rate: file.graph.rate })], { type: 'application/json' }), `${fileStem(file.graph.name ?? 'measured-graph')}.json`);
  return (
    <section className="lf-steps-section" aria-labelledby="lf-steps-edit" data-testid="steps-editor">
      <h3 id="lf-steps-edit">Edit the measured graph</h3>
      <div className="lf-steps-row">
        <label>From <select value={from} onChange={(e) => setFrom(Number(e.target.value))}>{names.map((n, i) => <option key={i} value={i}>{n}</option>)}</select></label>
        <label>Edge <select value={kind} onChange={(e) => setKind(e.target.value as EdgeKind)}>
          <option value="directed">→ directed</option>
          <option value="bidirected">↔ bidirected</option>
        </select></label>
        <label>To <select value={to} onChange={(e) => setTo(Number(e.target.value))}>{names.map((n, i) => <option key={i} value={i}>{n}</option>)}</select></label>
        <button type="button" onClick={() => apply('add', kind, from, to)}>Add edge</button>
        <button type="button" onClick={save}>Save graph file</button>
      </div>
      {message && <p className="lf-steps-error" role="alert">{message}</p>}
      <ul className="lf-steps-edit-list" data-testid="steps-edges">
        {edges.map(({ kind: k, i, j }) => {
          const t = `${names[i]} ${k === 'directed' ? '→' : '↔'} ${names[j]}`;
          return <li key={`${k}${i}-${j}`}><span>{t}</span> <button type="button" className="lf-steps-remove" aria-label={`Remove ${t}`} onClick={() => apply('remove', k, i, j)}>×</button></li>;
        })}
        {edges.length === 0 && <li className="lf-steps-note">No edges yet.</li>}
      </ul>
    </section>
  );
}

function ReasonList({ lines }: { lines: string[] }) {
  const first = lines.slice(0, 8);
  const rest = lines.slice(8);
  return (
    <>
      <ul className="lf-steps-reasons" data-testid="steps-reasons">{first.map((t) => <li key={t}>{t}</li>)}</ul>
      {rest.length > 0 && (
        <details>
          <summary>{rest.length} more</summary>
          <ul className="lf-steps-reasons">{rest.map((t) => <li key={t}>{t}</li>)}</ul>
        </details>
      )}
    </>
  );
}

function InverseSection({ graph, rate, maxRate, fromFile }: { graph: MeasuredGraph; rate: number; maxRate: number; fromFile: boolean }) {
  const [scope, setScope] = useState<'rate' | 'any'>(fromFile ? 'any' : 'rate');
  const [progress, setProgress] = useState<InverseProgress | null>(null);
  const [outcome, setOutcome] = useState<(InverseOutcome & { key: string }) | null>(null);
  const run = useRef<InverseRun | null>(null);
  const rates = scope === 'rate' ? [rate] : Array.from({ length: maxRate }, (_, i) => i + 1);
  const key = JSON.stringify([graph.directed, graph.bidirected, rates]);
  const limit = inverseLimit(graph);
  useEffect(() => () => run.current?.cancel(), []);
  const start = () => {
    run.current?.cancel();
    setOutcome(null);
    setProgress({ rate: rates[0], rateIndex: 0, rates: rates.length, nodes: 0, fraction: 0, count: 0 });
    // Cancel before the client has loaded still stops the run.
    let stopped = false;
    const pending: InverseRun = { result: Promise.resolve(null), cancel: () => { stopped = true; setProgress(null); setOutcome({ status: 'cancelled', key }); } };
    run.current = pending;
    void appUndersampleClient().then((client) => {
      if (stopped || run.current !== pending) return;
      const r = client.runInverse({ graph, rates, maxSolutions: 200 }, setProgress);
      run.current = r;
      void r.result.then((o) => {
        if (run.current !== r || o === null) return;
        run.current = null;
        setProgress(null);
        setOutcome({ ...o, key });
      });
    });
  };
  const busy = progress !== null;
  const fresh = outcome && outcome.key === key ? outcome : null;
  return (
    <section className="lf-steps-section" aria-labelledby="lf-steps-back" data-testid="steps-inverse">
      <h3 id="lf-steps-back">Back to the causal step</h3>
      <p className="lf-steps-note">Which causal-step graphs give {fromFile ? 'the measured graph from the file' : 'the measured graph shown'}? Up to {SEARCH_MAX_VARIABLES} variables an exact search, above that a solver (up to 10).</p>
      <fieldset>
        <legend>Rates</legend>
        <label><input type="radio" name="lf-steps-scope" checked={scope === 'rate'} onChange={() => setScope('rate')} /> at u = {rate}</label>
        <label><input type="radio" name="lf-steps-scope" checked={scope === 'any'} onChange={() => setScope('any')} /> at any u ≤ {maxRate}</label>
      </fieldset>
      <div className="lf-steps-row">
        <button type="button" onClick={start} disabled={busy || limit !== null}>Find causal graphs</button>
        {busy && (
          <>
            <progress className="lf-steps-progress" max={1} value={(progress.rateIndex + progress.fraction) / progress.rates} aria-label="Search progress" />
            <span className="lf-steps-note" data-testid="steps-progress">u = {progress.rate}: {progress.nodes.toLocaleString('en')} nodes, {progress.count.toLocaleString('en')} found</span>
            <button type="button" onClick={() => { run.current?.cancel(); }}>Cancel</button>
          </>
        )}
      </div>
      {limit && <p className="lf-steps-note">{limit}.</p>}
      {outcome?.status === 'cancelled' && outcome.key === key && <p className="lf-steps-note" role="status">The search was stopped.</p>}
      {fresh?.status === 'done' && <InverseResult graph={graph} rates={rates} outcome={fresh} />}
    </section>
  );
}

function InverseResult({ graph, rates, outcome }: { graph: MeasuredGraph; rates: number[]; outcome: Extract<InverseOutcome, { status: 'done' }> }) {
  const a = outcome.answer;
  if (!a.ok) return <p className="lf-steps-error" role="alert">{a.reason}</p>;
  const r = a.answer;
  const where = rates.length === 1 ? `at u = ${rates[0]}` : `at any u ≤ ${rates[rates.length - 1]}`;
  const cost = r.byRate.map((b) => `u = ${b.rate}: ${b.method}, ${b.nodes.toLocaleString('en')} nodes, ${b.ms} ms`).join('; ');
  const names = graph.names;
  return (
    <div role="status" data-testid="steps-result" data-count={r.count}>
      {r.count === 0 ? (
        <>
          <p><strong>{r.complete ? `No causal graph ${where} gives this measured graph.` : `No causal graph ${where} was found before the search stopped.`}</strong></p>
          <p className="lf-steps-note">This is the common case for graphs estimated from data: one edge missed or added by a test is enough.</p>
          {a.nearest && a.nearest.graphs.length > 0 && (
            <>
              <p>The nearest measured graphs a causal graph does give ({a.nearest.distance} edge{a.nearest.distance === 1 ? '' : 's'} changed{a.nearest.complete ? '' : '; the search for nearer ones stopped at its budget'}):</p>
              <ul className="lf-steps-solutions">
                {a.nearest.graphs.map((g, k) => {
                  const nm = (p: [number, number][], s: string, arrow: string) => p.map(([i, j]) => `${s} ${names[i]} ${arrow} ${names[j]}`);
                  const changes = [...nm(g.added.directed, '+', '→'), ...nm(g.added.bidirected, '+', '↔'), ...nm(g.removed.directed, '−', '→'), ...nm(g.removed.bidirected, '−', '↔')];
                  return <li key={k}>u = {g.rates.join(', ')}: {changes.join(', ')} <span className="lf-steps-edges">(e.g. from {edgesText(names, g.example)})</span></li>;
                })}
              </ul>
            </>
          )}
        </>
      ) : (
        <>
          <p><strong>{r.count.toLocaleString('en')}{r.complete ? '' : ' or more'} causal-step graph{r.count === 1 ? '' : 's'} {where} give{r.count === 1 ? 's' : ''} this measured graph.</strong></p>
          {r.byRate.filter((b) => b.count > 0).map((b) => (
            <p key={b.rate} className="lf-steps-edges">
              u = {b.rate}: {b.count.toLocaleString('en')}; in every one: {edgesText(names, b.always)}; in some only: {edgesText(names, b.sometimes.map((x, i) => x & ~b.always[i]))}
            </p>
          ))}
          <ul className="lf-steps-solutions">
            {r.solutions.slice(0, 12).map((s, k) => <li key={k}>u = {s.rate}: {edgesText(names, s.directed)}</li>)}
          </ul>
          {r.count > 12 && <p className="lf-steps-note">… and {(r.count - 12).toLocaleString('en')} more (the command line lists them: loopfold unsample GRAPH.json --json).</p>}
        </>
      )}
      <p className="lf-steps-note" data-testid="steps-cost">Cost: {cost} (in the {outcome.where}).</p>
    </div>
  );
}
