import type { KeyboardEvent } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import type { El } from '../../export/scene';
import { labelOf } from '../../present/index';
import { elToReact } from '../elReact';

/** The text a part of the figure shows (the weight label of a link). */
function visibleText(e: El): string {
  const out: string[] = [];
  const walk = (x: El | string) => {
    if (typeof x === 'string') out.push(x);
    else if (x.tag !== 'title') (x.children ?? []).forEach(walk);
  };
  (e.children ?? []).forEach(walk);
  return out.join(' ').trim();
}

/**
 * A network drawn by the exporter's builder (`laggedNetwork`,
 * `sameIntervalNetwork`); with `onPick` each link is a button that shows it
 * against the interval (click, Enter or Space).
 */
export function NetworkDiagram({ model, figure, onPick }: { model: Model; figure: El; onPick?: (from: VariableId, to: VariableId) => void }) {
  return elToReact(figure, (e) => {
    // With pickable links the figure is a group of buttons, not one image (an image holds no controls).
    if (e.tag === 'svg') return onPick ? { className: 'lf-num-network', role: 'group' } : { className: 'lf-num-network' };
    const edge = e.attrs['data-edge'];
    if (!onPick || typeof edge !== 'string') return undefined;
    const [from, to] = edge.split('>');
    return {
      role: 'button',
      tabIndex: 0,
      className: 'lf-net-pick',
      // The name starts with the weight written on the link, so what is seen is what a screen reader says.
      'aria-label': `${visibleText(e)} ${labelOf(model, from)} → ${labelOf(model, to)}: show against the interval`.trim(),
      onClick: () => onPick(from, to),
      onKeyDown: (ev: KeyboardEvent) => {
        if (ev.key === 'Enter' || ev.key === ' ') { ev.preventDefault(); onPick(from, to); }
      },
    };
  });
}
