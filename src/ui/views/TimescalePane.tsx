/**
 * The timescale views: the mechanism as drawn beside the ordering at the
 * chosen sampling interval (or the three instants t−1, t, t+1), the
 * explanation of what differs and why, and the figure export.
 */
import { useCallback, useEffect, useId, useMemo, useRef, useState } from 'react';
import type { Model } from '../../core/model/types';
import { explainOrdering } from '../../core/view/explain';
import { mechanismView, orderingView, simultaneousBlocks, blockKey } from '../../core/view/derive';
import type { ViewModel } from '../../core/view/types';
import { drawnPositions } from '../../layout/instant';
import type { Layout } from '../../layout/types';
import { useValidatedModel } from '../../state/document';
import { foldedKeys, studyStore, useStudy } from '../../state/study';
import { modelLength, useSessionStudy } from '../../state/session';
import { viewCaption } from '../../export/caption';
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';

/** Whether the export row is unfolded: kept while the modeller goes to another tab and back. */
const exportRowStore = createStore<{ open: boolean }>(() => ({ open: false }));
import { openBandCache, useBandCache, useShownBand } from './bandCache';
import { exportPng, exportSvg } from './exportFigure';
import { ExportDialog } from '../export/ExportDialog';
import { fileStem } from '../figureFiles';
import { ViewCanvas } from './ViewCanvas';
import { ExplainList } from './ExplainList';
import { GrowthNotice } from '../diagnostics/GrowthNotice';
import { restDelay, useIntervalDrag } from '../interval/dragging';
import { openPresentation } from '../Presentation';
import './views.css';
import { fixedText } from '../../present/index';

export function TimescalePane() {
  const model = useValidatedModel();
  if (!model) return <section className="lf-timescale" aria-label="Ordering at the sampling interval"><p>Fix the model's problems to see its ordering at a sampling interval.</p></section>;
  return <TimescalePaneFor model={model} />;
}

