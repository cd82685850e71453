import { useId } from 'react';
import type { Link, LinkKind, Model } from '../../core/model/types';
import { LINK_STYLE } from '../../theme/visual';
import { documentStore, editDocument } from '../../state/document';
import { selectionStore } from '../../state/selection';
import { DEFAULT_TOTAL_GAIN, linkCounts, linkStrengths, parseStrengthRangeText, strengthRangeText } from '../../core/model/strength';
import { CheckedField, numberCheck, toNumber } from './fields';
import { labeller, significant } from '../../present/index';

/** What the strength is in the equations, its unit and the default when empty. */
function strengthHint(link: Link, model: Model, name: (id: string) => string) {
  const to = model.variables.find((w) => w.id === link.to);
  const k = model.links.indexOf(link);
  const s = linkStrengths(model)[k];
  const t = name(link.to), f = name(link.from);
  if (!to || !linkCounts(model, link)) return <>Drawn as line width. This link does not enter {t}'s sketched equation ({link.kind} links into a {to?.kind ?? 'variable'} are not read).</>;
  if (to.formula !== undefined || to.rate !== undefined) return <>Drawn as line width only: {t} has a {to.kind === 'state' ? 'rate' : 'formula'} of its own, which sets its equation.</>;
  const eq = to.kind === 'state'
    ? `d${t}/dt = (Σ strength × source − ${t}) / τ`
    : `${t} = Σ strength × source`;
  const def = significant(DEFAULT_TOTAL_GAIN / s.sharedBy, 3);
  return (
    <>
      The coefficient of {f} in {t}'s equation, <span className="lf-mono">{eq}</span>, with the sign above. No unit: the change in {t}{to.kind === 'state' ? '’s balance' : ''} per unit of {f}.
      {' '}Empty: {def}{s.sharedBy > 1 ? ` (${DEFAULT_TOTAL_GAIN} shared by the ${s.sharedBy} links into ${t})` : ''}, so that a sketch without strengths keeps every loop’s gain below one and comes to rest.
      {' '}Drawn as line width.
    </>
  );
}

/** The person SD of a link's strength: empty, or a number ≥ 0; the message names the field. */
export function personSdCheck(text: string): string | null {
  if (text.trim() === '') return null;
  const n = Number(text);
  if (!Number.isFinite(n)) return `Person SD of strength: "${text}" is not a number`;
  if (n < 0) return `Person SD of strength: ${text} is negative; a standard deviation across persons is 0 or more`;
  return null;
}

export function LinkInspector({ link, model }: { link: Link; model: Model }) {
  const kindName = useId();
  const signName = useId();
  const name = labeller(model);
  const stop = () => documentStore.getState().stopGesture();
  const set = (patch: Partial<Link>) => {
    stop();
    editDocument({ type: 'updateLink', id: link.id!, patch });
  };
  /** A field of the link that is a number or empty; typing in it is one undo step. */
  const edited = (key: 'weight' | 'personSD' | 'strengthRange', text: (l: Link) => string, patch: (t: string) => Partial<Link> | null) => ({
    value: text(link),
    commit: (t: string) => { const p = patch(t); if (p) editDocument({ type: 'updateLink', id: link.id!, patch: p }, { squash: `${link.id}:${key}` }); },
    onBlur: stop,
  });
  const optional = (x: number | undefined) => (x === undefined ? '' : String(x));
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
        {...edited('weight', (l) => optional(l.weight), (t) => ({ weight: toNumber(t) }))}
        check={numberCheck}
        hint={strengthHint(link, model, name)}
        placeholder={`empty: ${significant(DEFAULT_TOTAL_GAIN / linkStrengths(model)[model.links.indexOf(link)].sharedBy, 3)}`}
      />
      <CheckedField
        label="Strength range (optional)"
        {...edited('strengthRange', (l) => strengthRangeText(l.strengthRange), (t) => { const r = parseStrengthRangeText(t); return r.ok ? { strengthRange: r.value } : null; })}
        check={(t) => { const r = parseStrengthRangeText(t); return r.ok ? null : r.message; }}
        hint="When the strength is only roughly known: low..high, such as 0.2..0.9 (sizes; the sign above applies). The design advisor then reports how often its interval holds over strengths drawn from the range (loopfold advise --uncertain)."
        placeholder="e.g. 0.2..0.9"
      />
      <CheckedField
        label="Person SD of strength (optional)"
        {...edited('personSD', (l) => optional(l.personSD), (t) => ({ personSD: toNumber(t) }))}
        check={personSdCheck}
        hint="How much this strength differs from person to person (a standard deviation, same scale as the strength). It moves each person’s balance point and so enters the covariance across persons in the Pictures tab; empty: the same for everyone."
        placeholder="empty: 0"
      />
    </div>
  );
}
