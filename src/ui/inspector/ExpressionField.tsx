import { useId } from 'react';
import type { Model } from '../../core/model/types';
import { checkFormula, checkRelation, symbolsOf } from '../../state/validate';
import { selectionStore } from '../../state/selection';
import { finishKeys, useDraft } from './fields';
import { labeller } from '../../present/index';

interface Props {
  label: string;
  value: string;
  model: Model;
  relation?: boolean;
  placeholder?: string;
  hint?: string;
  autoFocus?: boolean;
  onChange(text: string): void;
  onBlur?(): void;
}

/**
 * A formula in the restricted syntax, checked as it is typed: where the error
 * is, which names are unknown, which are used. It is stored on Enter or when
 * the field is left (never per keystroke), also when it has an error: the
 * model keeps what the modeller wrote and the Checks list the problem.
 * Escape brings back the stored formula.
 */
export function ExpressionField({ label, value: stored, model, relation, placeholder, hint, autoFocus, onChange, onBlur }: Props) {
  const id = useId();
  const d = useDraft(stored, onChange);
  const value = d.text;
  const blank = value.trim() === '';
  const error = blank ? null : relation ? checkRelation(value, model) : checkFormula(value, model);
  const symbols = error ? [] : symbolsOf(value, relation);
  const name = labeller(model);
  return (
    <div className="lf-field lf-expr">
      <label htmlFor={id}>{label}</label>
      <textarea
        id={id}
        rows={value.length > 40 ? 3 : 1}
        className={`lf-mono lf-expr-input${error ? ' is-invalid' : ''}`}
        value={value}
        placeholder={placeholder}
        spellCheck={false}
        autoFocus={autoFocus}
        autoComplete="off"
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-msg`}
        onChange={(e) => d.edit(e.target.value.replace(/\n/g, ' '))}
        // one expression per field: Enter finishes instead of starting a second line
        onKeyDown={finishKeys(() => d.finish(), d.cancel)}
        onBlur={() => {
          d.finish();
          onBlur?.();
        }}
      />
      <div id={`${id}-msg`} aria-live="polite">
        {error && (
          <div className="lf-expr-error" role="alert">
            {error.position !== undefined && (
              <pre className="lf-caret" aria-hidden="true">
                {value}
                {'\n'}
                {' '.repeat(Math.min(error.position, value.length))}^
              </pre>
            )}
            <p>
              {error.position !== undefined ? `At character ${error.position + 1}: ` : ''}
              {error.message}
            </p>
            {error.unknown && error.unknown.length > 0 && (
              <p className="lf-unknown">
                Not in this model: {error.unknown.map((u) => <code key={u}>{u}</code>)}. Names are the variables’ “name in formulas”.
              </p>
            )}
          </div>
        )}
        {!error && symbols.length > 0 && (
          <p className="lf-symbols">
            Uses:{' '}
            {symbols.map((s) => (
              <button key={s} type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ nodes: [s] })} title={`Select ${name(s)}`}>
                {name(s)}
              </button>
            ))}
          </p>
        )}
        {blank && hint && <p className="lf-hint">{hint}</p>}
      </div>
    </div>
  );
}
