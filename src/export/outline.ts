/**
 * The pen outline of a stroke: the region the pen disks cover along it, as closed rings
 * (flat x, y, x, y, … in px, counter-clockwise in image coordinates) whose nonzero fill is
 * the union of the pen disks and of the hulls between consecutive disks.
 *
 * FIRST VERSION (correct, not compact): one circumscribed polygon per disk and one hull
 * quad per step. To be replaced by the traced boundary.
 */
export interface PenSample {
  x: number;
  y: number;
  r: number;
}

/** A closed ring, flat [x0, y0, x1, y1, …]; the closing edge is implied. */
export type Ring = number[];

/** Largest distance the polygon of a disk may lie beyond the circle, px. */
export const OUTLINE_TOLERANCE = 0.1;

function diskRing(s: PenSample): Ring {
  // Circumscribed n-gon: its edges touch the circle, its corners lie r/cos(π/n) out.
  let n = 8;
  while (s.r * (1 / Math.cos(Math.PI / n) - 1) > OUTLINE_TOLERANCE) n *= 2;
  const R = s.r / Math.cos(Math.PI / n);
  const out: Ring = [];
  for (let k = 0; k < n; k++) {
    const a = (2 * Math.PI * k) / n;
    out.push(s.x + R * Math.cos(a), s.y + R * Math.sin(a));
  }
  return out;
}

/** Outline of samples from..to (inclusive) of a stroke. */
export function penOutline(samples: readonly PenSample[], from = 0, to = samples.length - 1): Ring[] {
  const rings: Ring[] = [];
  for (let i = from; i <= to; i++) {
    rings.push(diskRing(samples[i]));
    if (i === to) continue;
    const a = samples[i];
    const b = samples[i + 1];
    const d = Math.hypot(b.x - a.x, b.y - a.y);
    if (d <= Math.abs(b.r - a.r)) continue; // one disk holds the other
    // Outer tangents of the two circles.
    const ux = (b.x - a.x) / d, uy = (b.y - a.y) / d;
    const c = (a.r - b.r) / d;
    const h = Math.sqrt(Math.max(0, 1 - c * c));
    const n1x = c * ux - h * uy, n1y = c * uy + h * ux;
    const n2x = c * ux + h * uy, n2y = c * uy - h * ux;
    rings.push([
      a.x + a.r * n2x, a.y + a.r * n2y,
      b.x + b.r * n2x, b.y + b.r * n2y,
      b.x + b.r * n1x, b.y + b.r * n1y,
      a.x + a.r * n1x, a.y + a.r * n1y,
    ]);
  }
  return rings;
}
