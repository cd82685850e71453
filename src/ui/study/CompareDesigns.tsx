/**
 * Compare designs: up to three whole schedules side by side (prompts in a
 * daily window, at a fixed interval day and night, daily, weekly), over the
 * same weeks, persons and missed prompts. One row per design, each with the
 * causal ordering at its interval, the lagged and same-interval networks at
 * that interval, and what a VAR over its consecutive prompts estimates
 * (night gaps and missed prompts included). The networks come from the
 * numeric worker's lane, drawn by the one renderer (src/export/); the
 * orderings are laid out by ELK's worker.
 */
import { useEffect, useRef, useState } from 'react';
import type { Model, Schedule, Study } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { orderingAt } from '../../core/ordering/index';
import { designOfStudy, parseInterval, studyInterval } from '../../core/study/convert';
import { orderingView } from '../../core/view/derive';
import { laggedNetwork, networkDiagram, sameIntervalNetwork } from '../../export/charts';
import { buildScene, type El } from '../../export/scene';
import { browserElk } from '../../layout/browser';
import { figureLayout } from '../../layout/figure';
import { editStudy, type SessionStudy } from '../../state/session';
import type { SampledAnswer, StudyDesignReport } from '../../worker/numericApi';
import { elToReact } from '../elReact';
import { useModalFocus } from '../modal';
import { NetworkDiagram } from '../numbers/NetworkDiagram';
import { isFailed, useNumeric } from '../numbers/useNumeric';
import { designText, designWith, MAX_DESIGNS, sameDesign, startingDesigns } from './compare';
import { clockText, patchProblem, scheduleOfKind, wholeNumber } from './edit';


const KINDS: { kind: Schedule['kind']; text: string }[] = [
  { kind: 'daily-window', text: 'in a daily window' },
  { kind: 'fixed', text: 'at a fixed interval, day and night' },
  { kind: 'daily', text: 'once a day' },
  { kind: 'weekly', text: 'once a week' },
];

export function CompareDesigns({ model, s, onClose }: { model: Model; s: SessionStudy; onClose(): void }) {
  const ref = useRef<HTMLDialogElement>(null);
  const unit = model.timeUnit;
  const [designs, setDesigns] = useState<Study[]>(() => startingDesigns(s.study, unit));
  useModalFocus(ref, true);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
  }, []);
  const length = designs[0]?.length ?? s.study.length;
  const add = () => {
    const next = startingDesigns(s.study, unit).find((c) => !designs.some((d) => sameDesign(d, c, unit))) ?? designWith(s.study, unit, { kind: 'weekly' });
    setDesigns((xs) => [...xs, next]);
  };
  return (
    <dialog ref={ref} className="lf-dialog lf-compare" aria-labelledby="lf-compare-title" onClose={onClose}>
      <h2 id="lf-compare-title">Compare designs</h2>
      <p className="lf-hint">
        One row per schedule, each over the study's {String(length)}
        {s.study.persons ? `, ${s.study.persons} persons` : ''}
        {s.study.missedPrompts ? `, ${Math.round(s.study.missedPrompts * 100)} % of prompts missed` : ''}: the causal ordering a study at its interval sees, the lagged and same-interval networks at that interval (the same-interval network depends on the process noise of each state), and what a VAR over its consecutive prompts estimates, night gaps and missed prompts included.
      </p>
      <div className="lf-compare-rows">
        {designs.map((d, i) => (
          <DesignRow
            key={i}
            model={model}
            s={s}
            design={d}
            index={i}
            onChange={(next) => setDesigns((xs) => xs.map((x, k) => (k === i ? next : x)))}
            onRemove={designs.length > 1 ? () => setDesigns((xs) => xs.filter((_, k) => k !== i)) : undefined}
          />
        ))}
      </div>
      <p>
        {designs.length < MAX_DESIGNS && <button type="button" onClick={add}>Add a design</button>}{' '}
        <button type="button" onClick={() => ref.current?.close()}>Close</button>
      </p>
    </dialog>
  );
}

