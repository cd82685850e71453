/**
 * Typed edits of the model document, applied by a pure reducer.
 * The same change objects are the undo units of the editor and the
 * fixtures of its tests. The reducer never mutates its input.
 */
import type { EquationId, Link, Model, Position, Relation, TimeUnit, Variable, VariableId, VariableKind } from '../core/model/types';

export type VariablePatch = Partial<Omit<Variable, 'id' | 'kind'>>;
export type LinkPatch = Partial<Omit<Link, 'id' | 'from' | 'to'>>;
export type RelationPatch = Partial<Omit<Relation, 'id'>>;

export type Change =
  | { type: 'addVariable'; variable: Variable }
  | { type: 'updateVariable'; id: VariableId; patch: VariablePatch }
  | { type: 'setKind'; id: VariableId; kind: VariableKind }
  | { type: 'renameVariable'; id: VariableId; newId: VariableId }
  | { type: 'addLink'; link: Link }
  | { type: 'updateLink'; id: string; patch: LinkPatch }
  | { type: 'addRelation'; relation: Relation }
  | { type: 'updateRelation'; id: EquationId; patch: RelationPatch }
  | { type: 'remove'; variables?: VariableId[]; links?: string[]; relations?: EquationId[] }
  | { type: 'move'; positions: Record<string, Position> }
  | { type: 'paste'; variables: Variable[]; links: Link[]; relations: Relation[] }
  | { type: 'setMeta'; patch: { name?: string; description?: string; timeUnit?: TimeUnit } };

/** Fields a variable keeps only for some kinds. */
const KIND_FIELDS: Record<VariableKind, (keyof Variable)[]> = {
  input: ['value', 'personSD'],
  state: ['initial', 'timescale', 'selfRegulating', 'rate', 'noise'],
  derived: ['formula'],
};
const KIND_ONLY = new Set<keyof Variable>(['value', 'personSD', 'initial', 'timescale', 'selfRegulating', 'rate', 'noise', 'formula']);

/** Copy `base` with the patch applied; a patch value of `undefined` removes the field. */
function patched<T extends object, P extends object>(base: T, patch: P): T {
  const out: Record<string, unknown> = { ...(base as Record<string, unknown>) };
  for (const [k, v] of Object.entries(patch)) {
    if (v === undefined) delete out[k];
    else out[k] = v;
  }
  return out as T;
}

/** Every id in use: variables and relations share one name space. */
export function usedIds(model: Model): Set<string> {
  return new Set([...model.variables.map((v) => v.id), ...(model.relations ?? []).map((r) => r.id)]);
}

/** A fresh id `${stem}${n}` not in `taken`. */
export function freshId(stem: string, taken: ReadonlySet<string>): string {
  for (let n = 1; ; n++) {
    const id = `${stem}${n}`;
    if (!taken.has(id)) return id;
  }
}

/** Give every link an id, so the editor can address it. Links with ids keep them. */
export function withLinkIds(model: Model): Model {
  if (model.links.every((l) => l.id !== undefined)) return model;
  const taken = new Set(model.links.map((l) => l.id).filter((x): x is string => x !== undefined));
  const links = model.links.map((l) => {
    if (l.id !== undefined) return l;
    const id = freshId(`${l.from}_${l.to}_`, taken);
    taken.add(id);
    return { id, ...l };
  });
  return { ...model, links };
}

const IDENT = /[A-Za-z_][A-Za-z0-9_]*/g;
/** Replace whole identifiers `from` by `to` in a formula text (the text stays text: nothing is evaluated). */
export function renameInFormula(text: string, from: string, to: string): string {
  return text.replace(IDENT, (m, offset: number) => {
    const prev = text[offset - 1];
    // a name right after a digit or a dot is part of a number such as 1e5 or of something else
    if (prev !== undefined && /[0-9.]/.test(prev)) return m;
    return m === from ? to : m;
  });
}

