import type { Model, Relation } from '../../core/model/types';
import { documentStore, editDocument } from '../../state/document';
import { ExpressionField } from './ExpressionField';
import { TextField } from './fields';

export function RelationInspector({ relation, model }: { relation: Relation; model: Model }) {
  const stop = () => documentStore.getState().stopGesture();
  return (
    <div className="lf-inspector-body">
      <p className="lf-hint">An implicit equation between variables, not solved for any one of them. Name: <code>{relation.id}</code></p>
      <ExpressionField
        label="Equation"
        relation
        value={relation.equation}
        model={model}
        placeholder="e.g. a*b = c*d"
        hint="Write the equation this relation states between variables (their names in formulas), such as a*b = c*d. Until then it is left out of the model."
        autoFocus={relation.equation.trim() === ''}
        onChange={(t) => editDocument({ type: 'updateRelation', id: relation.id, patch: { equation: t } }, { squash: `${relation.id}:eq` })}
        onBlur={stop}
      />
      <TextField label="Note" multiline value={relation.note ?? ''} onChange={(t) => editDocument({ type: 'updateRelation', id: relation.id, patch: { note: t === '' ? undefined : t } }, { squash: `${relation.id}:note` })} onBlur={stop} />
    </div>
  );
}
