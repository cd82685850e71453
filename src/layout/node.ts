/** ELK in Node (command line, tests, benchmarks): the bundled build, run in-process. */
import ELK from 'elkjs/lib/elk.bundled.js';
import type { ViewModel } from '../core/view/types';
import { elkLayout, type ElkLayoutOptions, type ElkRunner } from './elk';
import type { Layout } from './types';

let shared: ElkRunner | undefined;
export function nodeElk(): ElkRunner {
  shared ??= new ELK() as unknown as ElkRunner;
  return shared;
}

export function layoutInNode(vm: ViewModel, opts: ElkLayoutOptions = {}): Promise<Layout> {
  return elkLayout(nodeElk(), vm, opts);
}
