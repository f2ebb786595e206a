/**
 * Small image operations on flat Float32 buffers: Gaussian blur, block downsampling,
 * separable max/min filters and bilinear upsampling. Each takes an optional output
 * buffer so that callers on hot paths can reuse memory.
 */
import { createGray, type GrayImage } from './gray.ts';

/** A normalised 1-D Gaussian kernel of standard deviation `sigma` px, radius ceil(3σ). */
export function gaussianKernel(sigma: number): Float32Array {
  const radius = Math.max(1, Math.ceil(3 * sigma));
  const k = new Float32Array(2 * radius + 1);
  let sum = 0;
  for (let i = -radius; i <= radius; i++) {
    const v = Math.exp((-i * i) / (2 * sigma * sigma));
    k[i + radius] = v;
    sum += v;
  }
  for (let i = 0; i < k.length; i++) k[i] /= sum;
  return k;
}

/**
 * Separable Gaussian blur with edge clamping.
 * @param sigma standard deviation in px; ≤ 0 copies the image.
 */
export function gaussianBlur(img: GrayImage, sigma: number, out?: Float32Array): GrayImage {
  const { width: w, height: h, data } = img;
  const dst = out ?? new Float32Array(w * h);
  if (sigma <= 0) {
    dst.set(data);
    return createGray(w, h, dst);
  }
  const k = gaussianKernel(sigma);
  const r = (k.length - 1) >> 1;
  const tmp = new Float32Array(w * h);
  const line = new Float32Array(Math.max(w, h) + 2 * r);
  for (let y = 0; y < h; y++) {
    const row = y * w;
    for (let i = 0; i < w + 2 * r; i++) {
      const x = i - r < 0 ? 0 : i - r >= w ? w - 1 : i - r;
      line[i] = data[row + x];
    }
    const kl = k.length;
    for (let x = 0; x < w; x++) {
      let s = 0;
      for (let t = 0; t < kl; t++) s += k[t] * line[x + t];
      tmp[row + x] = s;
    }
  }
  // Vertical pass row by row (streams through memory instead of striding columns).
  dst.fill(0);
  for (let y = 0; y < h; y++) {
    const row = y * w;
    for (let t = 0; t < k.length; t++) {
      let sy = y + t - r;
      if (sy < 0) sy = 0;
      else if (sy >= h) sy = h - 1;
      const kt = k[t];
      const src = sy * w;
      for (let x = 0; x < w; x++) dst[row + x] += kt * tmp[src + x];
    }
  }
  return createGray(w, h, dst);
}

/** How a block of pixels is reduced to one. */
export type BlockReduce = 'mean' | 'max';

/** Downsamples by an integer factor; partial blocks at the edges are reduced too. */
export function downsample(img: GrayImage, factor: number, reduce: BlockReduce = 'mean'): GrayImage {
  const { width: w, height: h, data } = img;
  const cw = Math.ceil(w / factor);
  const ch = Math.ceil(h / factor);
  const out = new Float32Array(cw * ch);
  const count = new Float32Array(cw);
  for (let cy = 0; cy < ch; cy++) {
    const y0 = cy * factor;
    const y1 = Math.min(h, y0 + factor);
    const orow = cy * cw;
    if (reduce === 'max') out.fill(-Infinity, orow, orow + cw);
    else count.fill(0);
    for (let y = y0; y < y1; y++) {
      const row = y * w;
      for (let x = 0; x < w; x++) {
        const cx = (x / factor) | 0;
        const v = data[row + x];
        if (reduce === 'max') {
          if (v > out[orow + cx]) out[orow + cx] = v;
        } else {
          out[orow + cx] += v;
          count[cx] += 1;
        }
      }
    }
    if (reduce === 'mean') for (let cx = 0; cx < cw; cx++) out[orow + cx] /= count[cx];
  }
  return createGray(cw, ch, out);
}

/**
 * Separable square max (dilation) or min (erosion) filter of the given radius in px,
 * with the van Herk / Gil–Werman algorithm: about three comparisons per pixel and pass
 * whatever the radius (van Herk 1992; Gil & Werman 1993). Edges behave as if the image
 * were padded with the neutral value.
 */
