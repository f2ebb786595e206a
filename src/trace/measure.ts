/**
 * The last step of a solve: the pen's width and centre measured on the photo itself.
 * The optimised path follows the ink evidence, whose map from darkness to probability
 * saturates and blurs, so its edges sit a little in or out depending on the ink's
 * strength. Here each inked sample's cross-section of the image band is read (averaged
 * with its neighbours along the stroke against noise), and the two edges are put where
 * the profile crosses half-way between the local ink level and the local ground: the
 * full width at half maximum (FWHM, common practice for measuring the width of a line in
 * an image; for a straight edge blurred by any symmetric point-spread function the
 * half-level crossing is the edge). The radius becomes half that width and the sample
 * moves to the midpoint of the two edges.
 *
 * Samples in restored spans, at anchors (held exactly) and where the profile is too
 * faint or not a single dip keep what the solver found.
 */
import { sampleBilinear, type GrayImage } from '../image/gray.ts';
import type { SampleSpan, StrokeSample } from './types.ts';

export interface MeasureOptions {
  /** 'dark' ink on a lighter ground (default) or 'light' ink on a darker ground. */
  polarity?: 'dark' | 'light';
  /** Samples averaged on each side along the stroke. Default 4. */
  window?: number;
  /** Least ink contrast (ground − ink, image units 0..1) worth measuring. Default 0.03. */
  minContrast?: number;
  /** Largest change of radius or centre accepted from the measurement, px. Default 2. */
  maxChange?: number;
  /** Sample indices held exactly (the anchors). */
  fixed?: readonly number[];
  /** Sample indices whose radius is pinned (kept; the centre may still be measured). */
  pinned?: readonly number[];
}

/** Profile half-length beyond the pen, px, and the profile's step, px. */
const REACH = 6;
const STEP = 0.25;
/** Ground is read beyond the pen edge plus this margin, px. */
const GROUND_GAP = 2.5;

/** Most steps in a profile (±31.75 px): a pen of radius above about 27 px keeps its solved width (no ground in reach). */
const MAX_STEPS = 255;
/** Reused buffers, one profile long. */
const profile = new Float64Array(MAX_STEPS);
const ground = new Float64Array(MAX_STEPS);

/**
 * Measures width and centre of `samples` in place (see the module comment). Returns the
 * number of samples measured.
 */
export function measureOnImage(image: GrayImage, samples: StrokeSample[], restored: readonly SampleSpan[], options: MeasureOptions = {}): number {
  const n = samples.length;
  if (n < 3) return 0;
  const sign = options.polarity === 'light' ? -1 : 1;
  const win = options.window ?? 4;
  const minContrast = options.minContrast ?? 0.03;
  const maxChange = options.maxChange ?? 2;
  const skip = new Uint8Array(n);
  const inRestored = new Uint8Array(n);
  for (const s of restored) for (let i = Math.max(0, s.from); i <= Math.min(n - 1, s.to); i++) inRestored[i] = 1;
  for (const i of options.fixed ?? []) if (i >= 0 && i < n) skip[i] = 1;
  const pinned = new Uint8Array(n);
  for (const i of options.pinned ?? []) if (i >= 0 && i < n) pinned[i] = 1;

  // Tangents from the solved line (±2 samples), and the measured radius and offset.
  const tx = new Float64Array(n);
  const ty = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - 2);
    const b = Math.min(n - 1, i + 2);
    const dx = samples[b].x - samples[a].x;
    const dy = samples[b].y - samples[a].y;
    const l = Math.hypot(dx, dy) || 1;
    tx[i] = dx / l;
    ty[i] = dy / l;
  }
  const newR = new Float64Array(n).fill(NaN);
  const shift = new Float64Array(n);

  for (let i = 0; i < n; i++) {
    if (inRestored[i] || skip[i]) continue;
    const r0 = samples[i].r;
    const half = r0 + REACH;
    const m = Math.min(MAX_STEPS, Math.round((2 * half) / STEP) | 1);
    const c = (m - 1) >> 1;
    profile.fill(0, 0, m);
    let count = 0;
    for (let k = Math.max(0, i - win); k <= Math.min(n - 1, i + win); k++) {
      if (inRestored[k]) continue;
      const nx = -ty[k];
      const ny = tx[k];
      const sx = samples[k].x;
      const sy = samples[k].y;
      for (let j = 0; j < m; j++) {
        const t = (j - c) * STEP;
        profile[j] += sign * sampleBilinear(image, sx + nx * t, sy + ny * t);
      }
      count++;
    }
    for (let j = 0; j < m; j++) profile[j] /= count;

    // Ground: the median beyond the pen; ink: the lowest value near the centre line.
    let g = 0;
    for (let j = 0; j < m; j++) if (Math.abs((j - c) * STEP) >= r0 + GROUND_GAP) ground[g++] = profile[j];
    if (g < 6) continue;
    const gs = ground.subarray(0, g).sort();
    const level = gs[g >> 1];
    const core = Math.max(0.75, r0 - 0.75);
    let ink = Infinity;
    let jc = c;
    for (let j = 0; j < m; j++) {
      if (Math.abs((j - c) * STEP) <= core && profile[j] < ink) {
        ink = profile[j];
        jc = j;
      }
    }
    if (!(level - ink > minContrast)) continue;
    const mid = (level + ink) / 2;
    let jm = -1;
    let jp = -1;
    for (let j = jc; j > 0; j--) {
      if (profile[j - 1] >= mid && profile[j] < mid) {
        jm = j - 1;
        break;
      }
    }
    for (let j = jc; j < m - 1; j++) {
      if (profile[j + 1] >= mid && profile[j] < mid) {
        jp = j;
        break;
      }
    }
    if (jm < 0 || jp < 0) continue;
    const em = (jm + (profile[jm] - mid) / (profile[jm] - profile[jm + 1]) - c) * STEP;
    const ep = (jp + (mid - profile[jp]) / (profile[jp + 1] - profile[jp]) - c) * STEP;
    const r = (ep - em) / 2;
    const off = (ep + em) / 2;
    if (!(r > 0.3 && Math.abs(r - r0) <= maxChange && Math.abs(off) <= maxChange)) continue;
    newR[i] = r;
    shift[i] = off;
  }

  let measured = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(newR[i])) continue;
    const s = samples[i];
    if (!pinned[i]) s.r = newR[i];
    s.x += -ty[i] * shift[i];
    s.y += tx[i] * shift[i];
    measured++;
  }
  return measured;
}
