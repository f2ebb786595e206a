/**
 * A small single-line font of our own for the text a raster needs without a font engine:
 * the scale bar's label ("20 mm") and the line numbers. Digits, '.', 'm' and the space;
 * each glyph a few polylines on a unit grid (x right, y up from the baseline, digits 1
 * high), drawn as pen outlines (outline.ts) so the PNG's text is ink like its strokes.
 */
import { penOutline, type Ring } from './outline.ts';
import type { DrawingText } from './drawing.ts';

type Glyph = { advance: number; lines: [number, number][][] };

const DIGIT = 0.78;
const GLYPHS: Record<string, Glyph> = {
  '0': { advance: DIGIT, lines: [[[0.3, 1], [0.52, 0.88], [0.6, 0.5], [0.52, 0.12], [0.3, 0], [0.08, 0.12], [0, 0.5], [0.08, 0.88], [0.3, 1]]] },
  '1': { advance: DIGIT, lines: [[[0.12, 0.8], [0.34, 1], [0.34, 0]], [[0.1, 0], [0.58, 0]]] },
  '2': { advance: DIGIT, lines: [[[0.04, 0.8], [0.18, 0.96], [0.44, 0.98], [0.58, 0.82], [0.54, 0.6], [0, 0], [0.6, 0]]] },
  '3': { advance: DIGIT, lines: [[[0.04, 0.9], [0.3, 1], [0.55, 0.88], [0.55, 0.64], [0.3, 0.53], [0.56, 0.42], [0.58, 0.14], [0.3, 0], [0.02, 0.1]]] },
  '4': { advance: DIGIT, lines: [[[0.46, 0], [0.46, 1], [0, 0.3], [0.62, 0.3]]] },
  '5': { advance: DIGIT, lines: [[[0.56, 1], [0.08, 1], [0.05, 0.56], [0.34, 0.6], [0.56, 0.46], [0.58, 0.14], [0.3, 0], [0.02, 0.1]]] },
  '6': { advance: DIGIT, lines: [[[0.52, 0.95], [0.3, 1], [0.08, 0.85], [0, 0.45], [0.05, 0.12], [0.3, 0], [0.55, 0.12], [0.58, 0.36], [0.4, 0.56], [0.15, 0.52], [0.02, 0.38]]] },
  '7': { advance: DIGIT, lines: [[[0, 1], [0.6, 1], [0.2, 0]]] },
  '8': { advance: DIGIT, lines: [[[0.3, 0.55], [0.08, 0.68], [0.08, 0.88], [0.3, 1], [0.52, 0.88], [0.52, 0.68], [0.3, 0.55], [0.03, 0.38], [0.05, 0.12], [0.3, 0], [0.55, 0.12], [0.57, 0.38], [0.3, 0.55]]] },
  '9': { advance: DIGIT, lines: [[[0.58, 0.62], [0.45, 0.46], [0.2, 0.46], [0.03, 0.62], [0.05, 0.88], [0.3, 1], [0.52, 0.9], [0.6, 0.6], [0.55, 0.2], [0.3, 0], [0.08, 0.05]]] },
  '.': { advance: 0.4, lines: [[[0.12, 0], [0.16, 0]]] },
  'm': {
    advance: 0.9,
    lines: [[[0, 0], [0, 0.7]], [[0, 0.55], [0.12, 0.7], [0.25, 0.7], [0.32, 0.56], [0.32, 0]], [[0.32, 0.56], [0.42, 0.7], [0.55, 0.7], [0.62, 0.56], [0.62, 0]]],
  },
  ' ': { advance: 0.4, lines: [] },
};

/** Height of a digit against the font size (its cap height). */
const CAP = 0.7;
/** Pen radius against the font size. */
const PEN = 0.05;

/** Whether every character of `text` has a glyph here. */
export function canDraw(text: string): boolean {
  for (const ch of text) if (!GLYPHS[ch]) return false;
  return text.length > 0;
}

/** Width of `text` in the units of its size (mm for the drawing's text). */
export function textWidth(text: string, size: number): number {
  let w = 0;
  for (const ch of text) w += GLYPHS[ch]?.advance ?? 0;
  return w * CAP * size;
}

/**
 * The text as pen-outline rings in the drawing's units (mm), placed as the SVG places it
 * (x by its anchor, y on the baseline). Characters without a glyph are left out.
 */
export function textRings(t: DrawingText): Ring[] {
  const k = CAP * t.size;
  const width = textWidth(t.text, t.size);
  let x = t.anchor === 'start' ? t.x : t.anchor === 'end' ? t.x - width : t.x - width / 2;
  const r = PEN * t.size;
  const rings: Ring[] = [];
  for (const ch of t.text) {
    const g = GLYPHS[ch];
    if (!g) continue;
    for (const line of g.lines) {
      // Pen samples every tenth of a unit, so that the outline follows the glyph's corners.
      const samples: { x: number; y: number; r: number }[] = [];
      for (let i = 0; i < line.length; i++) {
        const [ax, ay] = line[i];
        if (i === 0) samples.push({ x: x + ax * k, y: t.y - ay * k, r });
        if (i + 1 >= line.length) continue;
        const [bx, by] = line[i + 1];
        const steps = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / 0.1));
        for (let s = 1; s <= steps; s++) {
          const u = s / steps;
          samples.push({ x: x + (ax + (bx - ax) * u) * k, y: t.y - (ay + (by - ay) * u) * k, r });
        }
      }
      for (const ring of penOutline(samples)) rings.push(ring);
    }
    x += g.advance * k;
  }
  return rings;
}
