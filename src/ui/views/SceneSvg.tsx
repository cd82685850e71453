/** The exporter's scene tree as React elements: the screen shows the exported picture. */
import { createElement, type ReactNode } from 'react';
import type { El } from '../../export/scene';

function propName(k: string): string {
  if (k === 'class') return 'className';
  if (k.startsWith('data-') || k.startsWith('aria-') || k === 'xmlns') return k;
  return k.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
}

export function toReact(node: El | string, key?: string | number): ReactNode {
  if (typeof node === 'string') return node;
  const props: Record<string, unknown> = { key };
  for (const [k, v] of Object.entries(node.attrs)) {
    if (v === undefined) continue;
    if (k === 'style') props.style = Object.fromEntries(String(v).split(';').filter(Boolean).map((d) => { const [a, b] = d.split(':'); return [propName(a.trim()), b.trim()]; }));
    else props[propName(k)] = v;
  }
  const kid = (c: El | string, i: number) => {
    const k = typeof c === 'string' ? i : (c.attrs['data-node'] ?? c.attrs['data-edge'] ?? c.attrs['data-group'] ?? i);
    return toReact(c, String(k));
  };
  return createElement(node.tag, props, ...(node.children ?? []).map(kid));
}
