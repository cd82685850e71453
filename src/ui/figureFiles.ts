/**
 * Figures as files: an SVG text offered as a download, or drawn on a canvas
 * at 1×, 2× or 4× and offered as PNG. The timescale views and the Numbers
 * pane both export through these.
 */
import { downloadBlob } from './download';

export function downloadSvg(svg: string, name: string): void {
  downloadBlob(new Blob([svg], { type: 'image/svg+xml' }), `${name}.svg`);
}

/** The SVG drawn at `scale` times its width and height attributes, saved as `${name}@${scale}x.png`. */
export async function downloadPng(svg: string, name: string, scale: 1 | 2 | 4): Promise<void> {
  const w = Number(/width="(\d+)"/.exec(svg)?.[1] ?? 800);
  const h = Number(/height="(\d+)"/.exec(svg)?.[1] ?? 600);
  downloadBlob(await svgPng(svg, { width: w * scale, height: h * scale }), `${name}@${scale}x.png`);
}

/** The SVG text drawn by the browser on a canvas of `size` pixels, as PNG. */
export async function svgPng(svg: string, size: { width: number; height: number }): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = size.width;
    canvas.height = size.height;
    canvas.getContext('2d')!.drawImage(img, 0, 0, size.width, size.height);
    const blob = await new Promise<Blob | null>((res) => canvas.toBlob(res, 'image/png'));
    if (!blob) throw new Error('the browser made no PNG');
    return blob;
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** A file name stem from the model's name: "Sleep & stress" → "sleep-stress". */
export function fileStem(name: string): string {
  return name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'model';
}
