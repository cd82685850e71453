import { memo } from 'react';
import { BaseEdge, EdgeLabelRenderer, getBezierPath, getStraightPath, type EdgeProps } from '@xyflow/react';
import { LINK_STYLE, MUTED } from '../../theme/visual';
import { HEAD_MARKER } from './Markers';
import type { LinkFlowEdge } from './flow';

/** Line width from the link strength |weight| (default 1). */
export function strokeForWeight(weight: number | undefined): number {
  const w = Math.min(3, Math.abs(weight ?? 1));
  return 1.2 + w * 0.9;
}

/** A link: instantaneous = solid with a filled head, integrating = dashed with a hollow head; sign near the head. */
export const LinkEdge = memo(function LinkEdge(props: EdgeProps<LinkFlowEdge>) {
  const { sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, data, selected } = props;
  const link = data!.link;
  const style = LINK_STYLE[link.kind];
  const [path] = getBezierPath({ sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, curvature: 0.3 });
  // the sign sits near the head, offset to the side of the line
  const t = 0.8;
  const gx = sourceX + (targetX - sourceX) * t;
  const gy = sourceY + (targetY - sourceY) * t;
  return (
    <>
      {selected && <BaseEdge path={path} style={{ stroke: '#c77d0a', strokeOpacity: 0.4, strokeWidth: strokeForWeight(link.weight) + 6 }} />}
      <BaseEdge path={path} markerEnd={HEAD_MARKER[link.kind]} style={{ stroke: style.stroke, strokeWidth: strokeForWeight(link.weight), strokeDasharray: style.dash }} interactionWidth={16} />
      {link.sign && (
        <EdgeLabelRenderer>
          <span className={`lf-sign${link.sign === '-' ? ' is-minus' : ''}`} style={{ transform: `translate(-50%, -50%) translate(${gx}px, ${gy - 12}px)` }} aria-hidden="true">
            {link.sign === '-' ? '−' : '+'}
          </span>
        </EdgeLabelRenderer>
      )}
    </>
  );
});

/** A relation joined to one of its variables: dotted, no head (a relation has no direction). */
export const MemberEdge = memo(function MemberEdge(props: EdgeProps) {
  const [path] = getStraightPath({ sourceX: props.sourceX, sourceY: props.sourceY + 15, targetX: props.targetX, targetY: props.targetY });
  return <BaseEdge path={path} style={{ stroke: MUTED, strokeWidth: 1.4, strokeDasharray: '1.5 3', strokeLinecap: 'round' }} />;
});