/** A text field of a design row: stored on Enter or when left; a problem stays with a message naming the field. */
function RowField({ label, value, size, check }: { label: string; value: string; size: number; check(text: string): string | null }) {
  const [text, setText] = useState(value);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => { setText(value); setProblem(null); }, [value]);
  const commit = () => { if (text !== value) setProblem(check(text)); };
  return (
    <>
      <input
        aria-label={label}
        value={text}
        size={size}
        aria-invalid={problem ? true : undefined}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') { e.preventDefault(); commit(); }
          if (e.key === 'Escape') { e.stopPropagation(); e.preventDefault(); setText(value); setProblem(null); }
        }}
      />
      {problem && <span className="lf-field-error" role="alert">{problem}</span>}
    </>
  );
}

function DesignRow({ model, s, design, index, onChange, onRemove }: { model: Model; s: SessionStudy; design: Study; index: number; onChange(d: Study): void; onRemove?: () => void }) {
  const unit = model.timeUnit;
  const n = index + 1;
  const at = studyInterval(design, unit);
  const sch = design.schedule;
  const text = designText(design, unit);
  /** Apply a change of the schedule or interval; the message names the field when the design does not check out. */
  const change = (schedule: Schedule, interval?: Study['interval']): string | null => {
    const next = designWith(design, unit, schedule, interval ?? design.interval);
    const problem = patchProblem(design, { schedule: next.schedule, interval: next.interval }, model);
    if (problem) return problem;
    onChange(next);
    return null;
  };
  const inUse = sameDesign(design, s.study, unit);
  const sampled = useNumeric<SampledAnswer>(at !== undefined && at > 0 ? (c) => c.askIn(`compare-${index}`, 'sampled', model, at) : null, [model, at, index]);
  const estimated = useNumeric<{ ok: true; report: StudyDesignReport }>((c) => c.askIn(`compare-${index}`, 'design', model, design), [model, design, index]);
  const answer = sampled.status === 'done' ? sampled.answer : undefined;
  const report = estimated.status === 'done' ? estimated.answer : undefined;
  return (
    <section className="lf-compare-row" aria-label={`Design ${n}: ${text}`} data-design={index} data-kind={sch.kind}>
      <div className="lf-compare-head">
        <span className="lf-compare-name">Design {n}: {text}</span>
        <button
          type="button"
          disabled={inUse}
          aria-label={inUse ? `Use design ${n}: in use (${text}, the study’s design)` : `Use design ${n} (${text}) as the study`}
          title={inUse ? 'The study uses this design' : 'Set the study’s schedule and interval to this design (undo brings back the one before)'}
          onClick={() => editStudy({ schedule: design.schedule, interval: design.interval })}
        >
          {inUse ? `Use design ${n}: in use` : `Use design ${n}`}
        </button>
        {onRemove && <button type="button" aria-label={`Remove design ${n}`} onClick={onRemove}>Remove</button>}
      </div>
      <div className="lf-compare-edit">
        <label>
          Prompts come{' '}
          <select aria-label={`Schedule of design ${n}`} value={sch.kind} onChange={(e) => change(scheduleOfKind(e.target.value as Schedule['kind'], sch))}>
            {KINDS.map((k) => <option key={k.kind} value={k.kind}>{k.text}</option>)}
          </select>
        </label>
        {sch.kind === 'fixed' && (
          <label>
            every{' '}
            <RowField
              label={`Interval of design ${n}`}
              value={String(design.interval)}
              size={8}
              check={(t) => {
                const p = parseInterval(t, unit);
                if (!p.ok) return `Interval: ${p.message}`;
                if (!(p.value > 0)) return 'Interval: must be longer than zero';
                return change(sch, t.trim());
              }}
            />
          </label>
        )}
        {sch.kind === 'daily-window' && (
          <>
            <label>
              <RowField label={`Prompts per day of design ${n}`} value={String(sch.promptsPerDay)} size={3} check={(t) => { const w = wholeNumber(t, 'Prompts per day', 1); return w.ok ? change({ ...sch, promptsPerDay: w.value }) : w.message; }} />{' '}
              a day
            </label>
            <label>
              from <RowField label={`First prompt of design ${n}`} value={sch.from} size={5} check={(t) => change({ ...sch, from: clockText(t) })} />
            </label>
            <label>
              to <RowField label={`Last prompt of design ${n}`} value={sch.to} size={5} check={(t) => change({ ...sch, to: clockText(t) })} />
            </label>
            <select aria-label={`Timing of design ${n}`} value={sch.timing} onChange={(e) => change({ ...sch, timing: e.target.value as 'fixed' | 'stratified-random' })}>
              <option value="stratified-random">stratified random</option>
              <option value="fixed">evenly spaced</option>
            </select>
          </>
        )}
        {at !== undefined && sch.kind !== 'fixed' && <span className="lf-hint">nominal interval {formatDuration(at, unit)}</span>}
      </div>
      <div className="lf-compare-figures">
        <figure className="lf-compare-ordering">
          <figcaption>Causal ordering at {at !== undefined ? formatDuration(at, unit) : '—'}</figcaption>
          {at !== undefined && at > 0 ? <OrderingFigure model={model} design={design} /> : null}
        </figure>
        <figure>
          <figcaption>Lagged network</figcaption>
          {answer === undefined ? <p className="lf-hint">Working out…</p> : isFailed(answer) ? <p className="lf-field-error">{answer.reason}</p> : <Net model={model} figure={laggedNetwork(model, answer, false)} none="No lagged effects to draw." />}
        </figure>
        <figure>
          <figcaption>Same-interval network</figcaption>
          {answer === undefined ? <p className="lf-hint">Working out…</p> : isFailed(answer) ? <p className="lf-field-error">{answer.reason}</p> : <Net model={model} figure={sameIntervalNetwork(model, answer)} none="Not defined here: some states receive no noise." />}
        </figure>
        <figure className="lf-compare-estimated" data-status={estimated.status}>
          <figcaption>What a VAR over its prompts estimates</figcaption>
          {report === undefined ? <p className="lf-hint">Working out…</p> : isFailed(report) ? <p className="lf-field-error">{report.reason}</p> : <Estimated model={model} r={report.report} />}
        </figure>
      </div>
    </section>
  );
}

