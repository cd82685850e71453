import { useEffect } from 'react';
import { useReactFlow } from '@xyflow/react';
import { documentStore } from '../state/document';
import { selectionStore } from '../state/selection';
import { uiStore } from '../state/ui';
import { fitCanvas } from './canvas/fit';
import { addVariable, copySelection, deleteSelection, pasteClipboard, save, selectAll } from './actions';

function typing(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el) return false;
  const tag = el.tagName;
  return tag === 'INPUT' || tag === 'TEXTAREA' || tag === 'SELECT' || el.isContentEditable;
}

/** Editor keys: undo/redo everywhere outside text fields, plus add, delete, copy/paste, select all, fit, save. */
export function useShortcuts(): void {
  const flow = useReactFlow();
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const mod = e.ctrlKey || e.metaKey;
      const k = e.key.toLowerCase();
      if (mod && k === 's') {
        e.preventDefault();
        void save();
        return;
      }
      if (typing(e.target) || (e.target as HTMLElement | null)?.closest?.('dialog')) return;
      if (mod && k === 'z') {
        e.preventDefault();
        if (e.shiftKey) documentStore.getState().redo();
        else documentStore.getState().undo();
      } else if (mod && k === 'y') {
        e.preventDefault();
        documentStore.getState().redo();
      } else if (mod && k === 'c') {
        if (copySelection()) e.preventDefault();
      } else if (mod && k === 'v') {
        e.preventDefault();
        pasteClipboard();
      } else if (mod && k === 'a') {
        e.preventDefault();
        selectAll();
      } else if (!mod && !e.altKey && (k === 'n' || e.key === 'Insert')) {
        e.preventDefault();
        addVariable('derived');
      } else if (!mod && !e.altKey && (e.key === 'Delete' || e.key === 'Backspace')) {
        const s = selectionStore.getState();
        if (s.nodes.length + s.links.length === 0) return;
        e.preventDefault();
        deleteSelection();
      } else if (!mod && !e.altKey && k === 'f') {
        e.preventDefault();
        fitCanvas(flow, document.querySelector<HTMLElement>('.lf-canvas'), uiStore.getState().legendOpen, 200);
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [flow]);
}
