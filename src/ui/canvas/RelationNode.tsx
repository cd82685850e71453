import { memo } from 'react';
import { Handle, Position, type NodeProps } from '@xyflow/react';
import { INK } from '../../theme/visual';
import type { RelationFlowNode } from './flow';
import { SELECTION, WHITE } from '../../theme/tokens';

export const RELATION_R = 15;

/** An implicit relation: a small ring with "=" joined by dotted lines to its variables. */
export const RelationNode = memo(function RelationNode({ data, selected }: NodeProps<RelationFlowNode>) {
  const d = RELATION_R * 2;
  const c = RELATION_R + 3; // drawn 1:1, no viewBox (see VariableNode)
  return (
    <div className={`lf-rel${selected ? ' is-selected' : ''}`} title={data.relation.equation}>
      <svg width={d + 6} height={d + 6} aria-hidden="true">
        {selected && <circle cx={c} cy={c} r={RELATION_R + 2} fill="none" stroke={SELECTION} strokeWidth={5} strokeOpacity={0.45} />}
        <circle cx={c} cy={c} r={RELATION_R} fill={WHITE} stroke={INK} strokeWidth={1.5} />
        <circle cx={c} cy={c} r={RELATION_R - 3.5} fill="none" stroke={INK} strokeWidth={0.8} />
        <text x={c} y={c + 5} textAnchor="middle" fontSize="15" fontWeight="700" fill={INK}>=</text>
      </svg>
      <span className="lf-rel-text">{data.relation.equation}</span>
      {data.errors > 0 && <span className="lf-badge is-error lf-badge-rel">!<span className="lf-sr">has a problem</span></span>}
      <Handle type="source" position={Position.Top} className="lf-handle-hidden" isConnectable={false} />
      <Handle type="target" position={Position.Top} className="lf-handle-hidden" isConnectable={false} />
    </div>
  );
});
