/**
 * The timescale views: the mechanism as drawn beside the ordering at the
 * chosen sampling interval (or the three instants t−1, t, t+1), the
 * explanation of what differs and why, and the figure export.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { Model } from '../../core/model/types';
import { explainOrdering } from '../../core/view/explain';
import { mechanismView, orderingView, simultaneousBlocks, blockKey } from '../../core/view/derive';
import type { ViewModel } from '../../core/view/types';
import { drawnPositions } from '../../layout/instant';
import type { Layout } from '../../layout/types';
import { useValidatedModel } from '../../state/document';
import { foldedKeys, studyStore, useStudy } from '../../state/study';
import { useAnalysisState } from '../../state/analysis';
import { studyCaption } from '../../export/caption';
import { useBandCache } from './bandCache';
import { exportPng, exportSvg } from './exportFigure';
import { ViewCanvas } from './ViewCanvas';
import { useIntervalDrag } from '../interval/dragging';
import './views.css';

/** While dragging, the figure moves to the band under the thumb once the thumb has rested this long. */
const REST_MS = 100;

export function TimescalePane() {
  const model = useValidatedModel();
  if (!model) return <section className="lf-timescale" aria-label="Ordering at the sampling interval"><p>Fix the model's problems to see its ordering at a sampling interval.</p></section>;
  return <TimescalePaneFor model={model} />;
}

