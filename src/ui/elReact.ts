/**
 * A drawing's element tree (`El`, from `src/export/`) as React elements, so
 * a component shows exactly the picture the exporter writes. `decorate`
 * adds props (handlers, ARIA) to chosen elements; attribute names become
 * React's (`stroke-width` → `strokeWidth`, `class` → `className`).
 */
import { createElement, type ReactElement, type ReactNode } from 'react';
import type { El } from '../export/scene';

const names = new Map<string, string>();
function propName(attr: string): string {
  let n = names.get(attr);
  if (n === undefined) {
    n = attr === 'class' ? 'className' : attr.startsWith('data-') || attr.startsWith('aria-') ? attr : attr.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
    names.set(attr, n);
  }
  return n;
}

export type Decorate = (el: El) => Record<string, unknown> | undefined;

export function elToReact(node: El, decorate?: Decorate): ReactElement {
  const props: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(node.attrs)) if (v !== undefined) props[propName(k)] = v;
  const extra = decorate?.(node);
  if (extra) Object.assign(props, extra);
  const children: ReactNode[] = (node.children ?? []).map((c) => (typeof c === 'string' ? c : elToReact(c, decorate)));
  return createElement(node.tag, props, ...children);
}
