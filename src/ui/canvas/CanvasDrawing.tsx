/**
 * The drawing of the mechanism canvas: every link and every variable in one
 * `<svg>` under the flow's (transparent) variable boxes.
 *
 * The flow library would draw each link as its own `<svg>` with its own
 * subscription to the flow's store, and each variable as a box of HTML and
 * SVG: with 500 variables and 1,000 links a pointer move during a drag ran
 * 1,000 selectors, and the browser sorted some 2,000 separately painted
 * pieces into layers on every frame, also while only the interval control
 * beside the canvas moved. Here one subscription (the flow's node list)
 * recomputes the geometry of the links whose end boxes changed, one `<svg>`
 * holds the resting drawing, and what is being dragged (the variables and
 * their links) is drawn on a layer of its own, so a drag redraws only that.
 *
 * The flow's variable boxes stay on top, empty but for the connectors under
 * the pointer and problem badges: they take the pointer, the keyboard focus
 * and the screen reader's labels.
 *
 * Links are focusable (Tab), Enter or Space selects one, Shift adds it to the
 * selection, Escape clears it; a click selects, Shift/Ctrl/Cmd-click toggles.
 */
import { memo, useCallback, useMemo, useRef, type KeyboardEvent, type MouseEvent, type ReactElement } from 'react';
import { EdgeLabelRenderer, useStore, useStoreApi, type InternalNode } from '@xyflow/react';
import type { Link, Model, Variable } from '../../core/model/types';
import { timescaleText } from '../../core/model/timescale';
import { ACCUMULATOR_FLOOR, FONT_STACK, INK, KIND_SHAPE, LINK_STYLE, MUTED, ROLE_STYLE, shapePath } from '../../theme/visual';
import { selectionStore, useSelection } from '../../state/selection';
import { headPath, linkPath, type Box } from './geometry';
import { scaledDash } from './zoomDetail';
import { canvasLines } from './flow';
import { fitText, fontMeasure } from './textFit';
import { CANVAS_CAPTION_PX } from './fit';
import { NODE_H, variableWidth } from './VariableNode';
import { HIT_STROKE, SELECTION, WHITE } from '../../theme/tokens';

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

export function boxOf(n: InternalNode | undefined): Box | null {
  if (!n) return null;
  const w = n.measured.width ?? 0;
  const h = n.measured.height ?? 0;
  if (!w || !h) return null;
  return { x: n.internals.positionAbsolute.x, y: n.internals.positionAbsolute.y, w, h };
}

const sameBox = (a: Box, b: Box) => a.x === b.x && a.y === b.y && a.w === b.w && a.h === b.h;

interface Drawn {
  a: Box;
  b: Box;
  d: string;
  gx: number;
  gy: number;
  /** The arrowheads of both kinds at this line's tip (the layer draws the one of the link's kind). */
  heads: { filled: string; hollow: string };
}

/**
 * The path of a line between two boxes, from a cache kept per line: a line
 * whose two boxes did not move keeps its previous path string, so its element
 * sees the same props and is not redrawn.
 */
export function drawnBetween(cache: Map<string, Drawn>, id: string, a: Box, b: Box, draw: (a: Box, b: Box) => ReturnType<typeof linkPath>): Drawn {
  const old = cache.get(id);
  if (old && sameBox(old.a, a) && sameBox(old.b, b)) return old;
  const { path, glyph, tip, control } = draw(a, b);
  const next = { a, b, d: path, gx: glyph.x, gy: glyph.y, heads: { filled: headPath(tip, control, HEAD.filled.length, HEAD.filled.half), hollow: headPath(tip, control, HEAD.hollow.length, HEAD.hollow.half) } };
  cache.set(id, next);
  return next;
}

/** The two heads: filled (instantaneous) and hollow (integrating), as the notation's legend draws them. */
const HEAD = { filled: { length: 10, half: 5 }, hollow: { length: 11, half: 5.5 } } as const;

const LINK_DASH = { instantaneous: undefined, integrating: LINK_STYLE.integrating.dash && scaledDash(LINK_STYLE.integrating.dash) };

interface LinkShapeProps {
  link: Link;
  label: string;
  d: string;
  head: string;
  /** Zoomed far out: the sign glyph is left out (too small to read). */
  far: boolean;
  gx: number;
  gy: number;
  selected: boolean;
}

