/**
 * The clay surface: a texture field (multi-scale value noise, fine grain and mineral
 * inclusions) and the illumination shading of the photograph.
 */
import type { Random } from '../util/random.ts';
import { addLattice, makeLattice } from './noise.ts';

/** Texture octaves: lattice spacing in mm and weight (coarse mottling down to grain). */
const OCTAVES: ReadonlyArray<readonly [number, number]> = [
  [30, 0.45], [10, 0.35], [3.5, 0.3], [1.2, 0.3], [0.4, 0.28],
];

/**
 * Zero-mean texture of the surface, roughly in [-1, 1] (standard deviation ≈ 0.3):
 * how much brighter or darker than its mean tone each pixel of clay is.
 * Lattice spacings follow the physical grain (`pxPerMm`), never finer than 1.5 px.
 */
export function surfaceTexture(width: number, height: number, pxPerMm: number, rng: Random): Float32Array {
  const out = new Float32Array(width * height);
  for (const [mm, weight] of OCTAVES) {
    addLattice(out, width, height, makeLattice(rng, width, height, Math.max(1.5, mm * pxPerMm)), weight);
  }
  // Per-pixel grain: cheaper as a 1.2 px lattice than a filtered white noise.
  addLattice(out, width, height, makeLattice(rng, width, height, 1.2), 0.25);
  addInclusions(out, width, height, pxPerMm, rng);
  return out;
}

/** Small bright grits and dark pores, ~1 per 6 mm², radius 0.05–0.2 mm (≥ 0.7 px). */
function addInclusions(out: Float32Array, width: number, height: number, pxPerMm: number, rng: Random): void {
  const count = Math.round((width * height) / (6 * pxPerMm * pxPerMm));
  for (let m = 0; m < count; m++) {
    const x = rng.range(0, width);
    const y = rng.range(0, height);
    const r = Math.max(0.7, rng.range(0.05, 0.2) * pxPerMm);
    const amp = rng.next() < 0.6 ? rng.range(0.3, 0.8) : -rng.range(0.3, 0.9);
    const i0 = Math.max(0, Math.floor(x - r - 1));
    const i1 = Math.min(width - 1, Math.floor(x + r + 1));
    const j0 = Math.max(0, Math.floor(y - r - 1));
    const j1 = Math.min(height - 1, Math.floor(y + r + 1));
    for (let j = j0; j <= j1; j++) {
      const dy = j + 0.5 - y;
      for (let i = i0; i <= i1; i++) {
        const dx = i + 0.5 - x;
        const a = r + 0.5 - Math.sqrt(dx * dx + dy * dy);
        if (a > 0) out[j * width + i] += amp * (a > 1 ? 1 : a);
      }
    }
  }
}

/**
 * Multiplicative illumination, 1 = even light: a tilted gradient (light from one side),
 * darker corners and a broad uneven glow, all scaled by `strength` (0 = flat).
 * At strength 1 values stay within about [0.6, 1.25].
 */
export function illumination(width: number, height: number, strength: number, rng: Random): Float32Array {
  const out = new Float32Array(width * height);
  if (strength <= 0) {
    out.fill(1);
    return out;
  }
  const angle = rng.range(0, 2 * Math.PI);
  const gx = Math.cos(angle) * 0.15;
  const gy = Math.sin(angle) * 0.15;
  const glow = makeLattice(rng, width, height, Math.max(width, height) / 2.5);
  // The glow goes in first, unscaled, then the analytic part is added row by row.
  addLattice(out, width, height, glow, 0.1);
  const cx = width / 2 + rng.range(-0.15, 0.15) * width;
  const cy = height / 2 + rng.range(-0.15, 0.15) * height;
  const ix = 2 / width;
  const iy = 2 / height;
  for (let j = 0; j < height; j++) {
    const v = (j + 0.5 - cy) * iy;
    const row = j * width;
    for (let i = 0; i < width; i++) {
      const u = (i + 0.5 - cx) * ix;
      const shade = gx * u + gy * v - 0.08 * (u * u + v * v) + out[row + i];
      out[row + i] = 1 + strength * shade;
    }
  }
  return out;
}
