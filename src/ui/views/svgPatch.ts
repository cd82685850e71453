/**
 * The scene on screen, updated in place: the `<svg>` root and the figure's
 * parts (one `<g>` per node, edge, block and instant) are kept by key, and
 * only the parts whose element tree changed are parsed again. A new band
 * changes a few roles and links of a big model, so the browser restyles a
 * few elements instead of parsing and laying out the whole figure. A part
 * that only moved (the same elements with the same attributes, other
 * values: coordinates, paths) keeps its elements and gets the new values
 * written in: a new layout of a big figure moves every node, and parsing
 * them all again took most of the time it took to show it.
 */
import type { El } from '../../export/scene';
import { serialize } from '../../export/svg';

const SVG_NS = 'http://www.w3.org/2000/svg';

interface Shown {
  el: El;
  dom: Element;
  /** For the figure's body: its parts by key. */
  parts?: Map<string, Shown>;
}

export interface SvgHost {
  root: Shown | null;
}

/** Same element tree (tag, attributes, children, in order). */
export function sameEl(a: El | string, b: El | string): boolean {
  if (a === b) return true;
  if (typeof a === 'string' || typeof b === 'string') return false;
  if (a.tag !== b.tag) return false;
  if (!sameAttrs(a.attrs, b.attrs)) return false;
  const ak = a.children ?? [], bk = b.children ?? [];
  if (ak.length !== bk.length) return false;
  for (let i = 0; i < ak.length; i++) if (!sameEl(ak[i], bk[i])) return false;
  return true;
}

function sameAttrs(a: El['attrs'], b: El['attrs']): boolean {
  const ka = Object.keys(a);
  let nb = 0;
  for (const k in b) if (b[k] !== undefined) nb++;
  let na = 0;
  for (const k of ka) {
    if (a[k] === undefined) continue;
    na++;
    if (String(a[k]) !== String(b[k])) return false;
  }
  return na === nb;
}

/** The defined attribute names of `a`, in order. */
function attrNames(a: El['attrs']): string[] {
  const out: string[] = [];
  for (const k in a) if (a[k] !== undefined) out.push(k);
  return out;
}

/**
 * Same elements, attribute names and text positions, in the same order (the values may differ): `b`
 * can be written into what shows `a`. Mixed text and elements under one parent are never the same shape
 * (the file's white space between elements is not kept one to one).
 */
export function sameShape(a: El | string, b: El | string): boolean {
  if (typeof a === 'string' || typeof b === 'string') return typeof a === 'string' && typeof b === 'string';
  if (a.tag !== b.tag) return false;
  const na = attrNames(a.attrs), nb = attrNames(b.attrs);
  if (na.length !== nb.length) return false;
  for (let i = 0; i < na.length; i++) if (na[i] !== nb[i]) return false;
  const ak = a.children ?? [], bk = b.children ?? [];
  if (ak.length !== bk.length) return false;
  const texts = ak.filter((c) => typeof c === 'string').length;
  if (texts && texts !== ak.length) return false;
  if (texts) return true;
  for (let i = 0; i < ak.length; i++) if (!sameShape(ak[i], bk[i])) return false;
  return true;
}

/** Write `next` into `dom`, which shows `before` (same shape): only the values that differ. */
function morph(dom: Element, before: El, next: El): void {
  setAttrs(dom, before.attrs, next.attrs);
  const bk = before.children ?? [], nk = next.children ?? [];
  if (!nk.length) return;
  if (typeof nk[0] === 'string') {
    const text = (nk as string[]).join('');
    if ((bk as string[]).join('') !== text) dom.textContent = text;
    return;
  }
  const kids = dom.children;
  for (let i = 0; i < nk.length; i++) if (!sameEl(bk[i], nk[i])) morph(kids[i], bk[i] as El, nk[i] as El);
}

/** Parse many elements at once (one parser run), in order. */
function parseAll(els: El[], doc: Document): Element[] {
  if (!els.length) return [];
  const box = doc.createElementNS(SVG_NS, 'svg');
  box.innerHTML = els.map((e) => serialize(e)).join('');
  return [...box.children];
}

function setAttrs(dom: Element, before: El['attrs'] | null, after: El['attrs']): void {
  if (before) {
    for (const k of Object.keys(before)) if (before[k] !== undefined && after[k] === undefined) dom.removeAttribute(k);
  }
  for (const [k, v] of Object.entries(after)) {
    if (v === undefined) continue;
    const s = String(v);
    if (!before || before[k] === undefined || String(before[k]) !== s) dom.setAttribute(k, s);
  }
}

