import { useRef } from 'react';
import { useUi, uiStore } from '../state/ui';
import { useModalDialog } from './modal';

/** A message that needs reading: a file that could not be opened, with every problem and where it is. */
export function NoticeDialog() {
  const notice = useUi((s) => s.notice);
  const ref = useRef<HTMLDialogElement>(null);
  useModalDialog(ref, !!notice);
  return (
    <dialog ref={ref} className={`lf-dialog lf-notice${notice?.tone === 'error' ? ' is-error' : ''}`} aria-labelledby="lf-notice-title" onClose={() => uiStore.getState().set({ notice: null })}>
      {notice && (
        <>
          <h2 id="lf-notice-title">{notice.title}</h2>
          <ul className="lf-notice-lines">
            {notice.lines.slice(0, 50).map((l, i) => <li key={i}><code>{l}</code></li>)}
          </ul>
          {notice.lines.length > 50 && <p className="lf-hint">…and {notice.lines.length - 50} more.</p>}
          <form method="dialog"><button type="submit" autoFocus>Close</button></form>
        </>
      )}
    </dialog>
  );
}
