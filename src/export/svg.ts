/**
 * The one SVG renderer: a self-contained SVG string (no external CSS or
 * fonts, text kept as text, every label XML-escaped) for the app's export
 * and the command line (`render`, and the charts and networks of
 * `simulate`, `sampled` and `curves`).
 */
import type { ViewModel } from '../core/view/types';
import type { Layout } from '../layout/types';
import { buildScene, type El, type SceneOptions } from './scene';

export type SvgOptions = SceneOptions;

/** Escape text for XML content and attribute values. */
export function xmlEscape(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!)
    // characters XML 1.0 forbids
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '');
}

export function serialize(node: El | string, indent = ''): string {
  if (typeof node === 'string') return xmlEscape(node);
  const attrs = Object.entries(node.attrs)
    .filter(([, v]) => v !== undefined)
    .map(([k, v]) => ` ${k}="${xmlEscape(String(v))}"`)
    .join('');
  if (!node.children?.length) return `${indent}<${node.tag}${attrs}/>`;
  const textOnly = node.children.every((c) => typeof c === 'string');
  if (textOnly) return `${indent}<${node.tag}${attrs}>${node.children.map((c) => serialize(c)).join('')}</${node.tag}>`;
  const inner = node.children.map((c) => (typeof c === 'string' ? indent + '  ' + xmlEscape(c) : serialize(c, indent + '  '))).join('\n');
  return `${indent}<${node.tag}${attrs}>\n${inner}\n${indent}</${node.tag}>`;
}

/** A drawing's root `<svg>` element as a file: '<?xml version="1.0" …>\n<svg …>…</svg>\n'. */
export function svgDocument(root: El): string {
  return `<?xml version="1.0" encoding="UTF-8"?>\n${serialize(root)}\n`;
}

/** `renderSvg(view, layout, { caption: true })` → '<?xml version="1.0" …><svg …>…</svg>'. */
export function renderSvg(vm: ViewModel, layout: Layout, options: SvgOptions = {}): string {
  return svgDocument(buildScene(vm, layout, options));
}
