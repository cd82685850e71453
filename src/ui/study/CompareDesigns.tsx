/**
 * Compare designs: up to three sampling intervals side by side, one row per
 * design, each with the causal ordering at that interval, the lagged network
 * and the same-interval network, drawn by the one renderer (src/export/).
 * The networks come from the numeric worker's lane in one question; the
 * orderings are laid out by ELK's worker.
 */
import { useEffect, useRef, useState } from 'react';
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { orderingAt } from '../../core/ordering/index';
import { parseInterval } from '../../core/study/convert';
import { orderingView } from '../../core/view/derive';
import { laggedNetwork, sameIntervalNetwork } from '../../export/charts';
import { buildScene, type El } from '../../export/scene';
import { browserElk } from '../../layout/browser';
import { figureLayout } from '../../layout/figure';
import type { SessionStudy } from '../../state/session';
import type { SampledAnswer } from '../../worker/numericApi';
import { elToReact } from '../elReact';
import { NetworkDiagram } from '../numbers/NetworkDiagram';
import { isFailed, useNumeric } from '../numbers/useNumeric';
import { UseInterval } from './UseInterval';

/** The most designs compared at once. */
export const MAX_DESIGNS = 3;

/** The designs the dialog opens with: the study's own interval, then daily and weekly (those the study does not use already). */
export function startingDesigns(s: SessionStudy, unit: Model['timeUnit']): string[] {
  const own = formatDuration(s.interval, unit);
  const out = [own];
  for (const t of ['1 day', '1 week']) {
    const v = parseInterval(t, unit);
    if (v.ok && !out.some((o) => { const w = parseInterval(o, unit); return w.ok && Math.abs(w.value - v.value) <= 1e-9 * v.value; })) out.push(t);
  }
  return out.slice(0, MAX_DESIGNS);
}

export function CompareDesigns({ model, s, onClose }: { model: Model; s: SessionStudy; onClose(): void }) {
  const ref = useRef<HTMLDialogElement>(null);
  const unit = model.timeUnit;
  const [texts, setTexts] = useState<string[]>(() => startingDesigns(s, unit));
  const [drafts, setDrafts] = useState<string[]>(texts);
  const parsed = texts.map((t) => parseInterval(t, unit));
  const intervals = parsed.map((p) => (p.ok ? p.value : NaN));
  const sampled = useNumeric<{ ok: true; answers: (SampledAnswer | { ok: false; reason: string })[] }>((c) => c.ask('sampledAt', model, intervals.filter((x) => x > 0)), [model, intervals.join('|')]);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
  }, []);
  const problems = drafts.map((d) => { const p = parseInterval(d, unit); return p.ok ? (p.value > 0 ? null : 'Interval: must be longer than zero') : `Interval: ${p.message}`; });
  const commit = (i: number) => {
    if (problems[i] || drafts[i] === texts[i]) return;
    setTexts((xs) => xs.map((x, k) => (k === i ? drafts[i] : x)));
  };
  let k = 0;
  return (
    <dialog ref={ref} className="lf-dialog lf-compare" aria-labelledby="lf-compare-title" onClose={onClose}>
      <h2 id="lf-compare-title">Compare designs</h2>
      <p className="lf-hint">One row per sampling interval, with the study's length ({s.length.by === 'window' ? formatDuration(s.length.window, unit) : `${s.length.samples} prompts`}): the causal ordering a study at that interval sees, and the lagged and same-interval networks it would estimate (in expectation; the same-interval network depends on the process noise of each state).</p>
      <div className="lf-compare-rows">
        {texts.map((t, i) => {
          const at = intervals[i];
          const answer = sampled.status === 'done' && !isFailed(sampled.answer) && at > 0 ? sampled.answer.answers[k++] : undefined;
          return (
            <section key={i} className="lf-compare-row" aria-label={`Design ${i + 1}: every ${t}`} data-design={i}>
              <div className="lf-compare-head">
                <label>
                  Design {i + 1}: every{' '}
                  <input
                    aria-label={`Interval of design ${i + 1}`}
                    value={drafts[i]}
                    aria-invalid={problems[i] ? true : undefined}
                    onChange={(e) => setDrafts((xs) => xs.map((x, j) => (j === i ? e.target.value : x)))}
                    onBlur={() => commit(i)}
                    onKeyDown={(e) => { if (e.key === 'Enter') { e.preventDefault(); commit(i); } }}
                    size={10}
                  />
                </label>
                {problems[i] && <span className="lf-field-error" role="alert">{problems[i]}</span>}
                {at > 0 && <UseInterval value={at} unit={unit} what={`design ${i + 1}`} />}
                {texts.length > 1 && <button type="button" aria-label={`Remove design ${i + 1}`} onClick={() => { setTexts((xs) => xs.filter((_, j) => j !== i)); setDrafts((xs) => xs.filter((_, j) => j !== i)); }}>Remove</button>}
              </div>
              <div className="lf-compare-figures">
                <figure className="lf-compare-ordering">
                  <figcaption>Causal ordering</figcaption>
                  {at > 0 ? <OrderingFigure model={model} interval={at} s={s} /> : null}
                </figure>
                <figure>
                  <figcaption>Lagged network</figcaption>
                  {answer === undefined ? <p className="lf-hint">Working out…</p> : isFailed(answer) ? <p className="lf-field-error">{answer.reason}</p> : <Net model={model} figure={laggedNetwork(model, answer, false)} none="No lagged effects to draw." />}
                </figure>
                <figure>
                  <figcaption>Same-interval network</figcaption>
                  {answer === undefined ? <p className="lf-hint">Working out…</p> : isFailed(answer) ? <p className="lf-field-error">{answer.reason}</p> : <Net model={model} figure={sameIntervalNetwork(model, answer)} none="Not defined here: some states receive no noise." />}
                </figure>
              </div>
            </section>
          );
        })}
      </div>
      <p>
        {texts.length < MAX_DESIGNS && <button type="button" onClick={() => { setTexts((xs) => [...xs, '1 month']); setDrafts((xs) => [...xs, '1 month']); }}>Add a design</button>}{' '}
        <button type="button" onClick={() => ref.current?.close()}>Close</button>
      </p>
    </dialog>
  );
}

function Net({ model, figure, none }: { model: Model; figure: El | null; none: string }) {
  return figure ? <NetworkDiagram model={model} figure={figure} /> : <p className="lf-hint">{none}</p>;
}

/** The ordering at an interval over the study's length, laid out by ELK and drawn by the scene builder. */
function OrderingFigure({ model, interval, s }: { model: Model; interval: number; s: SessionStudy }) {
  const [el, setEl] = useState<El | null | 'failed'>(null);
  const length = s.length;
  useEffect(() => {
    let live = true;
    setEl(null);
    const design = length.by === 'window' ? { interval, window: length.window, hold: s.holds } : { interval, samples: length.samples, hold: s.holds };
    void (async () => {
      try {
        const ordering = orderingAt(model, design);
        const vm = orderingView(model, ordering, { mode: 'ordering', interval, window: design.window, samples: design.samples });
        const layout = await figureLayout(await browserElk(), vm);
        if (live) setEl(buildScene(vm, layout, { title: false }));
      } catch {
        if (live) setEl('failed');
      }
    })();
    return () => { live = false; };
  }, [model, interval, length, s.holds]);
  if (el === null) return <p className="lf-hint">Laying out…</p>;
  if (el === 'failed') return <p className="lf-field-error">The ordering at this interval could not be drawn.</p>;
  return elToReact(el, (e) => (e.tag === 'svg' ? { className: 'lf-compare-svg' } : undefined));
}
