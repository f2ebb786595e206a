/**
 * A small synthetic project for the text exports (TEI, annotations, letter set, chart):
 * "Sherd OT-17" from the Orvane terraces, invented. Two surfaces at different scales,
 * a second band (16-bit) on the recto, letters that are clear, doubtful, restored (whole
 * or in part), unlabelled, made of touching and of separate strokes, one running off the
 * image edge, labels that need escaping, a word divider and two lacunae.
 */
import type { Project, StrokeDoc, Surface } from '../../src/doc/model.ts';
import { addStroke, addTextMark, makeLetter, newProject, setInscription, setScale } from '../../src/doc/rules.ts';
import type { ExportImages } from '../../src/export/types.ts';
import { createGray } from '../../src/image/gray.ts';
import { encodeGrayPng } from '../../src/image/codec.ts';
import type { SampleSpan } from '../../src/trace/types.ts';

export const RECTO_W = 200, RECTO_H = 120, VERSO_W = 160, VERSO_H = 100;
export const RECTO_PX_PER_MM = 4, VERSO_PX_PER_MM = 8;
/** A label with a comma, quotes, a line break and markup: it must survive every format. */
export const NASTY_LABEL = 'a,"b"\n<script>&';

/** A straight stroke sampled every px or so with a constant pen radius, px. */
export function lineStroke(
  id: string, surfaceId: string, x0: number, y0: number, x1: number, y1: number, r: number, restoredSpans: SampleSpan[] = [],
): StrokeDoc {
  const n = Math.max(2, Math.ceil(Math.hypot(x1 - x0, y1 - y0)) + 1);
  const samples = [];
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    samples.push({ x: x0 + (x1 - x0) * t, y: y0 + (y1 - y0) * t, r, support: 1 });
  }
  return {
    id, surfaceId, anchors: [{ x: x0, y: y0 }, { x: x1, y: y1 }], samples, restoredSpans, overrides: [],
    cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 }, hidden: false,
  };
}

function grey(w: number, h: number, seed: number): Uint8Array {
  const img = createGray(w, h);
  // A gradient with a pattern, so that a crop's pixels tell where it came from.
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) img.data[y * w + x] = ((x * 7 + y * 13 + seed) % 256) / 255;
  return encodeGrayPng(img);
}

function grey16(w: number, h: number): Uint8Array {
  const img = createGray(w, h);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) img.data[y * w + x] = (x * 311 + y * 17) % 65536 / 65535;
  return encodeGrayPng(img, { depth: 16 });
}

export interface TextFixture {
  project: Project;
  images: ExportImages;
}

