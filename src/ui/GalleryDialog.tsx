import { useRef } from 'react';
import { EXAMPLES } from '../examples/index';
import { useUi, uiStore } from '../state/ui';
import { useModalDialog } from './modal';
import { openExample } from './actions';

/** The example gallery: scenarios to open and explore. */
export function GalleryDialog() {
  const open = useUi((s) => s.galleryOpen);
  const ref = useRef<HTMLDialogElement>(null);
  useModalDialog(ref, open);
  return (
    <dialog ref={ref} className="lf-dialog" aria-labelledby="lf-gallery-title" onClose={() => uiStore.getState().set({ galleryOpen: false })}>
      <h2 id="lf-gallery-title">Examples</h2>
      <p className="lf-hint">Scenarios made up to show how the causal structure changes with the sampling interval. Opening one replaces the canvas: save your own model first if you want to keep it.</p>
      <ul className="lf-gallery">
        {EXAMPLES.map((e) => (
          <li key={e.id}>
            <h3>{e.title}</h3>
            <p>{e.summary}</p>
            <button type="button" onClick={() => { if (openExample(e.id)) uiStore.getState().set({ galleryOpen: false }); }} aria-label={`Open the example ${e.title}`}>Open</button>
          </li>
        ))}
      </ul>
      <form method="dialog"><button type="submit">Close</button></form>
    </dialog>
  );
}
