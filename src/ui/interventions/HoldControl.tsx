/**
 * The hold control: fix a variable at a value (the do-operator), list the
 * holds, release them. A held state's rate is held at zero too.
 */
import { useEffect, useId, useState } from 'react';
import type { Model } from '../../core/model/types';
import { useValidatedModel } from '../../state/document';
import { useSelection } from '../../state/selection';
import { releaseAllHolds, releaseHold, setHold, useHolds } from './holds';
import './interventions.css';
import { labeller } from '../../present/index';

function startValue(model: Model, id: string): string {
  const v = model.variables.find((x) => x.id === id);
  return String(v?.value ?? v?.initial ?? 0);
}

export function HoldControl() {
  const model = useValidatedModel();
  if (!model) return <section className="lf-hold" aria-label="Hold a variable"><p>Fix the model's problems to hold a variable.</p></section>;
  return <HoldControlFor model={model} />;
}

export function HoldControlFor({ model }: { model: Model }) {
  const holds = useHolds();
  const selected = useSelection((s) => s.nodes);
  const ids = model.variables.map((v) => v.id);
  const preferred = selected.find((n) => ids.includes(n)) ?? ids[0] ?? '';
  const [variable, setVariable] = useState(preferred);
  const [text, setText] = useState(() => (preferred ? startValue(model, preferred) : '0'));
  const formId = useId();
  useEffect(() => {
    if (preferred && preferred !== variable && selected.includes(preferred)) {
      setVariable(preferred);
      setText(startValue(model, preferred));
    }
  }, [preferred]); // eslint-disable-line react-hooks/exhaustive-deps
  const label = labeller(model);
  const value = Number(text);
  const valid = text.trim() !== '' && Number.isFinite(value);
  const known = ids.includes(variable);
  const submit = () => {
    if (valid && known) setHold(variable, value);
  };
  const held = Object.keys(holds).filter((h) => ids.includes(h));
  return (
    <section className="lf-hold" aria-label="Hold a variable">
      <h3>Hold a variable</h3>
      <form onSubmit={(e) => { e.preventDefault(); submit(); }}>
        <label htmlFor={`${formId}-v`}>Variable</label>
        <select id={`${formId}-v`} value={known ? variable : ''} onChange={(e) => { setVariable(e.target.value); setText(startValue(model, e.target.value)); }}>
          {ids.map((id) => <option key={id} value={id}>{label(id)}</option>)}
        </select>
        <label htmlFor={`${formId}-x`}>at</label>
        <input id={`${formId}-x`} inputMode="decimal" value={text} aria-invalid={!valid} onChange={(e) => setText(e.target.value)} />
        <button type="submit" disabled={!valid || !known}>Hold</button>
        {!valid && <p className="lf-hold-error" role="alert">The value of {label(variable)} must be a number, such as 0 or 2.5.</p>}
      </form>
      {held.length > 0 ? (
        <ul className="lf-hold-list" aria-label="Held variables">
          {held.map((h) => (
            <li key={h}>
              <span className="lf-hold-glyph" aria-hidden="true">⊥</span> {label(h)} = {holds[h]}
              {model.variables.find((v) => v.id === h)?.kind === 'state' && <span className="lf-hold-note"> (its rate is held at zero)</span>}
              <button type="button" onClick={() => releaseHold(h)} aria-label={`Release ${label(h)}`}>Release</button>
            </li>
          ))}
          {held.length > 1 && <li><button type="button" onClick={() => releaseAllHolds()}>Release all</button></li>}
        </ul>
      ) : (
        <p className="lf-hold-note">Nothing is held. Holding fixes a variable from outside and cuts the links into it.</p>
      )}
    </section>
  );
}
