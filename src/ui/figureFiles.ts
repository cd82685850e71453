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

/** A file name stem from the model's name: "Sleep & stress" → "sleep-stress". */
export function fileStem(name: string): string {
  return name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'model';
}
