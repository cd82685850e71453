/**
 * The sampling-interval control: a logarithmic track from the model's
 * fastest to its slowest timescale (with a margin), ticks at breakpoints,
 * keys that stop at every breakpoint; beside it the study length, as a
 * duration or a number of samples.
 */
import { memo, useEffect, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { Model, Study, TimeUnit } from '../../core/model/types';
import { formatDuration, SECONDS_PER_UNIT } from '../../core/model/units';
import { fromPosition, passed, stepInterval, toPosition, type IntervalKey, type IntervalRange } from '../../core/view/interval';
import { documentStore, useValidatedModel } from '../../state/document';
import { editStudy, setStudyInterval, useSessionStudy, type StudyLength } from '../../state/session';
import { exactDuration, intervalLabel, modelAxis, parseInterval } from '../../core/study/convert';
import { lengthBy, lengthFieldText, lengthOther, switchedLength, typedLength, type LengthBy } from './length';
import { useBandCache, type BandCache } from '../views/bandCache';
import { breakpointRanges, type BreakpointRange } from '../../core/pictures/uncertain';
import { setIntervalDrag } from './dragging';
import { placeLabels, unitMarks } from './scale';
import { fontMeasure } from '../canvas/textFit';
import './interval.css';
import { BREAKPOINT, TRACK_NOTCH } from '../../theme/tokens';
import { labeller } from '../../present/index';

/** The length of a model's own study, as the control reads it (the session's, once it has one). */
function modelLength(model: Model): StudyLength {
  const a = modelAxis(model);
  return a.window !== undefined ? { by: 'window', window: a.window } : { by: 'samples', samples: a.samples };
}

const KEYS: ReadonlySet<string> = new Set(['ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown', 'PageUp', 'PageDown', 'Home', 'End']);

export function IntervalStrip() {
  const model = useValidatedModel();
  return model ? <IntervalStripFor model={model} /> : <div className="lf-interval" aria-label="Sampling interval">Fix the model's problems to choose a sampling interval.</div>;
}

export function IntervalStripFor({ model }: { model: Model }) {
  const session = useSessionStudy();
  const length = useMemo(() => session?.length ?? modelLength(model), [session, model]);
  const interval = session && Number.isFinite(session.interval) ? session.interval : null;
  const holds = session?.holds;
  const hold = holds && Object.keys(holds).length > 0 ? holds : undefined;
  const bc = useBandCache(model, length, hold);
  // Breakpoints of timescales given as ranges: where the change may happen, shaded on the track.
  const ranges = useMemo(() => breakpointRanges(model, length.by === 'window' ? { window: length.window } : { samples: length.samples }), [model, length]);
  const track = useRef<HTMLDivElement>(null);
  const unit = model.timeUnit;
  const cache = bc.status === 'ready' ? bc.cache : null;

  if (bc.status === 'failed') return <div className="lf-interval" role="alert">The breakpoints could not be computed: {bc.message}</div>;
  if (!cache || interval === null) return <div className="lf-interval">Finding the model's timescales…</div>;
  const { range, cuts } = cache;
  const pos = toPosition(range, interval);
  // one drag or run of key steps is one undo step
  const set = (v: number) => setStudyInterval(v, { squash: 'interval' });
  const fromPointer = (ev: PointerEvent) => {
    const r = track.current!.getBoundingClientRect();
    set(fromPosition(range, (ev.clientX - r.left) / r.width));
  };
  const onKey = (ev: KeyboardEvent) => {
    if (!KEYS.has(ev.key)) return;
    ev.preventDefault();
    set(stepInterval(range, cuts, interval, ev.key as IntervalKey));
  };
  const band = cache.band(interval);
  const lower = [...cuts].reverse().find((c) => passed(c, interval))?.at ?? range.min;
  const upper = cuts.find((c) => !passed(c, interval))?.at ?? range.max;
  const valueText = `every ${formatDuration(interval, unit)}`;
  return (
    <div className="lf-interval" aria-label="Sampling interval and study length">
      <div className="lf-interval-head">
        <span className="lf-interval-title" id="lf-interval-label">Sampling interval</span>
        <output className="lf-interval-value" aria-live="polite">{valueText}</output>
        <IntervalField unit={unit} interval={interval} exact={session?.study.interval} />
        <span className="lf-interval-band">band {band + 1} of {cuts.length + 1}</span>
      </div>
      <div
        ref={track}
        className="lf-interval-track"
        role="slider"
        tabIndex={0}
        aria-labelledby="lf-interval-label"
        aria-valuemin={0}
        aria-valuemax={1000}
        aria-valuenow={Math.round(pos * 1000)}
        aria-valuetext={valueText}
        data-band={band}
        data-interval={interval}
        data-interval-seconds={interval * SECONDS_PER_UNIT[unit]}
        onKeyDown={onKey}
        onBlur={() => documentStore.getState().stopGesture()}
        onPointerDown={(ev) => { ev.preventDefault(); documentStore.getState().stopGesture(); ev.currentTarget.setPointerCapture(ev.pointerId); ev.currentTarget.focus(); setIntervalDrag(interval); fromPointer(ev); }}
        onPointerMove={(ev) => { if (ev.currentTarget.hasPointerCapture(ev.pointerId)) fromPointer(ev); }}
        onPointerUp={() => setIntervalDrag(undefined)}
        onPointerCancel={() => setIntervalDrag(undefined)}
        onLostPointerCapture={() => setIntervalDrag(undefined)}
      >
        <TrackMarks cache={cache} model={model} ranges={ranges} />
        <div className="lf-band-current" style={{ left: `${toPosition(range, Math.max(lower, range.min)) * 100}%`, width: `${(toPosition(range, Math.min(upper, range.max)) - toPosition(range, Math.max(lower, range.min))) * 100}%` }} />
        {/* the thumb rides a rail as wide as the track, moved by a transform of the rail's own width:
            the compositor moves it, nothing under it is painted again */}
        <div className="lf-thumb-rail" style={{ transform: `translateX(${pos * 100}%)` }}>
          <div className="lf-thumb" />
        </div>
      </div>
      <UnitScale range={range} unit={unit} />
      {session && <StudyLengthField key={unit} unit={unit} study={session.study} />}
    </div>
  );
}

/** The hatch of every other band, in the control's pixels. */
const HATCH_ID = 'lf-band-hatch';
const TRACK_H = 26;

/**
 * The bands and breakpoint ticks of the control, drawn once per model and
 * study (not on every move of the thumb), in one svg drawn in pixels
 * (its width measured): a model of 2,000 variables has some 1,600 of each,
 * and as positioned boxes they were 3,200 pieces the browser laid out,
 * painted and sorted into layers again at every move of the thumb.
 */
const TrackMarks = memo(function TrackMarks({ cache, model, ranges }: { cache: BandCache; model: Model; ranges: BreakpointRange[] }) {
  const { range, cuts, breakpoints } = cache;
  const unit = model.timeUnit;
  const svg = useRef<SVGSVGElement>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = svg.current;
    if (!el) return;
    const measure = () => setWidth(el.getBoundingClientRect().width);
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const label = labeller(model);
  const edges = [range.min, ...cuts.map((c) => c.at).filter((c) => c > range.min && c < range.max), range.max];
  const X = (v: number) => Math.round(toPosition(range, v) * width * 10) / 10;
  let odd = '';
  for (let i = 1; i + 1 < edges.length; i += 2) odd += `M${X(edges[i])},0 H${X(edges[i + 1])} V${TRACK_H} H${X(edges[i])} Z `;
  return (
    <svg ref={svg} className="lf-track-marks" width="100%" height={TRACK_H} aria-hidden="true">
      <defs>
        <pattern id={HATCH_ID} width={7} height={7} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <rect width={2} height={7} fill={TRACK_NOTCH} />
        </pattern>
      </defs>
      {width > 0 && odd && <path className="lf-bands-odd" d={odd} fill={`url(#${HATCH_ID})`} />}
      {width > 0 &&
        ranges
          .filter((r) => r.high > range.min && r.low < range.max)
          .map((r) => {
            const x0 = X(Math.max(r.low, range.min)), x1 = X(Math.min(r.high, range.max));
            return (
              <rect key={`${r.variable}-${r.to}`} className="lf-bp-range" data-range={r.variable} x={x0} y={3} width={Math.max(1, x1 - x0)} height={TRACK_H - 6} fill={BREAKPOINT} fillOpacity={0.14} stroke={BREAKPOINT} strokeOpacity={0.5} strokeDasharray="3 2">
                <title>{`${label(r.variable)} ${r.from === 'state' ? 'dynamic' : r.from} → ${r.to === 'state' ? 'dynamic' : r.to} somewhere from ${formatDuration(r.low, unit)} to ${formatDuration(r.high, unit)} (its timescale is a range; the tick is at the geometric mean)`}</title>
              </rect>
            );
          })}
      {width > 0 &&
        breakpoints
          .filter((b) => b.interval > range.min && b.interval < range.max)
          .map((b, i) => {
            const x = X(b.interval);
            return (
              <path key={i} className="lf-tick" data-breakpoint={b.interval} d={`M${x},-5 V${TRACK_H + 5} M${x - 4},-8 H${x + 4} L${x},-2 Z`} stroke={BREAKPOINT} strokeWidth={2} fill={BREAKPOINT}>
                <title>{`${formatDuration(b.interval, unit)}${b.exclusive ? ' (just above)' : ''}: ${b.changes.map((c) => `${label(c.variable)} ${c.from} → ${c.to}`).join('; ')}`}</title>
              </path>
            );
          })}
    </svg>
  );
});

function StudyLengthField({ unit, study }: { unit: TimeUnit; study: Study }) {
  // the study's own length, as stored: "14 days" in any time unit, 70 prompts as 70
  const [text, setText] = useState(lengthFieldText(study));
  const [problem, setProblem] = useState<string | null>(null);
  // the length this field stored last: a length set elsewhere (the Study tab, undo, a file) replaces the text
  const stored = useRef<string | number>(study.length);
  useEffect(() => {
    if (study.length === stored.current) return;
    stored.current = study.length;
    setText(lengthFieldText(study));
    setProblem(null);
  }, [study]);
  const by = lengthBy(study);
  const apply = (value: string, as: LengthBy) => {
    setText(value);
    const r = typedLength(value, as, unit);
    if (!r.ok) { setProblem(r.message); return; }
    setProblem(null);
    // typing in the field is one undo step
    if (r.length === study.length) return;
    stored.current = r.length;
    editStudy({ length: r.length }, { squash: 'study-length' });
  };
  const switchTo = (as: LengthBy) => {
    if (as === by) return;
    documentStore.getState().stopGesture();
    apply(String(switchedLength(study, unit, as)), as);
  };
  const other = problem ? null : lengthOther(study, unit);
  return (
    <div className="lf-study">
      <label>
        Study length
        <select value={by === 'duration' ? 'window' : 'samples'} onChange={(e) => switchTo(e.target.value === 'window' ? 'duration' : 'samples')} aria-label="Study length given as">
          <option value="samples">in samples</option>
          <option value="window">as a duration</option>
        </select>
      </label>
      <input
        aria-label={by === 'samples' ? 'Number of samples' : 'Study duration'}
        value={text}
        onChange={(e) => apply(e.target.value, by)}
        onBlur={() => documentStore.getState().stopGesture()}
        aria-invalid={problem ? true : undefined}
        size={9}
      />
      {other && <span className="lf-study-other">{other}</span>}
      {problem && <span className="lf-problem" role="alert">{problem}</span>}
    </div>
  );
}

/**
 * The interval typed exactly: "3h", "90 min", "every 3 h", "daily", "weekly",
 * "5 a day", or any label the app shows. Kept as written with its unit, so a
 * change of the model's time unit leaves it the same real time.
 */
function IntervalField({ unit, interval, exact }: { unit: TimeUnit; interval: number; exact: Study['interval'] | undefined }) {
  const shown = typeof exact === 'string' ? exact : intervalLabel(interval, unit);
  const [text, setText] = useState(shown);
  const [editing, setEditing] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    if (!editing) setText(shown);
  }, [shown, editing]);
  const commit = () => {
    const r = parseInterval(text, unit);
    if (!r.ok) { setProblem(`Interval: ${r.message}`); return; }
    setProblem(null);
    setEditing(false);
    documentStore.getState().stopGesture();
    setStudyInterval(exactDuration(r.value, unit));
  };
  return (
    <span className="lf-interval-typed">
      <input
        aria-label="Type the sampling interval"
        data-testid="interval-text"
        title='Type an interval: "3h", "90 min", "every 3 h", "daily", "weekly", "5 a day"'
        value={text}
        size={12}
        aria-invalid={problem ? true : undefined}
        onFocus={() => setEditing(true)}
        onChange={(e) => { setEditing(true); setText(e.target.value); }}
        onKeyDown={(e) => {
          if (e.key === 'Enter') { e.preventDefault(); commit(); }
          if (e.key === 'Escape') { setEditing(false); setProblem(null); setText(shown); }
        }}
        onBlur={() => { if (editing) commit(); }}
      />
      {problem && <span className="lf-problem" role="alert">{problem}</span>}
    </span>
  );
}

/**
 * The unit labels under the track, measured at the track's width: a label that would overlap
 * another or run past an end keeps only its tick (scale.ts).
 */
function UnitScale({ range, unit }: { range: IntervalRange; unit: TimeUnit }) {
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState<{ width: number; font: string } | null>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const read = () => setSize((s) => (s && s.width === el.clientWidth ? s : { width: el.clientWidth, font: getComputedStyle(el).font }));
    read();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(read);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const marks = useMemo(() => {
    if (!size) return [];
    return placeLabels(unitMarks(range, unit), range, size.width, fontMeasure(size.font, 11));
  }, [range, unit, size]);
  return (
    <div className="lf-interval-scale" aria-hidden="true" ref={box}>
      {marks.map((m) => (
        <span key={m.label} className="lf-scale-mark" style={{ left: m.x }}>
          {m.shown && <span className="lf-scale-text" style={{ left: m.left - m.x }}>{m.label}</span>}
        </span>
      ))}
    </div>
  );
}
