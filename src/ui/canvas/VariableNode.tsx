import { memo, useEffect, useRef, useState, type PointerEvent } from 'react';
import { Handle, Position, useUpdateNodeInternals, type NodeProps } from '@xyflow/react';
import type { VariableFlowNode } from './flow';

export const NODE_H = 46;

export function variableWidth(label: string): number {
  return Math.max(112, Math.min(280, Math.round(label.length * 8.4 + 48)));
}

/**
 * A variable's box on the canvas: it takes the pointer, the focus and the
 * screen reader's label, and holds the connectors and problem badge. What the
 * variable looks like (tag = input, accumulator = state, pill = derived) is
 * drawn under it with everything else, in one svg (CanvasDrawing.tsx).
 */
export const VariableNode = memo(function VariableNode({ id, data, selected }: NodeProps<VariableFlowNode>) {
  const v = data.variable;
  const label = v.label ?? v.id;
  const w = variableWidth(label);
  const h = NODE_H;
  // The flow's connectors are mounted only on the variable under the pointer (or selected): each one
  // is a subscription to the flow's store and a piece of the page the browser sorts on every frame,
  // 1,000 of them on a 500-variable canvas. Elsewhere the drawing shows where to start a link.
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
  return (
    <div className={`lf-var lf-var-${v.kind}${selected ? ' is-selected' : ''}`} style={{ width: w, height: h }} data-kind={v.kind} onPointerEnter={onPointerEnter} onPointerLeave={onPointerLeave}>
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
      ) : null}
    </div>
  );
});
