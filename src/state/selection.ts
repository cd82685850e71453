/** What is selected on the canvas: variable and relation nodes, and links. */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { Model } from '../core/model/types';

export interface SelectionState {
  nodes: string[];
  links: string[];
  select(sel: { nodes?: string[]; links?: string[] }): void;
  clear(): void;
}

export function createSelectionStore() {
  return createStore<SelectionState>()((set) => ({
    nodes: [],
    links: [],
    select: (sel) => set({ nodes: sel.nodes ?? [], links: sel.links ?? [] }),
    clear: () => set({ nodes: [], links: [] }),
  }));
}

export const selectionStore = createSelectionStore();

export function useSelection<T>(selector: (s: SelectionState) => T): T {
  return useStore(selectionStore, selector);
}

/**
 * Keep the selection to what the model holds: after an undo, a redo, a load
 * or a removal, ids that no longer exist leave the selection (a removed
 * variable must not stay picked beside the next thing clicked).
 * Example: `startSelectionPruning(documentStore)` once at start-up.
 */
export function startSelectionPruning(
  documents: { getState(): { history: { present: Model } }; subscribe(listener: (s: { history: { present: Model } }, prev: { history: { present: Model } }) => void): () => void },
  selection = selectionStore,
): () => void {
  return documents.subscribe((s, prev) => {
    const m = s.history.present;
    if (m === prev.history.present) return;
    const sel = selection.getState();
    if (sel.nodes.length === 0 && sel.links.length === 0) return;
    const nodeIds = new Set([...m.variables.map((v) => v.id), ...(m.relations ?? []).map((r) => r.id)]);
    const linkIds = new Set(m.links.map((l) => l.id));
    const nodes = sel.nodes.filter((id) => nodeIds.has(id));
    const links = sel.links.filter((id) => linkIds.has(id));
    if (nodes.length !== sel.nodes.length || links.length !== sel.links.length) sel.select({ nodes, links });
  });
}
