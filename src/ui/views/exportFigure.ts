/**
 * Figure export from the app, written by the one SVG renderer: either the
 * layout on screen (what the modeller sees), or the same layout function as
 * `loopfold render` (ELK without seeding, or the drawn positions for the
 * mechanism), which gives the command line's file byte for byte. PNG by
 * drawing that SVG on a canvas at 1×, 2× or 4×.
 */
import type { ViewModel } from '../../core/view/types';
import { renderSvg, type SvgOptions } from '../../export/svg';
import { browserElk } from '../../layout/browser';
import { figureLayout } from '../../layout/figure';
import type { Layout } from '../../layout/types';
import { downloadPng, downloadSvg } from '../figureFiles';

/** Where the figure's positions come from: the drawn canvas (mechanism), the layout on screen, or neither (ELK afresh). */
export interface FigurePlacement {
  drawn?: Record<string, { x: number; y: number }>;
  /** The layout shown on screen: used when it places every node and block of the view. */
  shown?: Layout | null;
}

/** Whether a layout places every node and block of a view (it was made for this view). */
export function fits(vm: ViewModel, layout: Layout): boolean {
  return vm.nodes.every((n) => layout.nodes[n.id]) && vm.groups.every((g) => layout.groups[g.id]);
}

export async function figureSvg(vm: ViewModel, options: SvgOptions, at: FigurePlacement = {}): Promise<string> {
  const layout = at.shown && fits(vm, at.shown) ? at.shown : await figureLayout(await browserElk(), vm, at.drawn);
  return renderSvg(vm, layout, options);
}

export async function exportSvg(vm: ViewModel, options: SvgOptions, name: string, at: FigurePlacement = {}): Promise<void> {
  downloadSvg(await figureSvg(vm, options, at), name);
}

export async function exportPng(vm: ViewModel, options: SvgOptions, name: string, scale: 1 | 2 | 4, at: FigurePlacement = {}): Promise<void> {
  await downloadPng(await figureSvg(vm, options, at), name, scale);
}
