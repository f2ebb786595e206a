/**
 * Ink rasterising: every stroke is the union of its pen disks, one per truth sample, with
 * analytic anti-aliasing coverage(q) = clamp(r − |q − c| + 0.5, 0, 1), the maximum over
 * samples. An abrasion gap erases the ink across the whole width of the stroke between
 * two cuts square to the stroke at the gap's first and last sample: gap samples are left
 * out of the visible layer, and the disks of the visible samples next to a gap are
 * clipped at the cuts (anti-aliased), so the bare stretch is exactly the gap's span.
 * The full layer keeps all ink.
 */
import type { TruthStroke } from './types.ts';

export interface InkLayers {
  /** Coverage 0..1 of visible ink, row-major. */
  cover: Float32Array;
  /** Contrast of the sample that gave each pixel its coverage (0 where there is no ink). */
  contrast: Float32Array;
  /** Coverage 0..1 of all ink, gaps included. */
  fullCover: Float32Array;
}

/**
 * Stamp one disk into `score`, which holds r − distance (so coverage = score + 0.5,
 * clamped); where the disk raises the score, its contrast is written too.
 */
/** The erased slab of one gap: cut points A, B and the stroke's unit tangents there. */
interface Slab {
  ax: number; ay: number; atx: number; aty: number;
  bx: number; by: number; btx: number; bty: number;
}

function stampDisk(
  score: Float32Array, contrast: Float32Array | null, width: number, height: number,
  x: number, y: number, r: number, c: number, slabs: readonly Slab[] = [],
): void {
  const reach = r + 0.5;
  let i0 = Math.floor(x - reach);
  let i1 = Math.floor(x + reach);
  let j0 = Math.floor(y - reach);
  let j1 = Math.floor(y + reach);
  if (i0 < 0) i0 = 0;
  if (j0 < 0) j0 = 0;
  if (i1 > width - 1) i1 = width - 1;
  if (j1 > height - 1) j1 = height - 1;
  for (let j = j0; j <= j1; j++) {
    const dy = j + 0.5 - y;
    const row = j * width;
    for (let i = i0; i <= i1; i++) {
      const dx = i + 0.5 - x;
      let s = r - Math.sqrt(dx * dx + dy * dy);
      for (const g of slabs) {
        // Depth into the slab between the two cuts; the score is capped at −depth.
        const qx = i + 0.5;
        const qy = j + 0.5;
        const depth = Math.min((qx - g.ax) * g.atx + (qy - g.ay) * g.aty, (g.bx - qx) * g.btx + (g.by - qy) * g.bty);
        if (-depth < s) s = -depth;
      }
      const p = row + i;
      if (s > -0.5 && s > score[p]) {
        score[p] = s;
        if (contrast) contrast[p] = c;
      }
    }
  }
}

function scoreToCoverage(score: Float32Array): void {
  for (let p = 0; p < score.length; p++) {
    const v = score[p] + 0.5;
    score[p] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
}

export function renderInk(width: number, height: number, strokes: readonly TruthStroke[]): InkLayers {
  const n = width * height;
  const cover = new Float32Array(n).fill(-1);
  const fullCover = new Float32Array(n).fill(-1);
  const contrast = new Float32Array(n);
  for (const stroke of strokes) {
    const { samples, gaps } = stroke;
    const slabs = gaps.map((gap) => slabOf(samples, gap.from, gap.to));
    for (let k = 0; k < samples.length; k++) {
      const s = samples[k];
      stampDisk(fullCover, null, width, height, s.x, s.y, s.r, s.contrast);
      if (gaps.some((gap) => gap.from <= k && k <= gap.to)) continue;
      // Only the slabs this disk can reach (samples are 0.5 px apart).
      const near = slabs.filter((_, gi) => {
        const reach = Math.ceil((2 * s.r + 2) / 0.5);
        return k >= gaps[gi].from - reach && k <= gaps[gi].to + reach;
      });
      stampDisk(cover, contrast, width, height, s.x, s.y, s.r, s.contrast, near);
    }
  }
  scoreToCoverage(cover);
  scoreToCoverage(fullCover);
  return { cover, contrast, fullCover };
}

function slabOf(samples: readonly { x: number; y: number }[], from: number, to: number): Slab {
  const tangent = (k: number): [number, number] => {
    const a = samples[Math.max(0, k - 1)];
    const b = samples[Math.min(samples.length - 1, k + 1)];
    const l = Math.hypot(b.x - a.x, b.y - a.y) || 1;
    return [(b.x - a.x) / l, (b.y - a.y) / l];
  };
  const [atx, aty] = tangent(from);
  const [btx, bty] = tangent(to);
  return { ax: samples[from].x, ay: samples[from].y, atx, aty, bx: samples[to].x, by: samples[to].y, btx, bty };
}