/** `presenting`: inside presentation mode (no toolbar, no mechanism beside it). */
export function TimescalePaneFor({ model, presenting = false }: { model: Model; presenting?: boolean }) {
  const session = useSessionStudy();
  // the study's length; without a session (a model passed in) the core's reading of the model
  const length = session?.length ?? modelLength(model);
  const liveInterval = session ? session.interval : null;
  // while the control is dragged the figure follows the band where the thumb rests (a drag across a
  // big model passes a band every few pixels; drawing each would hold the thumb back)
  const drag = useIntervalDrag();
  const [rested, setRested] = useState<{ drag: number; interval: number | null } | null>(null);
  useEffect(() => {
    if (!drag) return;
    const t = setTimeout(() => setRested({ drag: drag.id, interval: liveInterval }), restDelay());
    return () => clearTimeout(t);
  }, [drag, liveInterval]);
  const interval = !drag ? liveInterval : rested?.drag === drag.id ? rested.interval : drag.from;
  const folded = useStudy((s) => s.folded);
  const view = useStudy((s) => s.view);
  const sideBySide = useStudy((s) => s.sideBySide) && !presenting;
  // interventions are the study's holds
  const holds = session?.holds;
  const hold = holds && Object.keys(holds).length > 0 ? holds : undefined;
  const bc = useBandCache(model, length, hold);
  const cache = bc.status === 'ready' ? bc.cache : null;
  // the band's ordering comes from the core worker; until it arrives the band drawn before stays,
  // and everything below (figure, data-band, explanation) follows the band drawn
  const { shown, problem } = useShownBand(cache, interval);
  const band = shown ? shown.band : -1;
  const ordering = shown?.ordering ?? null;
  const shownModel = shown?.cache.model ?? model;
  const shownLength = shown?.cache.length ?? length;
  const shownInterval = shown?.interval ?? null;
  const foldedList = useMemo(() => foldedKeys(folded), [folded]);
  const study = length.by === 'window' ? { window: length.window } : { samples: length.samples };
  // the view changes only with the band, the fold state, the mode or the study (not with every pixel of a drag)
  const vm = useMemo<ViewModel | null>(() => {
    if (!ordering || shownInterval === null) return null;
    const at = shownLength.by === 'window' ? { window: shownLength.window } : { samples: shownLength.samples };
    return orderingView(shownModel, ordering, { mode: view, folded: foldedList, interval: shownInterval, ...at });
  }, [shownModel, ordering, view, foldedList, shownLength]); // eslint-disable-line react-hooks/exhaustive-deps
  const mech = useMemo(() => mechanismView(model), [model]);
  const drawn = useMemo(() => drawnPositions(model.variables), [model]);
  const settled = useRef<Layout | null>(null);
  const onLayout = useCallback((l: Layout) => { settled.current = l; }, []);
  const toggle = useCallback((key: string) => studyStore.getState().toggleFold(key), []);
  const [exportOf, setExportOf] = useState<'view' | 'mechanism'>('view');
  const [placement, setPlacement] = useState<'screen' | 'fresh'>('screen');

  const shownCache = shown?.cache ?? null;
  const lines = useMemo(() => (ordering && shownInterval !== null && shownCache ? explainOrdering(shownCache.model, ordering, shownCache.design(shownInterval), shownCache.breakpoints) : []), [ordering, shownInterval, shownCache]);
  const [exportProblem, setExportProblem] = useState<string | null>(null);
  const [printing, setPrinting] = useState(false);
  const exportRow = useStore(exportRowStore, (x) => x.open);
  const setExportRow = (f: (open: boolean) => boolean) => exportRowStore.setState((x) => ({ open: f(x.open) }));
  const exportToggle = useRef<HTMLButtonElement>(null);
  const exportId = useId();

  if (bc.status === 'failed') return <section className="lf-timescale"><p role="alert">The ordering could not be computed: {bc.message}</p></section>;
  if (!vm || !ordering || interval === null) return <section className="lf-timescale" aria-label="Ordering at the sampling interval">{problem ? <p role="alert">The ordering could not be computed: {problem}</p> : <p>Finding the model's timescales…</p>}</section>;

  const blocks = simultaneousBlocks(ordering).map((b) => blockKey(b.variables));
  const doExport = (kind: 'svg' | 1 | 2 | 4) => {
    const base = model.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'model';
    if (exportOf === 'mechanism') {
      // the mechanism as drawn, at the canvas positions: what `loopfold render --view mechanism` writes
      if (kind === 'svg') void exportSvg(mech, { caption: false }, `${base}-mechanism`, { drawn });
      else void exportPng(mech, { caption: false }, `${base}-mechanism`, kind, { drawn });
      return;
    }
    // the view on screen is built once per band; the figure names the interval set now, with that
    // interval's ordering (the band's answer may still be on its way from the core)
    const name = `${base}-${view}`;
    // as on screen: the settled layout the modeller sees; else laid out afresh, as the command line does
    const at = { shown: placement === 'screen' ? settled.current : null };
    void (async () => {
      const c = await openBandCache(model, length, hold);
      const r = c.ok ? await c.cache.ordering(interval) : c;
      if (!r.ok) { setExportProblem(`The figure could not be exported: ${r.message}`); return; }
      setExportProblem(null);
      const figure = orderingView(model, r.ordering, { mode: view, folded: foldedList, interval, ...study });
      // the caption says what the title does not: the roles, the blocks and the links (as `loopfold render --caption`)
      const captionText = viewCaption(figure);
      if (kind === 'svg') await exportSvg(figure, { caption: true, captionText }, name, at);
      else await exportPng(figure, { caption: true, captionText }, name, kind, at);
    })();
  };
  return (
    <section className={`lf-timescale${presenting ? ' is-presenting' : ''}`} aria-label="Ordering at the sampling interval" data-band={band} data-compute-ms={shown ? fixedText(shown.computeMs, 3, { ascii: true }) : undefined} data-computed-in={shown?.where}>
      {!presenting && <div className="lf-timescale-bar" role="toolbar" aria-label="Timescale view">
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
        <button type="button" ref={exportToggle} aria-expanded={exportRow} aria-controls={`${exportId}-row`} onClick={() => setExportRow((o) => !o)}>Export <span aria-hidden="true">{exportRow ? '▴' : '▾'}</span></button>
        <button type="button" id="lf-present-open" className="lf-present-open" title="Presentation mode (P): the figure, the interval and the explanation large; arrows step the band, Esc leaves" onClick={openPresentation}>Present</button>
      </div>}
      {/* the export actions, used now and then, unfold as a row of their own under the toolbar (the toolbar keeps to its width at 1024 px) */}
      {!presenting && exportRow && <div className="lf-timescale-bar lf-timescale-export" id={`${exportId}-row`} role="group" aria-label="Export the figure" onKeyDown={(e) => { if (e.key === 'Escape' && !printing) { e.stopPropagation(); setExportRow(() => false); exportToggle.current?.focus(); } }}>
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
        <button type="button" onClick={() => setPrinting(true)}>Print options…</button>
      </div>}
      {printing && (
        <ExportDialog
          what={exportOf === 'mechanism' ? 'the mechanism' : view === 'unrolled' ? 'the three instants' : 'the ordering'}
          name={`${fileStem(model.name)}-${exportOf === 'mechanism' ? 'mechanism' : view}`}
          modelFile={`${fileStem(model.name)}.json`}
          source={() => ({
            kind: 'view',
            request: exportOf === 'mechanism'
              ? { model, view: 'mechanism', design: {}, caption: false }
              : { model, view, design: { interval, ...study, ...(hold ? { hold } : {}) }, folded: foldedList.filter((k) => blocks.includes(k)), caption: true },
          })}
          onClose={() => setPrinting(false)}
        />
      )}
      {(problem || exportProblem) && <p className="lf-problem" role="alert">{problem ? `The ordering at this interval could not be computed: ${problem}` : exportProblem}</p>}
      <div className={`lf-timescale-views ${sideBySide ? 'lf-two' : ''}`}>
        {sideBySide && (
          <div className="lf-view lf-view-mechanism">
            <ViewCanvas vm={mech} drawn={drawn} label="The mechanism as drawn" />
          </div>
        )}
        <div className="lf-view lf-view-ordering">
          <ViewCanvas vm={vm} tag={band} still={!drag} onToggleBlock={toggle} onLayout={onLayout} label={view === 'unrolled' ? 'The ordering over three instants' : 'The ordering at the interval'} />
        </div>
      </div>
      <aside className="lf-explain" aria-label="What changes at this interval">
        <h3>What changes at this interval</h3>
        <GrowthNotice what="settling (and the timescales it rests on)" />
        <ExplainList lines={lines} />
        {model.caution && <p className="lf-caution">{model.caution}</p>}
      </aside>
    </section>
  );
}
