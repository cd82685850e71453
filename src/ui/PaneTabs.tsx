/**
 * The side pane's tab row: always one row. Each tab shows its whole name while the
 * names fit the pane's width; when they do not (a 1024 px projector, a tenth or eleventh
 * tab), every tab shows its short name and keeps the whole one as its accessible name
 * and tooltip. Should even the short names not fit, the row scrolls sideways (the chosen
 * tab is scrolled into view) rather than wrapping onto a second row. The arrow keys, Home
 * and End move between tabs, as a tab list does.
 */
import { useLayoutEffect, useRef, useState } from 'react';
import './paneTabs.css';

export type PaneTab<T extends string> = { id: T; name: string };

/** Short names for a narrow pane; a tab without one keeps its whole name. */
const SHORT: Record<string, string> = {
  equations: 'Eqns',
  timescales: 'Times',
  intervene: 'Interv.',
  numbers: 'Nums',
  pictures: 'Pics',
};
export const shortName = (t: { id: string; name: string }): string => SHORT[t.id] ?? t.name;

export function PaneTabs<T extends string>({ tabs, pane, choose }: { tabs: readonly PaneTab<T>[]; pane: T; choose: (id: T) => void }) {
  const row = useRef<HTMLDivElement>(null);
  const probe = useRef<HTMLDivElement>(null);
  const [compact, setCompact] = useState(false);
  const names = tabs.map((t) => t.name).join('|');
  // whole names while they fit: measured on a hidden copy of the row set with the whole names
  useLayoutEffect(() => {
    const r = row.current;
    const p = probe.current;
    if (!r || !p) return;
    const measure = () => setCompact(p.scrollWidth > r.clientWidth + 0.5);
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(r);
    return () => ro.disconnect();
  }, [names]);
  useLayoutEffect(() => {
    const tab = document.getElementById(`lf-tab-${pane}`);
    if (tab && row.current && row.current.scrollWidth > row.current.clientWidth) tab.scrollIntoView({ block: 'nearest', inline: 'nearest' });
  }, [pane, compact]);
  const move = (key: string): T | null => {
    const i = tabs.findIndex((x) => x.id === pane);
    if (key === 'ArrowRight') return tabs[(i + 1) % tabs.length].id;
    if (key === 'ArrowLeft') return tabs[(i + tabs.length - 1) % tabs.length].id;
    if (key === 'Home') return tabs[0].id;
    if (key === 'End') return tabs[tabs.length - 1].id;
    return null;
  };
  return (
    <div className="lf-tabs-host">
      <div role="tablist" aria-label="Side pane view" className={`lf-tabs lf-tabs-row${compact ? ' is-compact' : ''}`} ref={row} data-compact={compact}>
        {tabs.map((t) => (
          <button
            key={t.id}
            type="button"
            role="tab"
            id={`lf-tab-${t.id}`}
            aria-selected={pane === t.id}
            aria-controls={`lf-panel-${t.id}`}
            tabIndex={pane === t.id ? 0 : -1}
            title={compact && shortName(t) !== t.name ? t.name : undefined}
            onClick={() => choose(t.id)}
            onKeyDown={(e) => {
              const next = move(e.key);
              if (next === null) return;
              e.preventDefault();
              choose(next);
              document.getElementById(`lf-tab-${next}`)?.focus();
            }}
          >
            {compact && shortName(t) !== t.name
              ? <><span className="lf-sr">{t.name}</span><span aria-hidden="true">{shortName(t)}</span></>
              : t.name}
          </button>
        ))}
      </div>
      <div className="lf-tabs lf-tabs-row lf-tabs-probe" ref={probe} aria-hidden="true">
        {tabs.map((t) => <span key={t.id} role="presentation">{t.name}</span>)}
      </div>
    </div>
  );
}
