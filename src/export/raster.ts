/**
 * A scanline polygon rasteriser: rings filled under the nonzero winding rule, with
 * anti-aliased coverage 0..1 per pixel. Each pixel row is sampled on SUB_ROWS scanlines
 * (at y = row + (k + ½)/SUB_ROWS); along each scanline the covered spans are added with
 * their exact horizontal overlap of every pixel. Pixel (i, j) covers [i, i+1) × [j, j+1)
 * of the ring coordinates. Flat typed arrays throughout, allocated once per call.
 */
import type { Ring } from './outline.ts';

/** Scanlines per pixel row. */
export const SUB_ROWS = 8;

export interface RasterOptions {
  /** Multiplier from ring units to pixels (e.g. px per mm). Default 1. */
  scale?: number;
  /** Offset added after scaling, px. Default 0. */
  dx?: number;
  dy?: number;
  /** Coverage buffer to add into (w × h, row-major); default a new one. Values may exceed 1 and are clamped at the end. */
  out?: Float32Array;
}

/**
 * Coverage of the nonzero fill of `rings` on a `width` × `height` grid; the result is
 * clamped to [0, 1] (the union of what was already in `out` and the rings).
 */
export function rasterizeRings(rings: readonly Ring[], width: number, height: number, options: RasterOptions = {}): Float32Array {
  const k = options.scale ?? 1, dx = options.dx ?? 0, dy = options.dy ?? 0;
  const cover = options.out ?? new Float32Array(width * height);
  let ne = 0;
  for (const r of rings) ne += r.length >> 1;
  // Edges as x0, y0, x1, y1 with y0 < y1, and their direction (+1 down, −1 up).
  const ex0 = new Float64Array(ne), ey0 = new Float64Array(ne), ex1 = new Float64Array(ne), ey1 = new Float64Array(ne);
  const edir = new Int8Array(ne);
  let m = 0;
  for (const r of rings) {
    const n = r.length >> 1;
    if (n < 3) continue;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      const xa = r[2 * j] * k + dx, ya = r[2 * j + 1] * k + dy, xb = r[2 * i] * k + dx, yb = r[2 * i + 1] * k + dy;
      if (ya === yb) continue;
      if (ya < yb) { ex0[m] = xa; ey0[m] = ya; ex1[m] = xb; ey1[m] = yb; edir[m] = 1; }
      else { ex0[m] = xb; ey0[m] = yb; ex1[m] = xa; ey1[m] = ya; edir[m] = -1; }
      m++;
    }
  }
  // Edges in order of their top.
  const order = new Uint32Array(m);
  for (let i = 0; i < m; i++) order[i] = i;
  order.sort((a, b) => ey0[a] - ey0[b]);
  const active = new Uint32Array(m);
  let na = 0;
  let next = 0;
  const xs = new Float64Array(m);
  const ws = new Int8Array(m);
  const row = new Float64Array(width + 2);
  const diff = new Float64Array(width + 2);
  const w1 = 1 / SUB_ROWS;
  for (let j = 0; j < height; j++) {
    let touched = false;
    for (let s = 0; s < SUB_ROWS; s++) {
      const y = j + (s + 0.5) * w1;
      while (next < m && ey0[order[next]] <= y) active[na++] = order[next++];
      // Drop finished edges and gather the crossings of this scanline.
      let nc = 0;
      for (let a = 0; a < na; a++) {
        const e = active[a];
        if (ey1[e] <= y) { active[a--] = active[--na]; continue; }
        if (ey0[e] > y) continue;
        const x = ex0[e] + ((y - ey0[e]) * (ex1[e] - ex0[e])) / (ey1[e] - ey0[e]);
        // Insertion into the sorted crossings (few per scanline).
        let p = nc++;
        while (p > 0 && xs[p - 1] > x) { xs[p] = xs[p - 1]; ws[p] = ws[p - 1]; p--; }
        xs[p] = x; ws[p] = edir[e];
      }
      if (nc === 0) continue;
      let wind = 0;
      for (let c = 0; c < nc - 1; c++) {
        wind += ws[c];
        if (wind === 0) continue;
        let a = xs[c], b = xs[c + 1];
        if (b <= 0 || a >= width) continue;
        if (a < 0) a = 0;
        if (b > width) b = width;
        if (b <= a) continue;
        touched = true;
        const ia = Math.floor(a), ib = Math.floor(b);
        if (ia === ib) {
          row[ia] += (b - a) * w1;
        } else {
          row[ia] += (ia + 1 - a) * w1;
          diff[ia + 1] += w1;
          diff[ib] -= w1;
          if (ib < width) row[ib] += (b - ib) * w1;
        }
      }
    }
    if (!touched) continue;
    let run = 0;
    const base = j * width;
    for (let i = 0; i < width; i++) {
      run += diff[i];
      const v = cover[base + i] + row[i] + run;
      cover[base + i] = v > 1 ? 1 : v;
      row[i] = 0;
      diff[i] = 0;
    }
    row[width] = 0; diff[width] = 0; row[width + 1] = 0; diff[width + 1] = 0;
  }
  return cover;
}

/**
 * Rings of a dashed line of `width` along closed rings: one rectangle per dash piece of
 * each edge (the dash pattern runs on along the ring, starting with a dash), all turned
 * the same way so that their nonzero fill is their union.
 */
export function dashRings(rings: readonly Ring[], width: number, dash: number, gap: number): Ring[] {
  const out: Ring[] = [];
  const hw = width / 2;
  const period = dash + gap;
  for (const r of rings) {
    const n = r.length >> 1;
    let phase = 0; // distance along the pattern
    for (let i = 0; i < n; i++) {
      const j = (i + 1) % n;
      const x0 = r[2 * i], y0 = r[2 * i + 1], x1 = r[2 * j], y1 = r[2 * j + 1];
      const len = Math.hypot(x1 - x0, y1 - y0);
      if (len === 0) continue;
      const ux = (x1 - x0) / len, uy = (y1 - y0) / len;
      let t = 0;
      while (t < len) {
        const inDash = phase < dash;
        const left = inDash ? dash - phase : period - phase;
        const step = Math.min(left, len - t);
        if (inDash && step > 0) {
          const ax = x0 + ux * t, ay = y0 + uy * t, bx = ax + ux * step, by = ay + uy * step;
          // Turned like the pen outlines (positive shoelace area).
          out.push([ax + uy * hw, ay - ux * hw, bx + uy * hw, by - ux * hw, bx - uy * hw, by + ux * hw, ax - uy * hw, ay + ux * hw]);
        }
        t += step;
        phase += step;
        if (phase >= period - 1e-12) phase = 0;
      }
    }
  }
  return out;
}
