/**
 * Placement of letters in lines: picks the letters, sizes them to fill the writing area,
 * slants and jitters them like a hand, and turns every stroke into a centreline sampled
 * every ≤ 0.5 px of arc length. Lines run in the reading direction; letters of one line
 * are kept apart by at least three worst-case pen radii plus 4 px.
 */
import type { Random } from '../util/random.ts';
import { ALPHABET, type LetterTemplate } from './alphabet.ts';
import { flattenPath, resampleEven, type Affine } from './curves.ts';

/** A stroke centreline in px, points ≤ 0.5 px apart along the arc. */
export interface Centreline {
  /** Interleaved x, y, px. */
  xy: Float64Array;
  count: number;
  /** Arc length between consecutive points, px (≤ 0.5). */
  step: number;
}

export interface PlacedLetter {
  id: string;
  name: string;
  /** From 1, top line first. */
  line: number;
  /** From 1, in reading direction. */
  order: number;
  strokeIds: string[];
  strokes: Centreline[];
}

export interface Layout {
  /** Nominal letter height, px. */
  letterHeight: number;
  /** Base pen radius of the inscription, px. */
  penRadius: number;
  /** Smallest centreline distance kept between letters, px. */
  letterSeparation: number;
  /** Writing area [x0, y0, x1, y1], px. */
  area: [number, number, number, number];
  /** Band kept free of writing at the bottom for the ruler [x0, y0, x1, y1], px. */
  rulerBand: [number, number, number, number];
  letters: PlacedLetter[];
}

export interface LayoutOptions {
  width: number;
  height: number;
  lines: number;
  lettersPerLine: [number, number];
  direction: 'ltr' | 'rtl';
  /** Strength of the width variation, used for the worst-case pen radius. */
  widthVariation: number;
}

/** Worst-case ratio of a local pen radius to the base radius (see profile.ts). */
export function radiusSpread(widthVariation: number): number {
  const w = Math.min(2, Math.max(1, widthVariation));
  return (1 + 0.08 * w) * (1 + 0.35 * w);
}

interface Draft {
  template: LetterTemplate;
  shear: number;
  scale: number;
  /** Centreline bounding box of the slanted, scaled template, letter heights. */
  bx0: number;
  bx1: number;
  gap: number;
}

/** Template map before sizing: slant (x shifts with height) and scale jitter. */
function unitMap(shear: number, scale: number): Affine {
  return { a: scale, b: -scale * shear, c: scale * shear, d: 0, e: scale, f: 0 };
}

function unitBox(template: LetterTemplate, map: Affine): [number, number, number, number] {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const path of template.strokes) {
    // 0.002 letter heights is well under 0.5 px for any letter height used here.
    const pl = flattenPath(path, map, 0.002);
    for (let k = 0; k < pl.count; k++) {
      const x = pl.xy[2 * k];
      const y = pl.xy[2 * k + 1];
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      if (y > y1) y1 = y;
    }
  }
  return [x0, y0, x1, y1];
}

