import type { KeyboardEvent } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import type { El } from '../../export/scene';
import { labelOf } from '../../present/index';
import { elToReact } from '../elReact';

/**
 * A network drawn by the exporter's builder (`laggedNetwork`,
 * `sameIntervalNetwork`); with `onPick` each link is a button that shows it
 * against the interval (click, Enter or Space).
 */
export function NetworkDiagram({ model, figure, onPick }: { model: Model; figure: El; onPick?: (from: VariableId, to: VariableId) => void }) {
  return elToReact(figure, (e) => {
    if (e.tag === 'svg') return { className: 'lf-num-network' };
    const edge = e.attrs['data-edge'];
    if (!onPick || typeof edge !== 'string') return undefined;
    const [from, to] = edge.split('>');
    return {
      role: 'button',
      tabIndex: 0,
      className: 'lf-net-pick',
      'aria-label': `Show ${labelOf(model, from)} → ${labelOf(model, to)} against the interval`,
      onClick: () => onPick(from, to),
      onKeyDown: (ev: KeyboardEvent) => {
        if (ev.key === 'Enter' || ev.key === ' ') { ev.preventDefault(); onPick(from, to); }
      },
    };
  });
}
