import { memo, useEffect, useRef, useState, type PointerEvent } from 'react';
import { Handle, Position, useUpdateNodeInternals, type NodeProps } from '@xyflow/react';
import { ACCUMULATOR_FLOOR, KIND_SHAPE, ROLE_STYLE, shapePath } from '../../theme/visual';
import type { VariableFlowNode } from './flow';

export const NODE_H = 46;
const KIND_CAPTION = { input: 'input', state: 'state', derived: 'derived' } as const;

export function variableWidth(label: string): number {
  return Math.max(112, Math.min(280, Math.round(label.length * 8.4 + 48)));
}

/** A variable drawn in the notation: tag = input, accumulator = state, pill = derived. */
export const VariableNode = memo(function VariableNode({ id, data, selected }: NodeProps<VariableFlowNode>) {
  const v = data.variable;
  const label = v.label ?? v.id;
  const w = variableWidth(label);
  const h = NODE_H;
  const shape = KIND_SHAPE[v.kind];
  const role = data.role ?? v.kind;
  const style = ROLE_STYLE[role];
  // The flow's connectors are mounted only on the variable under the pointer (or selected): each one
  // is a subscription to the flow's store and a piece of the page the browser sorts on every frame,
  // 1,000 of them on a 500-variable canvas. Elsewhere a drawn stand-in shows where to start a link.
  const [near, setNear] = useState(false);
  const live = near || selected;
  // the flow finds a connector by the bounds it measured: measure again when they appear or go
  const updateInternals = useUpdateNodeInternals();
  const measuredLive = useRef(live);
  useEffect(() => {
    if (measuredLive.current === live) return; // a new node is measured by the flow itself
    measuredLive.current = live;
    updateInternals(id);
  }, [live, id, updateInternals]);
  const onPointerEnter = () => setNear(true);
  // not while a button is down: a link being drawn from here keeps its connector
  const onPointerLeave = (e: PointerEvent) => {
    if (e.buttons === 0) setNear(false);
  };
  const caption = v.kind === 'state' && v.timescale !== undefined ? `state · τ ${String(v.timescale)}` : KIND_CAPTION[v.kind];
  return (
    <div className={`lf-var lf-var-${v.kind}${selected ? ' is-selected' : ''}`} style={{ width: w, height: h }} data-kind={v.kind} onPointerEnter={onPointerEnter} onPointerLeave={onPointerLeave}>
      {/* drawn 1:1 at a 2 px offset (no viewBox): a scaled or shifted viewBox would give every variable a
          transform of its own, which the browser sorts into layers on every frame of a drag */}
      <svg className="lf-var-shape" width={w + 4} height={h + 4} aria-hidden="true">
        {selected && <path d={shapePath(shape, w, h, 2, 2)} fill="none" stroke="#c77d0a" strokeWidth={6} strokeOpacity={0.45} />}
        <path d={shapePath(shape, w, h, 2, 2)} fill={style.fill} stroke={style.stroke} strokeWidth={style.strokeWidth} strokeDasharray={style.dash} />
        {shape === 'accumulator' && <rect x={2} y={2 + h - ACCUMULATOR_FLOOR} width={w} height={ACCUMULATOR_FLOOR} fill={style.stroke} />}
      </svg>
      <div className="lf-var-text" style={{ paddingRight: shape === 'tag' ? 16 : 8, paddingBottom: shape === 'accumulator' ? ACCUMULATOR_FLOOR : 0 }}>
        <span className="lf-var-label">{label}</span>
        <span className="lf-var-caption">{caption}</span>
      </div>
      {style.glyph && <span className="lf-var-glyph" aria-hidden="true">{style.glyph}</span>}
      {(data.errors > 0 || data.warnings > 0) && (
        <span className={`lf-badge ${data.errors > 0 ? 'is-error' : 'is-warning'}`} title={`${data.errors} problem(s), ${data.warnings} warning(s): see the list`}>
          {data.errors > 0 ? '!' : '?'}
          <span className="lf-sr">{data.errors > 0 ? `${data.errors} problem${data.errors > 1 ? 's' : ''}` : `${data.warnings} warning${data.warnings > 1 ? 's' : ''}`}</span>
        </span>
      )}
      {live ? (
        <>
          <Handle type="target" position={Position.Left} className="lf-handle-in" isConnectableStart={false} />
          <Handle type="source" position={Position.Right} className="lf-handle-out" title="Drag to another variable to draw a link" />
        </>
      ) : (
        <span className="lf-connector" aria-hidden="true" />
      )}
    </div>
  );
});
