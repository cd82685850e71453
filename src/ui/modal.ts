/**
 * The one keyboard behaviour of every modal layer (the native dialogs and the
 * presentation): the focus stays inside while it is open (Tab past the last control
 * comes back to the first, Shift+Tab past the first to the last), and when it closes
 * (Escape, a Close button, or the layer taken away) the focus goes back to the control
 * that opened it.
 */
import { useEffect, useLayoutEffect, type RefObject } from 'react';

const FOCUSABLE = 'button, [href], input:not([type=hidden]), select, textarea, summary, [tabindex]:not([tabindex="-1"])';

/** The controls inside `root` the Tab key stops at, in document order. */
export function focusables(root: Element): HTMLElement[] {
  return ([...root.querySelectorAll(FOCUSABLE)] as HTMLElement[]).filter((el) =>
    !(el as HTMLButtonElement).disabled && el.tabIndex >= 0 && el.getClientRects().length > 0 && !el.closest('[inert], [aria-hidden=true]'));
}

const openers = new WeakMap<HTMLElement, HTMLElement | null>();
/** A layer still on the page (it was only set up again), and a native dialog there still open (one taken off the page while open keeps its open flag). */
const stillOpen = (el: HTMLElement): boolean => el.isConnected && (!(el instanceof HTMLDialogElement) || el.open);

/** Keeps the focus inside `ref` while `open`; gives it back to the opener when it closes. Call it before the effect that opens a native dialog. */
export function useModalFocus(ref: RefObject<HTMLElement | null>, open: boolean): void {
  useLayoutEffect(() => {
    const layer = ref.current;
    if (!open || !layer) return;
    // read before a native dialog's showModal moves the focus into it
    const active = document.activeElement;
    // (an effect run twice over the same layer, as React's strict mode does, keeps the first opener)
    const opener = openers.has(layer) ? openers.get(layer)! : active instanceof HTMLElement && active !== document.body && !layer.contains(active) ? active : null;
    openers.set(layer, opener);
    const onKey = (e: KeyboardEvent) => {
      const root = layer;
      if (e.key !== 'Tab' || e.defaultPrevented) return;
      const items = focusables(root);
      const now = document.activeElement;
      const inside = !!now && root.contains(now);
      if (items.length === 0) { e.preventDefault(); root.focus(); return; }
      const first = items[0];
      const last = items[items.length - 1];
      if (e.shiftKey && (!inside || now === first || now === root)) { e.preventDefault(); last.focus(); }
      else if (!e.shiftKey && (!inside || now === last)) { e.preventDefault(); first.focus(); }
    };
    document.addEventListener('keydown', onKey, true);
    return () => {
      document.removeEventListener('keydown', onKey, true);
      const root = layer;
      // after the layer has closed (a native dialog closes in the effect after this one)
      setTimeout(() => {
        if (stillOpen(root)) return;
        openers.delete(root);
        const now = document.activeElement;
        // an opener drawn again while the layer was open (same id) is the one to go back to
        const back = opener && !opener.isConnected && opener.id ? document.getElementById(opener.id) : opener;
        if (back?.isConnected && (!now || now === document.body || !root.isConnected || root.contains(now))) back.focus();
      }, 0);
    };
  }, [open, ref]);
}

/** A native dialog shown as a modal while `open` and closed when not, with the keyboard behaviour of `useModalFocus`. */
export function useModalDialog(ref: RefObject<HTMLDialogElement | null>, open: boolean): void {
  useModalFocus(ref, open);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open, ref]);
}
