/**
 * The invented alphabet of the synthetic inscriptions: sixteen letters, each one to three
 * pen strokes in writing order. Coordinates are in a box of height 1 and width `width`
 * (x right, y down). Every stroke is a single smooth movement: no corner is sharper than
 * a fillet of radius 0.08 (about 6 px at the test-set scale), so a stroke never turns by
 * more than ~30° over 3 px. Strokes of one letter may touch or cross at junctions, but
 * a stroke that starts on another one ends far (≥ 0.45 letter heights) from every other
 * stroke and none runs alongside another, so the inked route between a stroke's two
 * ends is the stroke itself, not a detour over a neighbour and a short jump. No stroke's
 * ends are closer than 0.45 of its length (a loop or a sharp V is two strokes, as with a
 * reed pen): from its two ends alone a stroke that nearly closes on itself cannot be told
 * from the straight jump between them, and a person tracing one adds an anchor.
 */
import { arc, cubic, line, rounded, type StrokePath } from './curves.ts';

/**
 * A circular arc followed by a straight tail leaving along the arc's end tangent
 * (angles in degrees, increasing; tail length in letter heights).
 */
function hook(cx: number, cy: number, r: number, deg0: number, deg1: number, tail: number): StrokePath {
  const a = (deg1 * Math.PI) / 180;
  const ex = cx + r * Math.cos(a);
  const ey = cy + r * Math.sin(a);
  return [arc(cx, cy, r, r, deg0, deg1), line(ex, ey, ex - tail * Math.sin(a), ey + tail * Math.cos(a))];
}

export interface LetterTemplate {
  /** The letter's invented name. */
  name: string;
  /** Width of the template box in letter heights. */
  width: number;
  /** Strokes in writing order, each in writing direction. */
  strokes: StrokePath[];
}

export const ALPHABET: readonly LetterTemplate[] = [
  // A valley: two slanting strokes meeting at the foot.
  { name: 'vel', width: 0.72, strokes: [[line(0, 0, 0.36, 1)], [line(0.36, 1, 0.72, 0)]] },
  // A stem, then a hook that leaves the stem and rises to the right.
  {
    name: 'tark', width: 0.62, strokes: [
      [line(0.12, 0, 0.12, 1)],
      [cubic(0.12, 0.46, 0.42, 0.46, 0.62, 0.32, 0.6, 0.02)],
    ],
  },
  // An oval left open at the upper right, written as two half-bows.
  { name: 'osh', width: 0.8, strokes: [[arc(0.4, 0.5, 0.4, 0.5, -70, -220)], [arc(0.4, 0.5, 0.4, 0.5, -220, -370)]] },
  // A wide bow over a short upright.
  { name: 'merro', width: 1.0, strokes: [[arc(0.5, 0.95, 0.5, 0.85, 200, 340)], [line(0.5, 0.5, 0.5, 1)]] },
  // A double curve with a short upright through its waist.
  {
    name: 'dulm', width: 0.62, strokes: [
      [
        cubic(0.58, 0.08, 0.12, -0.1, -0.05, 0.42, 0.31, 0.5),
        cubic(0.31, 0.5, 0.67, 0.58, 0.5, 1.1, 0.04, 0.92),
      ],
      [line(0.31, 0.34, 0.31, 0.66)],
    ],
  },
  // A straight diagonal crossed by a curved one.
  {
    name: 'kesk', width: 0.7, strokes: [
      [line(0, 0, 0.7, 1)],
      [cubic(0.7, 0, 0.32, 0.22, 0.4, 0.78, 0, 1)],
    ],
  },
  // A stem with an arm leaving its middle, bending down to the foot line.
  {
    name: 'irun', width: 0.66, strokes: [
      [line(0.12, 0, 0.12, 1)],
      rounded([[0.12, 0.42], [0.66, 0.42], [0.66, 1]], 0.16),
    ],
  },
  // A cup with a short upright inside it.
  {
    name: 'ulo', width: 0.66, strokes: [
      rounded([[0, 0], [0, 1], [0.33, 1]], 0.28),
      rounded([[0.33, 1], [0.66, 1], [0.66, 0]], 0.28),
      [line(0.33, 0.22, 0.33, 0.6)],
    ],
  },
  // A zigzag of three bars.
  { name: 'fenn', width: 0.66, strokes: [rounded([[0, 0.02], [0.66, 0.02], [0, 0.98], [0.66, 0.98]], 0.1)] },
  // A hook over a footing bar.
  {
    name: 'sorv', width: 0.74, strokes: [
      hook(0.31, 0.33, 0.3, 190, 330, 0.3),
      [line(0.02, 1, 0.6, 1)],
    ],
  },
  // A stem standing on a rounded tent.
  {
    name: 'yeth', width: 0.7, strokes: [
      [line(0.35, 0, 0.35, 0.54)],
      rounded([[0, 1], [0.35, 0.42], [0.7, 1]], 0.12),
    ],
  },
  // Two uprights joined by a slanting bar.
  {
    name: 'zir', width: 0.6, strokes: [
      [line(0, 0, 0, 1)],
      [line(0.6, 0, 0.6, 1)],
      [line(0.02, 0.3, 0.58, 0.7)],
    ],
  },
  // An upright with a hook over its left side (the script runs right to left).
  {
    name: 'pell', width: 0.62, strokes: [
      [line(0.58, 1, 0.58, 0)],
      rounded([[0.58, 0.02], [0.02, 0.02], [0.02, 0.58]], 0.2),
    ],
  },
  // An arch open at the bottom above a base line.
  {
    name: 'quon', width: 0.8, strokes: [
      [arc(0.4, 0.45, 0.38, 0.42, 120, 270)],
      [arc(0.4, 0.45, 0.38, 0.42, 270, 420)],
      [line(0, 1.02, 0.8, 1.02)],
    ],
  },
  // A stem with an arch that springs from it leftwards and comes down.
  {
    name: 'brai', width: 0.64, strokes: [
      [line(0.56, 0, 0.56, 1)],
      [cubic(0.56, 0.45, 0.3, 0.18, 0.02, 0.2, 0.02, 1)],
    ],
  },
  // Two waves, one above the other.
  {
    name: 'thenn', width: 0.8, strokes: [
      [cubic(0, 0.24, 0.27, -0.08, 0.53, 0.52, 0.8, 0.2)],
      [cubic(0, 0.8, 0.27, 0.48, 0.53, 1.08, 0.8, 0.76)],
    ],
  },
];
