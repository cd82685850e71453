import { LINK_STYLE } from '../../theme/visual';

/** Arrowheads of the two link kinds, defined once for the whole page. */
export function LinkMarkers() {
  return (
    <svg width="0" height="0" style={{ position: 'absolute' }} aria-hidden="true">
      <defs>
        <marker id="lf-head-filled" viewBox="0 0 12 12" refX="11" refY="6" markerWidth="12" markerHeight="12" markerUnits="userSpaceOnUse" orient="auto-start-reverse">
          <path d="M1,1 L11,6 L1,11 Z" fill={LINK_STYLE.instantaneous.stroke} stroke={LINK_STYLE.instantaneous.stroke} strokeWidth="1" />
        </marker>
        <marker id="lf-head-hollow" viewBox="0 0 14 14" refX="13" refY="7" markerWidth="14" markerHeight="14" markerUnits="userSpaceOnUse" orient="auto-start-reverse">
          <path d="M1.5,1.5 L12.5,7 L1.5,12.5 Z" fill="#ffffff" stroke={LINK_STYLE.integrating.stroke} strokeWidth="1.6" />
        </marker>
      </defs>
    </svg>
  );
}

export const HEAD_MARKER = { instantaneous: 'url(#lf-head-filled)', integrating: 'url(#lf-head-hollow)' } as const;
