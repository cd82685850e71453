/**
 * PNG files of figures: the SVG rasterised by resvg (`@resvg/resvg-js`, a
 * Rust renderer shipped as a prebuilt binary inside the npm package) with
 * DejaVu Sans from `dejavu-fonts-ttf` only (no system fonts: the same pixels
 * on every machine), at a given resolution written into the file (pHYs).
 * Node only.
 */
import { Resvg } from '@resvg/resvg-js';
import { withDpi } from '../../export/print/png';
import { ALL_FACES, fontFile } from './fonts';

/** Pixels wide of a figure `widthIn` inches wide at `dpi`. */
export const pixelsFor = (widthIn: number, dpi: number): number => Math.max(1, Math.round(widthIn * dpi));

/** The SVG text as a PNG `pixelWidth` pixels wide, stating `dpi`. */
export function svgToPng(svg: string, pixelWidth: number, dpi: number): Uint8Array {
  const r = new Resvg(svg, {
    fitTo: { mode: 'width', value: pixelWidth },
    font: { fontFiles: ALL_FACES.map(fontFile), loadSystemFonts: false, defaultFontFamily: 'DejaVu Sans', sansSerifFamily: 'DejaVu Sans' },
    shapeRendering: 2,
    textRendering: 1,
  });
  const png = r.render().asPng();
  return withDpi(new Uint8Array(png.buffer, png.byteOffset, png.byteLength), dpi);
}
