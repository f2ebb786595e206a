/**
 * JPEG-like block artefacts: each 8×8 block goes through a DCT, its coefficients are
 * quantised with the luminance table of the JPEG standard (ITU-T T.81, Annex K) scaled
 * for a quality, and it is transformed back; samples are then rounded to 8 bits.
 */

/** Annex K luminance quantisation table, in row-major (not zigzag) order. */
const LUMA_TABLE = [
  16, 11, 10, 16, 24, 40, 51, 61,
  12, 12, 14, 19, 26, 58, 60, 55,
  14, 13, 16, 24, 40, 57, 69, 56,
  14, 17, 22, 29, 51, 87, 80, 62,
  18, 22, 37, 56, 68, 109, 103, 77,
  24, 35, 55, 64, 81, 104, 113, 92,
  49, 64, 78, 87, 103, 121, 120, 101,
  72, 92, 95, 98, 112, 100, 103, 99,
];

/** cos((2x + 1) u π / 16) × c(u) / 2, indexed [u * 8 + x]: the orthonormal 8-point DCT. */
const BASIS = (() => {
  const b = new Float64Array(64);
  for (let u = 0; u < 8; u++) {
    const cu = u === 0 ? Math.SQRT1_2 : 1;
    for (let x = 0; x < 8; x++) b[u * 8 + x] = 0.5 * cu * Math.cos(((2 * x + 1) * u * Math.PI) / 16);
  }
  return b;
})();

const BASIS_T = (() => {
  const t = new Float64Array(64);
  for (let u = 0; u < 8; u++) for (let x = 0; x < 8; x++) t[x * 8 + u] = BASIS[u * 8 + x];
  return t;
})();

/** Quality 1..100 of an encoder for a strength: 0 → 100 (off), 1 → 15. */
export function blockQuality(strength: number): number {
  return Math.max(3, Math.round(100 - 85 * strength));
}

/**
 * Apply block artefacts in place to a width × height image with values in 0..1.
 * `strength` 0 leaves it untouched; 1 is about quality 15.
 */
export function applyBlockiness(data: Float32Array, width: number, height: number, strength: number): void {
  if (strength <= 0) return;
  const quality = blockQuality(strength);
  // The usual quality scaling of the reference encoder.
  const scale = quality < 50 ? 5000 / quality : 200 - 2 * quality;
  const q = new Float64Array(64);
  for (let k = 0; k < 64; k++) q[k] = Math.min(255, Math.max(1, Math.floor((LUMA_TABLE[k] * scale + 50) / 100)));
  const block = new Float64Array(64);
  const tmp = new Float64Array(64);
  for (let by = 0; by < height; by += 8) {
    for (let bx = 0; bx < width; bx += 8) {
      // Load with edge replication so partial blocks at the borders behave like an encoder's padding.
      for (let y = 0; y < 8; y++) {
        const sy = Math.min(height - 1, by + y) * width;
        for (let x = 0; x < 8; x++) block[y * 8 + x] = data[sy + Math.min(width - 1, bx + x)] * 255 - 128;
      }
      transform2(block, tmp, BASIS);
      for (let k = 0; k < 64; k++) block[k] = Math.round(block[k] / q[k]) * q[k];
      transform2(block, tmp, BASIS_T);
      for (let y = 0; y < 8 && by + y < height; y++) {
        const row = (by + y) * width;
        for (let x = 0; x < 8 && bx + x < width; x++) {
          const v = Math.round(block[y * 8 + x] + 128);
          data[row + bx + x] = (v < 0 ? 0 : v > 255 ? 255 : v) / 255;
        }
      }
    }
  }
}

/**
 * Separable 2-D transform of an 8×8 block in place: block ← M · block · Mᵀ with M the DCT
 * basis (forward) or its transpose (inverse); `tmp` is scratch. The 8-term sums are
 * written out because this runs once per 8×8 block of every band.
 */
function transform2(block: Float64Array, tmp: Float64Array, m: Float64Array): void {
  for (let y = 0; y < 64; y += 8) {
    const b0 = block[y], b1 = block[y + 1], b2 = block[y + 2], b3 = block[y + 3];
    const b4 = block[y + 4], b5 = block[y + 5], b6 = block[y + 6], b7 = block[y + 7];
    for (let u = 0; u < 64; u += 8) {
      tmp[y + (u >> 3)] = m[u] * b0 + m[u + 1] * b1 + m[u + 2] * b2 + m[u + 3] * b3 +
        m[u + 4] * b4 + m[u + 5] * b5 + m[u + 6] * b6 + m[u + 7] * b7;
    }
  }
  for (let x = 0; x < 8; x++) {
    const t0 = tmp[x], t1 = tmp[8 + x], t2 = tmp[16 + x], t3 = tmp[24 + x];
    const t4 = tmp[32 + x], t5 = tmp[40 + x], t6 = tmp[48 + x], t7 = tmp[56 + x];
    for (let v = 0; v < 64; v += 8) {
      block[v + x] = m[v] * t0 + m[v + 1] * t1 + m[v + 2] * t2 + m[v + 3] * t3 +
        m[v + 4] * t4 + m[v + 5] * t5 + m[v + 6] * t6 + m[v + 7] * t7;
    }
  }
}
