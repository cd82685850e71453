/**
 * Free space in a figure: boxes and lines already drawn, and where a small
 * mark (a sign glyph, a weight) can go next to its line without covering a
 * node, another mark or another line. Shared by the timescale views
 * (`scene.ts`) and the networks (`charts.ts`). Pure geometry, no DOM.
 */
import type { Box, Point } from './types';

/** A box as [x0, y0, x1, y1]. */
export type Rect = readonly [number, number, number, number];

export const rectOf = (b: Box, pad = 0): Rect => [b.x - pad, b.y - pad, b.x + b.width + pad, b.y + b.height + pad];
export const rectsMeet = (a: Rect, b: Rect): boolean => a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3];

/** Whether the segment p–q passes through the inside of rectangle r (Liang–Barsky clipping, common practice). */
export function segmentMeetsRect(p: Point, q: Point, r: Rect): boolean {
  let t0 = 0, t1 = 1;
  const dx = q.x - p.x, dy = q.y - p.y;
  const clip = (den: number, num: number): boolean => {
    if (den === 0) return num >= 0;
    const t = num / den;
    if (den < 0) { if (t > t1) return false; if (t > t0) t0 = t; }
    else { if (t < t0) return false; if (t < t1) t1 = t; }
    return true;
  };
  // strict inside: a segment that only grazes the border does not count
  return clip(-dx, p.x - r[0]) && clip(dx, r[2] - p.x) && clip(-dy, p.y - r[1]) && clip(dy, r[3] - p.y) && t1 - t0 > 1e-9
    && !(dx === 0 && (p.x <= r[0] || p.x >= r[2])) && !(dy === 0 && (p.y <= r[1] || p.y >= r[3]));
}

/** Whether the polyline passes through the inside of r. */
export function polylineMeetsRect(ps: readonly Point[], r: Rect): boolean {
  for (let i = 1; i < ps.length; i++) if (segmentMeetsRect(ps[i - 1], ps[i], r)) return true;
  return false;
}

/** Length of a polyline. */
export function polylineLength(ps: readonly Point[]): number {
  let s = 0;
  for (let i = 1; i < ps.length; i++) s += Math.hypot(ps[i].x - ps[i - 1].x, ps[i].y - ps[i - 1].y);
  return s;
}

/** The point at arc length `s` from the start (clamped), with the unit direction of its segment. */
export function pointAlong(ps: readonly Point[], s: number): { p: Point; ux: number; uy: number } {
  let left = Math.max(0, s);
  for (let i = 1; i < ps.length; i++) {
    const a = ps[i - 1], b = ps[i];
    const l = Math.hypot(b.x - a.x, b.y - a.y);
    if (l === 0) continue;
    if (left <= l || i === ps.length - 1) {
      const t = Math.min(1, left / l);
      return { p: { x: a.x + (b.x - a.x) * t, y: a.y + (b.y - a.y) * t }, ux: (b.x - a.x) / l, uy: (b.y - a.y) / l };
    }
    left -= l;
  }
  return { p: ps[ps.length - 1] ?? { x: 0, y: 0 }, ux: 1, uy: 0 };
}

/** A quadratic Bézier curve as a polyline of `n` segments. */
export function quadPoints(p0: Point, c: Point, p1: Point, n = 16): Point[] {
  const out: Point[] = [];
  for (let k = 0; k <= n; k++) {
    const t = k / n, u = 1 - t;
    out.push({ x: u * u * p0.x + 2 * u * t * c.x + t * t * p1.x, y: u * u * p0.y + 2 * u * t * c.y + t * t * p1.y });
  }
  return out;
}

/**
 * What is drawn so far, in a uniform grid of cells (a query looks only at the
 * cells it meets, so a figure of thousands of nodes stays fast): boxes that
 * nothing may cover, and lines, each with an owner (a line may carry its own mark).
 */
