/**
 * A single-band image with float samples, row-major. Values are in [0, 1] unless a
 * function says otherwise. The sample data[j * width + i] belongs to the pixel whose
 * centre is at (i + 0.5, j + 0.5) in image coordinates (x right, y down), as in SVG
 * and canvas.
 */
export interface GrayImage {
  readonly width: number;
  readonly height: number;
  readonly data: Float32Array;
}

export function createGray(width: number, height: number, data?: Float32Array): GrayImage {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width <= 0 || height <= 0) {
    throw new RangeError(`image size must be positive integers, got ${width}×${height}`);
  }
  const d = data ?? new Float32Array(width * height);
  if (d.length !== width * height) {
    throw new RangeError(`image data has ${d.length} samples, expected ${width * height}`);
  }
  return { width, height, data: d };
}

/**
 * Bilinear sample at image coordinates (x, y) with the pixel-centre convention above;
 * outside the image the nearest edge sample is used.
 */
export function sampleBilinear(img: GrayImage, x: number, y: number): number {
  const w = img.width;
  const h = img.height;
  let fx = x - 0.5;
  let fy = y - 0.5;
  if (fx < 0) fx = 0;
  else if (fx > w - 1) fx = w - 1;
  if (fy < 0) fy = 0;
  else if (fy > h - 1) fy = h - 1;
  const i0 = fx | 0;
  const j0 = fy | 0;
  const i1 = i0 + 1 < w ? i0 + 1 : i0;
  const j1 = j0 + 1 < h ? j0 + 1 : j0;
  const ax = fx - i0;
  const ay = fy - j0;
  const d = img.data;
  const r0 = j0 * w;
  const r1 = j1 * w;
  const top = d[r0 + i0] + (d[r0 + i1] - d[r0 + i0]) * ax;
  const bot = d[r1 + i0] + (d[r1 + i1] - d[r1 + i0]) * ax;
  return top + (bot - top) * ay;
}
