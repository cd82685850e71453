/** View state of the editor shell: which pane shows, which dialog is open, messages. */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';

export type RightPane = 'edit' | 'equations' | 'timescales' | 'intervene' | 'numbers' | 'pictures' | 'steps' | 'study' | 'data' | 'rehearse';

export interface Notice {
  title: string;
  lines: string[];
  tone: 'error' | 'info';
}

export interface UiState {
  pane: RightPane;
  galleryOpen: boolean;
  legendOpen: boolean;
  notice: Notice | null;
  /** A short confirmation shown for a few seconds ("Link copied"). */
  toast: string | null;
  /** When the document was last kept in this browser (autosave), as a clock time. */
  autosaved: string | null;
  set(patch: Partial<Omit<UiState, 'set'>>): void;
}

export const uiStore = createStore<UiState>()((set) => ({
  pane: 'edit',
  galleryOpen: false,
  legendOpen: true,
  notice: null,
  toast: null,
  autosaved: null,
  set: (patch) => set(patch),
}));

export function useUi<T>(selector: (s: UiState) => T): T {
  return useStore(uiStore, selector);
}

export function showNotice(notice: Notice): void {
  uiStore.getState().set({ notice });
}
