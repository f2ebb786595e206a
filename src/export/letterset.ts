/**
 * letters.zip: the letter set. One folder per letter with a crop of every band of its
 * surface (PNG, the source's channels and bit depth kept where PNG can hold them), the
 * stroke mask on the same crop, the letter's vector drawing (SVG, mm) and its strokes
 * (strokes.json); at the top letters.csv (RFC 4180) and letters.json, one row per letter,
 * the same rows in both.
 */
import { convertIndexedToRgb, decode as decodePng, encode as encodePng } from 'fast-png';
import jpeg from 'jpeg-js';
import { strToU8, zipSync, type Zippable } from 'fflate';
import type { ImageRef, Letter, Project } from '../doc/model.ts';
import { meanWidth, restoredShare, strokeLength, effectiveRestoredSpans } from '../doc/rules.ts';
import { withPhys } from '../image/codec.ts';
import {
  codePointsText, drawnParts, fillNonzero, letterShape, lettersInReadingOrder, transformRings, type LetterShape,
} from './letterGeometry.ts';
import type { Ring } from './outline.ts';
import { ExportError, type ExportImages, type ExportInput, type LetterSetOptions } from './types.ts';
import { num, xmlText } from './xml.ts';

/** Default margin around a crop, mm (px on an uncalibrated surface). */
export const DEFAULT_MARGIN = 2;
/** Ink black and restored slate (../shared/naming.md). */
const INK = '#1b1b1f';
const RESTORED = '#6b7280';

/** One row of letters.csv and letters.json. null: not known (e.g. mm on an uncalibrated surface). */
export interface LetterRow {
  id: string;
  label: string;
  /** 'U+0391' or several, space-separated. */
  codePoints: string;
  reading: 'clear' | 'doubtful';
  restored: boolean;
  surface: string;
  line: number;
  order: number;
  /** Box of the pen disks, px. */
  x0Px: number | null;
  y0Px: number | null;
  x1Px: number | null;
  y1Px: number | null;
  /** The same box, mm. */
  x0Mm: number | null;
  y0Mm: number | null;
  x1Mm: number | null;
  y1Mm: number | null;
  widthMm: number | null;
  heightMm: number | null;
  strokeCount: number;
  /** Mean pen width (2r) over all samples of the letter, mm. */
  meanPenWidthMm: number | null;
  /** Share of the centrelines' length that is restored, 0..1. */
  restoredShare: number | null;
  /** Image the crop box refers to (the surface's first image) and its band. */
  sourceImage: string;
  band: string;
  /** Scale of the surface, px per mm. */
  pxPerMm: number | null;
  /** Folder of the letter inside the zip ('' when it has no strokes to draw). */
  folder: string;
}

/** The column order of letters.csv: the keys of LetterRow. */
export const LETTER_COLUMNS: readonly (keyof LetterRow)[] = [
  'id', 'label', 'codePoints', 'reading', 'restored', 'surface', 'line', 'order',
  'x0Px', 'y0Px', 'x1Px', 'y1Px', 'x0Mm', 'y0Mm', 'x1Mm', 'y1Mm', 'widthMm', 'heightMm',
  'strokeCount', 'meanPenWidthMm', 'restoredShare', 'sourceImage', 'band', 'pxPerMm', 'folder',
];

const round = (v: number, digits: number) => Number(v.toFixed(digits));

