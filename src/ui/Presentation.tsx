/**
 * Presentation mode: the ordering figure, the sampling interval and the
 * explanation, large, over the whole window (and full screen where the
 * browser allows it), for a room looking at a projector. Opened with the
 * Present button of the timescale view or the P key; the arrow keys, Page
 * Up/Down, Home and End step the interval from band to band; Escape leaves
 * (and leaves full screen).
 */
import { useEffect, useRef } from 'react';
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { Model } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { stepInterval, type IntervalKey } from '../core/view/interval';
import { useValidatedModel } from '../state/document';
import { modelLength, setStudyInterval, useSessionStudy, type StudyLength } from '../state/session';
import { useBandCache } from './views/bandCache';
import { TimescalePaneFor } from './views/TimescalePane';
import './presentation.css';
import { useModalFocus } from './modal';

const presentStore = createStore<{ open: boolean }>(() => ({ open: false }));
export const openPresentation = (): void => presentStore.setState({ open: true });
export const closePresentation = (): void => presentStore.setState({ open: false });
export const usePresenting = (): boolean => useStore(presentStore, (s) => s.open);

/** Keys that step the band, as the interval control's own band keys. */
const STEP: Record<string, IntervalKey> = { ArrowRight: 'PageUp', ArrowUp: 'PageUp', PageUp: 'PageUp', ArrowLeft: 'PageDown', ArrowDown: 'PageDown', PageDown: 'PageDown', Home: 'Home', End: 'End' };

const typing = (t: EventTarget | null) => t instanceof HTMLElement && (t.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName));

/** The P key opens presentation mode (not while typing in a field). */
export function usePresentKey(): void {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'p' && e.key !== 'P') return;
      if (e.ctrlKey || e.metaKey || e.altKey || typing(e.target) || presentStore.getState().open) return;
      if (e.target instanceof Element && e.target.closest('dialog[open]')) return;
      e.preventDefault();
      openPresentation();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}

export function Presentation() {
  usePresentKey();
  const open = usePresenting();
  const model = useValidatedModel();
  if (!open) return null;
  return <PresentationFor model={model} />;
}

function PresentationFor({ model }: { model: Model | null }) {
  const root = useRef<HTMLDivElement>(null);
  useModalFocus(root, true);
  const session = useSessionStudy();
  // without a checked model nothing is computed; the length then only fills the hook's argument
  const length: StudyLength = session?.length ?? (model ? modelLength(model) : { by: 'samples', samples: 2 });
  const interval = session && Number.isFinite(session.interval) ? session.interval : null;
  const holds = session?.holds;
  const hold = holds && Object.keys(holds).length > 0 ? holds : undefined;
  const bc = useBandCache(model, length, hold);
  const cache = bc.status === 'ready' ? bc.cache : null;
  const step = (key: IntervalKey) => {
    if (!cache || interval === null) return;
    setStudyInterval(stepInterval(cache.range, cache.cuts, interval, key), { squash: 'interval' });
  };
  const stepRef = useRef(step);
  stepRef.current = step;

  // full screen where the browser allows it; focus on the presentation; the keys while it is open
  useEffect(() => {
    const el = root.current;
    el?.focus();
    let entered = false;
    if (el?.requestFullscreen && !document.fullscreenElement) {
      el.requestFullscreen().then(() => { entered = true; }, () => { /* not allowed here: the window is used */ });
    }
    const leave = () => {
      closePresentation();
      if (document.fullscreenElement) void document.exitFullscreen().catch(() => undefined);
    };
    const onKey = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey) return;
      if (e.key === 'Escape') { e.preventDefault(); e.stopPropagation(); leave(); return; }
      const key = STEP[e.key];
      if (key) { e.preventDefault(); e.stopPropagation(); stepRef.current(key); return; }
      // the editor's own shortcuts (delete, fit, new variable) do not act behind the presentation;
      // Tab, Enter and Space keep their own work on its buttons
      if (e.key !== 'Tab') e.stopPropagation();
    };
    // the browser leaving full screen by itself (its own Escape) leaves the presentation too
    const onFull = () => { if (entered && !document.fullscreenElement) closePresentation(); };
    window.addEventListener('keydown', onKey, true);
    document.addEventListener('fullscreenchange', onFull);
    return () => {
      window.removeEventListener('keydown', onKey, true);
      document.removeEventListener('fullscreenchange', onFull);
    };
  }, []);

  const band = cache && interval !== null ? cache.band(interval) : -1;
  const bands = cache ? cache.cuts.length + 1 : 0;
  return (
    <div ref={root} className="lf-present" role="dialog" aria-modal="true" aria-label="Presentation" tabIndex={-1}>
      <header className="lf-present-head">
        <div className="lf-present-title">
          <h2>{model?.name ?? 'Model'}</h2>
          <p className="lf-present-interval" aria-live="polite">
            <span className="lf-present-label">Sampling interval</span>{' '}
            <output className="lf-present-value" data-band={band}>{interval !== null && model ? `every ${formatDuration(interval, model.timeUnit)}` : '…'}</output>
            {bands > 0 && <span className="lf-present-band"> band {band + 1} of {bands}</span>}
          </p>
        </div>
        <div className="lf-present-controls" role="group" aria-label="Step the interval">
          <button type="button" onClick={() => step('PageDown')} disabled={band <= 0}>← Shorter</button>
          <button type="button" onClick={() => step('PageUp')} disabled={band < 0 || band >= bands - 1}>Longer →</button>
          <button type="button" className="lf-present-leave" onClick={() => { closePresentation(); if (document.fullscreenElement) void document.exitFullscreen().catch(() => undefined); }}>Leave <kbd>Esc</kbd></button>
        </div>
      </header>
      <div className="lf-present-body">
        {model ? <TimescalePaneFor model={model} presenting /> : <p role="alert">Fix the model's problems to present its ordering.</p>}
      </div>
      <p className="lf-present-keys">← → or Page Up / Page Down: the next band · Home / End: the shortest / longest interval · Esc: leave</p>
    </div>
  );
}
