import { memo } from 'react';
import { BaseEdge, useInternalNode, type EdgeProps, type InternalNode } from '@xyflow/react';
import { INK, LINK_STYLE, MUTED } from '../../theme/visual';
import { HEAD_MARKER } from './Markers';
import { linkPath, type Box } from './geometry';
import { scaledDash } from './zoomDetail';
import type { LinkFlowEdge } from './flow';

/** Line width from the link strength |weight| (default 1). */
export function strokeForWeight(weight: number | undefined): number {
  const w = Math.min(3, Math.abs(weight ?? 1));
  return 1.2 + w * 0.9;
}

/** The bar of a minus, or the cross of a plus, centred on (x, y). */
export function signPath(sign: '+' | '-', x: number, y: number): string {
  const bar = `M${x - 4.5},${y} H${x + 4.5}`;
  return sign === '-' ? bar : `${bar} M${x},${y - 4.5} V${y + 4.5}`;
}

function boxOf(n: InternalNode | undefined): Box | null {
  if (!n) return null;
  const w = n.measured.width ?? 0;
  const h = n.measured.height ?? 0;
  if (!w || !h) return null;
  return { x: n.internals.positionAbsolute.x, y: n.internals.positionAbsolute.y, w, h };
}

const LINK_DASH = { instantaneous: undefined, integrating: LINK_STYLE.integrating.dash && scaledDash(LINK_STYLE.integrating.dash) };

/** A link: instantaneous = solid with a filled head, integrating = dashed with a hollow head; sign near the head. */
export const LinkEdge = memo(function LinkEdge({ source, target, data, selected }: EdgeProps<LinkFlowEdge>) {
  const a = boxOf(useInternalNode(source));
  const b = boxOf(useInternalNode(target));
  if (!a || !b) return null;
  const link = data!.link;
  const style = LINK_STYLE[link.kind];
  const { path, glyph } = linkPath(a, b);
  const width = strokeForWeight(link.weight);
  return (
    <>
      {selected && <BaseEdge path={path} style={{ stroke: '#c77d0a', strokeOpacity: 0.45, strokeWidth: width + 7 }} />}
      <BaseEdge path={path} markerEnd={HEAD_MARKER[link.kind]} style={{ stroke: style.stroke, strokeWidth: width, strokeDasharray: LINK_DASH[link.kind] }} interactionWidth={18} />
      {link.sign && (
        // drawn in the edge layer itself (no HTML overlay per link), in the edge's own coordinates: a
        // transform per glyph would split the page's paint into one more piece per link
        <g className={`lf-sign${link.sign === '-' ? ' is-minus' : ''}`} aria-hidden="true">
          <circle cx={glyph.x} cy={glyph.y} r={8.5} fill={link.sign === '-' ? INK : '#ffffff'} stroke={INK} strokeWidth={1} />
          <path d={signPath(link.sign, glyph.x, glyph.y)} stroke={link.sign === '-' ? '#ffffff' : INK} strokeWidth={1.8} strokeLinecap="round" />
        </g>
      )}
    </>
  );
});

/** A relation joined to one of its variables: dotted, no head (a relation has no direction). */
export const MemberEdge = memo(function MemberEdge({ source, target }: EdgeProps) {
  const a = boxOf(useInternalNode(source));
  const b = boxOf(useInternalNode(target));
  if (!a || !b) return null;
  // relation ring is the left 30 px of its node
  const ring: Box = { x: a.x, y: a.y, w: 30, h: 30 };
  const { path } = linkPath(ring, b, 0);
  return <BaseEdge path={path} style={{ stroke: MUTED, strokeWidth: 1.5, strokeDasharray: '1.5 3.5', strokeLinecap: 'round' }} />;
});
