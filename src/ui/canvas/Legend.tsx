import { Panel } from '@xyflow/react';
import { ACCUMULATOR_FLOOR, LINK_STYLE, ROLE_STYLE, shapePath, INK, MUTED } from '../../theme/visual';
import { useUi, uiStore } from '../../state/ui';

function Shape({ kind }: { kind: 'input' | 'state' | 'derived' }) {
  const shape = kind === 'input' ? 'tag' : kind === 'state' ? 'accumulator' : 'pill';
  const s = ROLE_STYLE[kind];
  return (
    <svg width="44" height="22" viewBox="-1 -1 46 24" aria-hidden="true">
      <path d={shapePath(shape, 44, 22)} fill={s.fill} stroke={s.stroke} strokeWidth={1.5} />
      {shape === 'accumulator' && <rect x={0} y={22 - ACCUMULATOR_FLOOR / 2} width={44} height={ACCUMULATOR_FLOOR / 2} fill={s.stroke} />}
    </svg>
  );
}

function Line({ kind }: { kind: 'instantaneous' | 'integrating' }) {
  const s = LINK_STYLE[kind];
  return (
    <svg width="44" height="14" aria-hidden="true">
      <line x1="2" y1="7" x2="32" y2="7" stroke={s.stroke} strokeWidth="2" strokeDasharray={s.dash} />
      {s.head === 'filled' ? <path d="M31,2 L42,7 L31,12 Z" fill={s.stroke} /> : <path d="M31,2 L42,7 L31,12 Z" fill="#fff" stroke={s.stroke} strokeWidth="1.5" />}
    </svg>
  );
}

/** What the shapes and lines mean; collapsible. */
export function Legend() {
  const open = useUi((s) => s.legendOpen);
  return (
    <Panel position="top-left" className="lf-legend">
      <button type="button" className="lf-legend-toggle" aria-expanded={open} onClick={() => uiStore.getState().set({ legendOpen: !open })}>
        {open ? '▾' : '▸'} Notation
      </button>
      {open && (
        <dl>
          <dt><Shape kind="input" /></dt><dd>input — set from outside</dd>
          <dt><Shape kind="state" /></dt><dd>state — accumulates (has a timescale τ)</dd>
          <dt><Shape kind="derived" /></dt><dd>derived — follows its sources at once</dd>
          <dt><Line kind="instantaneous" /></dt><dd>instantaneous link — {LINK_STYLE.instantaneous.label}</dd>
          <dt><Line kind="integrating" /></dt><dd>integrating link — {LINK_STYLE.integrating.label}</dd>
          <dt><span className="lf-legend-glyph" style={{ color: INK }}>+ / −</span></dt><dd>sign of the effect; line width = strength</dd>
          <dt>
            <svg width="44" height="22" aria-hidden="true"><circle cx="11" cy="11" r="9" fill="#fff" stroke={INK} strokeWidth="1.4" /><text x="11" y="15" textAnchor="middle" fontSize="11" fontWeight="700" fill={INK}>=</text><line x1="21" y1="11" x2="43" y2="11" stroke={MUTED} strokeWidth="1.4" strokeDasharray="1.5 3" strokeLinecap="round" /></svg>
          </dt><dd>relation — an equation joining its variables</dd>
        </dl>
      )}
    </Panel>
  );
}
