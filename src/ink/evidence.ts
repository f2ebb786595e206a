/**
 * Ink evidence: a per-pixel map in [0, 1] of how strongly a pixel looks like ink.
 *
 * 1. A light Gaussian smoothing against sensor noise.
 * 2. The background (the bare surface without ink) is estimated at large scale by a
 *    grey-level closing on a downsampled copy (dilation then erosion, a common
 *    background estimate for dark writing on a lighter ground), then smoothed.
 * 3. The ink signal is the relative darkening against that background,
 *    (B − I) / B, which removes multiplicative shading.
 * 4. A white top-hat (the signal minus its morphological opening by a square wider than
 *    the widest pen) keeps thin strokes and drops broad blotches, so that a stain
 *    darker than the ink neither passes for ink nor dims the ink beside it.
 * 5. Local contrast is normalised by the local ink strength (a smoothed local maximum
 *    of the signal), so that faded ink reaches about 1 at the centre of its stroke
 *    like well-preserved ink; a floor tied to the noise level keeps bare surface low.
 */
import { createGray, type GrayImage } from '../image/gray.ts';
import { downsample, gaussianBlur, rankFilter, upsample } from '../image/filters.ts';

export type InkEvidence = GrayImage;

export interface InkOptions {
  /** 'dark' ink on a lighter ground (default) or 'light' ink on a darker ground. */
  polarity?: 'dark' | 'light';
  /** Noise smoothing, Gaussian σ in px. Default 1. */
  smoothing?: number;
  /** Largest ink half-width the background estimate must bridge, px. Default 12. */
  backgroundRadius?: number;
  /** Half-width of the widest ink line the top-hat keeps, px. Default 7. */
  maxInkRadius?: number;
  /** Radius over which local ink strength is measured, px. Default 16. */
  contrastRadius?: number;
  /** Floor of the local strength in multiples of the noise σ. Default 5. */
  noiseFloor?: number;
  /** Absolute floor of the local strength (relative darkening). Default 0.06. */
  minStrength?: number;
  /** Share of the local strength that maps to evidence 1. Default 0.85. */
  saturation?: number;
}

export const DEFAULT_INK_OPTIONS: Required<InkOptions> = {
  polarity: 'dark',
  smoothing: 1,
  backgroundRadius: 12,
  maxInkRadius: 7,
  contrastRadius: 16,
  noiseFloor: 5,
  minStrength: 0.06,
  saturation: 0.85,
};

/** Block size of the coarse grid used for the large-scale estimates, px. */
const COARSE = 4;

export function inkEvidence(image: GrayImage, options: InkOptions = {}): InkEvidence {
  const o = { ...DEFAULT_INK_OPTIONS, ...options };
  const { width: w, height: h } = image;
  const n = w * h;
  const src = new Float32Array(n);
  if (o.polarity === 'light') for (let p = 0; p < n; p++) src[p] = 1 - image.data[p];
  else src.set(image.data);
  const smooth = gaussianBlur(createGray(w, h, src), o.smoothing, src);

  // Background: closing on the coarse grid (dilation bridges the ink, erosion restores
  // the extent of bright areas), then smoothing.
  const coarse = downsample(smooth, COARSE, 'mean');
  const rb = Math.max(1, Math.ceil(o.backgroundRadius / COARSE));
  const closed = rankFilter(rankFilter(coarse, rb, 'max'), rb, 'min');
  const bgCoarse = gaussianBlur(closed, rb);
  const bg = upsample(bgCoarse, COARSE, w, h);

  // Relative darkening; stored in place of the background buffer.
  const signal = bg.data;
  for (let p = 0; p < n; p++) {
    const b = signal[p] > 0.02 ? signal[p] : 0.02;
    signal[p] = (b - smooth.data[p]) / b;
  }
  // Top-hat: remove what an opening wider than any pen keeps (blotches, broad shading).
  const ri = Math.max(1, Math.round(o.maxInkRadius));
  const opened = rankFilter(rankFilter(createGray(w, h, signal), ri, 'min'), ri, 'max');
  for (let p = 0; p < n; p++) signal[p] -= opened.data[p];
  const sigmaNoise = robustSigma(signal);

  // Local ink strength: max of the signal over contrastRadius, smoothed.
  const sig = createGray(w, h, signal);
  const strengthCoarse = downsample(sig, COARSE, 'max');
  const rc = Math.max(1, Math.ceil(o.contrastRadius / COARSE));
  const strength = upsample(gaussianBlur(rankFilter(strengthCoarse, rc, 'max'), rc / 2), COARSE, w, h, smooth.data);

  const floor = Math.max(o.minStrength, o.noiseFloor * sigmaNoise);
  const out = new Float32Array(n);
  const sat = o.saturation;
  for (let p = 0; p < n; p++) {
    const s = signal[p];
    if (s <= 0) continue;
    const m = strength.data[p] > floor ? strength.data[p] : floor;
    const e = s / (sat * m);
    out[p] = e >= 1 ? 1 : e;
  }
  return createGray(w, h, out);
}

/**
 * Noise σ of the signal from the median absolute deviation of its horizontal
 * differences (MAD × 1.4826 / √2: robust scale estimate, common practice), computed on
 * a subsample so it stays cheap on large images.
 */
function robustSigma(signal: Float32Array): number {
  const step = Math.max(1, Math.floor(signal.length / 50_000));
  const diffs = new Float32Array(Math.floor((signal.length - 1) / step));
  for (let i = 0, p = 0; i < diffs.length; i++, p += step) diffs[i] = Math.abs(signal[p + 1] - signal[p]);
  diffs.sort();
  const mad = diffs[diffs.length >> 1] ?? 0;
  return (mad * 1.4826) / Math.SQRT2;
}
