/** Canvas drawing of the demo: the photo scaled to fit, and optionally the true centrelines. */
import type { InscriptionTruth } from '../src/synth/types.ts';

/** Colour of the ground-truth overlay (the ink evidence amber of the palette). */
export const TRUTH_COLOUR = '#e0a030';

/** Scale that fits an image of w×h into a box of bw×bh without cropping or enlarging past 4×. */
export function fitScale(w: number, h: number, bw: number, bh: number): number {
  if (w <= 0 || h <= 0 || bw <= 0 || bh <= 0) return 1;
  return Math.min(bw / w, bh / h, 4);
}

/**
 * Draws the image at `scale` css px per image px into the canvas, whose backing store is
 * sized for the device pixel ratio so the photo stays sharp on dense screens.
 */
export function drawDemo(
  canvas: HTMLCanvasElement, image: HTMLImageElement, truth: InscriptionTruth | undefined,
  scale: number, showTruth: boolean,
): void {
  const dpr = window.devicePixelRatio || 1;
  const cssW = Math.max(1, Math.round(image.naturalWidth * scale));
  const cssH = Math.max(1, Math.round(image.naturalHeight * scale));
  canvas.style.width = `${cssW}px`;
  canvas.style.height = `${cssH}px`;
  canvas.width = Math.round(cssW * dpr);
  canvas.height = Math.round(cssH * dpr);
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  const k = scale * dpr;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.imageSmoothingQuality = 'high';
  ctx.drawImage(image, 0, 0, canvas.width, canvas.height);
  if (!showTruth || !truth) return;
  ctx.setTransform(k, 0, 0, k, 0, 0);
  ctx.strokeStyle = TRUTH_COLOUR;
  // 1.5 css px whatever the zoom, so thin strokes stay readable at any fit.
  ctx.lineWidth = 1.5 / scale;
  ctx.lineCap = 'round';
  ctx.lineJoin = 'round';
  for (const stroke of truth.strokes) {
    const s = stroke.samples;
    if (s.length < 2) continue;
    ctx.beginPath();
    ctx.moveTo(s[0].x, s[0].y);
    for (let i = 1; i < s.length; i++) ctx.lineTo(s[i].x, s[i].y);
    ctx.stroke();
  }
}
