import { useEffect, useId, useState, type ReactNode } from 'react';

export function Field({ label, children, id }: { label: string; children: ReactNode; id: string }) {
  return (
    <div className="lf-field">
      <label htmlFor={id}>{label}</label>
      {children}
    </div>
  );
}

export function TextField({ label, value, onChange, onBlur, multiline, placeholder }: { label: string; value: string; onChange(v: string): void; onBlur?(): void; multiline?: boolean; placeholder?: string }) {
  const id = useId();
  return (
    <Field label={label} id={id}>
      {multiline ? (
        <textarea id={id} value={value} rows={3} placeholder={placeholder} onChange={(e) => onChange(e.target.value)} onBlur={onBlur} />
      ) : (
        <input id={id} value={value} placeholder={placeholder} onChange={(e) => onChange(e.target.value)} onBlur={onBlur} />
      )}
    </Field>
  );
}

/**
 * A text box whose content is checked before it is stored: `check` returns
 * an error message or null; only valid text reaches `commit`.
 */
export function CheckedField({ label, value, check, commit, onBlur, hint, placeholder, commitOn = 'change' }: {
  label: string;
  value: string;
  check(text: string): string | null;
  commit(text: string): void;
  onBlur?(): void;
  hint?: string;
  placeholder?: string;
  commitOn?: 'change' | 'blur';
}) {
  const id = useId();
  const [draft, setDraft] = useState(value);
  const [editing, setEditing] = useState(false);
  useEffect(() => {
    if (!editing) setDraft(value);
  }, [value, editing]);
  const error = check(draft);
  const finish = () => {
    setEditing(false);
    if (commitOn === 'blur' && !check(draft) && draft !== value) commit(draft);
    else if (check(draft)) setDraft(value);
    onBlur?.();
  };
  return (
    <div className="lf-field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        value={draft}
        placeholder={placeholder}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-msg`}
        className={error ? 'is-invalid' : undefined}
        onFocus={() => setEditing(true)}
        onChange={(e) => {
          setDraft(e.target.value);
          if (commitOn === 'change' && !check(e.target.value)) commit(e.target.value);
        }}
        onBlur={finish}
        onKeyDown={(e) => {
          if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
          if (e.key === 'Escape') {
            setDraft(value);
            setEditing(false);
          }
        }}
      />
      <div id={`${id}-msg`} aria-live="polite">
        {error ? <p className="lf-field-error" role="alert">{error}</p> : hint ? <p className="lf-hint">{hint}</p> : null}
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
