/**
 * The drawn shapes of a stroke, in image px, made once per stroke object (strokes are
 * immutable: a change makes a new object, so a WeakMap keyed by it never goes stale) and
 * per level of detail: zoomed out, every 2nd, 4th, … sample is used, so that a screen full
 * of strokes costs about the same to draw at any zoom.
 *
 * The inked body is the union of the pen disks along the samples: each disk and the quad
 * of the two outer tangents between consecutive disks, all wound the same way in one
 * path, so a nonzero fill covers the union with no seams and no holes. A disk adds to the
 * quads only at the ends and on the outer side of a turn; where that wedge is thinner than
 * a tenth of a screen px the disk is left out (it halves the cost of a smooth stroke).
 * A pen at most one device px wide on screen is drawn as a line of its mean width instead
 * (the rasterizer's fast hair-line path; no disk shows at that size).
 */
import type { StrokeDoc } from '../../src/doc/model.ts';
import { effectiveRestoredSpans } from '../../src/doc/rules.ts';
import type { SampleSpan, StrokeSample } from '../../src/trace/types.ts';

/** Greatest level of detail: every 64th sample. */
const MAX_LOD = 6;

export interface StrokeGeometry {
  /** Bounding box of the pen outline, image px. */
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** Sample spans drawn as ink: the complement of the shown restored spans. */
  inked: SampleSpan[];
  restored: SampleSpan[];
  /** Smallest, largest and mean pen radius of the inked samples, px. */
  minR: number;
  maxR: number;
  meanR: number;
  /** Paths by level of detail, made when first asked for. */
  ink: (Path2D | undefined)[];
  /** The inked spans' centrelines, for the narrow-pen drawing. */
  inkLine: (Path2D | undefined)[];
  restoredOutline: (Path2D | null | undefined)[];
}

const cache = new WeakMap<StrokeDoc, StrokeGeometry>();

export function geometryOf(stroke: StrokeDoc): StrokeGeometry {
  let g = cache.get(stroke);
  if (g) return g;
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const s of stroke.samples) {
    if (s.x - s.r < x0) x0 = s.x - s.r;
    if (s.y - s.r < y0) y0 = s.y - s.r;
    if (s.x + s.r > x1) x1 = s.x + s.r;
    if (s.y + s.r > y1) y1 = s.y + s.r;
  }
  const restored = effectiveRestoredSpans(stroke);
  const inked: SampleSpan[] = [];
  let from = 0;
  for (const r of restored) {
    if (r.from > from) inked.push({ from, to: r.from - 1 });
    from = r.to + 1;
  }
  if (from < stroke.samples.length) inked.push({ from, to: stroke.samples.length - 1 });
  let maxR = 0;
  let minR = Infinity;
  let sumR = 0;
  let n = 0;
  for (const span of inked) {
    for (let i = span.from; i <= span.to; i++) {
      const r = stroke.samples[i].r;
      if (r > maxR) maxR = r;
      if (r < minR) minR = r;
      sumR += r;
      n++;
    }
  }
  g = { x0, y0, x1, y1, inked, restored, minR: n ? minR : 0, maxR, meanR: n ? sumR / n : 0, ink: [], inkLine: [], restoredOutline: [] };
  cache.set(stroke, g);
  return g;
}

/** Up to this pen width on screen (device px), a stroke is drawn as a line of its mean width. */
export const NARROW_PEN_PX = 1;

/** Whether the stroke is drawn as a line of its mean width at `device` px per image px (see above). */
export function drawnAsLine(g: StrokeGeometry, device: number): boolean {
  return 2 * g.maxR * device <= NARROW_PEN_PX;
}

/** Level of detail for a zoom: samples about 1 px apart are thinned to about 2 screen px apart. */
export function lodFor(zoom: number): number {
  return Math.max(0, Math.min(MAX_LOD, Math.floor(Math.log2(2 / zoom))));
}

/** Indices from..to every `step`, always with both ends. */
function thinned(from: number, to: number, step: number): number[] {
  const out: number[] = [];
  for (let i = from; i < to; i += step) out.push(i);
  out.push(to);
  return out;
}

