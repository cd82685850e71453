/**
 * The fonts printed figures are set in: DejaVu Sans (the first family of the
 * figures' font stack), read from the `dejavu-fonts-ttf` package so PNG, PDF
 * and text-as-paths SVG come out the same on a machine without DejaVu
 * installed. Node only.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import * as fontkit from 'fontkit';

export type Face = 'regular' | 'bold' | 'oblique' | 'bold-oblique';
const FILES: Record<Face, string> = { regular: 'DejaVuSans.ttf', bold: 'DejaVuSans-Bold.ttf', oblique: 'DejaVuSans-Oblique.ttf', 'bold-oblique': 'DejaVuSans-BoldOblique.ttf' };

let dir: string | undefined;
/** The folder of the TrueType files. */
export function fontDir(): string {
  dir ??= join(dirname(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/package.json')), 'ttf');
  return dir;
}

export function fontFile(face: Face): string {
  return join(fontDir(), FILES[face]);
}

export const ALL_FACES: readonly Face[] = ['regular', 'bold', 'oblique', 'bold-oblique'];

/** The face of a text element from its font-weight and font-style. */
export function faceOf(weight: unknown, style: unknown): Face {
  const bold = weight === 'bold' || Number(weight) >= 600;
  const oblique = style === 'italic' || style === 'oblique';
  return bold ? (oblique ? 'bold-oblique' : 'bold') : oblique ? 'oblique' : 'regular';
}

const cache = new Map<Face, fontkit.Font>();
/** The parsed font of a face (fontkit), read once. */
export function fontOf(face: Face): fontkit.Font {
  let f = cache.get(face);
  if (!f) {
    f = fontkit.create(readFileSync(fontFile(face))) as fontkit.Font;
    cache.set(face, f);
  }
  return f;
}
