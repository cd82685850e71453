/**
 * The latest core analysis of the document. Results come from the worker
 * and are never recorded in the undo history. The study design (sampling
 * interval, study length, interventions) follows the session's study
 * (`src/state/session.ts`) through `setStudyDesign`.
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { Model } from '../core/model/types';
import type { StudyDesign } from '../core/ordering/types';
import type { Analysis } from '../worker/protocol';
import type { CoreClient } from '../worker/client';
import { documentStore, selectModel, validationOf } from './document';
import { onlyPositionsDiffer } from './positions';
import { onlyStudyDiffers } from './studyModel';

export interface AnalysisState {
  design: StudyDesign;
  analysis: Analysis | null;
  /** The model object the analysis belongs to. */
  model: Model | null;
  status: 'idle' | 'running' | 'done' | 'failed';
  message?: string;
  where?: 'worker' | 'main thread';
}

export const analysisStore = createStore<AnalysisState>()(() => ({ design: {}, analysis: null, model: null, status: 'idle' }));

export function useAnalysisState<T>(selector: (s: AnalysisState) => T): T {
  return useStore(analysisStore, selector);
}

/** The latest core analysis (ordering with its diagnostics, breakpoints, bands), or null. */
export function useAnalysis(): Analysis | null {
  return useStore(analysisStore, (s) => s.analysis);
}

export function setStudyDesign(design: StudyDesign): void {
  analysisStore.setState({ design });
}

/**
 * Keep the analysis up to date with the document and the design: each
 * change sends a request after a short pause; the client delivers only the
 * latest answer. Returns a function that stops it.
 */
export function startAnalysis(client: CoreClient, pauseMs = 120): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let lastModel: Model | null = null;
  let lastDesign: StudyDesign | null = null;
  const run = async () => {
    const model = validationOf(selectModel(documentStore.getState())).model;
    const { design } = analysisStore.getState();
    if (!model) {
      analysisStore.setState({ status: 'failed', message: 'the model has problems to fix first (see the list)', analysis: null, model: null });
      return;
    }
    analysisStore.setState({ status: 'running' });
    const r = await client.analyze(model, design);
    if (r === null) return;
    if (r.ok) analysisStore.setState({ analysis: r.analysis, model: selectModel(documentStore.getState()), status: 'done', message: undefined, where: client.where() });
    else analysisStore.setState({ analysis: null, model: null, status: 'failed', message: r.message, where: client.where() });
  };
  const schedule = () => {
    const model = selectModel(documentStore.getState());
    const { design } = analysisStore.getState();
    if (model === lastModel && design === lastDesign) return;
    // a move changes no equation: the analysis (done, or on its way) holds for the moved model too
    const moved = lastModel !== null && design === lastDesign && analysisStore.getState().status !== 'failed' && (onlyPositionsDiffer(lastModel, model) || onlyStudyDiffers(lastModel, model));
    lastModel = model;
    lastDesign = design;
    if (moved) {
      const s = analysisStore.getState();
      if (s.status === 'done' && s.model !== null) analysisStore.setState({ model });
      return;
    }
    clearTimeout(timer);
    timer = setTimeout(() => void run(), pauseMs);
  };
  const unsubDoc = documentStore.subscribe(schedule);
  const unsubDesign = analysisStore.subscribe((s, prev) => {
    if (s.design !== prev.design) schedule();
  });
  schedule();
  return () => {
    clearTimeout(timer);
    unsubDoc();
    unsubDesign();
    client.dispose();
  };
}
