/**
 * PNG files that carry their resolution: a `pHYs` chunk (pixels per metre,
 * unit 1 = metre; PNG specification, ISO/IEC 15948:2004, 11.3.5.3) put right
 * after `IHDR`, replacing any the encoder wrote. Pure byte work, shared by
 * the command line (resvg's output) and the app (the canvas's output).
 */

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 of PNG chunks (ISO/IEC 15948, annex D). */
export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

const SIGNATURE = [137, 80, 78, 71, 13, 10, 26, 10];

/** The chunks of a PNG file: type, data, and where each starts. */
export function pngChunks(png: Uint8Array): { type: string; data: Uint8Array; at: number; end: number }[] {
  if (png.length < 8 || SIGNATURE.some((b, i) => png[i] !== b)) throw new Error('not a PNG file');
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const out: { type: string; data: Uint8Array; at: number; end: number }[] = [];
  let p = 8;
  while (p + 12 <= png.length) {
    const len = view.getUint32(p);
    const type = String.fromCharCode(...png.subarray(p + 4, p + 8));
    out.push({ type, data: png.subarray(p + 8, p + 8 + len), at: p, end: p + 12 + len });
    p += 12 + len;
    if (type === 'IEND') break;
  }
  return out;
}

/** Dots per inch → pixels per metre, rounded (the unit pHYs stores). */
export const dpiToPpm = (dpi: number): number => Math.round(dpi / 0.0254);

/** The PNG with its resolution set to `dpi` in both directions. */
export function withDpi(png: Uint8Array, dpi: number): Uint8Array {
  const chunks = pngChunks(png);
  const ihdr = chunks[0];
  if (!ihdr || ihdr.type !== 'IHDR') throw new Error('a PNG file must start with IHDR');
  const body = new Uint8Array(13);
  const dv = new DataView(body.buffer);
  body.set([0x70, 0x48, 0x59, 0x73]); // "pHYs"
  dv.setUint32(4, dpiToPpm(dpi));
  dv.setUint32(8, dpiToPpm(dpi));
  body[12] = 1; // unit: metre
  const chunk = new Uint8Array(4 + 13 + 4);
  const cv = new DataView(chunk.buffer);
  cv.setUint32(0, 9);
  chunk.set(body, 4);
  cv.setUint32(17, crc32(body));
  const parts: Uint8Array[] = [png.subarray(0, ihdr.end), chunk];
  for (const c of chunks.slice(1)) if (c.type !== 'pHYs') parts.push(png.subarray(c.at, c.end));
  const total = parts.reduce((s, q) => s + q.length, 0);
  const out = new Uint8Array(total);
  let o = 0;
  for (const q of parts) { out.set(q, o); o += q.length; }
  return out;
}

/** The resolution a PNG states, in dots per inch (undefined without pHYs in metres). */
export function dpiOf(png: Uint8Array): number | undefined {
  const c = pngChunks(png).find((x) => x.type === 'pHYs');
  if (!c || c.data[8] !== 1) return undefined;
  const dv = new DataView(c.data.buffer, c.data.byteOffset, c.data.byteLength);
  return dv.getUint32(0) * 0.0254;
}
