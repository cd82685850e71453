/**
 * Inspector fields keep what is typed in a draft and store it only when the
 * modeller finishes: Enter or leaving the field. Nothing is stored per
 * keystroke (typing "5 fortnights" never stores "5" on the way), and text
 * that does not check out stays in the field with its message until it is
 * corrected or Escape brings back the stored value.
 */
import { useId, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';

export function Field({ label, children, id }: { label: string; children: ReactNode; id: string }) {
  return (
    <div className="lf-field">
      <label htmlFor={id}>{label}</label>
      {children}
    </div>
  );
}

/**
 * The draft of one field: `text` is shown, `edit` follows typing, `finish`
 * stores (through `store`) when the draft differs and checks out, `cancel`
 * drops the draft. A draft that fails its check is kept.
 */
export function useDraft(value: string, store: (text: string) => void, check: (text: string) => string | null = () => null) {
  const [draft, setDraft] = useState<string | null>(null);
  // the draft as of the last keystroke: finishing twice before React renders again (Enter, then the
  // field left) stores once
  const live = useRef<string | null>(null);
  const text = draft ?? value;
  return {
    text,
    error: check(text),
    edit: (t: string) => { live.current = t; setDraft(t); },
    finish: (): string | null => {
      const t = live.current;
      if (t === null) return null;
      if (check(t)) return null; // stays in the field with its message
      live.current = null;
      setDraft(null);
      if (t !== value) store(t);
      return t;
    },
    cancel: () => { live.current = null; setDraft(null); },
  };
}

/** Enter finishes a one-line field, Ctrl/Cmd+Enter a multi-line one; Escape drops the draft. */
export function finishKeys(finish: () => void, cancel: () => void, multiline = false) {
  return (e: KeyboardEvent<HTMLInputElement | HTMLTextAreaElement>) => {
    if (e.key === 'Enter' && (!multiline || e.ctrlKey || e.metaKey)) {
      e.preventDefault();
      finish();
    }
    if (e.key === 'Escape') {
      e.stopPropagation();
      cancel();
    }
  };
}

/** Free text (labels, notes). `onChange` receives the finished text; `onBlur` runs after it, with that text. */
export function TextField({ label, value, onChange, onBlur, multiline, placeholder }: { label: string; value: string; onChange(v: string): void; onBlur?(finished: string): void; multiline?: boolean; placeholder?: string }) {
  const id = useId();
  const d = useDraft(value, onChange);
  const finish = () => {
    // store first, whether or not the caller wants to hear of the blur (`onBlur?.(d.finish())` would skip storing without one)
    const finished = d.finish() ?? value;
    onBlur?.(finished);
  };
  const common = {
    id,
    value: d.text,
    placeholder,
    onChange: (e: { target: { value: string } }) => d.edit(e.target.value),
    onBlur: finish,
    // Enter stores the draft itself (not through leaving the field: a window without focus never blurs)
    onKeyDown: finishKeys(finish, d.cancel, multiline),
  };
  return <Field label={label} id={id}>{multiline ? <textarea {...common} rows={3} /> : <input {...common} />}</Field>;
}

/**
 * A text box whose content is checked before it is stored: `check` returns
 * an error message or null; only valid text reaches `commit`, on Enter or
 * when the field is left.
 */
export function CheckedField({ label, value, check, commit, onBlur, hint, placeholder }: {
  label: string;
  value: string;
  check(text: string): string | null;
  commit(text: string): void;
  onBlur?(): void;
  hint?: ReactNode;
  placeholder?: string;
}) {
  const id = useId();
  const d = useDraft(value, commit, check);
  return (
    <div className="lf-field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        value={d.text}
        placeholder={placeholder}
        aria-invalid={d.error ? true : undefined}
        aria-describedby={`${id}-msg`}
        className={d.error ? 'is-invalid' : undefined}
        onChange={(e) => d.edit(e.target.value)}
        onBlur={() => {
          d.finish();
          onBlur?.();
        }}
        onKeyDown={finishKeys(() => d.finish(), d.cancel)}
      />
      <div id={`${id}-msg`} aria-live="polite">
        {d.error ? (
          <p className="lf-field-error" role="alert">{d.error} <span className="lf-hint">(not stored: correct it, or press Escape for the stored value)</span></p>
        ) : hint ? (
          <p className="lf-hint">{hint}</p>
        ) : null}
      </div>
    </div>
  );
}

/** Parse an optional number typed by the modeller: '' → undefined. */
export function numberCheck(text: string): string | null {
  if (text.trim() === '') return null;
  const n = Number(text);
  return Number.isFinite(n) ? null : `"${text}" is not a number`;
}
export function toNumber(text: string): number | undefined {
  return text.trim() === '' ? undefined : Number(text);
}