/** One CSV field per RFC 4180 §2: quoted when it holds a comma, a quote or a line break. */
export function csvField(v: string | number | boolean | null): string {
  const s = v === null ? '' : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** CSV text with a header row, CRLF line ends (RFC 4180). */
export function lettersCsv(rows: readonly LetterRow[]): string {
  const lines = [LETTER_COLUMNS.join(',')];
  for (const r of rows) lines.push(LETTER_COLUMNS.map((k) => csvField(r[k])).join(','));
  return lines.join('\r\n') + '\r\n';
}

/** A file-name piece from any text: ASCII letters and digits kept, anything else as uXXXX. */
function safePiece(s: string, max = 40): string {
  let out = '';
  for (const ch of s) {
    const piece = /[A-Za-z0-9]/.test(ch) ? ch : `u${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
    if (out.length + piece.length > max) break; // whole pieces only, so a name never ends in half an escape
    out += piece;
  }
  return out;
}

/** A decoded raster for cropping: interleaved samples of 8 or 16 bits. */
interface Raster {
  width: number;
  height: number;
  channels: number;
  depth: 8 | 16;
  data: Uint8Array | Uint16Array;
}

function decodeRaster(img: ImageRef, images: ExportImages): Raster {
  const file = images[img.id];
  if (!file) throw new ExportError(`The image "${img.file}" (${img.band}) is missing from the export input.`);
  try {
    if (file.mime === 'image/jpeg') {
      const j = jpeg.decode(file.bytes, { useTArray: true, formatAsRGBA: false });
      return { width: j.width, height: j.height, channels: 3, depth: 8, data: j.data };
    }
    const png = decodePng(file.bytes);
    if (png.palette) {
      const rgb = convertIndexedToRgb(png);
      return { width: png.width, height: png.height, channels: png.transparency ? 4 : 3, depth: 8, data: new Uint8Array(rgb) };
    }
    if (png.depth === 8 || png.depth === 16) {
      const data = png.depth === 16 ? (png.data as Uint16Array) : new Uint8Array(png.data.buffer, png.data.byteOffset, png.data.length);
      return { width: png.width, height: png.height, channels: png.channels, depth: png.depth, data };
    }
    // 1, 2 or 4 bits, packed by row: widened to 8 bits (the levels kept, scaled to 0..255).
    const d = png.depth, c = png.channels, w = png.width, h = png.height;
    const src = png.data, rowBytes = Math.ceil((w * c * d) / 8), scale = 255 / ((1 << d) - 1), mask = (1 << d) - 1;
    const data = new Uint8Array(w * h * c);
    for (let y = 0; y < h; y++) {
      for (let i = 0; i < w * c; i++) {
        const bit = i * d;
        const v = (src[y * rowBytes + (bit >> 3)] >> (8 - d - (bit & 7))) & mask;
        data[y * w * c + i] = Math.round(v * scale);
      }
    }
    return { width: w, height: h, channels: c, depth: 8, data };
  } catch (e) {
    throw new ExportError(`The image "${img.file}" could not be decoded (${(e as Error).message}).`);
  }
}

function cropRaster(r: Raster, x0: number, y0: number, w: number, h: number): Raster {
  const c = r.channels;
  const data = r.depth === 16 ? new Uint16Array(w * h * c) : new Uint8Array(w * h * c);
  for (let y = 0; y < h; y++) {
    const from = ((y0 + y) * r.width + x0) * c;
    data.set(r.data.subarray(from, from + w * c), y * w * c);
  }
  return { width: w, height: h, channels: c, depth: r.depth, data };
}

function pngOf(r: Raster, pxPerMm?: number): Uint8Array {
  const bytes = encodePng({ width: r.width, height: r.height, data: r.data, depth: r.depth, channels: r.channels });
  return pxPerMm ? withPhys(bytes, Math.round(pxPerMm * 1000)) : bytes;
}

function pathData(rings: readonly Ring[], digits: number): string {
  let d = '';
  for (const r of rings) {
    for (let i = 0; i < r.length; i += 2) d += `${i === 0 ? 'M' : 'L'}${num(r[i], digits)} ${num(r[i + 1], digits)}`;
    d += 'Z';
  }
  return d;
}

/** The letter's drawing: inked parts filled, restored parts dashed; mm (px when uncalibrated). */
function letterSvg(shape: LetterShape, project: Project): string {
  const k = shape.pxPerMm ? 1 / shape.pxPerMm : 1;
  const unit = shape.pxPerMm ? 'mm' : 'px';
  const pad = shape.pxPerMm ? 0.5 : 2;
  const [bx0, by0, bx1, by1] = shape.boxPx;
  const x = bx0 * k - pad, y = by0 * k - pad, w = (bx1 - bx0) * k + 2 * pad, h = (by1 - by0) * k + 2 * pad;
  const digits = shape.pxPerMm ? 4 : 2;
  const parts = drawnParts(shape);
  const inked = transformRings(parts.inked, k);
  const restored = transformRings(parts.restored, k);
  const line = shape.pxPerMm ? 0.1 : 0.5;
  const out = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${num(w, 3)}${unit}" height="${num(h, 3)}${unit}" viewBox="${num(x, digits)} ${num(y, digits)} ${num(w, digits)} ${num(h, digits)}">`,
    `<title>${xmlText(shape.letter.label || '?')} — ${xmlText(project.title)}</title>`,
    `<desc>${shape.pxPerMm ? 'Units: mm on the object.' : 'The surface is not calibrated: units are image px.'} Restored parts: dashed outline.</desc>`,
  ];
  if (inked.length) out.push(`<path class="inked" fill="${INK}" fill-rule="nonzero" d="${pathData(inked, digits)}"/>`);
  if (restored.length) {
    out.push(`<path class="restored" fill="none" stroke="${RESTORED}" stroke-width="${line}" stroke-dasharray="${line * 4} ${line * 3}" d="${pathData(restored, digits)}"/>`);
  }
  out.push('</svg>');
  return out.join('\n') + '\n';
}

function strokesJson(shape: LetterShape): string {
  const k = shape.pxPerMm;
  const order = shape.surface.strokeOrder;
  const strokes = shape.strokes.map((st) => ({
    id: st.id,
    ductus: order.indexOf(st.id) + 1,
    lengthPx: round(strokeLength(st), 3),
    restoredShare: round(restoredShare(st), 4),
    restoredSpans: effectiveRestoredSpans(st),
    px: st.samples.map((s) => [round(s.x, 3), round(s.y, 3), round(s.r, 3)]),
    mm: k ? st.samples.map((s) => [round(s.x / k, 4), round(s.y / k, 4), round(s.r / k, 4)]) : null,
  }));
  return JSON.stringify({
    letter: shape.letter.id,
    label: shape.letter.label,
    pxPerMm: k ?? null,
    note: 'Centreline samples [x, y, pen radius]; restoredSpans are inclusive sample index ranges.' + (k ? '' : ' The surface is not calibrated: no mm.'),
    strokes,
  }, null, 1) + '\n';
}

function rowOf(project: Project, letter: Letter, shape: LetterShape | undefined, folder: string): LetterRow {
  const surface = project.surfaces.find((s) => s.id === letter.surfaceId)!;
  const img = surface.images[0];
  const k = surface.pxPerMm && surface.pxPerMm > 0 ? surface.pxPerMm : undefined;
  const row: LetterRow = {
    id: letter.id, label: letter.label, codePoints: codePointsText(letter.label), reading: letter.reading, restored: letter.restored,
    surface: surface.name, line: letter.line, order: letter.order,
    x0Px: null, y0Px: null, x1Px: null, y1Px: null, x0Mm: null, y0Mm: null, x1Mm: null, y1Mm: null, widthMm: null, heightMm: null,
    strokeCount: shape ? shape.strokes.length : 0, meanPenWidthMm: null, restoredShare: null,
    sourceImage: img?.file ?? '', band: img?.band ?? '', pxPerMm: k ?? null, folder,
  };
  if (!shape) return row;
  const b = shape.boxPx;
  [row.x0Px, row.y0Px, row.x1Px, row.y1Px] = b.map((v) => round(v, 3));
  let len = 0, restoredLen = 0, widthSum = 0, n = 0;
  for (const st of shape.strokes) {
    const l = strokeLength(st);
    len += l;
    restoredLen += l * restoredShare(st);
    widthSum += meanWidth(st) * st.samples.length;
    n += st.samples.length;
  }
  row.restoredShare = round(len > 0 ? restoredLen / len : 0, 4);
  if (k) {
    [row.x0Mm, row.y0Mm, row.x1Mm, row.y1Mm] = b.map((v) => round(v / k, 4));
    row.widthMm = round((b[2] - b[0]) / k, 4);
    row.heightMm = round((b[3] - b[1]) / k, 4);
    row.meanPenWidthMm = round(widthSum / n / k, 4);
  }
  return row;
}

/**
 * The letter set as a zip (fflate, fixed timestamps: the same project gives the same
 * bytes). Letters of all surfaces unless `input.surfaceId` names one, in reading order.
 * Each crop is the letter's box of pen disks plus `opts.margin` (default 2 mm, or 2 px on
 * an uncalibrated surface, which the rows and strokes.json then say), widened to whole
 * pixels and cut to the image. The mask (8-bit grey, 255 inside) marks the pixels whose
 * centre lies inside the letter's pen outline under nonzero winding.
 * Throws ExportError when an image's bytes are missing or unreadable, or the margin is bad.
 */
export function letterSet(input: ExportInput, opts: LetterSetOptions = {}): Uint8Array {
  const margin = opts.margin ?? DEFAULT_MARGIN;
  if (!(Number.isFinite(margin) && margin >= 0)) throw new ExportError(`The margin must be a number of mm of 0 or more, not ${margin}.`);
  const { project } = input;
  const letters = lettersInReadingOrder(project, input.surfaceId);
  const mtime = new Date(Date.UTC(2000, 0, 1));
  const files: Zippable = {};
  const rasters = new Map<string, Raster>();
  const rasterOf = (img: ImageRef) => {
    let r = rasters.get(img.id);
    if (!r) rasters.set(img.id, (r = decodeRaster(img, input.images)));
    return r;
  };
  const rows: LetterRow[] = [];
  const usedFolders = new Set<string>();
  let uncalibrated = false;
  for (const letter of letters) {
    const shape = letterShape(project, letter);
    if (!shape) {
      rows.push(rowOf(project, letter, undefined, ''));
      continue;
    }
    const k = shape.pxPerMm;
    if (!k) uncalibrated = true;
    let folder = `${safePiece(shape.surface.name, 20)}-${String(letter.line).padStart(2, '0')}-${String(letter.order).padStart(3, '0')}-${letter.label ? safePiece(letter.label) : 'unlabelled'}`;
    if (usedFolders.has(folder)) folder += `-${safePiece(letter.id, 20)}`;
    usedFolders.add(folder);
    rows.push(rowOf(project, letter, shape, folder));

    const img0 = shape.surface.images[0];
    if (img0) {
      const m = k ? margin * k : margin;
      const [bx0, by0, bx1, by1] = shape.boxPx;
      const first = rasterOf(img0);
      const cx0 = Math.max(0, Math.floor(bx0 - m)), cy0 = Math.max(0, Math.floor(by0 - m));
      const cx1 = Math.min(first.width, Math.ceil(bx1 + m)), cy1 = Math.min(first.height, Math.ceil(by1 + m));
      const cw = cx1 - cx0, ch = cy1 - cy0;
      if (cw > 0 && ch > 0) {
        for (const img of shape.surface.images) {
          const r = rasterOf(img);
          const w = Math.min(cw, r.width - cx0), h = Math.min(ch, r.height - cy0);
          if (w <= 0 || h <= 0) continue;
          files[`${folder}/crop-${safePiece(img.band, 30)}.png`] = [pngOf(cropRaster(r, cx0, cy0, w, h), k), { level: 0, mtime }];
        }
        const mask = fillNonzero(shape.outline, cx0, cy0, cw, ch);
        for (let i = 0; i < mask.length; i++) mask[i] *= 255;
        const maskPng = encodePng({ width: cw, height: ch, data: mask, depth: 8, channels: 1 });
        files[`${folder}/mask.png`] = [k ? withPhys(maskPng, Math.round(k * 1000)) : maskPng, { level: 0, mtime }];
        files[`${folder}/crop.json`] = [strToU8(JSON.stringify({ x0: cx0, y0: cy0, x1: cx0 + cw, y1: cy0 + ch, unit: 'px', image: img0.file }) + '\n'), { level: 6, mtime }];
      }
    }
    files[`${folder}/letter.svg`] = [strToU8(letterSvg(shape, project)), { level: 6, mtime }];
    files[`${folder}/strokes.json`] = [strToU8(strokesJson(shape)), { level: 6, mtime }];
  }
  const note = uncalibrated
    ? 'Some surfaces are not calibrated: their mm fields are empty and their crop margins are in px.'
    : 'Boxes in px of the surface image and in mm on the object.';
  files['letters.csv'] = [strToU8(lettersCsv(rows)), { level: 6, mtime }];
  files['letters.json'] = [strToU8(JSON.stringify({ format: 'inkroute-letters', version: 1, title: project.title, note, columns: LETTER_COLUMNS, letters: rows }, null, 1) + '\n'), { level: 6, mtime }];
  return zipSync(files);
}