/** Builds the fixture; `calibrated: false` leaves the recto without a scale. */
export function textFixture(options: { calibrated?: boolean } = {}): TextFixture {
  const calibrated = options.calibrated ?? true;
  let p = newProject('Sherd OT-17 <from the "Orvane" terraces> & more', {
    band: 'visible', file: 'images/recto-visible.png', mime: 'image/png', width: RECTO_W, height: RECTO_H, bitDepth: 8,
  });
  const recto = p.surfaces[0];
  recto.images[0].id = 'img-recto-vis';
  recto.images.push({ id: 'img-recto-ir', band: 'infrared', file: 'images/recto-infrared.png', mime: 'image/png', width: RECTO_W, height: RECTO_H, bitDepth: 16 });
  const verso: Surface = {
    id: 'verso', name: 'verso', strokeOrder: [],
    images: [{ id: 'img-verso', band: 'visible', file: 'images/verso.png', mime: 'image/png', width: VERSO_W, height: VERSO_H, bitDepth: 8 }],
  };
  p = { ...p, id: 'p-ot17', surfaces: [recto, verso] };
  if (calibrated) p = setScale(p, 'recto', RECTO_PX_PER_MM, { kind: 'ruler', x0: 0, y0: 110, x1: 40, y1: 110, mm: 10 });
  p = setScale(p, 'verso', VERSO_PX_PER_MM, { kind: 'file', detail: 'pHYs' });
  p = setInscription(p, { script: 'Greek', direction: 'ltr', description: 'Ink on a sherd, <synthetic> & "invented".', creator: 'the Orvane survey' });

  const S = (st: StrokeDoc) => (p = addStroke(p, st));
  const L = (ids: string[], id: string, fields: Parameters<typeof makeLetter>[2] = {}) => {
    p = makeLetter(p, ids, fields, id).project;
  };
  // Line 1 of the recto (y 20..40): Α Β · Α Ξ(separate bars) Χ(crossing) ?(unlabelled)
  S(lineStroke('s1a', 'recto', 12, 40, 20, 20, 2)); S(lineStroke('s1b', 'recto', 20, 20, 28, 40, 2)); S(lineStroke('s1c', 'recto', 15, 32, 25, 32, 1.5));
  L(['s1a', 's1b', 's1c'], 'lA1', { label: 'Α' });
  S(lineStroke('s2a', 'recto', 40, 20, 40, 40, 2)); S(lineStroke('s2b', 'recto', 40, 20, 50, 30, 1.5));
  L(['s2a', 's2b'], 'lB1', { label: 'Β', reading: 'doubtful' });
  p = addTextMark(p, 'recto', 'divider', { x: 58, y: 30 }, undefined, 'm-div').project;
  S(lineStroke('s3a', 'recto', 64, 40, 72, 20, 2)); S(lineStroke('s3b', 'recto', 72, 20, 80, 40, 2, [{ from: 8, to: 21 }]));
  L(['s3a', 's3b'], 'lA2', { label: 'Α' });
  S(lineStroke('s4a', 'recto', 90, 21, 104, 21, 1.5)); S(lineStroke('s4b', 'recto', 92, 30, 102, 30, 1.5)); S(lineStroke('s4c', 'recto', 90, 39, 104, 39, 1.5));
  L(['s4a', 's4b', 's4c'], 'lXi', { label: 'Ξ' });
  S(lineStroke('s5a', 'recto', 114, 20, 128, 40, 2)); S(lineStroke('s5b', 'recto', 128, 20, 114, 40, 2));
  L(['s5a', 's5b'], 'lChi', { label: 'Χ', reading: 'doubtful', restored: true });
  S(lineStroke('s6a', 'recto', 140, 22, 150, 38, 2));
  L(['s6a'], 'lNone', {});
  // Line 2 (y 70..90): [c.3] Α(restored) Β(restored) NASTY [...] Β(off the right edge)
  p = addTextMark(p, 'recto', 'lacuna', { x: 8, y: 80 }, 3, 'm-gap3').project;
  S(lineStroke('s7a', 'recto', 24, 90, 32, 70, 2)); S(lineStroke('s7b', 'recto', 32, 70, 40, 90, 2));
  L(['s7a', 's7b'], 'lA3', { label: 'Α', restored: true });
  S(lineStroke('s8a', 'recto', 52, 70, 52, 90, 2)); S(lineStroke('s8b', 'recto', 52, 70, 60, 80, 2));
  L(['s8a', 's8b'], 'lB2', { label: 'Β', restored: true });
  S(lineStroke('s9a', 'recto', 74, 72, 84, 88, 2)); S(lineStroke('s9b', 'recto', 74, 88, 84, 72, 2));
  L(['s9a', 's9b'], 'lNasty', { label: NASTY_LABEL });
  p = addTextMark(p, 'recto', 'lacuna', { x: 120, y: 80 }, undefined, 'm-gapU').project;
  S(lineStroke('s10a', 'recto', 190, 70, 199, 90, 3)); S(lineStroke('s10b', 'recto', 190, 70, 199, 78, 2));
  L(['s10a', 's10b'], 'lB3', { label: 'Β' });
  // The verso, twice the resolution: an Α of the same size in mm as lA1 (lA1 doubled in px).
  S(lineStroke('v1a', 'verso', 24, 80, 40, 40, 4)); S(lineStroke('v1b', 'verso', 40, 40, 56, 80, 4)); S(lineStroke('v1c', 'verso', 30, 64, 50, 64, 3));
  L(['v1a', 'v1b', 'v1c'], 'lA4', { label: 'Α' });

  p = { ...p, modifiedAt: '2024-05-06T07:08:09.000Z' };
  const images: ExportImages = {
    'img-recto-vis': { bytes: grey(RECTO_W, RECTO_H, 0), mime: 'image/png' },
    'img-recto-ir': { bytes: grey16(RECTO_W, RECTO_H), mime: 'image/png' },
    'img-verso': { bytes: grey(VERSO_W, VERSO_H, 50), mime: 'image/png' },
  };
  return { project: p, images };
}
