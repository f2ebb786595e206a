/**
 * What the pen and time did along each stroke: the pen radius (smooth variation), the
 * ink contrast (fading, smooth along the stroke and across the surface) and abrasion
 * gaps, turning centrelines into truth strokes.
 */
import type { Random } from '../util/random.ts';
import type { Centreline, PlacedLetter } from './layout.ts';
import { latticeAt, makeWave, waveAt, type Lattice } from './noise.ts';
import type { IndexSpan, TruthSample, TruthStroke } from './types.ts';

export interface ProfileOptions {
  /** Base pen radius, px. */
  penRadius: number;
  /** 0..2: per-stroke radius ±8 % × w and along-stroke variation ±35 % × w. */
  widthVariation: number;
  /** Contrast goes down to 1 − 0.7 × fade (never below 0.05). */
  fade: number;
  /** Chance that each gap candidate of a stroke (one per 180 px, at least one) is erased. */
  abrasion: number;
  /** Regional fading across the surface, px coordinates, values in [-1, 1]. */
  fadeField: Lattice;
}

/** Gaps never come closer than this to a stroke end, px. */
export const GAP_END_MARGIN = 8;
/** Shortest and longest abrasion gap, px of arc. */
export const GAP_MIN = 5;
export const GAP_MAX = 40;
/** Largest total gap length of a stroke, as a share of the distance between its ends. */
export const MAX_GAP_SHARE_OF_CHORD = 0.3;
/**
 * Largest turn of the stroke across a gap and 3 px either side, radians (25°): where
 * the ink is lost at a corner, no smoothness prior can know where the corner was.
 */
export const MAX_GAP_TURN = (25 * Math.PI) / 180;
/** Samples (0.5 px each) on either side of a gap that must also keep clear of other strokes. */
const JUNCTION_MARGIN_SAMPLES = 12;
/** Visible ink kept between two gaps of one stroke, px. */
const GAP_SPACING = 10;

function clamp01(v: number): number {
  return v < 0 ? 0 : v > 1 ? 1 : v;
}

/**
 * Truth strokes of one letter. `rng` draws radii and fading, `gapRng` the gaps, so the
 * abrasion strength never changes the other two.
 */
export function profileLetter(letter: PlacedLetter, opts: ProfileOptions, rng: Random, gapRng: Random): TruthStroke[] {
  const w = Math.min(2, Math.max(0, opts.widthVariation));
  const radii: Float64Array[] = [];
  const contrasts: Float64Array[] = [];
  for (const line of letter.strokes) {
    // A stroke is one dip of the pen: its own mean radius, then a slow swell and thinning.
    const strokeRadius = opts.penRadius * (1 + 0.08 * w * rng.range(-1, 1));
    const widthWave = makeWave(rng, 40, 160);
    const fadeWave = makeWave(rng, 50, 200);
    const r = new Float64Array(line.count);
    const c = new Float64Array(line.count);
    for (let k = 0; k < line.count; k++) {
      const s = k * line.step;
      r[k] = strokeRadius * (1 + 0.35 * w * waveAt(widthWave, s));
      const x = line.xy[2 * k];
      const y = line.xy[2 * k + 1];
      // Half along the stroke, half regional; stretched so the full range is reached.
      const u = 0.25 * (waveAt(fadeWave, s) + 1) + 0.25 * (latticeAt(opts.fadeField, x, y) + 1);
      c[k] = Math.max(0.05, 1 - 0.7 * opts.fade * clamp01((u - 0.2) / 0.6));
    }
    radii.push(r);
    contrasts.push(c);
  }

  return letter.strokes.map((line, si) => {
    const gaps = placeGaps(letter.strokes, radii, si, opts.abrasion, gapRng);
    const r = radii[si];
    const c = contrasts[si];
    const samples: TruthSample[] = new Array(line.count);
    for (let k = 0; k < line.count; k++) {
      samples[k] = { x: line.xy[2 * k], y: line.xy[2 * k + 1], r: r[k], contrast: c[k] };
    }
    return { id: letter.strokeIds[si], letterId: letter.id, samples, gaps };
  });
}

/**
 * Abrasion gaps of stroke `si`: long enough that the ink really breaks (longer than the
 * pen diameter plus 5 px), at least 8 px from the ends, and centred away from the
 * letter's other strokes so that the break stays visible.
 */
