/**
 * Stains: irregular blotches darker than the ink (soil, burnt residue) reaching 8–40 px
 * from their centre. Each stain is a few overlapping wobbly lobes with a soft edge, a
 * slightly darker tide-line rim and mottled inside. Painted as a darkness layer d in
 * [0, 1) that the image is multiplied by (1 − d).
 */
import type { Random } from '../util/random.ts';
import { latticeAt, makeLattice } from './noise.ts';
import { inkWithin, someSampleNear, type SampleGrid } from './sampleGrid.ts';

export interface StainPolicy {
  /** Keep every stain clear of all ink (the 'easy' test images). */
  avoidInk: boolean;
  /** Otherwise: the largest share of any stroke's samples that all stains together may cover. */
  maxStrokeShare: number;
  /** Rectangles [x0, y0, x1, y1] px where no stain goes (the ruler). */
  keepOut: ReadonlyArray<readonly [number, number, number, number]>;
}

/** A painted stain: centre and largest radius, px. */
export interface StainRecord {
  x: number;
  y: number;
  radius: number;
}

/** Harmonics 2..7 of a lobe's outline. */
const HARMONICS = 6;
/** Lobes per stain at most. */
const MAX_LOBES = 4;
/** Shortest and longest reach of a stain from its centre, px. */
export const STAIN_MIN_RADIUS = 8;
export const STAIN_MAX_RADIUS = 40;

/** A stain's shape: lobe centres, mean radii and outline harmonics, in flat arrays. */
interface Shape {
  lobes: number;
  lx: Float64Array;
  ly: Float64Array;
  mean: Float64Array;
  /** amp and phase of lobe l, harmonic h at l * HARMONICS + h. */
  amp: Float64Array;
  phase: Float64Array;
  edge: number;
  reach: number;
}

function newShape(): Shape {
  return {
    lobes: 0,
    lx: new Float64Array(MAX_LOBES), ly: new Float64Array(MAX_LOBES), mean: new Float64Array(MAX_LOBES),
    amp: new Float64Array(MAX_LOBES * HARMONICS), phase: new Float64Array(MAX_LOBES * HARMONICS),
    edge: 0, reach: 0,
  };
}

/** Draw a shape whose reach from (0, 0) is within [8, 40] px (edge included). */
function drawShape(shape: Shape, rng: Random): void {
  // Small stains are a little commoner than big ones.
  const u = rng.next();
  const main = 7 + 19 * Math.pow(u, 1.4);
  shape.edge = rng.range(1.5, 4);
  shape.lobes = 1 + rng.int(0, MAX_LOBES - 1);
  let reach = 0;
  for (let l = 0; l < shape.lobes; l++) {
    const m = l === 0 ? main : main * rng.range(0.35, 0.7);
    const a = rng.range(0, 2 * Math.PI);
    const off = l === 0 ? 0 : main * rng.range(0.5, 0.95);
    shape.lx[l] = off * Math.cos(a);
    shape.ly[l] = off * Math.sin(a);
    shape.mean[l] = m;
    let wobble = 0;
    for (let h = 0; h < HARMONICS; h++) {
      // Lower harmonics bend the outline, higher ones fray it.
      shape.amp[l * HARMONICS + h] = rng.range(0, 0.12 / (h + 1));
      shape.phase[l * HARMONICS + h] = rng.range(0, 2 * Math.PI);
      wobble += shape.amp[l * HARMONICS + h];
    }
    reach = Math.max(reach, off + m * (1 + wobble));
  }
  shape.reach = Math.min(STAIN_MAX_RADIUS, Math.max(STAIN_MIN_RADIUS, reach + shape.edge / 2));
}

/**
 * Signed depth inside the stain at offset (dx, dy) px from its centre: outline radius
 * minus distance, maximum over lobes (> 0 inside), clipped to the stain's reach.
 */
