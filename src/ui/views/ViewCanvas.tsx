/**
 * One view drawn on screen: placed at once from the previous positions,
 * then moved smoothly to the tuned ELK layout when it arrives (a layout made
 * obsolete by a newer view is dropped).
 */
import { useEffect, useMemo, useRef, useState, type MouseEvent } from 'react';
import type { ViewModel } from '../../core/view/types';
import { buildScene } from '../../export/scene';
import { createLayoutQueue } from '../../layout/browser';
import { ease, interpolateLayout } from '../../layout/geometry';
import { instantLayout } from '../../layout/instant';
import type { Layout } from '../../layout/types';
import { toReact } from './SceneSvg';

const ANIMATION_MS = 320;
/** Above this many nodes, positions jump instead of moving (keeps the page responsive). */
const ANIMATE_UP_TO = 400;

export interface ViewCanvasProps {
  vm: ViewModel;
  /** The modeller's drawn positions: used as is (no ELK) when given. */
  drawn?: Record<string, { x: number; y: number }>;
  onToggleBlock?(key: string): void;
  /** Called with the settled layout (for export and tests). */
  onLayout?(layout: Layout): void;
  label: string;
}

export function ViewCanvas({ vm, drawn, onToggleBlock, onLayout, label }: ViewCanvasProps) {
  const [shown, setShown] = useState<Layout | null>(null);
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

  useEffect(() => () => cancelAnimationFrame(frame.current), []);

  const scene = useMemo(() => (shown ? buildScene(vm, shown, { legend: true, title: true }) : null), [vm, shown]);
  const onClick = (ev: MouseEvent) => {
    const t = (ev.target as Element).closest('.lf-toggle');
    const key = t?.getAttribute('data-block');
    if (key && onToggleBlock) onToggleBlock(key);
  };
  return (
    <div className="lf-view-canvas" aria-label={label} role="figure" data-layout={shown?.source ?? 'none'} data-pending={pending ? 'true' : 'false'} onClick={onClick}>
      {scene ? toReact({ ...scene, attrs: { ...scene.attrs, width: '100%', height: undefined, preserveAspectRatio: 'xMidYMin meet' } }) : <p>Placing the variables…</p>}
    </div>
  );
}