/** The inked body of a stroke at a level of detail. */
export function inkPath(stroke: StrokeDoc, g: StrokeGeometry, lod: number): Path2D {
  let p = g.ink[lod];
  if (p) return p;
  p = new Path2D();
  // Level k is drawn at 2^−k to 2^(1−k) device px per image px (level 0 at 1 and more).
  const least = lod === 0 ? 1 : 2 ** -lod;
  // A tenth of a device px at the largest zoom of the level; half a device px of overlap at the least.
  const wedge = lod === 0 ? 0.01 : 0.05 * (1 << lod);
  for (const span of g.inked) addPenUnion(p, stroke.samples, thinned(span.from, span.to, 1 << lod), wedge, 0.5 / least);
  g.ink[lod] = p;
  return p;
}

/** The centrelines of the inked spans at a level of detail (drawn with lineWidth 2 · meanR). */
export function inkLinePath(stroke: StrokeDoc, g: StrokeGeometry, lod: number): Path2D {
  let p = g.inkLine[lod];
  if (p) return p;
  p = new Path2D();
  const s = stroke.samples;
  for (const span of g.inked) {
    const idx = thinned(span.from, span.to, 1 << lod);
    p.moveTo(s[idx[0]].x, s[idx[0]].y);
    // A single sample still shows as a dot with round caps.
    if (idx.length === 1) p.lineTo(s[idx[0]].x + 1e-3, s[idx[0]].y);
    for (let k = 1; k < idx.length; k++) p.lineTo(s[idx[k]].x, s[idx[k]].y);
  }
  g.inkLine[lod] = p;
  return p;
}

/** The outline of the stroke's restored spans at a level of detail, or null without any. */
export function restoredPath(stroke: StrokeDoc, g: StrokeGeometry, lod: number): Path2D | null {
  const cached = g.restoredOutline[lod];
  if (cached !== undefined) return cached;
  let p: Path2D | null = null;
  if (g.restored.length > 0) {
    p = new Path2D();
    for (const span of g.restored) addOutline(p, stroke.samples, thinned(span.from, span.to, 1 << lod), 0);
  }
  g.restoredOutline[lod] = p;
  return p;
}

/**
 * Adds the union of pen disks at the samples `idx` (and the tangent quads between
 * consecutive ones) to a path. Every subpath is wound clockwise on screen (as canvas
 * arcs are), so that the nonzero rule fills the union. With `wedge` > 0 (px), an inner
 * disk is left out when the part of it outside the two quads beside it is thinner than
 * that (for a turn θ it is r·(1 − cos θ/2) thick). Quads that merely abut leave faint
 * seams where the rasterizer's edge coverage does not add up, so inner quad ends reach
 * `overlap` px into their neighbours (at most half the segment; the corners then stand
 * out of the disk by about overlap²/2r, a fraction of a device px).
 */