function inside(shape: Shape, dx: number, dy: number): number {
  let best = -Infinity;
  for (let l = 0; l < shape.lobes; l++) {
    const ex = dx - shape.lx[l];
    const ey = dy - shape.ly[l];
    const d = Math.sqrt(ex * ex + ey * ey);
    const theta = Math.atan2(ey, ex);
    let f = 1;
    const base = l * HARMONICS;
    for (let h = 0; h < HARMONICS; h++) f += shape.amp[base + h] * Math.cos((h + 2) * theta + shape.phase[base + h]);
    const s = shape.mean[l] * f - d;
    if (s > best) best = s;
  }
  const clip = shape.reach - shape.edge / 2 - Math.sqrt(dx * dx + dy * dy);
  return clip < best ? clip : best;
}

/**
 * Paint `count` stains into `dark` (width × height), avoiding or hardly touching ink as
 * `policy` says. A stain that cannot be placed in 40 tries is skipped.
 */
export function paintStains(
  dark: Float32Array, width: number, height: number, count: number,
  grid: SampleGrid, strokeSampleCounts: ArrayLike<number>, policy: StainPolicy, rng: Random,
): StainRecord[] {
  const covered = new Float64Array(strokeSampleCounts.length);
  const tentative = new Float64Array(strokeSampleCounts.length);
  let maxInkRadius = 0;
  for (let k = 0; k < grid.r.length; k++) maxInkRadius = Math.max(maxInkRadius, grid.r[k]);
  const shape = newShape();
  const records: StainRecord[] = [];

  for (let m = 0; m < count; m++) {
    for (let attempt = 0; attempt < 40; attempt++) {
      drawShape(shape, rng);
      // Even the lightest pixel of the core stays darker than full-strength ink (depth ≤ 0.75).
      const depth = rng.range(0.86, 0.94);
      const x = rng.range(0, width);
      const y = rng.range(0, height);
      const reach = shape.reach;
      if (policy.keepOut.some((b) => x + reach > b[0] && x - reach < b[2] && y + reach > b[1] && y - reach < b[3])) continue;

      if (policy.avoidInk) {
        if (inkWithin(grid, x, y, reach + 3, maxInkRadius)) continue;
      } else {
        tentative.fill(0);
        someSampleNear(grid, x, y, reach, (id) => {
          if (inside(shape, grid.xy[2 * id] - x, grid.xy[2 * id + 1] - y) > -0.5 * shape.edge) tentative[grid.stroke[id]]++;
          return false;
        });
        let ok = true;
        for (let s = 0; s < tentative.length && ok; s++) {
          if (tentative[s] > 0 && (covered[s] + tentative[s]) / strokeSampleCounts[s] > policy.maxStrokeShare) ok = false;
        }
        if (!ok) continue;
        for (let s = 0; s < tentative.length; s++) covered[s] += tentative[s];
      }
      paintOne(dark, width, height, x, y, shape, depth, rng);
      records.push({ x, y, radius: reach });
      break;
    }
  }
  return records;
}

function paintOne(
  dark: Float32Array, width: number, height: number, x: number, y: number, shape: Shape, depth: number, rng: Random,
): void {
  const mottle = makeLattice(rng, 2 * shape.reach + 2, 2 * shape.reach + 2, rng.range(3, 7));
  const i0 = Math.max(0, Math.floor(x - shape.reach));
  const i1 = Math.min(width - 1, Math.floor(x + shape.reach));
  const j0 = Math.max(0, Math.floor(y - shape.reach));
  const j1 = Math.min(height - 1, Math.floor(y + shape.reach));
  const x0 = x - shape.reach;
  const y0 = y - shape.reach;
  const rimWidth = 2 + shape.edge;
  for (let j = j0; j <= j1; j++) {
    const dy = j + 0.5 - y;
    for (let i = i0; i <= i1; i++) {
      const dx = i + 0.5 - x;
      const s = inside(shape, dx, dy);
      let alpha = s / shape.edge + 0.5;
      if (alpha <= 0) continue;
      if (alpha > 1) alpha = 1;
      // Pigment gathers at the drying edge: a little darker just inside the outline.
      const rim = s > 0 && s < rimWidth ? 1 : 0.94;
      const grain = 1 + 0.03 * latticeAt(mottle, i + 0.5 - x0, j + 0.5 - y0);
      let v = depth * alpha * rim * grain;
      if (v > 0.96) v = 0.96;
      const p = j * width + i;
      dark[p] = 1 - (1 - dark[p]) * (1 - v);
    }
  }
}
