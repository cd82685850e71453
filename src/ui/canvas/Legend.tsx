import { useEffect, useState } from 'react';
import { Panel } from '@xyflow/react';
import { ACCUMULATOR_FLOOR, LINK_STYLE, ROLE_STYLE, shapePath, INK, MUTED } from '../../theme/visual';
import { useUi, uiStore } from '../../state/ui';
import { WHITE } from '../../theme/tokens';

function Shape({ kind }: { kind: 'input' | 'state' | 'derived' }) {
  const shape = kind === 'input' ? 'tag' : kind === 'state' ? 'accumulator' : 'pill';
  const s = ROLE_STYLE[kind];
  return (
    <svg width="34" height="18" viewBox="-1 -1 46 24" aria-hidden="true">
      <path d={shapePath(shape, 44, 22)} fill={s.fill} stroke={s.stroke} strokeWidth={1.5} />
      {shape === 'accumulator' && <rect x={0} y={22 - ACCUMULATOR_FLOOR / 2} width={44} height={ACCUMULATOR_FLOOR / 2} fill={s.stroke} />}
    </svg>
  );
}

function Line({ kind }: { kind: 'instantaneous' | 'integrating' }) {
  const s = LINK_STYLE[kind];
  return (
    <svg width="40" height="14" aria-hidden="true">
      <line x1="2" y1="7" x2="32" y2="7" stroke={s.stroke} strokeWidth="2" strokeDasharray={s.dash} />
      {s.head === 'filled' ? <path d="M31,2 L42,7 L31,12 Z" fill={s.stroke} /> : <path d="M31,2 L42,7 L31,12 Z" fill={WHITE} stroke={s.stroke} strokeWidth="1.5" />}
    </svg>
  );
}

/**
 * What the shapes and lines mean; collapsible. On a narrow canvas (a projector) it starts folded
 * to its button and opens on request, without changing the choice kept for a wide canvas.
 */
export function Legend({ narrow = false, onResize }: { narrow?: boolean; onResize?: () => void }) {
  const wideOpen = useUi((s) => s.legendOpen);
  const [narrowOpen, setNarrowOpen] = useState(false);
  const open = narrow ? narrowOpen : wideOpen;
  const toggle = () => (narrow ? setNarrowOpen(!open) : uiStore.getState().set({ legendOpen: !open }));
  useEffect(() => onResize?.(), [open, onResize]);
  return (
    <Panel position="top-left" className={`lf-legend${open ? ' is-open' : ''}`} aria-label="Notation">
      <button type="button" className="lf-legend-toggle" aria-expanded={open} onClick={toggle}>
        {open ? '▾' : '▸'} Notation
      </button>
      {open && (
        <ul className="lf-legend-items">
          <li><Shape kind="input" /> input <span>set from outside</span></li>
          <li><Shape kind="state" /> state <span>accumulates, timescale τ</span></li>
          <li><Shape kind="derived" /> derived <span>follows at once</span></li>
          <li><Line kind="instantaneous" /> instantaneous <span>{LINK_STYLE.instantaneous.label}</span></li>
          <li><Line kind="integrating" /> integrating <span>{LINK_STYLE.integrating.label}</span></li>
          <li><span className="lf-legend-glyph" style={{ color: INK }}>+ −</span> sign <span>line width = strength</span></li>
          <li>
            <svg width="40" height="22" aria-hidden="true"><circle cx="11" cy="11" r="9" fill={WHITE} stroke={INK} strokeWidth="1.4" /><text x="11" y="15" textAnchor="middle" fontSize="11" fontWeight="700" fill={INK}>=</text><line x1="21" y1="11" x2="39" y2="11" stroke={MUTED} strokeWidth="1.4" strokeDasharray="1.5 3" strokeLinecap="round" /></svg>
            relation <span>an equation joining variables</span>
          </li>
        </ul>
      )}
    </Panel>
  );
}