export function rankFilter(img: GrayImage, radius: number, kind: 'max' | 'min', out?: Float32Array): GrayImage {
  const { width: w, height: h, data } = img;
  const tmp = new Float32Array(w * h);
  const dst = out ?? new Float32Array(w * h);
  const r = Math.max(0, Math.round(radius));
  const line = new Float32Array(Math.max(w, h));
  const res = new Float32Array(Math.max(w, h));
  const scratch = new Float32Array(2 * (Math.max(w, h) + 2 * r + 2 * r + 2));
  for (let y = 0; y < h; y++) {
    line.set(data.subarray(y * w, y * w + w));
    rank1d(line, w, r, kind === 'max', res, scratch);
    tmp.set(res.subarray(0, w), y * w);
  }
  for (let x = 0; x < w; x++) {
    for (let y = 0; y < h; y++) line[y] = tmp[y * w + x];
    rank1d(line, h, r, kind === 'max', res, scratch);
    for (let y = 0; y < h; y++) dst[y * w + x] = res[y];
  }
  return createGray(w, h, dst);
}

/** 1-D running max/min over windows [i − r, i + r] (van Herk / Gil–Werman). */
function rank1d(src: Float32Array, n: number, r: number, isMax: boolean, out: Float32Array, scratch: Float32Array): void {
  if (r === 0) {
    out.set(src.subarray(0, n));
    return;
  }
  const k = 2 * r + 1;
  const neutral = isMax ? -Infinity : Infinity;
  // Padded input p[j] = src[j − r]; blocks of length k.
  const len = Math.ceil((n + 2 * r) / k) * k;
  const g = scratch.subarray(0, len);
  const hh = scratch.subarray(len, 2 * len);
  for (let j = 0; j < len; j++) {
    const i = j - r;
    const v = i >= 0 && i < n ? src[i] : neutral;
    if (j % k === 0) g[j] = v;
    else g[j] = isMax ? (v > g[j - 1] ? v : g[j - 1]) : v < g[j - 1] ? v : g[j - 1];
  }
  for (let j = len - 1; j >= 0; j--) {
    const i = j - r;
    const v = i >= 0 && i < n ? src[i] : neutral;
    if (j % k === k - 1 || j === len - 1) hh[j] = v;
    else hh[j] = isMax ? (v > hh[j + 1] ? v : hh[j + 1]) : v < hh[j + 1] ? v : hh[j + 1];
  }
  // Window of output i covers padded [i, i + 2r]: max(h[i], g[i + 2r]).
  for (let i = 0; i < n; i++) {
    const a = hh[i];
    const b = g[i + 2 * r];
    out[i] = isMax ? (a > b ? a : b) : a < b ? a : b;
  }
}

/**
 * Bilinear upsampling of a coarse image made by `downsample(…, factor)` back to
 * width × height, aligning block centres with the pixels they summarise.
 */
export function upsample(coarse: GrayImage, factor: number, width: number, height: number, out?: Float32Array): GrayImage {
  const dst = out ?? new Float32Array(width * height);
  const cw = coarse.width;
  const ch = coarse.height;
  const c = coarse.data;
  const xi0 = new Int32Array(width);
  const xi1 = new Int32Array(width);
  const xa = new Float32Array(width);
  for (let x = 0; x < width; x++) {
    let fx = (x + 0.5) / factor - 0.5;
    if (fx < 0) fx = 0;
    if (fx > cw - 1) fx = cw - 1;
    const i0 = fx | 0;
    xi0[x] = i0;
    xi1[x] = Math.min(cw - 1, i0 + 1);
    xa[x] = fx - i0;
  }
  for (let y = 0; y < height; y++) {
    let fy = (y + 0.5) / factor - 0.5;
    if (fy < 0) fy = 0;
    if (fy > ch - 1) fy = ch - 1;
    const j0 = fy | 0;
    const j1 = Math.min(ch - 1, j0 + 1);
    const ay = fy - j0;
    const r0 = j0 * cw;
    const r1 = j1 * cw;
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const a = xa[x];
      const top = c[r0 + xi0[x]] + (c[r0 + xi1[x]] - c[r0 + xi0[x]]) * a;
      const bot = c[r1 + xi0[x]] + (c[r1 + xi1[x]] - c[r1 + xi0[x]]) * a;
      dst[row + x] = top + (bot - top) * ay;
    }
  }
  return createGray(width, height, dst);
}
