/**
 * Width and centre measured on the image (src/trace/measure.ts) against the analytic
 * profile of a bar: a bar of half-width h blurred by a Gaussian of σ has the cross-section
 * p(t) = ½[erf((t + h)/(σ√2)) − erf((t − h)/(σ√2))] (the convolution of a box with a
 * Gaussian, common practice), so its full width at half maximum is the t where
 * p(t) = p(0)/2 — h itself when h ≫ σ, a little more for a thin bar. erf is from
 * Abramowitz & Stegun 7.1.26 (error below 1.5e-7).
 */
import { describe, expect, it } from 'vitest';
import { createGray, type GrayImage } from '../src/image/gray.ts';
import { measureOnImage } from '../src/trace/measure.ts';
import type { StrokeSample } from '../src/trace/types.ts';

const W = 120;
const H = 60;

function erf(x: number): number {
  // Abramowitz & Stegun 7.1.26.
  const s = Math.sign(x);
  const a = Math.abs(x);
  const t = 1 / (1 + 0.3275911 * a);
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-a * a);
  return s * y;
}

const profile = (t: number, h: number, sigma: number) => 0.5 * (erf((t + h) / (sigma * Math.SQRT2)) - erf((t - h) / (sigma * Math.SQRT2)));

/** Half of the full width at half maximum of the blurred bar, by bisection on p(t) = p(0)/2. */
function halfFwhm(h: number, sigma: number): number {
  const target = profile(0, h, sigma) / 2;
  let lo = 0, hi = h + 6 * sigma;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (profile(mid, h, sigma) > target) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** A horizontal bar centred on y = cy: the blurred profile sampled at pixel centres (y + 0.5). */
function bar(cy: number, h: number, ink: number, ground: number, sigma: number): GrayImage {
  const data = new Float32Array(W * H);
  for (let y = 0; y < H; y++) {
    const v = ground + (ink - ground) * profile(y + 0.5 - cy, h, sigma);
    for (let x = 0; x < W; x++) data[y * W + x] = v;
  }
  return createGray(W, H, data);
}

function line(y: number, r: number): StrokeSample[] {
  const out: StrokeSample[] = [];
  for (let x = 20; x <= 100; x++) out.push({ x, y, r, support: 1 });
  return out;
}

describe('measureOnImage', () => {
  it('finds the half width at half depth and the centre of a blurred bar, from a guess 0.6 px off and 0.8 px too wide', () => {
    for (const [h, sigma] of [[2.35, 0.6], [2.35, 1.2], [4, 1], [1.5, 0.8]]) {
      const s = line(30.9, h + 0.8);
      const n = measureOnImage(bar(30.3, h, 0.25, 0.8, sigma), s, []);
      expect(n).toBe(s.length);
      const want = halfFwhm(h, sigma);
      for (const p of s.slice(5, -5)) {
        expect(Math.abs(p.r - want)).toBeLessThan(0.03);
        expect(Math.abs(p.y - 30.3)).toBeLessThan(0.03);
      }
      if (sigma <= 0.6) expect(Math.abs(want - h)).toBeLessThan(0.01); // a wide bar: its true half-width
    }
  });

  it('is the same for faint ink and for light ink on a dark ground', () => {
    // The bar's centre (y = 30) falls between two pixel centres (29.5, 30.5), the worst
    // case for reading its depth: the image holds p(±0.5), not p(0), so the half level sits
    // a little high and the width comes out up to 0.07 px narrow for this thin bar.
    const want = halfFwhm(1.8, 1);
    const dark = line(30, 2);
    measureOnImage(bar(30, 1.8, 0.25, 0.8, 1), dark, []);
    expect(Math.abs(dark[40].r - want)).toBeLessThan(0.08);
    const faint = line(30, 2);
    measureOnImage(bar(30, 1.8, 0.7, 0.8, 1), faint, []);
    const light = line(30, 2);
    measureOnImage(bar(30, 1.8, 0.9, 0.2, 1), light, [], { polarity: 'light' });
    // The measurement does not depend on the ink's strength or polarity.
    expect(faint[40].r).toBeCloseTo(dark[40].r, 6);
    expect(light[40].r).toBeCloseTo(dark[40].r, 6);
  });

  it('keeps restored spans, anchors and pinned radii, and too faint ink, as the solver found them', () => {
    const img = bar(30.3, 2.35, 0.25, 0.8, 1);
    const s = line(30.9, 3.15);
    const before = structuredClone(s);
    measureOnImage(img, s, [{ from: 30, to: 40 }], { fixed: [0, s.length - 1], pinned: [50] });
    expect(s.slice(30, 41)).toEqual(before.slice(30, 41));
    expect(s[0]).toEqual(before[0]);
    expect(s[s.length - 1]).toEqual(before[before.length - 1]);
    expect(s[50].r).toBe(3.15); // pinned: the radius stays, the centre is measured
    expect(Math.abs(s[50].y - 30.3)).toBeLessThan(0.03);
    const flat = line(30, 2);
    expect(measureOnImage(bar(30, 2, 0.79, 0.8, 1), flat, [])).toBe(0);
  });
});
