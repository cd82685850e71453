/**
 * The Pictures pane: what studies of the mechanism would see — the network
 * within persons at the study's interval, the factor picture across persons,
 * the lagged matrix over a long interval — each with a one-line reading, and
 * the probability of each ordering when timescales are ranges. Loaded on
 * demand (React.lazy); the core runs in the pictures worker.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { readTimescale } from '../../core/model/timescale';
import { DEFAULT_PERSONS, defaultObserved, type Level } from '../../core/pictures/index';
import { useValidatedModel } from '../../state/document';
import { designOf } from '../../state/study';
import { useSessionStudy } from '../../state/session';
import { studyPrompts } from '../../core/study/schedule';
import { factorFigure, laggedMatrixFigure, rankCurveCaption, rankCurveFigure, withinNetworkFigure } from '../../export/pictures';
import { svgDocument } from '../../export/svg';
import { sideBySideFigure } from '../../export/picturesSideBySide';
import type { El } from '../../export/scene';
import type { FigureOptions } from '../../export/charts';
import { elToReact } from '../elReact';
import { useModalFocus } from '../modal';
import { fileStem } from '../figureFiles';
import { ExportButtons } from '../numbers/ExportButtons';
import { appPicturesClient } from '../../worker/picturesClient';
import type { PicturesAnswer, ProbabilitiesAnswer } from '../../worker/picturesApi';
import './pictures.css';
import { fixedText, labelOf } from '../../present/index';

export default function PicturesPane() {
  const model = useValidatedModel();
  if (!model) return <p className="lf-pictures lf-pic-note">The pictures appear once the model has no problems left (see the Edit tab).</p>;
  return <PicturesOf model={model} />;
}

const LEVEL_WORDS: Record<Level, string> = { within: 'within persons', between: 'across persons (person means)', cross: 'one-time survey' };

function Figure({ el, what, name, print }: { el: El | null; what: string; name: string; print?: Parameters<typeof ExportButtons>[0]['print'] }) {
  if (!el) return <p className="lf-pic-note">Not defined here.</p>;
  return (
    <>
      <div className="lf-pic-figure">{elToReact(el)}</div>
      <ExportButtons what={what} name={name} svg={() => svgDocument(el)} print={print} />
    </>
  );
}

function PicturesOf({ model }: { model: Model }) {
  const session = useSessionStudy();
  const interval = session && Number.isFinite(session.interval) ? session.interval : null;
  // the study's length and prompts, through the core's conversion (null only while the model does not check out)
  const length = session?.length ?? null;
  const study = session?.study;
  const states = model.variables.filter((v) => v.kind === 'state').map((v) => v.id);
  const inputs = model.variables.filter((v) => v.kind === 'input');
  // the checked model carries no study: the persons come from the session's study
  const [persons, setPersons] = useState(study?.persons !== undefined && study.persons >= 2 ? study.persons : DEFAULT_PERSONS);
  const [observed, setObserved] = useState<string[] | null>(null);
  const [personSD, setPersonSD] = useState<Record<string, number>>({});
  const [level, setLevel] = useState<Level>('between');
  const [wide, setWide] = useState(false);
  const [answer, setAnswer] = useState<PicturesAnswer | null>(null);
  // the side-by-side view is modal: the focus stays inside and goes back to its button when it closes
  const overlay = useRef<HTMLDivElement>(null);
  const overlayOpen = wide && !!answer?.ok;
  useModalFocus(overlay, overlayOpen);
  useEffect(() => { if (overlayOpen) overlay.current?.querySelector<HTMLElement>('.lf-pic-overlay-head button')?.focus(); }, [overlayOpen]);
  const obs = (observed ?? defaultObserved(model)).filter((id) => states.includes(id));
  const samples = useMemo(() => {
    if (interval === null || !study) return null;
    try {
      return studyPrompts(study, model.timeUnit, interval);
    } catch {
      return null;
    }
  }, [study, model.timeUnit, interval]);
  const sdOverrides = useMemo(() => Object.fromEntries(inputs.map((v) => [v.id, personSD[v.id] ?? v.personSD ?? 0])), [inputs, personSD]);

  useEffect(() => {
    if (interval === null || samples === null) return;
    let live = true;
    void appPicturesClient().then((c) => c.pictures(model, { interval, samples, persons, observed: obs, personSD: sdOverrides, factors: 2 })).then((a) => { if (live && a) setAnswer(a); });
    return () => { live = false; };
  }, [model, interval, samples, persons, obs.join(','), JSON.stringify(sdOverrides)]); // eslint-disable-line react-hooks/exhaustive-deps

  if (interval === null || samples === null || length === null) return <p className="lf-pictures lf-pic-note">Choose a sampling interval and a study length (Study tab, or the track below the canvas).</p>;
  const stem = fileStem(model.name);
  const caption = `Model-based: what a study every ${formatDuration(interval, model.timeUnit)} with ${samples} prompts and ${persons} persons would see if the mechanism were true; not a finding.`;
  const file = { heading: true, caption };
  const P = answer?.ok ? answer.pictures : null;
  const pictures = P
    ? [
        { key: 'within', title: 'Within persons', reading: P.within.reading + ' ' + P.byLevel.within.reading, el: withinNetworkFigure(model, P.within), file: (o: FigureOptions = file) => withinNetworkFigure(model, P.within, o), name: `${stem}-within-network` },
        { key: 'factor', title: `Factor picture ${LEVEL_WORDS[level]}`, reading: P.byLevel[level].reading, el: factorFigure(model, P.levels.observed, P.byLevel[level]), file: (o: FigureOptions = file) => factorFigure(model, P.levels.observed, P.byLevel[level], o), name: `${stem}-factor-${level}` },
        { key: 'long', title: `Lagged matrix every ${formatDuration(P.rankLong.interval, model.timeUnit)}`, reading: P.longReading, el: laggedMatrixFigure(model, P.rankLong), file: (o: FigureOptions = file) => laggedMatrixFigure(model, P.rankLong, o), name: `${stem}-lagged-matrix` },
      ]
    : [];
  const row = (
    <div className={`lf-pic-row${wide ? ' is-wide' : ''}`} data-pictures={P ? 'ready' : 'waiting'}>
      {pictures.map((p) => (
        <section key={p.key} className="lf-pic-card" aria-label={p.title} data-picture={p.key}>
          <h4>{p.title}</h4>
          <p className="lf-pic-reading">{p.reading}</p>
          {p.el ? <div className="lf-pic-figure">{elToReact(p.el)}</div> : <p className="lf-pic-note">Not defined here.</p>}
          {p.el && <ExportButtons what={p.title.toLowerCase()} name={p.name} svg={() => svgDocument(p.file()!)} print={{ modelFile: `${stem}.json`, source: () => ({ kind: 'chart', build: p.file, caption }) }} />}
        </section>
      ))}
    </div>
  );
  return (
    <div className="lf-pictures" aria-label="Pictures a study would see">
      <p className="lf-pic-note">One mechanism, different pictures: what a study of this sketch would see within persons, across persons and over long intervals. Model-based hypotheses, not findings.{model.caution ? ` ${model.caution}` : ''}</p>
      <div className="lf-pic-controls">
        <label>Persons <input type="number" min={2} step={1} value={persons} onChange={(e) => { const n = Number(e.target.value); if (Number.isInteger(n) && n >= 2) setPersons(n); }} /></label>
        <span>{samples} prompts each, every {formatDuration(interval, model.timeUnit)}</span>
        <label>Factor picture <select value={level} onChange={(e) => setLevel(e.target.value as Level)}>
          <option value="between">across persons (person means)</option>
          <option value="cross">one-time survey</option>
          <option value="within">within persons</option>
        </select></label>
        <button type="button" onClick={() => setWide(true)} disabled={!P}>Side by side, full width</button>
      </div>
      <fieldset className="lf-pic-observed">
        <legend>Variables analysed (states)</legend>
        {states.map((id) => (
          <label key={id}><input type="checkbox" checked={obs.includes(id)} onChange={(e) => setObserved(e.target.checked ? [...obs, id] : obs.filter((x) => x !== id))} /> {labelOf(model, id)}</label>
        ))}
      </fieldset>
      {inputs.length > 0 && (
        <fieldset className="lf-pic-observed">
          <legend>Person differences: SD of each input across persons</legend>
          {inputs.map((v) => (
            <label key={v.id}>{v.label ?? v.id} <input type="number" min={0} step={0.1} aria-label={`SD of ${v.label ?? v.id} across persons`} value={sdOverrides[v.id]} onChange={(e) => { const x = Number(e.target.value); if (x >= 0) setPersonSD({ ...personSD, [v.id]: x }); }} /></label>
          ))}
        </fieldset>
      )}
      {answer && !answer.ok && <p className="lf-pic-error" role="alert">{answer.reason}</p>}
      {!answer && <p className="lf-pic-note">Working out the pictures…</p>}
      {P && (
        <>
          <ul className="lf-pic-summary" aria-label="Readings">{P.summary.map((s) => <li key={s}>{s}</li>)}</ul>
          {!wide && row}
          {wide && (
            <div ref={overlay} className="lf-pic-overlay" role="dialog" aria-modal="true" aria-label="The three pictures side by side" onKeyDown={(e) => { if (e.key === 'Escape') setWide(false); }}>
              <div className="lf-pic-overlay-head"><strong>{model.name}: three pictures at {formatDuration(interval, model.timeUnit)}</strong>{model.caution && <span className="lf-pic-note">{model.caution}</span>}<button type="button" onClick={() => setWide(false)}>Close</button></div>
              {row}
              <ExportButtons what="the three pictures side by side" name={`${stem}-three-pictures`} svg={() => svgDocument(sideBySideFigure(`${model.name}: three pictures at ${formatDuration(interval, model.timeUnit)}`, pictures.map((p) => ({ key: p.key, title: p.title, reading: p.reading, figure: p.el })), { heading: true, caption: model.caution ? `${caption} ${model.caution}` : caption }))} />
            </div>
          )}
          <h4>How the lagged matrix approaches rank one as the interval grows</h4>
          {/* print options: the builder and caption of `loopfold rank --out` (the same observed states, in the same order) */}
          <Figure el={rankCurveFigure(model, P)} what="the singular value ratios" name={`${stem}-rank-curve`} print={{ modelFile: `${stem}.json`, source: () => ({ kind: 'chart', build: (o: FigureOptions) => rankCurveFigure(model, P, o), caption: rankCurveCaption(model, P), cli: ['rank', '--interval', String(interval), '--observed', obs.join(','), '--caption'] }) }} />
          <FitTable answer={P} />
          {P.warnings.length > 0 && <ul className="lf-pic-warnings">{P.warnings.map((w) => <li key={w}>{w}</li>)}</ul>}
        </>
      )}
      <UncertainOrderings model={model} interval={interval} samples={samples} length={length} />
    </div>
  );
}