/** Apply one change. Changes that name missing items leave the model as it was (same object). */
export function applyChange(model: Model, change: Change): Model {
  switch (change.type) {
    case 'addVariable': {
      if (usedIds(model).has(change.variable.id)) return model;
      return { ...model, variables: [...model.variables, change.variable] };
    }
    case 'updateVariable': {
      const i = model.variables.findIndex((v) => v.id === change.id);
      if (i < 0) return model;
      const v = model.variables[i];
      const allowed = new Set(KIND_FIELDS[v.kind]);
      const patch: VariablePatch = {};
      for (const [k, val] of Object.entries(change.patch) as [keyof VariablePatch, unknown][]) {
        if (KIND_ONLY.has(k) && !allowed.has(k)) continue;
        (patch as Record<string, unknown>)[k] = val;
      }
      const variables = model.variables.slice();
      variables[i] = patched(v, patch);
      return { ...model, variables };
    }
    case 'setKind': {
      const i = model.variables.findIndex((v) => v.id === change.id);
      if (i < 0 || model.variables[i].kind === change.kind) return model;
      const v: Variable = { ...model.variables[i], kind: change.kind };
      for (const f of KIND_ONLY) if (!KIND_FIELDS[change.kind].includes(f)) delete v[f];
      const variables = model.variables.slice();
      variables[i] = v;
      let settings = model.settings;
      if (change.kind !== 'state' && settings?.noise && change.id in settings.noise) {
        const { [change.id]: _drop, ...noise } = settings.noise;
        void _drop;
        settings = { ...settings, noise };
      }
      return { ...model, variables, settings };
    }
    case 'renameVariable': {
      const { id, newId } = change;
      if (id === newId || usedIds(model).has(newId) || !model.variables.some((v) => v.id === id)) return model;
      const fix = (t: string | undefined) => (t === undefined ? t : renameInFormula(t, id, newId));
      const variables = model.variables.map((v) => {
        const w: Variable = v.id === id ? { ...v, id: newId } : { ...v };
        if (w.formula !== undefined) w.formula = fix(w.formula);
        if (w.rate !== undefined) w.rate = fix(w.rate);
        return w;
      });
      const relations = model.relations?.map((r) => ({ ...r, equation: fix(r.equation) as string }));
      const links = model.links.map((l) => (l.from === id || l.to === id ? { ...l, from: l.from === id ? newId : l.from, to: l.to === id ? newId : l.to } : l));
      let settings = model.settings;
      if (settings?.noise && id in settings.noise) {
        const { [id]: n, ...rest } = settings.noise;
        settings = { ...settings, noise: { ...rest, [newId]: n } };
      }
      const out: Model = { ...model, variables, links, settings };
      if (relations) out.relations = relations;
      if (!settings) delete out.settings;
      if (model.study?.holds && id in model.study.holds) {
        const { [id]: h, ...others } = model.study.holds;
        out.study = { ...model.study, holds: { ...others, [newId]: h } };
      }
      return out;
    }
    case 'addLink': {
      const { link } = change;
      const ids = new Set(model.variables.map((v) => v.id));
      if (!ids.has(link.from) || !ids.has(link.to) || link.from === link.to) return model;
      if (link.id !== undefined && model.links.some((l) => l.id === link.id)) return model;
      return { ...model, links: [...model.links, link] };
    }
    case 'updateLink': {
      const i = model.links.findIndex((l) => l.id === change.id);
      if (i < 0) return model;
      const links = model.links.slice();
      links[i] = patched(links[i], change.patch);
      return { ...model, links };
    }
    case 'addRelation': {
      if (usedIds(model).has(change.relation.id)) return model;
      return { ...model, relations: [...(model.relations ?? []), change.relation] };
    }
    case 'updateRelation': {
      const rel = model.relations ?? [];
      const i = rel.findIndex((r) => r.id === change.id);
      if (i < 0) return model;
      const relations = rel.slice();
      relations[i] = patched(relations[i], change.patch);
      return { ...model, relations };
    }
    case 'remove': {
      const vars = new Set(change.variables ?? []);
      const links = new Set(change.links ?? []);
      const rels = new Set(change.relations ?? []);
      if (vars.size + links.size + rels.size === 0) return model;
      const out: Model = {
        ...model,
        variables: model.variables.filter((v) => !vars.has(v.id)),
        links: model.links.filter((l) => !(l.id !== undefined && links.has(l.id)) && !vars.has(l.from) && !vars.has(l.to)),
      };
      if (model.relations) out.relations = model.relations.filter((r) => !rels.has(r.id));
      if (out.variables.length === model.variables.length && out.links.length === model.links.length && (out.relations?.length ?? 0) === (model.relations?.length ?? 0)) return model;
      if (model.settings?.noise && [...vars].some((v) => v in model.settings!.noise!)) {
        const noise = Object.fromEntries(Object.entries(model.settings.noise).filter(([k]) => !vars.has(k)));
        out.settings = { ...model.settings, noise };
      }
      // a hold of a variable that is gone is released
      if (model.study?.holds && [...vars].some((v) => v in model.study!.holds!)) {
        const holds = Object.fromEntries(Object.entries(model.study.holds).filter(([k]) => !vars.has(k)));
        out.study = { ...model.study, holds };
        if (Object.keys(holds).length === 0) delete out.study.holds;
      }
      return out;
    }
    case 'move': {
      const p = change.positions;
      let touched = false;
      const variables = model.variables.map((v) => {
        const q = p[v.id];
        if (!q) return v;
        touched = true;
        return { ...v, position: { x: Math.round(q.x), y: Math.round(q.y) } };
      });
      const relations = model.relations?.map((r) => {
        const q = p[r.id];
        if (!q) return r;
        touched = true;
        return { ...r, position: { x: Math.round(q.x), y: Math.round(q.y) } };
      });
      if (!touched) return model;
      const out: Model = { ...model, variables };
      if (relations) out.relations = relations;
      return out;
    }
    case 'paste': {
      if (change.variables.length + change.links.length + change.relations.length === 0) return model;
      const out: Model = { ...model, variables: [...model.variables, ...change.variables], links: [...model.links, ...change.links] };
      if (change.relations.length > 0 || model.relations) out.relations = [...(model.relations ?? []), ...change.relations];
      return out;
    }
    case 'setMeta':
      return patched(model, change.patch);
  }
}