/** One link: instantaneous = solid with a filled head, integrating = dashed with a hollow head; sign near the head. */
const LinkShape = memo(function LinkShape({ link, label, d, head, gx, gy, selected, far }: LinkShapeProps) {
  const style = LINK_STYLE[link.kind];
  const width = strokeForWeight(link.weight);
  const minus = link.sign === '-';
  return (
    <g className={`lf-link nopan${selected ? ' is-selected' : ''}`} data-link={link.id} data-kind={link.kind} tabIndex={0} role="button" aria-pressed={selected} aria-label={label}>
      {/* the wide stroke that takes the pointer: unpainted, shown as a soft band when the link has keyboard focus */}
      <path d={d} className="lf-link-hit" fill="none" stroke={HIT_STROKE} strokeWidth={18} />
      {selected && <path d={d} className="lf-link-halo" fill="none" stroke={SELECTION} strokeOpacity={0.45} strokeWidth={width + 7} />}
      <path d={d} className="lf-link-line" fill="none" stroke={style.stroke} strokeWidth={width} style={LINK_DASH[link.kind] ? { strokeDasharray: LINK_DASH[link.kind] } : undefined} />
      {link.kind === 'integrating' ? (
        <path d={head} className="lf-link-head" fill={WHITE} stroke={style.stroke} strokeWidth={1.6} strokeLinejoin="round" />
      ) : (
        <path d={head} className="lf-link-head" fill={style.stroke} stroke={style.stroke} strokeWidth={1} strokeLinejoin="round" />
      )}
      {link.sign && !far && (
        <g className={`lf-sign${minus ? ' is-minus' : ''}`} aria-hidden="true">
          <circle cx={gx} cy={gy} r={8.5} fill={minus ? INK : WHITE} stroke={INK} strokeWidth={1} />
          <path d={signPath(link.sign, gx, gy)} stroke={minus ? WHITE : INK} strokeWidth={1.8} strokeLinecap="round" />
        </g>
      )}
    </g>
  );
});

/** A relation joined to one of its variables: dotted, no head (a relation has no direction). */
const MemberShape = memo(function MemberShape({ d }: { d: string }) {
  return <path d={d} className="lf-member" fill="none" stroke={MUTED} strokeWidth={1.5} strokeDasharray="1.5 3.5" strokeLinecap="round" />;
});

const memberPath = (a: Box, b: Box) => linkPath({ x: a.x, y: a.y, w: 30, h: 30 }, b, 0); // the relation's ring is the left 30 px of its node

/** Below this zoom names are under 4 px high: the drawing leaves out text, connectors and sign glyphs. */
export const FAR_ZOOM = 0.3;

const KIND_CAPTION = { input: 'input', state: 'state', derived: 'derived' } as const;
const LABEL_PX = 13.5;
const CAPTION_PX = CANVAS_CAPTION_PX;
const labelMeasure = fontMeasure(`600 ${LABEL_PX}px ${FONT_STACK}`, LABEL_PX);
const captionMeasure = fontMeasure(`${CAPTION_PX}px ${FONT_STACK}`, CAPTION_PX, 0.58);

/** What a variable's box says: its name and, below it, its kind (a state with its timescale). */
export function variableCaption(v: Variable): string {
  return v.kind === 'state' && v.timescale !== undefined ? `state · τ ${timescaleText(v.timescale)}` : KIND_CAPTION[v.kind];
}

/**
 * A variable in the notation — tag = input, accumulator = state, pill =
 * derived — at (x, y) in canvas coordinates, with the connector (where a link
 * is drawn from) on its right. Drawn in the drawing's own coordinates: a
 * transform per variable would make each one a separate piece again.
 */
const VariableShape = memo(function VariableShape({ v, x, y, selected, far }: { v: Variable; x: number; y: number; selected: boolean; far: boolean }) {
  const label = v.label ?? v.id;
  const w = variableWidth(label);
  const h = NODE_H;
  const shape = KIND_SHAPE[v.kind];
  const style = ROLE_STYLE[v.kind];
  const d = shapePath(shape, w, h, x, y);
  const left = v.kind === 'derived' ? 18 : 12;
  const room = w - left - (shape === 'tag' ? 16 : 8);
  const body = shape === 'accumulator' ? h - ACCUMULATOR_FLOOR : h;
  // two lines (label, caption) centred in the body, as 1.15 line height would set them
  const top = y + (body - (LABEL_PX + CAPTION_PX) * 1.15) / 2;
  return (
    <g className="lf-var-drawn" data-variable={v.id} data-kind={v.kind}>
      {selected && <path d={d} fill="none" stroke={SELECTION} strokeWidth={6} strokeOpacity={0.45} />}
      <path d={d} fill={style.fill} stroke={style.stroke} strokeWidth={style.strokeWidth} strokeDasharray={style.dash} />
      {shape === 'accumulator' && <rect x={x} y={y + h - ACCUMULATOR_FLOOR} width={w} height={ACCUMULATOR_FLOOR} fill={style.stroke} />}
      {!far && <text x={x + left} y={top + LABEL_PX * 0.95} fontSize={LABEL_PX} fontWeight={600} fill={INK}>{fitText(label, room, labelMeasure)}</text>}
      {!far && <text x={x + left} y={top + LABEL_PX * 1.15 + CAPTION_PX * 0.95} fontSize={CAPTION_PX} fill={MUTED}>{fitText(variableCaption(v), room, captionMeasure)}</text>}
      {!far && <circle className="lf-connector" cx={x + w + 8} cy={y + h / 2} r={5} fill={WHITE} fillOpacity={0.35} stroke={INK} strokeOpacity={0.35} strokeWidth={2} />}
    </g>
  );
});

