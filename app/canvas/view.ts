/**
 * The view's arithmetic and the top bar's view commands. The view is store.view: `zoom`
 * screen px per image px and the screen position (`panX`, `panY`) of image point (0, 0),
 * so image x = (screen x − panX) / zoom, with screen px measured from the canvas's
 * top-left corner and pixel centres at i + 0.5 in image px.
 */
import type { ImageRef, Project, Surface } from '../../src/doc/model.ts';
import type { EditorStore } from '../store/store.ts';
import { editorStore } from '../store/useEditor.ts';

export const MIN_ZOOM = 1 / 64;
export const MAX_ZOOM = 32;
/** Room left around the image when it is fitted to the window, screen px. */
const FIT_MARGIN = 16;

export interface View {
  zoom: number;
  panX: number;
  panY: number;
}

/** Size of the canvas, css px; kept by the canvas as it resizes. */
const box = { width: 0, height: 0 };

export function setCanvasBox(width: number, height: number): void {
  box.width = width;
  box.height = height;
}

export function canvasBox(): { width: number; height: number } {
  return { ...box };
}

/** The surface being worked on. There is one view, on the first surface, until surfaces get their own switcher. */
export function currentSurface(p: Project | undefined): Surface | undefined {
  return p?.surfaces[0];
}

/** The image drawn and traced on: the current surface's first band. */
export function currentImage(p: Project | undefined): ImageRef | undefined {
  return currentSurface(p)?.images[0];
}

export function clampZoom(z: number): number {
  return Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, z));
}

/** The view that shows a w×h image whole and centred in a bw×bh box. */
export function fitView(w: number, h: number, bw: number, bh: number): View {
  const zoom = clampZoom(Math.min((bw - 2 * FIT_MARGIN) / w, (bh - 2 * FIT_MARGIN) / h));
  return { zoom, panX: (bw - w * zoom) / 2, panY: (bh - h * zoom) / 2 };
}

/** The view zoomed by `factor` keeping the image point under screen (sx, sy) in place. */
export function zoomedAt(v: View, factor: number, sx: number, sy: number): View {
  const zoom = clampZoom(v.zoom * factor);
  const k = zoom / v.zoom;
  return { zoom, panX: sx - (sx - v.panX) * k, panY: sy - (sy - v.panY) * k };
}

export function screenToImage(v: View, sx: number, sy: number): { x: number; y: number } {
  return { x: (sx - v.panX) / v.zoom, y: (sy - v.panY) / v.zoom };
}

export function imageToScreen(v: View, x: number, y: number): { x: number; y: number } {
  return { x: x * v.zoom + v.panX, y: y * v.zoom + v.panY };
}

/** The rectangle of image px on screen: [x0, y0, x1, y1], not clipped to the image. */
export function visibleRect(v: View, bw = box.width, bh = box.height): [number, number, number, number] {
  return [-v.panX / v.zoom, -v.panY / v.zoom, (bw - v.panX) / v.zoom, (bh - v.panY) / v.zoom];
}

/** Fit: the whole image in the window (the top bar's Fit). */
export function fitToWindow(store: EditorStore = editorStore): void {
  const img = currentImage(store.getState().project);
  if (!img || box.width <= 0 || box.height <= 0) return;
  store.getState().setView(fitView(img.width, img.height, box.width, box.height));
}

/** 1:1: one image px per screen px, about the centre of the window (the top bar's 1:1). */
export function actualSize(store: EditorStore = editorStore): void {
  const s = store.getState();
  store.getState().setView(zoomedAt(s, 1 / s.zoom, box.width / 2, box.height / 2));
}

/** Zooms by `factor` about the centre of the window (buttons and keys). */
export function zoomBy(factor: number, store: EditorStore = editorStore): void {
  store.getState().setView(zoomedAt(store.getState(), factor, box.width / 2, box.height / 2));
}
