/**
 * One view drawn on screen: placed at once from the previous positions,
 * then moved smoothly to the tuned ELK layout when it arrives (a layout made
 * obsolete by a newer view is dropped).
 */
import { memo, useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type MouseEvent } from 'react';
import type { ViewModel } from '../../core/view/types';
import { buildScene, sceneWidth } from '../../export/scene';
import { createLayoutQueue } from '../../layout/browser';
import { ease, interpolateLayout } from '../../layout/geometry';
import { instantLayout } from '../../layout/instant';
import type { Layout } from '../../layout/types';
import { patchSvg, type SvgHost } from './svgPatch';
import { contains, grown, visibleRect, type Area } from './inView';
import { aboveInPane, fitScaleFor, roomIn, type Size } from './fit';
import { fixedText } from '../../present/index';

const ANIMATION_MS = 320;
/** The tuned layout is asked for when the view has stayed this long (not for every band a drag passes). */
const LAYOUT_AFTER_MS = 120;
/**
 * Fit shrinks the figure to its pane (width and height) down to this scale, then the pane scrolls
 * (names, drawn at 13 px, stay at least about 8 px; the zoom buttons and presentation mode show them large).
 */
const MIN_SCALE = 0.6;
/** The three instants are wide: they open fitted to the pane, the whole sequence first, down to this scale. */
const FIT_SCALE_UNROLLED = 0.3;
/** Above this many nodes, positions jump instead of moving (keeps the page responsive). */
const ANIMATE_UP_TO = 250;
/** Above this many nodes, only the parts near what is in view are built and put on the page (`buildScene`'s `area`). */
const CULL_FROM = 150;
/** How far beyond what is in view parts are drawn: this many times the view's width and height on each side. */
const CULL_MARGIN = 0.5;

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
  /**
   * False while the interval is being dragged: the view is placed at once but
   * no tuned layout is asked for until the drag ends (each would cost a layout
   * run, and stopping a run costs a fresh worker).
   */
  still?: boolean;
}

