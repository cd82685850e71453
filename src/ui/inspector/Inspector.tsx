import { useModel } from '../../state/document';
import { useSelection } from '../../state/selection';
import { deleteSelection } from '../actions';
import { LinkInspector } from './LinkInspector';
import { ModelInspector } from './ModelInspector';
import { RelationInspector } from './RelationInspector';
import { VariableInspector } from './VariableInspector';

/** Edits the selection: one variable, link or relation; several can be deleted together. */
export function Inspector() {
  const model = useModel();
  const nodes = useSelection((s) => s.nodes);
  const links = useSelection((s) => s.links);
  const count = nodes.length + links.length;
  let title = 'Model';
  let body = <ModelInspector model={model} />;
  if (count > 1) {
    title = `${count} items selected`;
    body = (
      <div className="lf-inspector-body">
        <p>{nodes.length} node(s) and {links.length} link(s). Drag one of them to move them all, or copy with Ctrl+C.</p>
        <button type="button" onClick={deleteSelection}>Delete selected</button>
      </div>
    );
  } else if (nodes.length === 1) {
    const v = model.variables.find((x) => x.id === nodes[0]);
    const r = (model.relations ?? []).find((x) => x.id === nodes[0]);
    if (v) {
      title = `Variable: ${v.label ?? v.id}`;
      // keyed by place, not id: renaming a variable keeps its inspector (and focus) in place
      body = <VariableInspector key={`var-${model.variables.indexOf(v)}`} v={v} model={model} />;
    } else if (r) {
      title = 'Relation';
      body = <RelationInspector key={r.id} relation={r} model={model} />;
    }
  } else if (links.length === 1) {
    const l = model.links.find((x) => x.id === links[0]);
    if (l) {
      title = 'Link';
      body = <LinkInspector key={l.id} link={l} model={model} />;
    }
  }
  return (
    <section className="lf-inspector" aria-labelledby="lf-inspector-title">
      <div className="lf-section-head">
        <h2 id="lf-inspector-title">{title}</h2>
        {count === 1 && <button type="button" className="lf-small" onClick={deleteSelection} aria-label="Delete the selected item">Delete</button>}
      </div>
      {body}
    </section>
  );
}
