import { useId } from 'react';
import type { Link, LinkKind, Model } from '../../core/model/types';
import { LINK_STYLE } from '../../theme/visual';
import { documentStore, editDocument } from '../../state/document';
import { selectionStore } from '../../state/selection';
import { CheckedField, numberCheck, toNumber } from './fields';
import { labeller } from '../../present/index';

export function LinkInspector({ link, model }: { link: Link; model: Model }) {
  const kindName = useId();
  const signName = useId();
  const name = labeller(model);
  const stop = () => documentStore.getState().stopGesture();
  const set = (patch: Partial<Link>) => {
    stop();
    editDocument({ type: 'updateLink', id: link.id!, patch });
  };
  return (
    <div className="lf-inspector-body">
      <p>
        From <button type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ nodes: [link.from] })}>{name(link.from)}</button> to{' '}
        <button type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ nodes: [link.to] })}>{name(link.to)}</button>
      </p>
      <fieldset className="lf-kinds">
        <legend>How it acts</legend>
        {(['instantaneous', 'integrating'] as LinkKind[]).map((k) => (
          <label key={k} className="lf-kind">
            <input type="radio" name={kindName} checked={link.kind === k} onChange={() => set({ kind: k })} />
            <span><strong>{k === 'instantaneous' ? 'Instantaneous' : 'Integrating'}</strong> — {LINK_STYLE[k].label}</span>
          </label>
        ))}
      </fieldset>
      <fieldset className="lf-kinds lf-inline">
        <legend>Sign</legend>
        {([['+', 'increases (+)'], ['-', 'decreases (−)'], ['', 'unspecified']] as const).map(([s, text]) => (
          <label key={s} className="lf-kind">
            <input type="radio" name={signName} checked={(link.sign ?? '') === s} onChange={() => set({ sign: s === '' ? undefined : s })} />
            <span>{text}</span>
          </label>
        ))}
      </fieldset>
      <CheckedField
        label="Strength (optional)"
        value={link.weight === undefined ? '' : String(link.weight)}
        check={numberCheck}
        commit={(t) => editDocument({ type: 'updateLink', id: link.id!, patch: { weight: toNumber(t) } }, { squash: `${link.id}:weight` })}
        onBlur={stop}
        hint="Drawn as line width."
      />
    </div>
  );
}
