/** The part of fontkit's API the figure writers use (the package ships no types). */
declare module 'fontkit' {
  export interface Path {
    transform(m0: number, m1: number, m2: number, m3: number, m4: number, m5: number): Path;
    toSVG(): string;
  }
  export interface Glyph {
    path: Path;
    advanceWidth: number;
  }
  export interface GlyphPosition {
    xAdvance: number;
    yAdvance: number;
    xOffset: number;
    yOffset: number;
  }
  export interface GlyphRun {
    glyphs: Glyph[];
    positions: GlyphPosition[];
    advanceWidth: number;
  }
  export interface Font {
    unitsPerEm: number;
    ascent: number;
    descent: number;
    layout(text: string): GlyphRun;
  }
  export function create(buffer: Uint8Array): Font;
}