export function layoutLetters(opts: LayoutOptions, rng: Random): Layout {
  const { width: W, height: H, lines, direction } = opts;
  const marginX = Math.round(0.05 * W);
  const top = Math.round(0.07 * H);
  const bandHeight = Math.round(0.14 * H);
  const area: [number, number, number, number] = [marginX, top, W - marginX, H - bandHeight];
  const pitch = (area[3] - area[1]) / lines;
  const startJitter = 0.03 * W;
  const usable = area[2] - area[0] - startJitter;

  // A slant shared by the whole hand, with a little per letter.
  const slant = rng.range(-0.1, 0.1);
  const radiusFactor = rng.range(0.9, 1.1);
  const drafts: Draft[][] = [];
  for (let ln = 0; ln < lines; ln++) {
    const count = rng.int(opts.lettersPerLine[0], opts.lettersPerLine[1]);
    const row: Draft[] = [];
    let previous = -1;
    for (let k = 0; k < count; k++) {
      let pick = rng.int(0, ALPHABET.length - 1);
      // No letter twice in a row: repeated neighbours look like a layout bug.
      if (pick === previous) pick = (pick + 1 + rng.int(0, ALPHABET.length - 2)) % ALPHABET.length;
      previous = pick;
      const template = ALPHABET[pick];
      const shear = slant + rng.range(-0.04, 0.04);
      const scale = 1 + rng.range(-0.05, 0.05);
      const [bx0, , bx1] = unitBox(template, unitMap(shear, scale));
      row.push({ template, shear, scale, bx0, bx1, gap: rng.range(0.26, 0.34) });
    }
    drafts.push(row);
  }

  // Pen radius grows with the letter height: r = (1.3 + 0.0133 h) × factor (about 2.5 px
  // for 90 px letters, 3.6 px for 170 px letters). The letters
  // must stay apart by 3 r_max + 4 px (+1 px margin) or 0.26–0.34 h, whichever is more.
  const spread = radiusSpread(opts.widthVariation);
  const sepA = 3 * 1.3 * radiusFactor * spread + 5;
  const sepB = 3 * 0.0133 * radiusFactor * spread;
  let letterHeight = 0.6 * pitch;
  for (const row of drafts) {
    const widths = row.reduce((acc, d) => acc + (d.bx1 - d.bx0), 0);
    const n = row.length - 1;
    // Both gap rules are linear in h, so the largest h that fits is the smaller root.
    const byRatio = usable / (widths + n * 0.34);
    const bySeparation = (usable - n * sepA) / (widths + n * sepB);
    letterHeight = Math.min(letterHeight, byRatio, bySeparation);
  }
  if (!(letterHeight > 8)) {
    throw new RangeError(`synthesize: ${W}×${H} px is too small for ${lines} lines of up to ${opts.lettersPerLine[1]} letters`);
  }
  const penRadius = (1.3 + 0.0133 * letterHeight) * radiusFactor;
  const separation = sepA + sepB * letterHeight;

  const tilt = rng.range(-0.008, 0.008);
  const letters: PlacedLetter[] = [];
  for (let ln = 0; ln < lines; ln++) {
    const row = drafts[ln];
    const centreY = area[1] + (ln + 0.5) * pitch;
    let cursor = direction === 'rtl' ? area[2] - rng.range(0, startJitter) : area[0] + rng.range(0, startJitter);
    for (let k = 0; k < row.length; k++) {
      const d = row[k];
      const h = letterHeight;
      const ox = direction === 'rtl' ? cursor - h * d.bx1 : cursor - h * d.bx0;
      const midX = ox + h * 0.5 * (d.bx0 + d.bx1);
      const oy = centreY - 0.5 * h * d.scale + tilt * (midX - W / 2) + rng.range(-0.025, 0.025) * h;
      const u = unitMap(d.shear, d.scale);
      const map: Affine = { a: h * u.a, b: h * u.b, c: h * u.c + ox, d: 0, e: h * u.e, f: oy };
      const gap = Math.max(separation, d.gap * h);
      cursor = direction === 'rtl' ? ox + h * d.bx0 - gap : ox + h * d.bx1 + gap;

      const id = `L${ln + 1}.${k + 1}`;
      const strokes: Centreline[] = [];
      const strokeIds: string[] = [];
      d.template.strokes.forEach((path, si) => {
        const pl = flattenPath(path, map, 0.1);
        const even = resampleEven(pl, 0.5);
        strokes.push({ xy: even.xy, count: even.count, step: even.step });
        strokeIds.push(`${id}-s${si + 1}`);
      });
      letters.push({ id, name: d.template.name, line: ln + 1, order: k + 1, strokeIds, strokes });
    }
  }
  return {
    letterHeight,
    penRadius,
    letterSeparation: separation - 1,
    area,
    rulerBand: [0, H - bandHeight, W, H],
    letters,
  };
}