function pickLink(id: string, add: boolean): void {
  const s = selectionStore.getState();
  if (!add) {
    s.select({ nodes: [], links: [id] });
    return;
  }
  const links = s.links.includes(id) ? s.links.filter((x) => x !== id) : [...s.links, id];
  s.select({ nodes: s.nodes, links });
}

/** The links, relation members and variables of `model`, drawn where the flow has its nodes now. */
export function CanvasDrawing({ model }: { model: Model }) {
  // a new node list from the flow = something moved or was measured
  const flowNodes = useStore((s) => s.nodes);
  // zoomed far out, text and glyphs are too small to read: the drawing leaves them out (a third of its pieces)
  const far = useStore((s) => s.transform[2] < FAR_ZOOM);
  const lookup = useStoreApi().getState().nodeLookup;
  const selected = useSelection((s) => s.links);
  const selectedNodes = useSelection((s) => s.nodes);
  const cache = useRef(new Map<string, Drawn>());
  const onClick = useCallback((e: MouseEvent<SVGSVGElement>) => {
    const id = (e.target as Element).closest('[data-link]')?.getAttribute('data-link');
    if (id) pickLink(id, e.shiftKey || e.metaKey || e.ctrlKey);
  }, []);
  const onKeyDown = useCallback((e: KeyboardEvent<SVGSVGElement>) => {
    const id = (e.target as Element).getAttribute('data-link');
    if (!id) return;
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      pickLink(id, e.shiftKey);
    } else if (e.key === 'Escape') {
      const s = selectionStore.getState();
      s.select({ nodes: s.nodes, links: s.links.filter((x) => x !== id) });
    }
  }, []);

  // what depends on the document only, not on where the nodes are
  const lines = useMemo(() => canvasLines(model), [model]);
  const sel = new Set(selected);
  // what is being dragged (the variables and their lines) goes to a layer of its own (.lf-links.is-moving)
  const moving = new Set<string>();
  for (const n of flowNodes) if (n.dragging) moving.add(n.id);
  const seen = new Set<string>();
  const resting: ReactElement[] = [];
  const carried: ReactElement[] = [];
  for (const { id, link, label } of lines.links) {
    const a = boxOf(lookup.get(link.from));
    const b = boxOf(lookup.get(link.to));
    if (!a || !b) continue;
    seen.add(id);
    const g = drawnBetween(cache.current, id, a, b, linkPath);
    (moving.has(link.from) || moving.has(link.to) ? carried : resting).push(<LinkShape key={id} link={link} label={label} d={g.d} head={link.kind === 'integrating' ? g.heads.hollow : g.heads.filled} gx={g.gx} gy={g.gy} selected={sel.has(id)} far={far} />);
  }
  const members: ReactElement[] = [];
  const carriedMembers: ReactElement[] = [];
  for (const m of lines.members) {
    const a = boxOf(lookup.get(m.relation));
    const b = boxOf(lookup.get(m.variable));
    if (!a || !b) continue;
    seen.add(m.id);
    (moving.has(m.relation) || moving.has(m.variable) ? carriedMembers : members).push(<MemberShape key={m.id} d={drawnBetween(cache.current, m.id, a, b, memberPath).d} />);
  }
  for (const id of cache.current.keys()) if (!seen.has(id)) cache.current.delete(id);
  const pickedNodes = new Set(selectedNodes);
  const variables: ReactElement[] = [];
  const carriedVariables: ReactElement[] = [];
  for (const v of model.variables) {
    const n = lookup.get(v.id);
    if (!n) continue;
    const p = n.internals.positionAbsolute;
    (moving.has(v.id) ? carriedVariables : variables).push(<VariableShape key={v.id} v={v} x={p.x} y={p.y} selected={pickedNodes.has(v.id)} far={far} />);
  }

  return (
    <EdgeLabelRenderer>
      <svg className="lf-links" onClick={onClick} onKeyDown={onKeyDown} aria-label="Links" role="group">
        <g className="lf-members" aria-hidden="true">{members}</g>
        {resting}
        <g className="lf-vars-drawn" aria-hidden="true">{variables}</g>
      </svg>
      {moving.size > 0 && (
        <svg className="lf-links is-moving" onClick={onClick} onKeyDown={onKeyDown} aria-label="Links being moved" role="group">
          <g className="lf-members" aria-hidden="true">{carriedMembers}</g>
          {carried}
          <g className="lf-vars-drawn" aria-hidden="true">{carriedVariables}</g>
        </svg>
      )}
    </EdgeLabelRenderer>
  );
}
