/**
 * The geometry of a facsimile, written once for both writers (facsimile.ts draws it as
 * SVG, png.ts rasterises it): the layers of filled rings in object millimetres, the
 * restored spans, the letter labels and line numbers, the scale bar. Coordinates are
 * object mm from the image's top-left corner (x right, y down); the drawing's size on
 * paper is the object's size × `scale`.
 */
import { letterBox, textLines } from '../doc/layout.ts';
import type { ImageRef, Project, Surface } from '../doc/model.ts';
import type { Ring } from './outline.ts';
import { strokeParts } from './strokeParts.ts';
import { readingText } from './transcription.ts';
import { ExportError, type ExportInput, type FacsimileOptions, type RestoredStyle } from './types.ts';

/** Ink black and slate (../shared/naming.md). */
export const INK_COLOUR = '#1b1b1f';
export const RESTORED_COLOUR = '#6b7280';

/** A text placed on the drawing; x, y, size in object mm (y is the baseline). */
export interface DrawingText {
  x: number;
  y: number;
  size: number;
  text: string;
  anchor: 'start' | 'middle' | 'end';
}

export interface FacsimileDrawing {
  project: Project;
  surface: Surface;
  /** The image whose pixel grid the strokes live on. */
  image: ImageRef;
  pxPerMm: number;
  /** Object size, mm. */
  widthMm: number;
  heightMm: number;
  /** Drawing size against the object (1 = 1:1). */
  scale: number;
  /** Inked runs' pen outlines, mm; fill nonzero. */
  ink: Ring[];
  restoredStyle: RestoredStyle;
  /** Restored runs' pen outlines, mm ('grey': to fill, nonzero). */
  restoredFill: Ring[];
  /** Outer edge of each restored run (union of its pen), mm ('dashed': to stroke). */
  restoredEdge: Ring[];
  /** Width of the dashed line and its dash and gap lengths, object mm. */
  line: { width: number; dash: number; gap: number };
  labels: DrawingText[];
  lineNumbers: DrawingText[];
  /** The bar (x, y, width, height in object mm, width = lengthMm exactly) and its label. */
  scaleBar?: { x: number; y: number; width: number; height: number; lengthMm: number; label: DrawingText };
  /** The photo to lay under the drawing, if asked for. */
  photo?: { ref: ImageRef; bytes: Uint8Array; mime: 'image/png' | 'image/jpeg' };
}

/** 1, 2 or 5 × a power of ten nearest below `mm` (at least 1 mm). */
export function roundLength(mm: number): number {
  if (!(mm > 1)) return 1;
  const p = 10 ** Math.floor(Math.log10(mm));
  for (const k of [5, 2, 1]) if (k * p <= mm) return k * p;
  return p;
}

function surfaceOf(input: ExportInput): Surface {
  const { project } = input;
  const surface = input.surfaceId ? project.surfaces.find((s) => s.id === input.surfaceId) : project.surfaces[0];
  if (!surface) throw new ExportError(input.surfaceId ? `The project has no surface "${input.surfaceId}".` : 'The project has no surface.');
  return surface;
}

function scaled(rings: readonly Ring[], k: number, out: Ring[]): void {
  for (const r of rings) {
    const o: Ring = new Array(r.length);
    for (let i = 0; i < r.length; i++) o[i] = r[i] * k;
    out.push(o);
  }
}

/**
 * The facsimile of a surface. Throws ExportError for an uncalibrated surface (no scale:
 * no true size), a surface without image, a bad scale or an unknown photo image.
 */
