import { useId } from 'react';
import { TIME_UNITS, type Model, type TimeUnit } from '../../core/model/types';
import { documentStore, editDocument } from '../../state/document';
import { TextField } from './fields';

/** Nothing selected: the model itself. */
export function ModelInspector({ model }: { model: Model }) {
  const unitId = useId();
  const stop = () => documentStore.getState().stopGesture();
  return (
    <div className="lf-inspector-body">
      <TextField label="Model name" value={model.name} onChange={(t) => editDocument({ type: 'setMeta', patch: { name: t } }, { squash: 'meta:name' })} onBlur={stop} />
      <TextField label="Description" multiline value={model.description ?? ''} onChange={(t) => editDocument({ type: 'setMeta', patch: { description: t === '' ? undefined : t } }, { squash: 'meta:description' })} onBlur={stop} />
      <div className="lf-field">
        <label htmlFor={unitId}>Time unit of the model</label>
        <select id={unitId} value={model.timeUnit} onChange={(e) => { stop(); editDocument({ type: 'setMeta', patch: { timeUnit: e.target.value as TimeUnit } }); }}>
          {TIME_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
        </select>
      </div>
      <p className="lf-hint">{model.variables.length} variables, {model.links.length} links, {(model.relations ?? []).length} relations. Select something on the canvas to edit it.</p>
    </div>
  );
}
