/**
 * What each canvas layer draws, straight into the layer's 2D context (Konva's Shape
 * sceneFunc calls these): image px mapped to the screen by the view, only what is on
 * screen, and screen-sized marks (rings, dashes) divided by the zoom.
 */
import type { Anchor, Project, StrokeDoc } from '../../src/doc/model.ts';
import type { StrokeSample } from '../../src/trace/types.ts';
import type { EditorState } from '../store/store.ts';
import type { AnchorHit } from '../tools/types.ts';
import { HALO, INK, INK_OPACITY, RESTORED, SELECTION } from './colours.ts';
import { addOutline, addPenUnion, allIndices, drawnAsLine, geometryOf, inkLinePath, inkPath, lodFor, restoredPath, type StrokeGeometry } from './geometry.ts';
import { TileCache } from './tiles.ts';
import { drawPyramid, type Pyramid } from './pyramid.ts';
import { currentImage, currentSurface, visibleRect } from './view.ts';

export interface Frame {
  state: EditorState;
  /** Canvas size, css px. */
  width: number;
  height: number;
  /** Device px per css px. */
  dpr: number;
}

/** Anchor ring radius, screen px. */
const RING = 5;
/** How far the selection ring stands off the pen's edge, screen px. */
const SELECTION_PAD = 3;

function applyView(ctx: CanvasRenderingContext2D, f: Frame): void {
  const { zoom, panX, panY } = f.state;
  ctx.transform(zoom, 0, 0, zoom, panX, panY);
}

function onScreen(g: StrokeGeometry, r: [number, number, number, number]): boolean {
  return g.x1 >= r[0] && g.x0 <= r[2] && g.y1 >= r[1] && g.y0 <= r[3];
}

/** The visible strokes of the current surface that reach the screen, in ductus order. */
function visibleStrokes(p: Project | undefined, f: Frame, margin = 0): { stroke: StrokeDoc; g: StrokeGeometry; order: number }[] {
  const surface = currentSurface(p);
  if (!p || !surface) return [];
  const r = visibleRect(f.state, f.width, f.height);
  const m = margin / f.state.zoom;
  const rect: [number, number, number, number] = [r[0] - m, r[1] - m, r[2] + m, r[3] + m];
  const out: { stroke: StrokeDoc; g: StrokeGeometry; order: number }[] = [];
  surface.strokeOrder.forEach((id, order) => {
    const stroke = p.strokes[id];
    if (!stroke || stroke.hidden || stroke.samples.length === 0) return;
    const g = geometryOf(stroke);
    if (onScreen(g, rect)) out.push({ stroke, g, order });
  });
  return out;
}

/** The photo (or the evidence overlay): the on-screen part of the right pyramid level. */
export function drawImageLayer(ctx: CanvasRenderingContext2D, f: Frame, pyramid: Pyramid | undefined): void {
  if (!pyramid) return;
  applyView(ctx, f);
  const z = f.state.zoom;
  // Zoomed far in, the photo's own pixels are what an epigrapher wants to see.
  ctx.imageSmoothingEnabled = z * f.dpr < 3;
  ctx.imageSmoothingQuality = 'low';
  drawPyramid(ctx, pyramid, visibleRect(f.state, f.width, f.height), z * f.dpr);
}

/** The inked bodies of the visible strokes, drawn directly. */
function paintInk(ctx: CanvasRenderingContext2D, f: Frame): void {
  const list = visibleStrokes(f.state.project, f);
  if (list.length === 0) return;
  applyView(ctx, f);
  const device = f.state.zoom * f.dpr;
  const lod = lodFor(device);
  ctx.fillStyle = INK;
  ctx.strokeStyle = INK;
  ctx.lineJoin = 'round';
  ctx.lineCap = 'round';
  for (const { stroke, g } of list) {
    if (drawnAsLine(g, device)) {
      ctx.lineWidth = 2 * g.meanR;
      ctx.stroke(inkLinePath(stroke, g, lod));
    } else {
      ctx.fill(inkPath(stroke, g, lod));
    }
  }
}

