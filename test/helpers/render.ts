/**
 * Tiny renderers for solver unit tests: a pen stroke drawn as the union of disks along
 * a centreline with analytic anti-aliasing, on a flat ground.
 */
import { createGray, type GrayImage } from '../../src/image/gray.ts';

export interface PenPoint {
  x: number;
  y: number;
  r: number;
}

/** Samples a centreline function at `step` px of parameter. */
export function sampleCurve(f: (t: number) => PenPoint, steps: number): PenPoint[] {
  const out: PenPoint[] = [];
  for (let i = 0; i <= steps; i++) out.push(f(i / steps));
  return out;
}

/** Ink coverage of the union of pen disks, clamp(r − d + 0.5, 0, 1), as evidence. */
export function renderCoverage(width: number, height: number, strokes: PenPoint[][]): GrayImage {
  const data = new Float32Array(width * height);
  for (const s of strokes) {
    for (const p of s) {
      const R = Math.ceil(p.r + 1);
      for (let y = Math.max(0, Math.floor(p.y) - R); y <= Math.min(height - 1, Math.floor(p.y) + R); y++) {
        for (let x = Math.max(0, Math.floor(p.x) - R); x <= Math.min(width - 1, Math.floor(p.x) + R); x++) {
          const d = Math.hypot(x + 0.5 - p.x, y + 0.5 - p.y);
          const c = Math.min(1, Math.max(0, p.r - d + 0.5));
          if (c > data[y * width + x]) data[y * width + x] = c;
        }
      }
    }
  }
  return createGray(width, height, data);
}

/** Distance from (x, y) to the polyline through `pts`, px. */
export function distToPolyline(pts: readonly { x: number; y: number }[], x: number, y: number): number {
  let best = Infinity;
  for (let i = 1; i < pts.length; i++) {
    const a = pts[i - 1];
    const b = pts[i];
    const vx = b.x - a.x;
    const vy = b.y - a.y;
    const t = Math.max(0, Math.min(1, ((x - a.x) * vx + (y - a.y) * vy) / (vx * vx + vy * vy || 1)));
    best = Math.min(best, Math.hypot(a.x + t * vx - x, a.y + t * vy - y));
  }
  return best;
}
