/**
 * Mount React parts into happy-dom for component tests (the test file needs
 * `// @vitest-environment happy-dom`): `mount(<Part />)` returns the host
 * element; `unmountAll()` (in afterEach) removes what was mounted.
 */
import { act } from 'react';
import { createRoot, type Root } from 'react-dom/client';

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const mounted: { root: Root; host: HTMLElement }[] = [];

export function mount(node: React.ReactNode): HTMLElement {
  const host = document.createElement('div');
  document.body.append(host);
  const root = createRoot(host);
  act(() => root.render(node));
  mounted.push({ root, host });
  return host;
}

/** Re-render the latest mounted root with new props. */
export function rerender(node: React.ReactNode): void {
  const last = mounted[mounted.length - 1];
  if (!last) throw new Error('nothing mounted');
  act(() => last.root.render(node));
}

export function unmountAll(): void {
  for (const { root, host } of mounted.splice(0)) {
    act(() => root.unmount());
    host.remove();
  }
}
