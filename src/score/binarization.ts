/**
 * Binarization figures of a rendered facsimile against a ground-truth ink mask, as the
 * document binarization contests (DIBCO) report them. Masks are Uint8Array, width × height,
 * row-major; any non-zero value is foreground (ink).
 *
 * - F-measure: precision P = TP / (TP + FP), recall R = TP / (TP + FN) of the foreground
 *   pixels, F = 2PR / (P + R) × 100.
 * - DRD, distance-reciprocal distortion (Lu, Kot & Shi 2004, "Distance-reciprocal
 *   distortion measure for binary document images", IEEE Signal Processing Letters 11(2)):
 *   each flipped pixel k (result ≠ truth) costs DRD_k = Σ over its 5 × 5 neighbourhood of
 *   |truth(i, j) − result(k)| × W(i, j), with W the reciprocal distance to the centre
 *   (0 at the centre), normalised to sum 1; DRD = Σ DRD_k / NUBN, NUBN the number of 8 × 8
 *   blocks of the truth that are not all ink or all background. Here neighbours outside the
 *   image add nothing, and the partial blocks at the right and bottom edges count as blocks.
 */

/** Side of the DRD neighbourhood and of the NUBN blocks. */
export const DRD_SIZE = 5;
export const DRD_BLOCK = 8;

/** The 5 × 5 normalised weight matrix of DRD, row-major (centre 0, sum 1). */
export const DRD_WEIGHTS: Float64Array = (() => {
  const w = new Float64Array(DRD_SIZE * DRD_SIZE);
  const c = (DRD_SIZE - 1) / 2;
  let sum = 0;
  for (let i = 0; i < DRD_SIZE; i++) {
    for (let j = 0; j < DRD_SIZE; j++) {
      const d = Math.hypot(i - c, j - c);
      const v = d === 0 ? 0 : 1 / d;
      w[i * DRD_SIZE + j] = v;
      sum += v;
    }
  }
  for (let k = 0; k < w.length; k++) w[k] /= sum;
  return w;
})();

export interface FMeasure {
  /** Share of result ink that is true ink, 0..1. */
  precision: number;
  /** Share of true ink the result finds, 0..1. */
  recall: number;
  /** 2PR / (P + R) × 100; 0 when either is 0. */
  f: number;
  tp: number;
  fp: number;
  fn: number;
}

function checkSizes(result: Uint8Array, truth: Uint8Array, width?: number, height?: number): void {
  if (result.length !== truth.length) throw new RangeError(`result and truth masks differ in size: ${result.length} and ${truth.length} pixels.`);
  if (width !== undefined && height !== undefined && width * height !== truth.length) {
    throw new RangeError(`the masks hold ${truth.length} pixels, not ${width} × ${height}.`);
  }
}

/** F-measure of a result mask against the truth (DIBCO). */
export function fMeasure(result: Uint8Array, truth: Uint8Array): FMeasure {
  checkSizes(result, truth);
  let tp = 0, fp = 0, fn = 0;
  for (let p = 0; p < truth.length; p++) {
    const r = result[p] !== 0, t = truth[p] !== 0;
    if (r && t) tp++;
    else if (r) fp++;
    else if (t) fn++;
  }
  const precision = tp + fp > 0 ? tp / (tp + fp) : 0;
  const recall = tp + fn > 0 ? tp / (tp + fn) : 0;
  const f = precision + recall > 0 ? (200 * precision * recall) / (precision + recall) : 0;
  return { precision, recall, f, tp, fp, fn };
}

/** Number of 8 × 8 blocks of the truth holding both ink and background. */
export function nonUniformBlocks(truth: Uint8Array, width: number, height: number): number {
  let count = 0;
  for (let by = 0; by < height; by += DRD_BLOCK) {
    for (let bx = 0; bx < width; bx += DRD_BLOCK) {
      let ink = 0, all = 0;
      for (let y = by; y < Math.min(height, by + DRD_BLOCK); y++) {
        for (let x = bx; x < Math.min(width, bx + DRD_BLOCK); x++) {
          if (truth[y * width + x] !== 0) ink++;
          all++;
        }
      }
      if (ink > 0 && ink < all) count++;
    }
  }
  return count;
}

/**
 * DRD of a result mask against the truth (Lu, Kot & Shi 2004). A truth with no
 * non-uniform block (all ink or all background) gives 0 for a perfect result and
 * Infinity otherwise.
 */
export function drd(result: Uint8Array, truth: Uint8Array, width: number, height: number): number {
  checkSizes(result, truth, width, height);
  const c = (DRD_SIZE - 1) / 2;
  let total = 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const p = y * width + x;
      const r = result[p] !== 0 ? 1 : 0;
      if (r === (truth[p] !== 0 ? 1 : 0)) continue;
      let d = 0;
      for (let i = 0; i < DRD_SIZE; i++) {
        const yy = y + i - c;
        if (yy < 0 || yy >= height) continue;
        for (let j = 0; j < DRD_SIZE; j++) {
          const xx = x + j - c;
          if (xx < 0 || xx >= width) continue;
          const t = truth[yy * width + xx] !== 0 ? 1 : 0;
          if (t !== r) d += DRD_WEIGHTS[i * DRD_SIZE + j];
        }
      }
      total += d;
    }
  }
  const nubn = nonUniformBlocks(truth, width, height);
  if (nubn === 0) return total === 0 ? 0 : Infinity;
  return total / nubn;
}

/** A mask of the pixels whose coverage is at least `threshold` (default 0.5). */
export function binarize(coverage: ArrayLike<number>, threshold = 0.5, out = new Uint8Array(coverage.length)): Uint8Array {
  for (let p = 0; p < coverage.length; p++) out[p] = coverage[p] >= threshold ? 1 : 0;
  return out;
}
