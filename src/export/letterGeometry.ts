/**
 * The shared geometry of a letter for the text exports (TEI zones, W3C annotations, the
 * letter set, the paleographic chart): the union of its strokes' pen outlines, its inked
 * and restored parts, one polygon for a zone, its box in px and mm, and a nonzero-winding
 * rasterizer for masks. Coordinates are surface image pixels (x right, y down).
 */
import { letterBox, type Box } from '../doc/layout.ts';
import type { Letter, Project, StrokeDoc, Surface } from '../doc/model.ts';
import { differenceRings, intersectRings, ringArea, unionRings } from './clip.ts';
import { penOutline, type Ring } from './outline.ts';
import { strokeParts } from './strokeParts.ts';
import { ExportError } from './types.ts';

/** A letter with its geometry, px (and mm when its surface is calibrated). */
export interface LetterShape {
  letter: Letter;
  surface: Surface;
  /** Index of the surface in the project. */
  surfaceIndex: number;
  /** Its strokes that exist and have samples, in ductus order. */
  strokes: StrokeDoc[];
  /** Union of all its pen outlines: rings (flat x, y, … px) to fill with nonzero winding. */
  outline: Ring[];
  /** Union of the pen outlines of the inked (not restored) parts, px. */
  inked: Ring[];
  /** The restored region not covered by an inked part, px (empty when nothing is restored). */
  restored: Ring[];
  /** Box of its pen disks, px [x0, y0, x1, y1]. */
  boxPx: Box;
  /** Scale of the surface, px per mm; undefined when the surface is not calibrated. */
  pxPerMm?: number;
  /** boxPx in mm; undefined when the surface is not calibrated. */
  boxMm?: Box;
}

/** The geometry of a letter; undefined when none of its strokes has a sample. */
export function letterShape(project: Project, letter: Letter): LetterShape | undefined {
  const surfaceIndex = project.surfaces.findIndex((s) => s.id === letter.surfaceId);
  if (surfaceIndex < 0) return undefined;
  const surface = project.surfaces[surfaceIndex];
  const strokes = letter.strokeIds.map((id) => project.strokes[id]).filter((st) => st && st.samples.length > 0);
  const boxPx = letterBox(project, letter);
  if (strokes.length === 0 || !boxPx) return undefined;
  const inkedRaw: Ring[] = [];
  const restoredRaw: Ring[] = [];
  for (const st of strokes) {
    const parts = strokeParts(st);
    for (const r of parts.inked) inkedRaw.push(r);
    for (const r of parts.restored) restoredRaw.push(r);
  }
  const inked = unionRings(inkedRaw);
  const restored = restoredRaw.length ? differenceRings(restoredRaw, inked) : [];
  // The whole pen's union, restored spans included, cut nowhere: where the letter lies.
  const outline = restoredRaw.length ? unionRings(strokes.flatMap((st) => penOutline(st.samples))) : inked;
  const k = surface.pxPerMm;
  const shape: LetterShape = { letter, surface, surfaceIndex, strokes, outline, inked, restored, boxPx };
  if (k && k > 0) {
    shape.pxPerMm = k;
    shape.boxMm = [boxPx[0] / k, boxPx[1] / k, boxPx[2] / k, boxPx[3] / k];
  }
  return shape;
}

/**
 * What a drawing of the letter fills and what it dashes: a letter marked restored (supplied
 * by the editor, not read from ink) is drawn wholly as restored; otherwise the inked parts
 * are filled and only the restored spans dashed. Rings in px.
 */
export function drawnParts(shape: LetterShape): { inked: Ring[]; restored: Ring[] } {
  return shape.letter.restored ? { inked: [], restored: shape.outline } : { inked: shape.inked, restored: shape.restored };
}

/**
 * The letters of the project, or of one surface, in reading order: surface order, then
 * line, then place in the line.
 */
export function lettersInReadingOrder(project: Project, surfaceId?: string): Letter[] {
  if (surfaceId !== undefined && !project.surfaces.some((s) => s.id === surfaceId)) {
    throw new ExportError(`The project has no surface "${surfaceId}".`);
  }
  const rank = new Map(project.surfaces.map((s, i) => [s.id, i]));
  return Object.values(project.letters)
    .filter((l) => (surfaceId === undefined ? rank.has(l.surfaceId) : l.surfaceId === surfaceId))
    .sort((a, b) => rank.get(a.surfaceId)! - rank.get(b.surfaceId)! || a.line - b.line || a.order - b.order || (a.id < b.id ? -1 : 1));
}

/** Convex hull of all ring vertices (Andrew's monotone chain), as a ring without repeated ends. */
export function convexHull(rings: readonly Ring[]): Ring {
  const pts: [number, number][] = [];
  for (const r of rings) for (let i = 0; i < r.length; i += 2) pts.push([r[i], r[i + 1]]);
  pts.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (pts.length < 3) return pts.flat();
  const cross = (o: number[], a: number[], b: number[]) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: [number, number][] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: [number, number][] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return [...lower, ...upper].flat();
}

