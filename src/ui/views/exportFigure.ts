/**
 * Figure export from the app: the same view model and the same layout
 * function as `loopfold render` (ELK without seeding, or the drawn
 * positions for the mechanism), written by the one SVG renderer; PNG by
 * drawing that SVG on a canvas at 1×, 2× or 4×.
 */
import type { ViewModel } from '../../core/view/types';
import { renderSvg, type SvgOptions } from '../../export/svg';
import { browserElk } from '../../layout/browser';
import { figureLayout } from '../../layout/figure';
import { downloadBlob } from '../download';

export async function figureSvg(vm: ViewModel, options: SvgOptions, drawn?: Record<string, { x: number; y: number }>): Promise<string> {
  const layout = await figureLayout(await browserElk(), vm, drawn);
  return renderSvg(vm, layout, options);
}

export async function exportSvg(vm: ViewModel, options: SvgOptions, name: string, drawn?: Record<string, { x: number; y: number }>): Promise<void> {
  const svg = await figureSvg(vm, options, drawn);
  downloadBlob(new Blob([svg], { type: 'image/svg+xml' }), `${name}.svg`);
}

export async function exportPng(vm: ViewModel, options: SvgOptions, name: string, scale: 1 | 2 | 4, drawn?: Record<string, { x: number; y: number }>): Promise<void> {
  const svg = await figureSvg(vm, options, drawn);
  const w = Number(/width="(\d+)"/.exec(svg)?.[1] ?? 800);
  const h = Number(/height="(\d+)"/.exec(svg)?.[1] ?? 600);
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = w * scale;
    canvas.height = h * scale;
    const ctx = canvas.getContext('2d')!;
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, w, h);
    const blob = await new Promise<Blob | null>((res) => canvas.toBlob(res, 'image/png'));
    if (blob) downloadBlob(blob, `${name}@${scale}x.png`);
  } finally {
    URL.revokeObjectURL(url);
  }
}
