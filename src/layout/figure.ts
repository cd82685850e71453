/**
 * The layout of an exported figure, the same in the app and on the command
 * line: the modeller's drawn positions for the mechanism when every variable
 * has one, else ELK with the tuned options and no seeding (so the figure does
 * not depend on the path the slider took).
 */
import type { ViewModel } from '../core/view/types';
import { elkLayout, type ElkRunner } from './elk';
import { instantLayout } from './instant';
import type { Layout } from './types';

export async function figureLayout(elk: ElkRunner, vm: ViewModel, drawn?: Record<string, { x: number; y: number }>): Promise<Layout> {
  if (vm.mode === 'mechanism' && drawn) return { ...instantLayout(vm, undefined, drawn), source: 'drawn' };
  return elkLayout(elk, vm, {});
}