/** The VAR(1) limit over all consecutive prompts as a lagged network, and the night-gap effect in words. */
function Estimated({ model, r }: { model: Model; r: StudyDesignReport }) {
  const figure = networkDiagram({ model, states: r.states, matrix: r.pooled, directed: true, label: `Estimated over consecutive prompts, ${formatDuration(r.interval, r.timeUnit)} nominal` });
  const longest = r.gaps.reduce((m, g) => Math.max(m, g.gap), 0);
  return (
    <>
      <NetworkDiagram model={model} figure={figure} />
      <p className="lf-compare-says">
        {r.shrinkage.length > 0
          ? r.shrinkage[0]
          : longest <= r.interval * 1.01
            ? `Consecutive prompts are ${formatDuration(r.interval, r.timeUnit)} apart: the VAR estimates Φ at that interval.`
            : `Gaps up to ${formatDuration(longest, r.timeUnit)} after missed prompts: the VAR mixes Φ over them.`}
      </p>
    </>
  );
}

function Net({ model, figure, none }: { model: Model; figure: El | null; none: string }) {
  return figure ? <NetworkDiagram model={model} figure={figure} /> : <p className="lf-hint">{none}</p>;
}

/** The ordering at a design's interval over its length, laid out by ELK and drawn by the scene builder. */
function OrderingFigure({ model, design }: { model: Model; design: Study }) {
  const [el, setEl] = useState<El | null | 'failed'>(null);
  const unit = model.timeUnit;
  const key = JSON.stringify([design.interval, design.length, design.holds]);
  useEffect(() => {
    let live = true;
    setEl(null);
    const d = designOfStudy(design, unit);
    void (async () => {
      try {
        const ordering = orderingAt(model, d);
        const vm = orderingView(model, ordering, { mode: 'ordering', interval: d.interval, window: d.window, samples: d.samples });
        const layout = await figureLayout(await browserElk(), vm);
        if (live) setEl(buildScene(vm, layout, { title: false }));
      } catch {
        if (live) setEl('failed');
      }
    })();
    return () => { live = false; };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [model, key, unit]);
  if (el === null) return <p className="lf-hint">Laying out…</p>;
  if (el === 'failed') return <p className="lf-field-error">The ordering at this interval could not be drawn.</p>;
  return elToReact(el, (e) => (e.tag === 'svg' ? { className: 'lf-compare-svg' } : undefined));
}