function placeGaps(
  lines: Centreline[], radii: Float64Array[], si: number, abrasion: number, rng: Random,
): IndexSpan[] {
  const line = lines[si];
  const r = radii[si];
  const length = (line.count - 1) * line.step;
  let rMax = 0;
  for (let k = 0; k < r.length; k++) rMax = Math.max(rMax, r[k]);
  const shortest = Math.max(GAP_MIN + 0.5, 2 * rMax + 5);
  const candidates = 1 + Math.floor(length / 180);
  // The gaps of a stroke stay short against the distance between its ends: otherwise
  // the straight jump between the ends is as well supported by ink as the stroke.
  const ex = line.xy[0] - line.xy[2 * (line.count - 1)];
  const ey = line.xy[1] - line.xy[2 * (line.count - 1) + 1];
  const gapBudget = MAX_GAP_SHARE_OF_CHORD * Math.hypot(ex, ey);
  let gapTotal = 0;
  const gaps: IndexSpan[] = [];
  for (let m = 0; m < candidates; m++) {
    if (rng.next() >= abrasion) continue;
    for (let attempt = 0; attempt < 8; attempt++) {
      // Most gaps are short; about one in seven is 30–40 px.
      const longest = GAP_MAX - 0.5;
      const g = rng.next() < 0.85 ? rng.range(shortest, Math.max(shortest, 30)) : rng.range(Math.max(shortest, 30), longest);
      if (g > longest || g + 2 * GAP_END_MARGIN > length) break;
      const s0 = rng.range(GAP_END_MARGIN, length - GAP_END_MARGIN - g);
      const from = Math.ceil(s0 / line.step);
      const to = from + Math.round(g / line.step);
      if (to * line.step > length - GAP_END_MARGIN) continue;
      const overlaps = gaps.some((q) =>
        (from - q.to) * line.step < GAP_SPACING && (q.from - to) * line.step < GAP_SPACING);
      if (overlaps) continue;
      if (!spanIsClear(lines, radii, si, from - JUNCTION_MARGIN_SAMPLES, to + JUNCTION_MARGIN_SAMPLES)) continue;
      if (turning(line, from - 6, to + 6) > MAX_GAP_TURN) continue;
      if (gapTotal + (to - from) * line.step > gapBudget) continue;
      gapTotal += (to - from) * line.step;
      gaps.push({ from, to });
      break;
    }
  }
  gaps.sort((a, b) => a.from - b.from);
  return gaps;
}

/**
 * True when no other stroke of the letter comes within both radii + 4 px of samples
 * a..b. A gap next to a junction is ambiguous even to a person (the pen could have
 * turned onto the other stroke), so gaps keep clear of junctions.
 */
function spanIsClear(lines: Centreline[], radii: Float64Array[], si: number, a: number, b: number): boolean {
  const own = lines[si];
  for (let k = Math.max(0, a); k <= Math.min(own.count - 1, b); k++) {
    const x = own.xy[2 * k];
    const y = own.xy[2 * k + 1];
    const rk = radii[si][k];
    for (let o = 0; o < lines.length; o++) {
      if (o === si) continue;
      const { xy, count } = lines[o];
      const ro = radii[o];
      for (let j = 0; j < count; j++) {
        const reach = rk + ro[j] + 4;
        const dx = xy[2 * j] - x;
        const dy = xy[2 * j + 1] - y;
        if (dx * dx + dy * dy < reach * reach) return false;
      }
    }
  }
  return true;
}

/** Total absolute turning of a centreline between samples a and b, radians. */
function turning(line: Centreline, a: number, b: number): number {
  const { xy, count } = line;
  const lo = Math.max(1, a);
  const hi = Math.min(count - 2, b);
  let total = 0;
  for (let k = lo; k <= hi; k++) {
    const ax = xy[2 * k] - xy[2 * k - 2];
    const ay = xy[2 * k + 1] - xy[2 * k - 1];
    const bx = xy[2 * k + 2] - xy[2 * k];
    const by = xy[2 * k + 3] - xy[2 * k + 1];
    total += Math.abs(Math.atan2(ax * by - ay * bx, ax * bx + ay * by));
  }
  return total;
}
