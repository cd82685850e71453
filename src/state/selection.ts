/** What is selected on the canvas: variable and relation nodes, and links. */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';

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