function FitTable({ answer }: { answer: Extract<PicturesAnswer, { ok: true }>['pictures'] }) {
  const f = (x: number | null | undefined, d = 3) => (x === null || x === undefined ? '—' : fixedText(x, d, { ascii: true }));
  return (
    <table className="lf-pic-table" aria-label="Factor fits by level">
      <thead><tr><th>level</th><th>N</th><th>χ² (1 factor)</th><th>df</th><th>RMSEA</th><th>first eigenvalue</th><th>RMSEA, 2 factors</th></tr></thead>
      <tbody>
        {(['within', 'between', 'cross'] as const).map((l) => {
          const p = answer.byLevel[l];
          return (
            <tr key={l} data-level={l}>
              <td>{LEVEL_WORDS[l]}</td><td>{p.n}</td><td>{f(p.oneFactor?.chi2, 1)}</td><td>{p.oneFactor?.df ?? '—'}</td><td>{f(p.oneFactor?.rmsea)}</td><td>{f(p.oneFactor?.eigenvalues[0], 2)}</td><td>{f(p.kFactor?.rmsea)}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function UncertainOrderings({ model, interval, samples, length }: { model: Model; interval: number; samples: number; length: { by: 'samples'; samples: number } | { by: 'window'; window: number } }) {
  const ranged = model.variables.filter((v) => v.kind === 'state' && v.timescale !== undefined && (() => { const r = readTimescale(v.timescale!, model.timeUnit); return r.ok && r.uncertain; })());
  const [draws, setDraws] = useState(2000);
  const [seed, setSeed] = useState(1);
  const [answer, setAnswer] = useState<ProbabilitiesAnswer | null>(null);
  useEffect(() => {
    if (ranged.length === 0) return;
    let live = true;
    const design = { ...designOf({ interval, length }), interval };
    void appPicturesClient().then((c) => c.probabilities(model, design, draws, seed)).then((a) => { if (live && a) setAnswer(a); });
    return () => { live = false; };
  }, [model, interval, samples, draws, seed, JSON.stringify(length)]); // eslint-disable-line react-hooks/exhaustive-deps
  return (
    <section className="lf-pic-uncertain" aria-label="Orderings under uncertain timescales">
      <h4>Orderings under uncertain timescales</h4>
      {ranged.length === 0 ? (
        <p className="lf-pic-note">Every timescale is a single value. Type a range such as "30 min..3 h" as a state's timescale to see how sure the ordering is.</p>
      ) : (
        <>
          <div className="lf-pic-controls">
            <label>Draws <input type="number" min={100} step={100} value={draws} onChange={(e) => { const n = Number(e.target.value); if (Number.isInteger(n) && n >= 1 && n <= 200000) setDraws(n); }} /></label>
            <label>Seed <input type="number" step={1} value={seed} onChange={(e) => { const n = Number(e.target.value); if (Number.isInteger(n)) setSeed(n); }} /></label>
            <span className="lf-pic-note">Timescales log-uniform in their ranges; point analyses elsewhere use the geometric mean of each range.</span>
          </div>
          {answer && !answer.ok && <p className="lf-pic-error" role="alert">{answer.reason}</p>}
          {answer?.ok && (
            <>
              <ul className="lf-pic-summary" data-probabilities={answer.result.probabilities.length}>{answer.result.readings.map((r) => <li key={r}>{r}</li>)}</ul>
              <table className="lf-pic-table" aria-label="Probability of each ordering">
                <thead><tr><th>share of draws</th><th>roles that decide it</th><th>simultaneous blocks</th></tr></thead>
                <tbody>
                  {answer.result.probabilities.map((p, i) => (
                    <tr key={i}>
                      <td>{fixedText(p.share * 100, 1, { ascii: true })} %</td>
                      <td>{Object.entries(p.deciding).map(([id, r]) => `${labelOf(model, id)} ${r === 'state' ? 'dynamic' : r}`).join(', ') || '—'}</td>
                      <td>{p.blocks.filter((b) => b.variables.length > 1).map((b) => b.variables.join(' + ')).join('; ') || 'none'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </>
          )}
        </>
      )}
    </section>
  );
}
