import { memo } from 'react';
import { Handle, Position, type NodeProps } from '@xyflow/react';
import { ACCUMULATOR_FLOOR, KIND_SHAPE, ROLE_STYLE, shapePath } from '../../theme/visual';
import type { VariableFlowNode } from './flow';

export const NODE_H = 46;
const KIND_CAPTION = { input: 'input', state: 'state', derived: 'derived' } as const;

export function variableWidth(label: string): number {
  return Math.max(112, Math.min(280, Math.round(label.length * 8.4 + 48)));
}

/** A variable drawn in the notation: tag = input, accumulator = state, pill = derived. */
export const VariableNode = memo(function VariableNode({ data, selected }: NodeProps<VariableFlowNode>) {
  const v = data.variable;
  const label = v.label ?? v.id;
  const w = variableWidth(label);
  const h = NODE_H;
  const shape = KIND_SHAPE[v.kind];
  const role = data.role ?? v.kind;
  const style = ROLE_STYLE[role];
  const caption = v.kind === 'state' && v.timescale !== undefined ? `state · τ ${String(v.timescale)}` : KIND_CAPTION[v.kind];
  return (
    <div className={`lf-var lf-var-${v.kind}${selected ? ' is-selected' : ''}`} style={{ width: w, height: h }} data-kind={v.kind}>
      <svg className="lf-var-shape" width={w} height={h} viewBox={`-2 -2 ${w + 4} ${h + 4}`} aria-hidden="true">
        {selected && <path d={shapePath(shape, w, h)} fill="none" stroke="#c77d0a" strokeWidth={6} strokeOpacity={0.45} />}
        <path d={shapePath(shape, w, h)} fill={style.fill} stroke={style.stroke} strokeWidth={style.strokeWidth} strokeDasharray={style.dash} />
        {shape === 'accumulator' && <rect x={0} y={h - ACCUMULATOR_FLOOR} width={w} height={ACCUMULATOR_FLOOR} fill={style.stroke} />}
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
      <Handle type="target" position={Position.Left} className="lf-handle-in" isConnectableStart={false} />
      <Handle type="source" position={Position.Right} className="lf-handle-out" title="Drag to another variable to draw a link" />
    </div>
  );
});
