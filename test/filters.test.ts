/**
 * Image operations on tiny literal grids, and the fast rank filter against the
 * definition (a brute-force max/min over each square window).
 */
import { describe, expect, it } from 'vitest';
import { createGray, sampleBilinear } from '../src/image/gray.ts';
import { downsample, gaussianBlur, gaussianKernel, rankFilter } from '../src/image/filters.ts';
import { createRandom } from '../src/util/random.ts';

function bruteRank(data: Float32Array, w: number, h: number, r: number, isMax: boolean): Float32Array {
  const out = new Float32Array(w * h);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let m = isMax ? -Infinity : Infinity;
      for (let j = Math.max(0, y - r); j <= Math.min(h - 1, y + r); j++) {
        for (let i = Math.max(0, x - r); i <= Math.min(w - 1, x + r); i++) {
          const v = data[j * w + i];
          m = isMax ? Math.max(m, v) : Math.min(m, v);
        }
      }
      out[y * w + x] = m;
    }
  }
  return out;
}

describe('image filters', () => {
  it('rankFilter equals the brute-force window max and min for several radii and sizes', () => {
    const rnd = createRandom(11);
    for (const [w, h, r] of [[7, 5, 1], [13, 9, 2], [20, 17, 4], [5, 30, 3], [9, 9, 6]] as const) {
      const data = new Float32Array(w * h).map(() => rnd.next());
      const img = createGray(w, h, data);
      expect(Array.from(rankFilter(img, r, 'max').data)).toEqual(Array.from(bruteRank(data, w, h, r, true)));
      expect(Array.from(rankFilter(img, r, 'min').data)).toEqual(Array.from(bruteRank(data, w, h, r, false)));
    }
  });

  it('gaussianKernel sums to 1 and is symmetric; blur keeps a constant image constant', () => {
    const k = gaussianKernel(1.3);
    expect(k.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 6);
    for (let i = 0; i < k.length; i++) expect(k[i]).toBeCloseTo(k[k.length - 1 - i], 7);
    const flat = gaussianBlur(createGray(6, 4, new Float32Array(24).fill(0.4)), 2);
    for (const v of flat.data) expect(v).toBeCloseTo(0.4, 6);
  });

  it('downsample by 2: block means and maxima of a 4×2 grid', () => {
    const img = createGray(4, 2, Float32Array.from([0, 1, 2, 3, 4, 5, 6, 7]));
    expect(Array.from(downsample(img, 2, 'mean').data)).toEqual([2.5, 4.5]);
    expect(Array.from(downsample(img, 2, 'max').data)).toEqual([5, 7]);
  });

  it('sampleBilinear: pixel centres at i + 0.5 give the samples, midpoints the means', () => {
    const img = createGray(2, 2, Float32Array.from([0, 1, 2, 3]));
    expect(sampleBilinear(img, 0.5, 0.5)).toBe(0);
    expect(sampleBilinear(img, 1.5, 1.5)).toBe(3);
    expect(sampleBilinear(img, 1, 0.5)).toBe(0.5);
    expect(sampleBilinear(img, 1, 1)).toBe(1.5);
    expect(sampleBilinear(img, -3, 0.5)).toBe(0); // clamped at the edge
  });
});
