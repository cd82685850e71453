/** Where a link meets the outline of a node: the straight line between centres, clipped to each node's box. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** The point where the ray from the centre of `b` towards (tx, ty) leaves the box. */
export function boxExit(b: Box, tx: number, ty: number): { x: number; y: number } {
  const cx = b.x + b.w / 2;
  const cy = b.y + b.h / 2;
  const dx = tx - cx;
  const dy = ty - cy;
  if (dx === 0 && dy === 0) return { x: cx, y: cy };
  const sx = dx === 0 ? Infinity : b.w / 2 / Math.abs(dx);
  const sy = dy === 0 ? Infinity : b.h / 2 / Math.abs(dy);
  const s = Math.min(sx, sy);
  return { x: cx + dx * s, y: cy + dy * s };
}

/**
 * A gently bowed path from box `a` to box `b`. The bow always lies to the
 * left of the direction of travel, so links a→b and b→a never overlap.
 * Returns the SVG path, a point near the head for the sign glyph, the tip
 * (where the path meets `b`) and the curve's control point (the head's direction).
 */
export function linkPath(a: Box, b: Box, bow = 0.12): { path: string; glyph: { x: number; y: number }; mid: { x: number; y: number }; tip: { x: number; y: number }; control: { x: number; y: number } } {
  const acx = a.x + a.w / 2;
  const acy = a.y + a.h / 2;
  const bcx = b.x + b.w / 2;
  const bcy = b.y + b.h / 2;
  const len = Math.hypot(bcx - acx, bcy - acy) || 1;
  // normal to the left of a→b
  const nx = (bcy - acy) / len;
  const ny = -(bcx - acx) / len;
  const off = Math.min(60, len * bow);
  const mx = (acx + bcx) / 2 + nx * off;
  const my = (acy + bcy) / 2 + ny * off;
  const s = boxExit(a, mx, my);
  const t = boxExit(b, mx, my);
  // quadratic control so that the curve passes through (mx, my) at its middle
  const qx = 2 * mx - (s.x + t.x) / 2;
  const qy = 2 * my - (s.y + t.y) / 2;
  const at = (u: number) => ({ x: (1 - u) * (1 - u) * s.x + 2 * (1 - u) * u * qx + u * u * t.x, y: (1 - u) * (1 - u) * s.y + 2 * (1 - u) * u * qy + u * u * t.y });
  // the sign sits a fixed distance back from the head, so it never lands on the target's outline
  const chord = Math.hypot(t.x - s.x, t.y - s.y) || 1;
  const g = at(Math.max(0.5, 1 - 30 / chord));
  return { path: `M${s.x},${s.y} Q${qx},${qy} ${t.x},${t.y}`, glyph: { x: g.x + nx * 11, y: g.y + ny * 11 }, mid: at(0.5), tip: t, control: { x: qx, y: qy } };
}

/** Whether two boxes come closer than `gap` to each other. */
export function boxesClash(a: Box, b: Box, gap = 0): boolean {
  return a.x < b.x + b.w + gap && b.x < a.x + a.w + gap && a.y < b.y + b.h + gap && b.y < a.y + a.h + gap;
}

/**
 * Where a new box of size w × h goes: at `want` (its top-left corner) if that
 * keeps `gap` clear of every box in `taken`, otherwise at the nearest such
 * place on square rings of a `step` grid around `want` (nearest first within
 * a ring). After `rings` rings without room it gives `want` back: a crowded
 * canvas still gets the item where it was asked for.
 */
export function freeSpot(taken: readonly Box[], want: { x: number; y: number }, w: number, h: number, gap = 16, step = 24, rings = 40): { x: number; y: number } {
  const free = (x: number, y: number) => !taken.some((b) => boxesClash({ x, y, w, h }, b, gap));
  if (free(want.x, want.y)) return { x: want.x, y: want.y };
  for (let r = 1; r <= rings; r++) {
    const ring: { x: number; y: number; d: number }[] = [];
    for (let i = -r; i <= r; i++) {
      for (const [dx, dy] of [[i, -r], [i, r], [-r, i], [r, i]] as const) {
        if (Math.abs(dy) !== r && Math.abs(dx) !== r) continue;
        ring.push({ x: want.x + dx * step, y: want.y + dy * step, d: Math.hypot(dx, dy) });
      }
    }
    ring.sort((a, b) => a.d - b.d || a.y - b.y || a.x - b.x);
    for (const c of ring) if (free(c.x, c.y)) return { x: c.x, y: c.y };
  }
  return { x: want.x, y: want.y };
}

/**
 * An arrowhead drawn as a path (not an SVG marker: every marker instance is
 * drawn under a transform of its own, one more piece for the browser to sort
 * per link): a triangle with its tip at `tip`, pointing away from `from`
 * (a point the line comes from, e.g. the curve's last control point),
 * `length` long and `half` wide on each side.
 */
export function headPath(tip: { x: number; y: number }, from: { x: number; y: number }, length: number, half: number): string {
  const dx = tip.x - from.x;
  const dy = tip.y - from.y;
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len;
  const uy = dy / len;
  const bx = tip.x - ux * length;
  const by = tip.y - uy * length;
  const r = (v: number) => Math.round(v * 100) / 100;
  return `M${r(bx - uy * half)},${r(by + ux * half)} L${r(tip.x)},${r(tip.y)} L${r(bx + uy * half)},${r(by - ux * half)} Z`;
}