export class Occupancy {
  private readonly cells = new Map<number, number[]>();
  private readonly rects: Rect[] = [];
  private readonly lines: { p: Point; q: Point; owner: string }[] = [];
  private readonly kinds: ('box' | 'line')[] = [];
  private readonly refs: number[] = [];
  private stamp = 0;
  private readonly seen: number[] = [];
  constructor(private readonly cell = 64) {}

  private key(i: number, j: number): number { return (i + 32768) * 65536 + (j + 32768); }
  private insert(r: Rect, id: number): void {
    const c = this.cell;
    for (let i = Math.floor(r[0] / c); i <= Math.floor(r[2] / c); i++)
      for (let j = Math.floor(r[1] / c); j <= Math.floor(r[3] / c); j++) {
        const k = this.key(i, j);
        const list = this.cells.get(k);
        if (list) list.push(id); else this.cells.set(k, [id]);
      }
  }
  /** A box nothing may cover (a node, a mark, a block's header). */
  addBox(r: Rect): void {
    const id = this.kinds.length;
    this.kinds.push('box'); this.refs.push(this.rects.length); this.seen.push(0);
    this.rects.push(r);
    this.insert(r, id);
  }
  /** A line of `owner` (an edge id): marks of other edges keep off it. */
  addLine(ps: readonly Point[], owner: string): void {
    for (let k = 1; k < ps.length; k++) {
      const p = ps[k - 1], q = ps[k];
      const id = this.kinds.length;
      this.kinds.push('line'); this.refs.push(this.lines.length); this.seen.push(0);
      this.lines.push({ p, q, owner });
      this.insert([Math.min(p.x, q.x), Math.min(p.y, q.y), Math.max(p.x, q.x), Math.max(p.y, q.y)], id);
    }
  }
  /** Whether r is free: covers no box, and no line but those of `owner` (when lines count). */
  free(r: Rect, owner: string, lines = true): boolean {
    const c = this.cell;
    this.stamp++;
    for (let i = Math.floor(r[0] / c); i <= Math.floor(r[2] / c); i++)
      for (let j = Math.floor(r[1] / c); j <= Math.floor(r[3] / c); j++) {
        for (const id of this.cells.get(this.key(i, j)) ?? []) {
          if (this.seen[id] === this.stamp) continue;
          this.seen[id] = this.stamp;
          if (this.kinds[id] === 'box') { if (rectsMeet(r, this.rects[this.refs[id]])) return false; }
          else if (lines) {
            const l = this.lines[this.refs[id]];
            if (l.owner !== owner && segmentMeetsRect(l.p, l.q, r)) return false;
          }
        }
      }
    return true;
  }
}

/**
 * Where a mark of w × h goes beside its line `ps` (drawn from source to
 * head): the first free spot, trying distances from `from` px before the head
 * backwards along the line, on either side at `offset` px (0: on the line, for
 * marks with a halo such as a weight), then anywhere along the line. First
 * keeping off other lines too, then (unless `strict`) only off boxes. The spot found is taken
 * (added to `space` as a box). Null when no free spot exists.
 */
export function placeMark(space: Occupancy, ps: readonly Point[], owner: string, w: number, h: number, opts: { from: number; offset: number; onLine?: boolean; strict?: boolean }): { x: number; y: number } | null {
  const len = polylineLength(ps);
  if (len === 0) return null;
  const steps: number[] = [];
  for (let d = opts.from; d < len - 4; d += 7) steps.push(d);
  if (!steps.length) steps.push(len / 2);
  for (const lines of opts.strict ? [true] : [true, false]) {
    for (const d of steps) {
      const { p, ux, uy } = pointAlong(ps, len - d);
      const sides = opts.onLine ? [0, 1, -1] : [1, -1];
      for (const side of sides) {
        const off = side === 0 ? 0 : opts.offset + (Math.abs(ux) * h + Math.abs(uy) * w) / 2;
        const cx = p.x - uy * off * side, cy = p.y + ux * off * side;
        const r: Rect = [cx - w / 2, cy - h / 2, cx + w / 2, cy + h / 2];
        if (space.free(r, owner, lines)) { space.addBox(r); return { x: cx, y: cy }; }
      }
    }
  }
  return null;
}
