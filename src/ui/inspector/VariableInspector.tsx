import { useId, useState } from 'react';
import type { Model, Variable, VariableKind } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { parseTimescaleText, readTimescale, timescaleText } from '../../core/model/timescale';
import { DEFAULT_NOISE, DEFAULT_RELIABILITY } from '../../core/study/convert';
import { isReservedName } from '../../core/expr/parse';
import { documentStore, editDocument } from '../../state/document';
import { selectionStore } from '../../state/selection';
import { idFromLabel, isGeneratedId, usedIds } from '../../state/changes';
import { addLink } from '../actions';
import { ExpressionField } from './ExpressionField';
import { CheckedField, TextField, numberCheck, toNumber } from './fields';
import { labeller, significant } from '../../present/index';

const KINDS: { kind: VariableKind; name: string; text: string }[] = [
  { kind: 'input', name: 'Input', text: 'set from outside' },
  { kind: 'state', name: 'State', text: 'integrates its rate over time' },
  { kind: 'derived', name: 'Derived', text: 'computed at once from its sources' },
];
const ID_RE = /^[A-Za-z_][A-Za-z0-9_]*$/;

export function VariableInspector({ v, model }: { v: Variable; model: Model }) {
  const kindName = useId();
  const linkTarget = useId();
  const [target, setTarget] = useState('');
  const stop = () => documentStore.getState().stopGesture();
  const update = (field: string, patch: Partial<Variable>) => editDocument({ type: 'updateVariable', id: v.id, patch }, { squash: `${v.id}:${field}` });
  const others = model.variables.filter((w) => w.id !== v.id);
  const incoming = model.links.filter((l) => l.to === v.id);
  const outgoing = model.links.filter((l) => l.from === v.id);
  const name = labeller(model);
  const checkId = (t: string) => {
    if (t === v.id) return null;
    if (!ID_RE.test(t)) return 'a name in formulas starts with a letter or "_" and has only letters, digits and "_"';
    if (t.length > 64) return 'at most 64 characters';
    if (isReservedName(t)) return `"${t}" is a function or constant of formulas`;
    if (usedIds(model).has(t)) return `"${t}" is already used`;
    return null;
  };
  return (
    <div className="lf-inspector-body">
      <TextField
        label="Label"
        value={v.label ?? ''}
        onChange={(t) => update('label', { label: t === '' ? undefined : t })}
        onBlur={(label) => {
          // a variable still carrying its made-up name takes one from its label, so formulas read well
          if (isGeneratedId(v.id) && label) {
            const taken = usedIds(model);
            taken.delete(v.id);
            const id = idFromLabel(label, taken, isReservedName);
            if (id && id !== v.id) {
              editDocument({ type: 'renameVariable', id: v.id, newId: id }, { squash: `${v.id}:label` });
              selectionStore.getState().select({ nodes: [id] });
            }
          }
          stop();
        }}
      />
      <CheckedField
        label="Name in formulas"
        value={v.id}
        check={checkId}
        commit={(t) => {
          stop();
          editDocument({ type: 'renameVariable', id: v.id, newId: t });
          selectionStore.getState().select({ nodes: [t] });
        }}
        hint="Formulas and relations refer to the variable by this name; renaming rewrites them."
      />
      <fieldset className="lf-kinds">
        <legend>Kind</legend>
        {KINDS.map((k) => (
          <label key={k.kind} className="lf-kind">
            <input
              type="radio"
              name={kindName}
              value={k.kind}
              checked={v.kind === k.kind}
              onChange={() => {
                stop();
                editDocument({ type: 'setKind', id: v.id, kind: k.kind });
              }}
            />
            <span><strong>{k.name}</strong> — {k.text}</span>
          </label>
        ))}
      </fieldset>
      {v.kind === 'derived' && (
        <ExpressionField
          label="Formula"
          value={v.formula ?? ''}
          model={model}
          placeholder="e.g. 0.5*stress - 0.7*mood"
          hint="Optional: without a formula the links drawn define what it depends on."
          onChange={(t) => update('formula', { formula: t === '' ? undefined : t })}
          onBlur={stop}
        />
      )}
      {v.kind === 'state' && (
        <>
          <ExpressionField
            label="Rate (change per time unit)"
            value={v.rate ?? ''}
            model={model}
            placeholder={`e.g. (workload - ${v.id}) / 2`}
            hint="Optional: without a rate the links drawn define what drives it."
            onChange={(t) => update('rate', { rate: t === '' ? undefined : t })}
            onBlur={stop}
          />
          <CheckedField
            label="Timescale τ"
            value={v.timescale === undefined ? '' : timescaleText(v.timescale)}
            check={(t) => {
              if (t.trim() === '') return null;
              const d = parseTimescaleText(t, model.timeUnit);
              return d.ok ? null : d.message;
            }}
            commit={(t) => {
              const d = t.trim() === '' ? null : parseTimescaleText(t, model.timeUnit);
              update('timescale', { timescale: d === null ? undefined : d.ok ? d.value : t.trim() });
            }}
            onBlur={stop}
            placeholder={`e.g. 90 min, 2 days, or a range 30 min..3 h (bare numbers in ${model.timeUnit})`}
            hint={timescaleHint(v, model)}
          />
          <CheckedField label="Initial value" value={v.initial === undefined ? '' : String(v.initial)} check={numberCheck} commit={(t) => update('initial', { initial: toNumber(t) })} onBlur={stop} />
          <label className="lf-check">
            <input
              type="checkbox"
              checked={v.selfRegulating !== false}
              onChange={(e) => {
                stop();
                editDocument({ type: 'updateVariable', id: v.id, patch: { selfRegulating: e.target.checked ? undefined : false } });
              }}
            />
            Self-regulating (its rate depends on the state itself)
          </label>
          <CheckedField
            label="Process noise"
            value={v.noise === undefined ? '' : String(v.noise)}
            check={(t) => (t.trim() === '' ? null : numberCheck(t) ?? (Number(t) < 0 ? 'must not be negative' : null))}
            commit={(t) => update('noise', { noise: t.trim() === '' ? undefined : toNumber(t) })}
            onBlur={stop}
            placeholder={`default ${DEFAULT_NOISE}`}
            hint={`Variance the state gains per ${model.timeUnit} from everything the model leaves out (default ${DEFAULT_NOISE}). It sets the stationary spread and the same-interval network; the lagged effects do not depend on it.`}
          />
        </>
      )}
      <CheckedField
        label="Reliability of its measurement"
        value={v.reliability === undefined ? '' : String(v.reliability)}
        check={(t) => (t.trim() === '' ? null : numberCheck(t) ?? (Number(t) > 0 && Number(t) <= 1 ? null : 'must be above 0 and at most 1'))}
        commit={(t) => update('reliability', { reliability: t.trim() === '' ? undefined : toNumber(t) })}
        onBlur={stop}
        placeholder={`default ${DEFAULT_RELIABILITY} (no measurement error)`}
        hint={`Share of a measurement's variance that is the true value, 0–1 (default ${DEFAULT_RELIABILITY}). Below 1, estimated effects from this variable shrink towards zero.`}
      />
      {v.kind === 'input' && <CheckedField label="Value" value={v.value === undefined ? '' : String(v.value)} check={numberCheck} commit={(t) => update('value', { value: toNumber(t) })} onBlur={stop} />}
      <TextField label="Unit" value={v.unit ?? ''} onChange={(t) => update('unit', { unit: t === '' ? undefined : t })} onBlur={stop} placeholder="e.g. mg/L" />
      <TextField label="Note" multiline value={v.note ?? ''} onChange={(t) => update('note', { note: t === '' ? undefined : t })} onBlur={stop} />
      <section className="lf-links-of" aria-label="Links of this variable">
        <h3>Links</h3>
        {incoming.length + outgoing.length === 0 && <p className="lf-hint">No links yet.</p>}
        <ul>
          {incoming.map((l) => (
            <li key={l.id}><button type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ links: [l.id!] })}>from {name(l.from)}</button> <span className="lf-hint">{l.kind}{l.sign ? ` ${l.sign === '-' ? '−' : '+'}` : ''}</span></li>
          ))}
          {outgoing.map((l) => (
            <li key={l.id}><button type="button" className="lf-linkish" onClick={() => selectionStore.getState().select({ links: [l.id!] })}>to {name(l.to)}</button> <span className="lf-hint">{l.kind}{l.sign ? ` ${l.sign === '-' ? '−' : '+'}` : ''}</span></li>
          ))}
        </ul>
        {others.length > 0 && (
          <div className="lf-row">
            <label htmlFor={linkTarget}>New link to</label>
            <select id={linkTarget} value={target} onChange={(e) => setTarget(e.target.value)}>
              <option value="">choose…</option>
              {others.map((w) => <option key={w.id} value={w.id}>{w.label ?? w.id}</option>)}
            </select>
            <button type="button" disabled={target === ''} onClick={() => { if (target) { addLink(v.id, target); setTarget(''); } }}>Add link</button>
          </div>
        )}
      </section>
    </div>
  );
}

function timescaleHint(v: Variable, model: Model): string {
  if (v.timescale === undefined) return 'How fast the state responds, such as "90 min" or "2 days"; a range such as "30 min..3 h" when only roughly known.';
  const d = readTimescale(v.timescale, model.timeUnit);
  if (!d.ok) return '';
  const words = formatDuration(d.point, model.timeUnit);
  const inUnit = `${significant(d.point, 4)} ${model.timeUnit}`;
  const point = words === inUnit ? `= ${words}` : `= ${words} (${inUnit})`;
  return d.uncertain ? `a range: ${formatDuration(d.low, model.timeUnit)} to ${formatDuration(d.high, model.timeUnit)}; single-value analyses use its geometric mean ${point.slice(2)}` : point;
}