const keyOf = (e: El | string, i: number): string => {
  if (typeof e === 'string') return `#text${i}`;
  const a = e.attrs;
  const k = a['data-node'] ?? a['data-edge'] ?? a['data-group'] ?? a['data-slice-frame'] ?? a['data-part'];
  if (k !== undefined) return `${e.tag}:${String(k)}`;
  // a block's name and fold button, drawn over the links
  if (a['data-block-label'] !== undefined) return `label:${String(a['data-block-label'])}`;
  return `#${e.tag}${i}`;
};

/**
 * Keyed children of `parent`: unchanged ones stay, changed or new ones are
 * parsed in one go, gone ones are removed; the order follows `next`.
 * `deep(key)` names the child whose own children are kept by key too.
 */
function patchChildren(parent: Element, before: Map<string, Shown>, next: (El | string)[], deep?: (key: string) => boolean): Map<string, Shown> {
  const doc = parent.ownerDocument;
  const after = new Map<string, Shown>();
  const keys = next.map(keyOf);
  const fresh: El[] = [];
  const freshAt: number[] = [];
  const slots: (Shown | null)[] = next.map((e, i) => {
    if (typeof e === 'string') return null;
    const k = keys[i];
    const old = before.get(k);
    if (old && old.el.tag === e.tag && deep?.(k) && old.parts) {
      setAttrs(old.dom, old.el.attrs, e.attrs);
      old.parts = patchChildren(old.dom, old.parts, e.children ?? [], undefined);
      return { el: e, dom: old.dom, parts: old.parts };
    }
    if (old && sameEl(old.el, e)) return { el: e, dom: old.dom, ...(old.parts ? { parts: old.parts } : {}) };
    if (old && !old.parts && !deep?.(k) && sameShape(old.el, e)) {
      morph(old.dom, old.el, e);
      return { el: e, dom: old.dom };
    }
    fresh.push(e);
    freshAt.push(i);
    return null;
  });
  const parsed = parseAll(fresh, doc);
  freshAt.forEach((i, j) => {
    const dom = parsed[j];
    const e = next[i] as El;
    const shown: Shown = { el: e, dom };
    if (deep?.(keys[i])) shown.parts = indexParts(dom, e);
    slots[i] = shown;
  });
  slots.forEach((s, i) => { if (s) after.set(keys[i], s); });
  // drop what is gone or replaced
  for (const [k, s] of before) if (after.get(k)?.dom !== s.dom) s.dom.remove();
  // put the children in order (moves only those out of place)
  const owned = new Set<Node>();
  for (const s of slots) if (s) owned.add(s.dom);
  let cursor: ChildNode | null = parent.firstChild;
  for (const s of slots) {
    if (!s) continue;
    // skip stray nodes (whitespace, text) the patcher does not own
    while (cursor && cursor !== s.dom && !owned.has(cursor)) { const n: ChildNode | null = cursor.nextSibling; cursor.remove(); cursor = n; }
    if (cursor === s.dom) { cursor = cursor.nextSibling; continue; }
    parent.insertBefore(s.dom, cursor);
  }
  while (cursor) { const n: ChildNode | null = cursor.nextSibling; cursor.remove(); cursor = n; }
  return after;
}

/** The parts of a freshly parsed element, by key (element children only). */
function indexParts(dom: Element, e: El): Map<string, Shown> {
  const parts = new Map<string, Shown>();
  const kids = e.children ?? [];
  const doms = [...dom.children];
  let j = 0;
  kids.forEach((c, i) => {
    if (typeof c === 'string') return;
    parts.set(keyOf(c, i), { el: c, dom: doms[j++] });
  });
  // text between elements is not kept on screen
  for (const n of [...dom.childNodes]) if (n.nodeType === 3) n.remove();
  return parts;
}

const isFigure = (k: string) => k === 'g:figure';

/** Show `scene` in `host` (a plain element), changing only what differs from what is shown. */
export function patchSvg(container: Element, host: SvgHost, scene: El): void {
  const root = host.root;
  if (!root || root.dom.parentNode !== container || root.el.tag !== scene.tag) {
    container.textContent = '';
    const [dom] = parseAll([{ ...scene, children: [] }], container.ownerDocument);
    const svg = dom;
    container.appendChild(svg);
    const parts = patchChildren(svg, new Map(), scene.children ?? [], isFigure);
    host.root = { el: scene, dom: svg, parts };
    return;
  }
  setAttrs(root.dom, root.el.attrs, scene.attrs);
  root.parts = patchChildren(root.dom, root.parts ?? new Map(), scene.children ?? [], isFigure);
  root.el = scene;
}