export function facsimileDrawing(input: ExportInput, opts: FacsimileOptions = {}): FacsimileDrawing {
  const { project } = input;
  const surface = surfaceOf(input);
  const image = surface.images[0];
  if (!image) throw new ExportError(`The surface "${surface.name}" has no image to draw on.`);
  const pxPerMm = surface.pxPerMm;
  if (!(pxPerMm !== undefined && pxPerMm > 0 && Number.isFinite(pxPerMm))) {
    throw new ExportError(`The surface "${surface.name}" has no scale: calibrate the surface first (Calibrate: draw along a ruler in the photo).`);
  }
  const scale = opts.scale ?? 1;
  if (!(scale > 0 && Number.isFinite(scale))) throw new ExportError(`The drawing scale must be a positive number, got ${scale}.`);
  const mmPerPx = 1 / pxPerMm;
  const widthMm = image.width * mmPerPx;
  const heightMm = image.height * mmPerPx;

  const inkPx: Ring[] = [];
  const restoredPx: Ring[] = [];
  const edgePx: Ring[] = [];
  for (const id of surface.strokeOrder) {
    const st = project.strokes[id];
    if (!st || st.hidden || st.samples.length === 0) continue;
    const parts = strokeParts(st);
    for (const r of parts.inked) inkPx.push(r);
    // The restored runs come back from clipper as disjoint rings: their edges are the outline.
    for (const r of parts.restored) {
      restoredPx.push(r);
      edgePx.push(r);
    }
  }
  const ink: Ring[] = [];
  const restoredFill: Ring[] = [];
  const restoredEdge: Ring[] = [];
  scaled(inkPx, mmPerPx, ink);
  scaled(restoredPx, mmPerPx, restoredFill);
  scaled(edgePx, mmPerPx, restoredEdge);

  // Sizes of line and text are kept constant on paper: object mm ÷ scale.
  const onPaper = (mm: number) => mm / scale;
  const textSize = onPaper(3);
  const labels: DrawingText[] = [];
  const lineNumbers: DrawingText[] = [];
  const rtl = project.inscription.direction === 'rtl';
  if (opts.labels || opts.lineNumbers) {
    for (const line of textLines(project, surface.id)) {
      let ySum = 0, count = 0;
      for (const item of line.items) {
        if (item.kind === 'mark') {
          ySum += item.mark.y; count++;
          continue;
        }
        const box = letterBox(project, item.letter);
        if (!box) continue;
        ySum += (box[1] + box[3]) / 2; count++;
        if (opts.labels) {
          labels.push({
            x: ((box[0] + box[2]) / 2) * mmPerPx, y: box[1] * mmPerPx - onPaper(1), size: textSize,
            text: readingText(item.letter), anchor: 'middle',
          });
        }
      }
      if (opts.lineNumbers && count > 0) {
        const y = (ySum / count) * mmPerPx + textSize / 3;
        lineNumbers.push(rtl
          ? { x: widthMm - onPaper(2), y, size: textSize, text: String(line.line), anchor: 'end' }
          : { x: onPaper(2), y, size: textSize, text: String(line.line), anchor: 'start' });
      }
    }
  }

  const barMm = opts.scaleBarMm ?? roundLength(widthMm / 5);
  if (!(barMm >= 0 && Number.isFinite(barMm))) throw new ExportError(`The scale bar length must be 0 or more mm, got ${barMm}.`);
  let scaleBar: FacsimileDrawing['scaleBar'];
  if (barMm > 0) {
    const height = onPaper(1);
    const x = Math.min(onPaper(5), widthMm * 0.05);
    const y = heightMm - Math.min(onPaper(5), heightMm * 0.05) - height;
    scaleBar = {
      x, y, width: barMm, height, lengthMm: barMm,
      label: { x: x + barMm / 2, y: y - onPaper(1), size: textSize, text: `${barMm} mm`, anchor: 'middle' },
    };
  }

  let photo: FacsimileDrawing['photo'];
  if (opts.photoImageId !== undefined) {
    const ref = surface.images.find((i) => i.id === opts.photoImageId);
    const file = input.images[opts.photoImageId];
    if (!ref || !file) throw new ExportError(`The surface "${surface.name}" has no image "${opts.photoImageId}" to lay under the drawing.`);
    photo = { ref, bytes: file.bytes, mime: file.mime };
  }

  return {
    project, surface, image, pxPerMm, widthMm, heightMm, scale, ink,
    restoredStyle: opts.restoredStyle ?? 'dashed', restoredFill, restoredEdge,
    line: { width: onPaper(0.2), dash: onPaper(1), gap: onPaper(0.6) },
    labels, lineNumbers, scaleBar, photo,
  };
}