/** The restored spans of the visible strokes: dashed slate outlines, no fill. */
function paintRestored(ctx: CanvasRenderingContext2D, f: Frame, list = visibleStrokes(f.state.project, f, 12)): void {
  if (list.length === 0) return;
  ctx.save();
  applyView(ctx, f);
  const z = f.state.zoom;
  const lod = lodFor(z * f.dpr);
  ctx.strokeStyle = RESTORED;
  ctx.lineWidth = 1.5 / z;
  ctx.lineJoin = 'round';
  ctx.setLineDash([5 / z, 4 / z]);
  for (const { stroke, g } of list) {
    const path = restoredPath(stroke, g, lod);
    if (path) ctx.stroke(path);
  }
  ctx.restore();
}

/** The frame a tile is painted for: the layer as it would be drawn through the tile's view, at one device px per px. */
let currentFrame: Frame | undefined;
function tileFrame(view: { zoom: number; panX: number; panY: number }, width: number, height: number): Frame {
  return { state: { ...currentFrame!.state, ...view }, width, height, dpr: 1 };
}

/**
 * The strokes layer as the person sees it: the inked bodies in opaque ink black, brought
 * to 70 % as a whole (so overlaps do not darken, as a layer's opacity would), then the
 * restored spans' dashed outlines at full strength on top.
 */
function paintStrokes(ctx: CanvasRenderingContext2D, f: Frame): void {
  ctx.save();
  paintInk(ctx, f);
  ctx.restore();
  ctx.save();
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.globalCompositeOperation = 'destination-in';
  ctx.fillStyle = `rgba(0, 0, 0, ${INK_OPACITY})`;
  ctx.fillRect(0, 0, ctx.canvas.width, ctx.canvas.height);
  ctx.restore();
  paintRestored(ctx, f);
}

/** Tiles of the strokes layer, whose cost grows with the number of strokes on screen. */
const strokeTiles = new TileCache((ctx, view, w, h) => paintStrokes(ctx, tileFrame(view, w, h)));

/** Draws a layer from its tiles when zoomed out to full size or less; false when it must be drawn directly. */
function fromTiles(ctx: CanvasRenderingContext2D, f: Frame, tiles: TileCache): boolean {
  const p = f.state.project;
  const surface = currentSurface(p);
  const image = currentImage(p);
  if (!p || !surface || !image) return false;
  currentFrame = f;
  return tiles.draw(ctx, p, `${p.id}/${surface.id}/${image.id}`, image, f.state, f.dpr, { width: f.width, height: f.height });
}

/** The strokes: inked bodies in ink black at 70 %, restored spans as dashed slate outlines with no fill. */
export function drawStrokeLayer(ctx: CanvasRenderingContext2D, f: Frame): void {
  if (!fromTiles(ctx, f, strokeTiles)) paintStrokes(ctx, f);
}

function ring(ctx: CanvasRenderingContext2D, x: number, y: number, z: number, filled: boolean): void {
  ctx.beginPath();
  ctx.arc(x, y, RING / z, 0, 2 * Math.PI);
  ctx.fillStyle = filled ? SELECTION : HALO;
  ctx.fill();
  ctx.lineWidth = 2 / z;
  ctx.strokeStyle = SELECTION;
  ctx.stroke();
}

function anchorRings(ctx: CanvasRenderingContext2D, anchors: readonly Anchor[], z: number, selectedIndex = -1): void {
  anchors.forEach((a, i) => ring(ctx, a.x, a.y, z, i === selectedIndex));
}

/** A line along the samples with a white halo under it. */
function haloLine(ctx: CanvasRenderingContext2D, samples: readonly StrokeSample[], idx: readonly number[], colour: string, z: number, width: number): void {
  if (idx.length < 2) return;
  ctx.beginPath();
  ctx.moveTo(samples[idx[0]].x, samples[idx[0]].y);
  for (let k = 1; k < idx.length; k++) ctx.lineTo(samples[idx[k]].x, samples[idx[k]].y);
  ctx.lineJoin = 'round';
  ctx.lineCap = 'round';
  ctx.strokeStyle = HALO;
  ctx.lineWidth = (width + 2) / z;
  ctx.stroke();
  ctx.strokeStyle = colour;
  ctx.lineWidth = width / z;
  ctx.stroke();
}

