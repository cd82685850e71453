/**
 * One view drawn on screen: placed at once from the previous positions,
 * then moved smoothly to the tuned ELK layout when it arrives (a layout made
 * obsolete by a newer view is dropped).
 */
import { memo, useEffect, useMemo, useRef, useState, type MouseEvent } from 'react';
import type { ViewModel } from '../../core/view/types';
import { buildScene } from '../../export/scene';
import { createLayoutQueue } from '../../layout/browser';
import { ease, interpolateLayout } from '../../layout/geometry';
import { instantLayout } from '../../layout/instant';
import type { Layout } from '../../layout/types';
import { serialize } from '../../export/svg';

const ANIMATION_MS = 320;
/** The figure shrinks to fit its pane down to this scale, then scrolls (labels stay legible). */
const MIN_SCALE = 0.8;
/** The three instants are wide: fitting them shows the whole sequence first. */
const FIT_SCALE_UNROLLED = 0.45;
/** Above this many nodes, positions jump instead of moving (keeps the page responsive). */
const ANIMATE_UP_TO = 250;

export interface ViewCanvasProps {
  vm: ViewModel;
  /** The modeller's drawn positions: used as is (no ELK) when given. */
  drawn?: Record<string, { x: number; y: number }>;
  onToggleBlock?(key: string): void;
  /** Called with the settled layout (for export and tests). */
  onLayout?(layout: Layout): void;
  label: string;
  /** A name for the view shown (the band), written to data-shown once it is on screen (for tests and benchmarks). */
  tag?: string | number;
}

/** Memoised: dragging the interval inside a band re-renders the pane, not the figure. */
export const ViewCanvas = memo(function ViewCanvas({ vm, drawn, onToggleBlock, onLayout, label, tag }: ViewCanvasProps) {
  const [shown, setShown] = useState<Layout | null>(null);
  const [shownTag, setShownTag] = useState<string | number | undefined>(undefined);
  const shownRef = useRef<Layout | null>(null);
  const frame = useRef<number>(0);
  const queue = useMemo(() => createLayoutQueue(), []);
  const [pending, setPending] = useState(false);

  useEffect(() => {
    const show = (l: Layout) => { shownRef.current = l; setShown(l); };
    const animateTo = (target: Layout) => {
      cancelAnimationFrame(frame.current);
      const from = shownRef.current;
      if (!from || vm.nodes.length > ANIMATE_UP_TO) { show(target); return; }
      const t0 = performance.now();
      const step = () => {
        const t = Math.min(1, (performance.now() - t0) / ANIMATION_MS);
        show(t >= 1 ? target : interpolateLayout(from, target, ease(t)));
        if (t < 1) frame.current = requestAnimationFrame(step);
      };
      frame.current = requestAnimationFrame(step);
    };
    const prev = shownRef.current ?? undefined;
    setShownTag(tag);
    if (drawn) {
      const l = { ...instantLayout(vm, undefined, drawn), source: 'drawn' as const };
      animateTo(l);
      onLayout?.(l);
      return;
    }
    const instant = instantLayout(vm, prev);
    animateTo(instant);
    setPending(true);
    let live = true;
    void queue.request(vm, { previous: instant }).then((l) => {
      if (!live || !l) return;
      setPending(false);
      animateTo(l);
      onLayout?.(l);
    }).catch(() => { if (live) setPending(false); });
    return () => { live = false; };
    // onLayout is a callback prop: a new identity must not re-run the layout
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [vm, drawn, queue]);

  useEffect(() => () => { cancelAnimationFrame(frame.current); void queue.dispose(); }, [queue]);

  const [zoom, setZoom] = useState<'fit' | number>('fit');
  // the pane has its own heading and summary: the figure's title line is for exported files
  const scene = useMemo(() => (shown ? buildScene(vm, shown, { legend: true, title: false }) : null), [vm, shown]);
  const natural = scene ? Number(scene.attrs.width) : 0;
  const sizeStyle = zoom === 'fit' ? `width:100%;min-width:${Math.round(natural * (vm.mode === 'unrolled' ? FIT_SCALE_UNROLLED : MIN_SCALE))}px` : `width:${Math.round(natural * zoom)}px`;
  // the exporter's own serialiser: the screen shows the file's markup (and the browser parses it
  // far faster than a React tree of thousands of elements is reconciled)
  const markup = useMemo(() => (scene ? serialize({ ...scene, attrs: { ...scene.attrs, width: undefined, height: undefined, preserveAspectRatio: 'xMidYMin meet', style: sizeStyle } }) : ''), [scene, sizeStyle]);
  const zoomBy = (f: number) => setZoom((z) => Math.min(3, Math.max(0.25, (z === 'fit' ? 1 : z) * f)));
  const onClick = (ev: MouseEvent) => {
    const t = (ev.target as Element).closest('.lf-toggle');
    const key = t?.getAttribute('data-block');
    if (key && onToggleBlock) onToggleBlock(key);
  };
  return (
    <div className="lf-view-wrap">
      <div className="lf-zoom" role="group" aria-label={`Zoom: ${label}`}>
        <button type="button" aria-label="Zoom out" onClick={() => zoomBy(1 / 1.25)}>−</button>
        <button type="button" aria-pressed={zoom === 'fit'} onClick={() => setZoom('fit')}>Fit</button>
        <button type="button" aria-label="Zoom in" onClick={() => zoomBy(1.25)}>+</button>
      </div>
      {scene
        ? <div className="lf-view-canvas" aria-label={label} role="figure" data-layout={shown?.source ?? 'none'} data-pending={pending ? 'true' : 'false'} data-shown={shownTag} onClick={onClick} dangerouslySetInnerHTML={{ __html: markup }} />
        : <div className="lf-view-canvas" aria-label={label} role="figure" data-layout="none" data-pending="true"><p>Placing the variables…</p></div>}
    </div>
  );
});