/**
 * One polygon for a letter, where a format takes a single polygon (a TEI zone's @points, an
 * SVG selector): when its outline is one connected part, that part's outer boundary (holes,
 * such as the counter of an O, are dropped: a zone marks where the letter is); when its
 * strokes do not touch, the convex hull of all its parts, so that no stroke falls outside
 * the zone. With `clip` [x0, y0, x1, y1] px the outline is first cut to that rectangle
 * (the image), so the polygon never leaves it.
 */
export function letterPolygon(outline: readonly Ring[], clip?: Box): Ring {
  let rings: Ring[] = outline.slice();
  if (clip) {
    const rect: Ring = [clip[0], clip[1], clip[2], clip[1], clip[2], clip[3], clip[0], clip[3]];
    rings = intersectRings(rings, [rect]);
  }
  if (rings.length === 0) return [];
  // Outer rings have the orientation of the largest ring (clipper gives holes the other one).
  let largest = 0;
  for (let i = 1; i < rings.length; i++) if (Math.abs(ringArea(rings[i])) > Math.abs(ringArea(rings[largest]))) largest = i;
  const sign = Math.sign(ringArea(rings[largest]));
  const outers = rings.filter((r) => Math.sign(ringArea(r)) === sign);
  return outers.length === 1 ? outers[0] : convexHull(outers);
}

/** Rings mapped by x' = (x − dx)·k, y' = (y − dy)·k (e.g. px → mm with k = 1/pxPerMm). */
export function transformRings(rings: readonly Ring[], k: number, dx = 0, dy = 0): Ring[] {
  return rings.map((r) => r.map((v, i) => (v - (i % 2 === 0 ? dx : dy)) * k));
}

/**
 * Fills `out` (w × h, row-major, 1 inside and 0 outside) with the pixels of the window at
 * (x0, y0) px whose centres lie inside the rings under nonzero winding. Scanline by pixel
 * row over a flat edge list; buffers are allocated once per call, not per pixel.
 */
export function fillNonzero(rings: readonly Ring[], x0: number, y0: number, w: number, h: number, out = new Uint8Array(w * h)): Uint8Array {
  out.fill(0);
  let edgeCount = 0;
  for (const r of rings) edgeCount += r.length >> 1;
  const ex0 = new Float64Array(edgeCount), ey0 = new Float64Array(edgeCount), ex1 = new Float64Array(edgeCount), ey1 = new Float64Array(edgeCount);
  let e = 0;
  for (const r of rings) {
    const n = r.length;
    for (let i = 0, j = n - 2; i < n; j = i, i += 2) {
      ex0[e] = r[j]; ey0[e] = r[j + 1]; ex1[e] = r[i]; ey1[e] = r[i + 1];
      e++;
    }
  }
  const xs = new Float64Array(edgeCount);
  const ws = new Int8Array(edgeCount);
  for (let row = 0; row < h; row++) {
    const y = y0 + row + 0.5;
    let m = 0;
    for (let k = 0; k < edgeCount; k++) {
      const ya = ey0[k], yb = ey1[k];
      // Half-open rule: an edge counts for ya <= y < yb (or the reverse), so a vertex on
      // the scanline is counted once.
      let dir = 0;
      if (ya <= y && y < yb) dir = 1;
      else if (yb <= y && y < ya) dir = -1;
      if (dir === 0) continue;
      const x = ex0[k] + ((y - ya) * (ex1[k] - ex0[k])) / (yb - ya);
      // Insertion sort by x: a row crosses a handful of edges.
      let p = m++;
      while (p > 0 && xs[p - 1] > x) {
        xs[p] = xs[p - 1];
        ws[p] = ws[p - 1];
        p--;
      }
      xs[p] = x;
      ws[p] = dir;
    }
    let wind = 0;
    const base = row * w;
    for (let k = 0; k < m - 1; k++) {
      wind += ws[k];
      if (wind === 0) continue;
      // Pixel centres x0 + i + 0.5 in [xs[k], xs[k+1]).
      const i0 = Math.max(0, Math.ceil(xs[k] - x0 - 0.5));
      const i1 = Math.min(w, Math.ceil(xs[k + 1] - x0 - 0.5));
      for (let i = i0; i < i1; i++) out[base + i] = 1;
    }
  }
  return out;
}

/** Code points of a label as Unicode writes them: 'U+10900 U+10901'. */
export function codePointsText(label: string): string {
  return [...label].map((c) => 'U+' + c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')).join(' ');
}

/** The first image of a surface, or a clear error. */
export function firstImage(surface: Surface) {
  const img = surface.images[0];
  if (!img) throw new ExportError(`The surface "${surface.name}" has no image.`);
  return img;
}