/**
 * Prepare a copied selection for pasting: fresh ids for clashing names,
 * formulas and links rewritten to the new names, positions shifted.
 */
export function preparePaste(
  model: Model,
  clip: { variables: Variable[]; links: Link[]; relations: Relation[] },
  offset: Position,
): Extract<Change, { type: 'paste' }> {
  const taken = usedIds(model);
  const rename = new Map<string, string>();
  for (const v of [...clip.variables, ...clip.relations]) {
    const stem = v.id.replace(/_?\d+$/, '') || 'v';
    const id = taken.has(v.id) ? freshId(`${stem}_`, taken) : v.id;
    taken.add(id);
    rename.set(v.id, id);
  }
  const fix = (t: string) => {
    let out = t;
    // two passes through placeholders so that a→b, b→c never chain
    const pairs = [...rename.entries()].filter(([a, b]) => a !== b);
    pairs.forEach(([a], i) => (out = renameInFormula(out, a, `__paste${i}__`)));
    pairs.forEach(([, b], i) => (out = renameInFormula(out, `__paste${i}__`, b)));
    return out;
  };
  const shift = (p?: Position) => (p ? { x: p.x + offset.x, y: p.y + offset.y } : undefined);
  const variables = clip.variables.map((v) => {
    const w: Variable = { ...v, id: rename.get(v.id)! };
    // a pasted copy beside its original must be told apart by its label too
    if (w.id !== v.id) w.label = `${v.label ?? v.id} (copy)`;
    if (w.formula !== undefined) w.formula = fix(w.formula);
    if (w.rate !== undefined) w.rate = fix(w.rate);
    const p = shift(v.position);
    if (p) w.position = p;
    return w;
  });
  const relations = clip.relations.map((r) => {
    const w: Relation = { ...r, id: rename.get(r.id)!, equation: fix(r.equation) };
    const p = shift(r.position);
    if (p) w.position = p;
    return w;
  });
  const linkIds = new Set(model.links.map((l) => l.id).filter((x): x is string => !!x));
  const links = clip.links
    .filter((l) => rename.has(l.from) && rename.has(l.to))
    .map((l) => {
      const from = rename.get(l.from)!;
      const to = rename.get(l.to)!;
      const id = freshId(`${from}_${to}_`, linkIds);
      linkIds.add(id);
      return { ...l, id, from, to };
    });
  return { type: 'paste', variables, links, relations };
}

/** Whether an id is one the editor made up for a new variable (`v1`, `v2`, …). */
export function isGeneratedId(id: string): boolean {
  return /^v\d+$/.test(id);
}

/**
 * A name for formulas made from a label: "Soil water" → "soilWater".
 * `reserved` names (functions, constants) and `taken` ids are avoided by a suffix.
 */
export function idFromLabel(label: string, taken: ReadonlySet<string>, reserved: (name: string) => boolean = () => false): string | null {
  const words = label
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '') // accents come apart under NFKD: drop the marks, keep the letters
    .replace(/[^A-Za-z0-9\s_]/g, ' ')
    .split(/[\s_]+/)
    .filter(Boolean);
  if (words.length === 0) return null;
  let id = words.map((w, i) => (i === 0 ? w.charAt(0).toLowerCase() + w.slice(1) : w.charAt(0).toUpperCase() + w.slice(1))).join('');
  if (/^[0-9]/.test(id)) id = `v_${id}`;
  id = id.slice(0, 60);
  if (!taken.has(id) && !reserved(id)) return id;
  for (let n = 2; n < 1000; n++) if (!taken.has(`${id}_${n}`)) return `${id}_${n}`;
  return null;
}

/** An empty model to start from. */
export function emptyModel(name = 'Untitled model'): Model {
  return { format: 'loopfold-model', version: 2, name, timeUnit: 'h', variables: [], links: [] };
}