export function TimescalePaneFor({ model }: { model: Model }) {
  const length = useStudy((s) => s.length);
  const liveInterval = useStudy((s) => s.interval);
  // while the control is dragged the figure follows the band where the thumb rests (a drag across a
  // big model passes a band every few pixels; drawing each would hold the thumb back)
  const drag = useIntervalDrag();
  const [rested, setRested] = useState<{ drag: number; interval: number | null } | null>(null);
  useEffect(() => {
    if (!drag) return;
    const t = setTimeout(() => setRested({ drag: drag.id, interval: liveInterval }), REST_MS);
    return () => clearTimeout(t);
  }, [drag, liveInterval]);
  const interval = !drag ? liveInterval : rested?.drag === drag.id ? rested.interval : drag.from;
  const folded = useStudy((s) => s.folded);
  const view = useStudy((s) => s.view);
  const sideBySide = useStudy((s) => s.sideBySide);
  // interventions come with the analysis design (the interventions pane writes them)
  const hold = useAnalysisState((s) => s.design.hold);
  const bc = useBandCache(model, length, hold);
  const cache = bc.status === 'ready' ? bc.cache : null;
  const band = cache && interval !== null ? cache.band(interval) : -1;
  const ordering = useMemo(() => (cache && interval !== null ? cache.orderingAt(interval) : null), [cache, band]); // eslint-disable-line react-hooks/exhaustive-deps
  const foldedList = useMemo(() => foldedKeys(folded), [folded]);
  const study = length.by === 'window' ? { window: length.window } : { samples: length.samples };
  // the view changes only with the band, the fold state, the mode or the study (not with every pixel of a drag)
  const bandInterval = useRef<number | null>(null);
  const vm = useMemo<ViewModel | null>(() => {
    if (!ordering || interval === null) return null;
    bandInterval.current = interval;
    return orderingView(model, ordering, { mode: view, folded: foldedList, interval, ...study });
  }, [model, ordering, view, foldedList, length]); // eslint-disable-line react-hooks/exhaustive-deps
  const mech = useMemo(() => mechanismView(model), [model]);
  const drawn = useMemo(() => drawnPositions(model.variables), [model]);
  const settled = useRef<Layout | null>(null);
  const onLayout = useCallback((l: Layout) => { settled.current = l; }, []);
  const toggle = useCallback((key: string) => studyStore.getState().toggleFold(key), []);
  const [exportOf, setExportOf] = useState<'view' | 'mechanism'>('view');
  const [placement, setPlacement] = useState<'screen' | 'fresh'>('screen');

  const lines = useMemo(() => (ordering && interval !== null && cache ? explainOrdering(model, ordering, cache.design(interval), cache.breakpoints) : []), [model, ordering, interval, cache]);

  if (bc.status === 'missing') return <section className="lf-timescale"><p>The ordering core is not part of this build.</p></section>;
  if (bc.status === 'failed') return <section className="lf-timescale"><p role="alert">The ordering could not be computed: {bc.message}</p></section>;
  if (!vm || !ordering || interval === null) return <section className="lf-timescale" aria-label="Ordering at the sampling interval"><p>Finding the model's timescales…</p></section>;

  const blocks = simultaneousBlocks(ordering).map((b) => blockKey(b.variables));
  const caption = studyCaption(model, { interval, ...study });
  const doExport = (kind: 'svg' | 1 | 2 | 4) => {
    const base = model.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'model';
    if (exportOf === 'mechanism') {
      // the mechanism as drawn, at the canvas positions: what `loopfold render --view mechanism` writes
      if (kind === 'svg') void exportSvg(mech, { caption: false }, `${base}-mechanism`, { drawn });
      else void exportPng(mech, { caption: false }, `${base}-mechanism`, kind, { drawn });
      return;
    }
    // the view on screen is built once per band; the figure names the interval set now
    const figure = orderingView(model, ordering, { mode: view, folded: foldedList, interval, ...study });
    const name = `${base}-${view}`;
    // as on screen: the settled layout the modeller sees; else laid out afresh, as the command line does
    const at = { shown: placement === 'screen' ? settled.current : null };
    if (kind === 'svg') void exportSvg(figure, { caption: true, captionText: caption }, name, at);
    else void exportPng(figure, { caption: true, captionText: caption }, name, kind, at);
  };
  return (
    <section className="lf-timescale" aria-label="Ordering at the sampling interval" data-band={band}>
      <div className="lf-timescale-bar" role="toolbar" aria-label="Timescale view">
        <div className="lf-seg" role="group" aria-label="View at the interval">
          <button type="button" aria-pressed={view === 'ordering'} onClick={() => studyStore.getState().setView('ordering')}>Ordering</button>
          <button type="button" aria-pressed={view === 'unrolled'} onClick={() => studyStore.getState().setView('unrolled')}>Three instants</button>
        </div>
        <label><input type="checkbox" checked={sideBySide} onChange={(e) => studyStore.getState().setSideBySide(e.target.checked)} /> beside the mechanism</label>
        {blocks.length > 0 && (
          <>
            <button type="button" onClick={() => blocks.forEach((k) => studyStore.getState().setFolded(k, true))}>Fold blocks</button>
            <button type="button" onClick={() => blocks.forEach((k) => studyStore.getState().setFolded(k, false))}>Unfold blocks</button>
          </>
        )}
        <span className="lf-spacer" />
        <label className="lf-export-label">
          Export{' '}
          <select aria-label="Export figure of" value={exportOf} onChange={(e) => setExportOf(e.target.value as 'view' | 'mechanism')}>
            <option value="view">{view === 'unrolled' ? 'the three instants' : 'the ordering'}</option>
            <option value="mechanism">the mechanism</option>
          </select>
        </label>
        {exportOf === 'view' && (
          <label className="lf-export-label" title="As on screen: the positions you see. Afresh: laid out without the slider's history, the same file `loopfold render` writes.">
            laid out{' '}
            <select value={placement} onChange={(e) => setPlacement(e.target.value as 'screen' | 'fresh')}>
              <option value="screen">as on screen</option>
              <option value="fresh">afresh</option>
            </select>
          </label>
        )}
        <button type="button" onClick={() => doExport('svg')}>SVG</button>
        <button type="button" onClick={() => doExport(1)}>PNG 1×</button>
        <button type="button" onClick={() => doExport(2)}>2×</button>
        <button type="button" onClick={() => doExport(4)}>4×</button>
      </div>
      <div className={`lf-timescale-views ${sideBySide ? 'lf-two' : ''}`}>
        {sideBySide && (
          <div className="lf-view lf-view-mechanism">
            <ViewCanvas vm={mech} drawn={drawn} label="The mechanism as drawn" />
          </div>
        )}
        <div className="lf-view lf-view-ordering">
          <ViewCanvas vm={vm} tag={band} onToggleBlock={toggle} onLayout={onLayout} label={view === 'unrolled' ? 'The ordering over three instants' : 'The ordering at the interval'} />
        </div>
      </div>
      <aside className="lf-explain" aria-label="What changes at this interval">
        <h3>What changes at this interval</h3>
        <ul>
          {lines.map((l, i) => <li key={i} data-topic={l.topic}>{l.text}</li>)}
        </ul>
        {model.caution && <p className="lf-caution">{model.caution}</p>}
      </aside>
    </section>
  );
}