export function addPenUnion(path: CanvasPath, samples: readonly StrokeSample[], idx: readonly number[], wedge = 0, overlap = 0): void {
  const n = idx.length;
  for (let k = 0; k < n; k++) {
    const s = samples[idx[k]];
    if (!(s.r > 0)) continue;
    if (wedge > 0 && k > 0 && k < n - 1 && !diskShows(samples[idx[k - 1]], s, samples[idx[k + 1]], wedge)) continue;
    path.moveTo(s.x + s.r, s.y);
    path.arc(s.x, s.y, s.r, 0, 2 * Math.PI);
  }
  for (let k = 1; k < n; k++) {
    const a = samples[idx[k - 1]];
    const b = samples[idx[k]];
    const dx = b.x - a.x;
    const dy = b.y - a.y;
    const len = Math.hypot(dx, dy);
    // One disk inside the other: the disks are the union already.
    if (len <= Math.abs(a.r - b.r) + 1e-9) continue;
    const ux = dx / len;
    const uy = dy / len;
    // Outer tangents: unit normals u± = s·d ± c·n with s = (ra − rb)/len, n = d turned +90°.
    const s = (a.r - b.r) / len;
    const c = Math.sqrt(Math.max(0, 1 - s * s));
    const nx = -uy;
    const ny = ux;
    const px = s * ux + c * nx;
    const py = s * uy + c * ny;
    const mx = s * ux - c * nx;
    const my = s * uy - c * ny;
    const e = Math.min(overlap, len / 2);
    const ea = k > 1 ? e : 0;
    const eb = k < n - 1 ? e : 0;
    const ax = a.x - ux * ea;
    const ay = a.y - uy * ea;
    const bx = b.x + ux * eb;
    const by = b.y + uy * eb;
    // A (a, u+) → D (a, u−) → C (b, u−) → B (b, u+): the clockwise order on screen.
    path.moveTo(ax + a.r * px, ay + a.r * py);
    path.lineTo(ax + a.r * mx, ay + a.r * my);
    path.lineTo(bx + b.r * mx, by + b.r * my);
    path.lineTo(bx + b.r * px, by + b.r * py);
    path.closePath();
  }
}

/** Whether disk b between a and c shows beyond the tangent quads a–b and b–c by more than `wedge` px. */
function diskShows(a: StrokeSample, b: StrokeSample, c: StrokeSample, wedge: number): boolean {
  const l1 = Math.hypot(b.x - a.x, b.y - a.y);
  const l2 = Math.hypot(c.x - b.x, c.y - b.y);
  // A quad left out (one disk inside the other) leaves the disk to cover itself.
  if (l1 <= Math.abs(a.r - b.r) + 1e-9 || l2 <= Math.abs(b.r - c.r) + 1e-9) return true;
  const cos = ((b.x - a.x) * (c.x - b.x) + (b.y - a.y) * (c.y - b.y)) / (l1 * l2);
  // The tangent points on disk b lie the turn θ apart, plus the change of the tangents'
  // tilt (asin of the radius change per length) on one side: that angle φ leaves a wedge
  // r·(1 − cos φ/2) thick.
  const phi = Math.acos(Math.max(-1, Math.min(1, cos))) + Math.abs(Math.asin((a.r - b.r) / l1) - Math.asin((b.r - c.r) / l2));
  return b.r * (1 - Math.cos(phi / 2)) > wedge;
}

/**
 * Adds the closed outline of the pen along the samples `idx`, pushed out by `pad` px:
 * one side forward, the other back (the ends cut straight across).
 */
export function addOutline(path: CanvasPath, samples: readonly StrokeSample[], idx: readonly number[], pad: number): void {
  const n = idx.length;
  if (n === 0) return;
  if (n === 1) {
    const s = samples[idx[0]];
    path.moveTo(s.x + s.r + pad, s.y);
    path.arc(s.x, s.y, s.r + pad, 0, 2 * Math.PI);
    return;
  }
  const nx = new Float64Array(n);
  const ny = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const a = samples[idx[Math.max(0, k - 1)]];
    const b = samples[idx[Math.min(n - 1, k + 1)]];
    const dx = b.x - a.x;
    const dy = b.y - a.y;
    const l = Math.hypot(dx, dy) || 1;
    nx[k] = -dy / l;
    ny[k] = dx / l;
  }
  for (let k = 0; k < n; k++) {
    const s = samples[idx[k]];
    const d = s.r + pad;
    if (k === 0) path.moveTo(s.x + nx[k] * d, s.y + ny[k] * d);
    else path.lineTo(s.x + nx[k] * d, s.y + ny[k] * d);
  }
  for (let k = n - 1; k >= 0; k--) {
    const s = samples[idx[k]];
    const d = s.r + pad;
    path.lineTo(s.x - nx[k] * d, s.y - ny[k] * d);
  }
  path.closePath();
}

/** All sample indices of a stroke, thinned for a level of detail. */
export function allIndices(count: number, lod: number): number[] {
  return count === 0 ? [] : thinned(0, count - 1, 1 << lod);
}
