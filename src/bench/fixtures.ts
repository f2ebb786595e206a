/**
 * Benchmark inputs: long single strokes of known length on a textured, noisy ground,
 * so that solve times can be measured per stroke length. Synthetic, seeded.
 */
import { createGray, type GrayImage } from '../image/gray.ts';
import { createRandom } from '../util/random.ts';
import type { Point } from '../trace/types.ts';

export interface LongStroke {
  image: GrayImage;
  start: Point;
  end: Point;
  /** Arc length of the centreline, px. */
  length: number;
}

/**
 * A wavy stroke of about `length` px of arc, pen radius 2–4 px, fading to 40 % and
 * with one 20 px abrasion gap, on a `size`² image with noise σ = 0.03.
 */
export function longStroke(length: number, size: number, seed: number): LongStroke {
  const rnd = createRandom(seed);
  const data = new Float32Array(size * size);
  for (let i = 0; i < data.length; i++) data[i] = 0.78 + 0.03 * rnd.normal();
  // A curve that winds along a diagonal: x = t·L·cos45 + amplitude · sin.
  const amp = 12 + rnd.next() * 8;
  const waves = Math.max(1, Math.round(length / 150));
  const pts: { x: number; y: number; r: number; c: number }[] = [];
  const chord = length * 0.92;
  const cx = size / 2 - (chord / 2) * Math.SQRT1_2;
  const cy = size / 2 - (chord / 2) * Math.SQRT1_2;
  let arc = 0;
  const steps = Math.ceil(length * 4);
  let px = 0;
  let py = 0;
  const gapAt = 0.55;
  for (let i = 0; i <= steps; i++) {
    const t = i / steps;
    const along = t * chord;
    const across = amp * Math.sin(2 * Math.PI * waves * t);
    const x = cx + along * Math.SQRT1_2 - across * Math.SQRT1_2;
    const y = cy + along * Math.SQRT1_2 + across * Math.SQRT1_2;
    if (i > 0) arc += Math.hypot(x - px, y - py);
    px = x;
    py = y;
    pts.push({ x, y, r: 3 + Math.sin(5 * t + seed), c: 1 - 0.6 * Math.sin(Math.PI * t) ** 2 });
  }
  const total = arc;
  arc = 0;
  for (let i = 0; i < pts.length; i++) {
    if (i > 0) arc += Math.hypot(pts[i].x - pts[i - 1].x, pts[i].y - pts[i - 1].y);
    if (Math.abs(arc - gapAt * total) < 10) continue;
    const p = pts[i];
    const R = Math.ceil(p.r + 1);
    for (let y = Math.floor(p.y) - R; y <= Math.floor(p.y) + R; y++) {
      for (let x = Math.floor(p.x) - R; x <= Math.floor(p.x) + R; x++) {
        if (x < 0 || y < 0 || x >= size || y >= size) continue;
        const cov = Math.min(1, Math.max(0, p.r - Math.hypot(x + 0.5 - p.x, y + 0.5 - p.y) + 0.5));
        const v = 0.78 * (1 - 0.6 * p.c * cov);
        if (v < data[y * size + x]) data[y * size + x] = v;
      }
    }
  }
  return {
    image: createGray(size, size, data),
    start: { x: pts[0].x, y: pts[0].y },
    end: { x: pts[pts.length - 1].x, y: pts[pts.length - 1].y },
    length: total,
  };
}
