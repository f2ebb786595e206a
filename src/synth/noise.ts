/**
 * Value noise: random values on a square lattice, interpolated with a smoothstep so the
 * field is C1. A lattice is drawn once; it can be evaluated at single points (cheap,
 * for per-sample fields) or accumulated over a whole raster (row by row, with the
 * column weights precomputed so the inner loop is a handful of multiply-adds).
 */
import type { Random } from '../util/random.ts';

export interface Lattice {
  /** Node values in [-1, 1], row-major, cols × rows. */
  values: Float32Array;
  cols: number;
  rows: number;
  /** Node spacing, px. */
  cell: number;
  /** Offset of the lattice origin, px (random, so lattices of different scales do not align). */
  ox: number;
  oy: number;
}

/** A lattice covering a width × height px raster with nodes every `cell` px. */
export function makeLattice(rng: Random, width: number, height: number, cell: number): Lattice {
  const cols = Math.ceil(width / cell) + 3;
  const rows = Math.ceil(height / cell) + 3;
  const values = new Float32Array(cols * rows);
  for (let k = 0; k < values.length; k++) values[k] = rng.next() * 2 - 1;
  return { values, cols, rows, cell, ox: rng.next() * cell, oy: rng.next() * cell };
}

function smooth(t: number): number {
  return t * t * (3 - 2 * t);
}

/** Noise value at image point (x, y) px, in [-1, 1]. */
export function latticeAt(l: Lattice, x: number, y: number): number {
  let fx = (x + l.ox) / l.cell;
  let fy = (y + l.oy) / l.cell;
  if (fx < 0) fx = 0;
  if (fy < 0) fy = 0;
  let i0 = Math.floor(fx);
  let j0 = Math.floor(fy);
  if (i0 > l.cols - 2) i0 = l.cols - 2;
  if (j0 > l.rows - 2) j0 = l.rows - 2;
  const tx = smooth(Math.min(1, fx - i0));
  const ty = smooth(Math.min(1, fy - j0));
  const v = l.values;
  const r0 = j0 * l.cols + i0;
  const r1 = r0 + l.cols;
  const top = v[r0] + (v[r0 + 1] - v[r0]) * tx;
  const bot = v[r1] + (v[r1 + 1] - v[r1]) * tx;
  return top + (bot - top) * ty;
}

/** out[p] += amplitude × noise at the centre of pixel p, over a width × height raster. */
export function addLattice(out: Float32Array, width: number, height: number, l: Lattice, amplitude: number): void {
  const colIndex = new Int32Array(width);
  const colWeight = new Float32Array(width);
  for (let i = 0; i < width; i++) {
    const fx = (i + 0.5 + l.ox) / l.cell;
    const i0 = Math.floor(fx);
    colIndex[i] = i0;
    colWeight[i] = smooth(fx - i0);
  }
  const v = l.values;
  for (let j = 0; j < height; j++) {
    const fy = (j + 0.5 + l.oy) / l.cell;
    const j0 = Math.floor(fy);
    const ty = smooth(fy - j0);
    const r0 = j0 * l.cols;
    const r1 = r0 + l.cols;
    const row = j * width;
    for (let i = 0; i < width; i++) {
      const c = colIndex[i];
      const tx = colWeight[i];
      const a = v[r0 + c];
      const top = a + (v[r0 + c + 1] - a) * tx;
      const b = v[r1 + c];
      const bot = b + (v[r1 + c + 1] - b) * tx;
      out[row + i] += amplitude * (top + (bot - top) * ty);
    }
  }
}

/**
 * A smooth 1-D signal along arc length s (px): a sum of three sinusoids with random
 * wavelengths in [minWavelength, maxWavelength] px and phases, normalised to [-1, 1].
 */
export interface Wave {
  k: Float64Array;
  phase: Float64Array;
  amp: Float64Array;
}

export function makeWave(rng: Random, minWavelength: number, maxWavelength: number): Wave {
  const k = new Float64Array(3);
  const phase = new Float64Array(3);
  const amp = new Float64Array(3);
  let sum = 0;
  for (let m = 0; m < 3; m++) {
    k[m] = (2 * Math.PI) / rng.range(minWavelength, maxWavelength);
    phase[m] = rng.range(0, 2 * Math.PI);
    amp[m] = rng.range(0.5, 1);
    sum += amp[m];
  }
  for (let m = 0; m < 3; m++) amp[m] /= sum;
  return { k, phase, amp };
}

export function waveAt(w: Wave, s: number): number {
  return w.amp[0] * Math.sin(w.k[0] * s + w.phase[0]) +
    w.amp[1] * Math.sin(w.k[1] * s + w.phase[1]) +
    w.amp[2] * Math.sin(w.k[2] * s + w.phase[2]);
}