/** The ductus: an arrow along the middle of the stroke and its number in the order of writing. */
function ductusArrow(ctx: CanvasRenderingContext2D, stroke: StrokeDoc, order: number, z: number): void {
  const s = stroke.samples;
  if (s.length < 3) return;
  const i = Math.floor(s.length / 2);
  const a = s[Math.max(0, i - 3)];
  const b = s[Math.min(s.length - 1, i + 3)];
  const l = Math.hypot(b.x - a.x, b.y - a.y) || 1;
  const ux = (b.x - a.x) / l;
  const uy = (b.y - a.y) / l;
  const size = 7 / z;
  const tip = s[i];
  ctx.beginPath();
  ctx.moveTo(tip.x + ux * size, tip.y + uy * size);
  ctx.lineTo(tip.x - ux * size - uy * size * 0.7, tip.y - uy * size + ux * size * 0.7);
  ctx.lineTo(tip.x - ux * size + uy * size * 0.7, tip.y - uy * size - ux * size * 0.7);
  ctx.closePath();
  ctx.fillStyle = HALO;
  ctx.fill();
  ctx.lineWidth = 1.5 / z;
  ctx.strokeStyle = INK;
  ctx.stroke();
  const start = s[0];
  ctx.font = `${12 / z}px system-ui, sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  const label = String(order + 1);
  const x = start.x - (ux * 10) / z;
  const y = start.y - (uy * 10) / z;
  ctx.lineWidth = 3 / z;
  ctx.strokeStyle = HALO;
  ctx.strokeText(label, x, y);
  ctx.fillStyle = INK;
  ctx.fillText(label, x, y);
}

/**
 * The selection (teal ring on white along the pen's edge), anchors, and the ductus
 * arrows when asked for.
 */
export function drawMarkLayer(ctx: CanvasRenderingContext2D, f: Frame, selectedAnchor: AnchorHit | undefined): void {
  const { state } = f;
  const z = state.zoom;
  const list = visibleStrokes(state.project, f, 12);
  if (list.length === 0) return;
  applyView(ctx, f);
  const lod = lodFor(z * f.dpr);
  const selected = new Set(state.selection);
  for (const { stroke } of list) {
    if (!selected.has(stroke.id)) continue;
    const path = new Path2D();
    addOutline(path, stroke.samples, allIndices(stroke.samples.length, lod), SELECTION_PAD / z);
    ctx.lineJoin = 'round';
    ctx.strokeStyle = HALO;
    ctx.lineWidth = 4 / z;
    ctx.stroke(path);
    ctx.strokeStyle = SELECTION;
    ctx.lineWidth = 2 / z;
    ctx.stroke(path);
  }
  if (state.showDuctus) for (const { stroke, order } of list) ductusArrow(ctx, stroke, order, z);
  // Anchors: of the selected strokes, and of every stroke while refining (they are what Refine drags).
  for (const { stroke } of list) {
    if (state.tool !== 'refine' && !selected.has(stroke.id)) continue;
    const idx = selectedAnchor?.strokeId === stroke.id ? selectedAnchor.anchorIndex : -1;
    anchorRings(ctx, stroke.anchors, z, idx);
  }
}

/** The Follow preview (the pen along the path, lightly, and its centreline) and the pending anchors. */
export function drawLiveLayer(ctx: CanvasRenderingContext2D, f: Frame): StrokeSample | undefined {
  const { preview, pending, zoom: z } = f.state;
  if (!preview?.length && pending.length === 0) return undefined;
  applyView(ctx, f);
  let end: StrokeSample | undefined;
  if (preview && preview.length > 0) {
    const idx = allIndices(preview.length, 0);
    const body = new Path2D();
    addPenUnion(body, preview, idx);
    ctx.globalAlpha = 0.25;
    ctx.fillStyle = SELECTION;
    ctx.fill(body);
    ctx.globalAlpha = 1;
    haloLine(ctx, preview, idx, SELECTION, z, 1.5);
    end = preview[preview.length - 1];
  }
  anchorRings(ctx, pending, z);
  return end;
}