/** Memoised: dragging the interval inside a band re-renders the pane, not the figure. */
export const ViewCanvas = memo(function ViewCanvas({ vm, drawn, onToggleBlock, onLayout, label, tag, still = true }: ViewCanvasProps) {
  // the layout moved to after the view was first placed (animation frames, then ELK's), for that view
  const [moved, setMoved] = useState<{ vm: ViewModel; layout: Layout } | null>(null);
  // the view whose tuned layout came back (or failed): no longer pending
  const [settledFor, setSettledFor] = useState<ViewModel | null>(null);
  /** The layout on screen (set on commit). */
  const screenRef = useRef<Layout | null>(null);
  const frame = useRef<number>(0);
  const queue = useMemo(() => createLayoutQueue(), []);

  // a new view is placed in the same render that brings it (one scene per band, not two)
  const start = useMemo(() => {
    const prev = screenRef.current ?? undefined;
    const target: Layout = drawn ? { ...instantLayout(vm, undefined, drawn), source: 'drawn' } : instantLayout(vm, prev);
    const animate = !!prev && vm.nodes.length <= ANIMATE_UP_TO;
    return { vm, prev, target, first: animate && prev ? interpolateLayout(prev, target, 0) : target };
  }, [vm, drawn]);
  const shown = moved && moved.vm === vm ? moved.layout : start.first;
  const pending = !drawn && settledFor !== vm;
  useLayoutEffect(() => { screenRef.current = shown; }, [shown]);

  // moves the figure smoothly from where it is to a target layout (big views jump)
  const animateTo = useCallback((v: ViewModel, from: Layout | undefined, target: Layout) => {
    const show = (l: Layout) => setMoved({ vm: v, layout: l });
    cancelAnimationFrame(frame.current);
    if (!from || v.nodes.length > ANIMATE_UP_TO) { show(target); return; }
    const t0 = performance.now();
    const step = () => {
      const t = Math.min(1, (performance.now() - t0) / ANIMATION_MS);
      show(t >= 1 ? target : interpolateLayout(from, target, ease(t)));
      if (t < 1) frame.current = requestAnimationFrame(step);
    };
    frame.current = requestAnimationFrame(step);
  }, []);

  // a new view: from the previous positions to its instant placement
  useEffect(() => {
    if (start.first !== start.target) animateTo(vm, start.prev, start.target);
    else cancelAnimationFrame(frame.current);
    if (drawn) onLayout?.(start.target);
    // a layout still running for an older view is dropped (its worker finishes it; a newer request stops it)
    if (!drawn) queue.cancel();
    // onLayout is a callback prop: a new identity must not re-run this
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [start, queue]);

  // the tuned layout, asked for once the view has stayed a moment and the interval is not being dragged
  const tuned = !drawn && still && settledFor !== vm;
  useEffect(() => {
    if (!tuned) return;
    let live = true;
    const timer = setTimeout(() => {
      void queue.request(vm, { previous: start.target }).then((l) => {
        if (!live || !l) return;
        setSettledFor(vm);
        animateTo(vm, screenRef.current ?? undefined, l);
        onLayout?.(l);
      }).catch(() => { if (live) setSettledFor(vm); });
    }, LAYOUT_AFTER_MS);
    return () => { live = false; clearTimeout(timer); };
    // onLayout is a callback prop: a new identity must not re-run the layout
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [tuned, start, queue]);

  useEffect(() => () => { cancelAnimationFrame(frame.current); void queue.dispose(); }, [queue]);

  const [zoom, setZoom] = useState<'fit' | number>('fit');
  // another kind of view (the ordering, the three instants) opens fitted to the pane
  const [zoomMode, setZoomMode] = useState(vm.mode);
  if (zoomMode !== vm.mode) { setZoomMode(vm.mode); setZoom('fit'); }
  // the room the figure has in its pane (measured on mount and when the pane resizes)
  const [room, setRoom] = useState<Size | null>(null);
  const naturalHeight = useRef(0);
  // a big figure: only the parts near what is in view are built and go on the page; scrolling or
  // resizing the pane builds the parts it brings near (none while what is in view stays inside the area)
  const cull = vm.nodes.length > CULL_FROM;
  // what of the host is in view (grown by the margin), in its CSS pixels, and the host's width: measured
  // when the pane scrolls or resizes, never while a band is drawn (a read then would force a layout)
  const [seen, setSeen] = useState<{ rect: Area; width: number } | null>(null);
  const fitScale = vm.mode === 'unrolled' ? FIT_SCALE_UNROLLED : MIN_SCALE;
  // the pane has its own heading and summary: the figure's title line is for exported files
  const scene = useMemo(() => {
    const width = sceneWidth(shown);
    let area: number[] | undefined;
    if (cull) {
      // the svg's width on the page: the host's (not less than the smallest fit), or the zoom's
      const px = seen ? width * (zoom === 'fit' ? fitScaleFor({ width, height: naturalHeight.current || width }, room ?? { width: seen.width, height: 0 }, fitScale) : zoom) : 0;
      const k = px > 0 ? width / px : 0;
      // until the pane is measured (in the same frame, before it is painted), nothing of it is built
      area = seen && k ? [seen.rect.x0 * k, seen.rect.y0 * k, seen.rect.x1 * k, seen.rect.y1 * k] : [0, 0, -1, -1];
    }
    return buildScene(vm, shown, { legend: true, title: false, ...(area ? { area } : {}) });
  }, [vm, shown, cull, seen, zoom, fitScale, room]);
  const natural = Number(scene.attrs.width);
  const naturalH = Number(scene.attrs.height);
  naturalHeight.current = naturalH;
  // Fit: whole in the pane, width and height, not below the legible scale (the pane scrolls then)
  const scale = zoom === 'fit' ? fitScaleFor({ width: natural, height: naturalH }, room ?? { width: 0, height: 0 }, fitScale) : zoom;
  const sizeStyle = zoom === 'fit' && !room ? `width:100%;min-width:${Math.round(natural * fitScale)}px` : `width:${Math.round(natural * scale)}px;height:${Math.round(naturalH * scale)}px`;
  // the exporter's own scene, put on screen as the file's markup and then changed in place: only
  // the nodes, links and blocks that differ are parsed again (React does not reconcile thousands of elements)
  const host = useRef<HTMLDivElement>(null);
  const shownSvg = useRef<SvgHost>({ root: null });
  const seenNow = useRef(seen);
  seenNow.current = seen;
  /** Measure what of the host is in view; a new area when it left the one built or the host's width changed. */
  const remeasure = useCallback((h: HTMLElement) => {
    const width = h.clientWidth;
    let v = visibleRect(h);
    // out of sight: what would show first
    if (v.x1 <= v.x0 || v.y1 <= v.y0) v = { x0: 0, y0: 0, x1: width, y1: h.ownerDocument.defaultView?.innerHeight ?? 800 };
    const was = seenNow.current;
    if (was && was.width === width && contains(was.rect, v)) return;
    setSeen({ rect: grown(v, CULL_MARGIN), width });
  }, []);
  useLayoutEffect(() => {
    if (host.current) patchSvg(host.current, shownSvg.current, { ...scene, attrs: { ...scene.attrs, width: undefined, height: undefined, preserveAspectRatio: 'xMidYMin meet', style: sizeStyle } });
  }, [scene, sizeStyle]);
  // the room for Fit: the bordered box the figure scrolls in, below its zoom buttons
  const measureRoom = useCallback(() => {
    const h = host.current;
    const view = h?.parentElement?.parentElement;
    if (!h || !view) return;
    const reserved = h.getBoundingClientRect().top - view.getBoundingClientRect().top + view.scrollTop - view.clientTop;
    const r = roomIn(view, reserved);
    setRoom((was) => (was && Math.abs(was.width - r.width) < 1 && Math.abs(was.height - r.height) < 1 ? was : r));
  }, []);
  useLayoutEffect(() => {
    measureRoom();
    const view = host.current?.parentElement?.parentElement;
    if (!view || typeof ResizeObserver === 'undefined') return;
    let raf = 0;
    const soon = () => { if (!raf) raf = requestAnimationFrame(() => { raf = 0; measureRoom(); }); };
    // the box's width, and the pane's height (the window, the panes around it)
    const ro = new ResizeObserver(soon);
    ro.observe(view);
    // and what sits above it in the pane: a toolbar that wraps to a second row moves the box down
    for (const el of aboveInPane(view)) ro.observe(el);
    const win = view.ownerDocument.defaultView;
    win?.addEventListener('resize', soon);
    return () => { cancelAnimationFrame(raf); ro.disconnect(); win?.removeEventListener('resize', soon); };
  }, [measureRoom]);
  // the first measure of a big figure's pane, before it is painted
  useLayoutEffect(() => { if (cull && !seenNow.current && host.current) remeasure(host.current); }, [cull, remeasure]);
  useEffect(() => {
    const h = host.current;
    if (!h || !cull) return;
    let raf = 0;
    const soon = () => { if (!raf) raf = requestAnimationFrame(() => { raf = 0; remeasure(h); }); };
    h.ownerDocument.addEventListener('scroll', soon, { capture: true, passive: true });
    const ro = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(soon);
    ro?.observe(h);
    return () => { cancelAnimationFrame(raf); h.ownerDocument.removeEventListener('scroll', soon, { capture: true }); ro?.disconnect(); };
  }, [cull, remeasure]);
  // zooming from Fit starts at the fitted scale
  const zoomBy = (f: number) => setZoom((z) => Math.min(3, Math.max(0.25, (z === 'fit' ? scale : z) * f)));
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
        <button type="button" aria-label="1:1, actual size" title="Actual size: the exported file's own scale" aria-pressed={zoom === 1} onClick={() => setZoom(1)}>1:1</button>
      </div>
      <div ref={host} className="lf-view-canvas" aria-label={label} role="figure" data-layout={shown.source} data-pending={pending ? 'true' : 'false'} data-shown={tag} data-scale={fixedText(scale, 3, { ascii: true })} data-fit={zoom === 'fit' ? 'true' : 'false'} onClick={onClick} />
    </div>
  );
});
