/**
 * The document store: the model being edited and its undo history.
 * Writes declare their history intent (a squash key merges the steps of one
 * gesture); analysis results from the core live in analysis.ts and are never
 * recorded here.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { Model } from '../core/model/types';
import { applyChange, emptyModel, withLinkIds, type Change } from './changes';
import { record, redo, startHistory, stop, undo, type History } from './history';
import { movedValidation, onlyPositionsDiffer } from './positions';
import { onlyStudyDiffers, withoutStudy } from './studyModel';
import { validateModel, type Validation } from './validate';

export interface DocumentState {
  history: History;
  /** The file name the model was last opened from or saved to. */
  fileName?: string;
  /** The model as it was at the last open or save; `dirty` compares with it. */
  savedModel: Model | null;
  /** Counts the documents loaded (open, new, example): views refit when it changes. */
  generation: number;
  apply(change: Change | Change[], opts?: { squash?: string }): void;
  /** End the current gesture (pointer-down, blur): the next edit is a new undo step. */
  stopGesture(): void;
  undo(): void;
  redo(): void;
  /** Start a new document (open, new, example): the history starts afresh. */
  load(model: Model, opts?: { fileName?: string; dirty?: boolean }): void;
  markSaved(fileName?: string): void;
}

export type DocumentStore = StoreApi<DocumentState>;

export function createDocumentStore(initial: Model = emptyModel()): DocumentStore {
  const start = withLinkIds(initial);
  return createStore<DocumentState>()((set, get) => ({
    history: startHistory(start),
    savedModel: start,
    generation: 0,
    apply(change, opts) {
      const h = get().history;
      const list = Array.isArray(change) ? change : [change];
      let next = h.present;
      for (const c of list) next = applyChange(next, c);
      if (next === h.present) return;
      set({ history: record(h, next, opts?.squash) });
    },
    stopGesture() {
      const h = get().history;
      const s = stop(h);
      if (s !== h) set({ history: s });
    },
    undo() {
      set({ history: undo(get().history) });
    },
    redo() {
      set({ history: redo(get().history) });
    },
    load(model, opts) {
      const m = withLinkIds(model);
      set((st) => ({ history: startHistory(m), fileName: opts?.fileName, savedModel: opts?.dirty ? null : m, generation: st.generation + 1 }));
    },
    markSaved(fileName) {
      set((s) => ({ savedModel: s.history.present, fileName: fileName ?? s.fileName }));
    },
  }));
}

export const selectModel = (s: DocumentState) => s.history.present;
export const selectDirty = (s: DocumentState) => s.history.present !== s.savedModel;
export const selectCanUndo = (s: DocumentState) => s.history.past.length > 0;
export const selectCanRedo = (s: DocumentState) => s.history.future.length > 0;

/** The editor's document store. */
export const documentStore = createDocumentStore();

export function useDocument<T>(selector: (s: DocumentState) => T): T {
  return useStore(documentStore, selector);
}

/** The model being edited (re-renders on every edit). */
export function useModel(): Model {
  return useStore(documentStore, selectModel);
}

/** The checked model carries no study: the study is read through the session (src/state/session.ts). */
function checked(v: Validation): Validation {
  return v.model ? { ...v, model: withoutStudy(v.model) } : v;
}

const validations = new WeakMap<Model, Validation>();
let lastChecked: { model: Model; validation: Validation } | undefined;
/**
 * Schema and formula checks of a model, computed once per model object; after
 * a move (only positions differ from the model checked last) they are carried
 * over instead of recomputed.
 */
export function validationOf(model: Model): Validation {
  let v = validations.get(model);
  if (!v) {
    // an edit of the study alone (the interval control, a hold) changes nothing the checked model holds
    const studyOnly = lastChecked && onlyStudyDiffers(lastChecked.model, model) ? lastChecked.validation : null;
    const moved = !studyOnly && lastChecked && onlyPositionsDiffer(lastChecked.model, model) ? movedValidation(lastChecked.model, lastChecked.validation, model) : null;
    v = studyOnly ?? moved ?? checked(validateModel(model));
    validations.set(model, v);
  }
  lastChecked = { model, validation: v };
  return v;
}

/** The live checks of the model being edited. */
export function useValidation(): Validation {
  return validationOf(useModel());
}

/**
 * The current model when it passes the file schema, else null: what the
 * core and the timescale views may read (without its study: read that
 * through `useSessionStudy`).
 */
export function useValidatedModel(): Model | null {
  return useValidation().model;
}

export function editDocument(change: Change | Change[], opts?: { squash?: string }): void {
  documentStore.getState().apply(change, opts);
}
