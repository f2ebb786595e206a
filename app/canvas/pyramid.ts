/**
 * An image as a pyramid of downsampled copies (full, 1/2, 1/4, …), so that drawing a
 * large photo zoomed out reads a small copy, and drawing it zoomed in reads only the part
 * on screen. Each level is a canvas made once.
 */
export interface PyramidLevel {
  source: CanvasImageSource;
  /** Level px per image px: 1, 1/2, 1/4, … */
  scale: number;
  width: number;
  height: number;
}

export interface Pyramid {
  /** Size of the image, px. */
  width: number;
  height: number;
  levels: PyramidLevel[];
}

/** Levels are made down to this size of the longer side, px. */
const SMALLEST = 256;

function canvasOf(w: number, h: number): HTMLCanvasElement {
  const c = document.createElement('canvas');
  c.width = w;
  c.height = h;
  return c;
}

export function buildPyramid(source: CanvasImageSource, width: number, height: number): Pyramid {
  const levels: PyramidLevel[] = [{ source, scale: 1, width, height }];
  let prev = levels[0];
  while (Math.max(prev.width, prev.height) > SMALLEST) {
    const w = Math.max(1, Math.round(prev.width / 2));
    const h = Math.max(1, Math.round(prev.height / 2));
    const c = canvasOf(w, h);
    const ctx = c.getContext('2d');
    if (!ctx) break;
    ctx.imageSmoothingEnabled = true;
    ctx.imageSmoothingQuality = 'high';
    ctx.drawImage(prev.source, 0, 0, prev.width, prev.height, 0, 0, w, h);
    prev = { source: c, scale: prev.scale / 2, width: w, height: h };
    levels.push(prev);
  }
  const pyramid = { width, height, levels };
  void settle(pyramid);
  return pyramid;
}

/**
 * Swaps each canvas level for an ImageBitmap once made: a bitmap never changes, so the
 * browser draws from it without taking a snapshot of a canvas first (which showed in the
 * frame time of a 24 MP surface).
 */
async function settle(p: Pyramid): Promise<void> {
  for (const l of p.levels) {
    if (!(l.source instanceof HTMLCanvasElement)) continue;
    try {
      const bitmap = await createImageBitmap(l.source);
      const canvas = l.source;
      l.source = bitmap;
      // The canvas's pixels are no longer needed.
      canvas.width = canvas.height = 0;
    } catch {
      // Drawing from the canvas works as well, if a little slower.
    }
  }
}

/** The coarsest level that still has at least one level px per device px at this zoom. */
export function pickLevel(p: Pyramid, devicePxPerImagePx: number): PyramidLevel {
  let best = p.levels[0];
  for (const l of p.levels) if (l.scale >= devicePxPerImagePx) best = l;
  return best;
}

/**
 * Draws the part of the image inside `rect` (image px [x0, y0, x1, y1]) into a context
 * whose transform maps image px to the screen; `devicePxPerImagePx` picks the level.
 */
export function drawPyramid(ctx: CanvasRenderingContext2D, p: Pyramid, rect: [number, number, number, number], devicePxPerImagePx: number): void {
  const x0 = Math.max(0, Math.floor(rect[0]));
  const y0 = Math.max(0, Math.floor(rect[1]));
  const x1 = Math.min(p.width, Math.ceil(rect[2]));
  const y1 = Math.min(p.height, Math.ceil(rect[3]));
  if (x1 <= x0 || y1 <= y0) return;
  const l = pickLevel(p, devicePxPerImagePx);
  const k = l.scale;
  // Whole level px, so the copy lines up with the image's pixel grid at every level.
  const sx = Math.floor(x0 * k);
  const sy = Math.floor(y0 * k);
  const sw = Math.min(l.width, Math.ceil(x1 * k)) - sx;
  const sh = Math.min(l.height, Math.ceil(y1 * k)) - sy;
  if (sw <= 0 || sh <= 0) return;
  ctx.drawImage(l.source, sx, sy, sw, sh, sx / k, sy / k, sw / k, sh / k);
}

/** The ink evidence (0..255 per px) as an amber layer whose alpha is the evidence. */
export function evidenceCanvas(width: number, height: number, data: Uint8ClampedArray, rgb: [number, number, number]): HTMLCanvasElement {
  const c = canvasOf(width, height);
  const ctx = c.getContext('2d');
  if (!ctx) return c;
  const img = ctx.createImageData(width, height);
  const px = new Uint32Array(img.data.buffer);
  // RGBA bytes little-endian as one word per pixel: one store per pixel.
  const base = rgb[0] | (rgb[1] << 8) | (rgb[2] << 16);
  for (let i = 0; i < data.length; i++) px[i] = (base | (data[i] << 24)) >>> 0;
  ctx.putImageData(img, 0, 0);
  return c;
}
