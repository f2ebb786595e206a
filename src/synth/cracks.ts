/**
 * Cracks and scratches: thin (0.6–1.5 px) dark lines that wander across the surface and
 * are not ink. Cracks meander and may branch; scratches run nearly straight. Painted as a
 * darkness layer (maximum over lines) that the image is multiplied by (1 − d).
 */
import type { Random } from '../util/random.ts';
import { inkWithin, type SampleGrid } from './sampleGrid.ts';

export interface CrackPolicy {
  /** Keep every crack clear of all ink (the 'easy' test images). */
  avoidInk: boolean;
  /** Largest pen radius of the inscription, px (for the clearance test). */
  maxInkRadius: number;
}

/** A painted crack: its centreline and width, px. */
export interface CrackRecord {
  width: number;
  points: [number, number][];
}

/** Step of the random walk, px. */
const STEP = 1.5;

/**
 * Paint `count` cracks (each may add one branch) into `dark`. When ink may be crossed,
 * every second crack is aimed at a random stroke so that some do cross the writing.
 */
export function paintCracks(
  dark: Float32Array, width: number, height: number, count: number,
  grid: SampleGrid, policy: CrackPolicy, rng: Random,
): CrackRecord[] {
  const diagonal = Math.hypot(width, height);
  const records: CrackRecord[] = [];
  const clearance = policy.maxInkRadius + 3 + 1;
  for (let m = 0; m < count; m++) {
    for (let attempt = 0; attempt < 12; attempt++) {
      const scratch = rng.next() < 0.3;
      const lineWidth = rng.range(0.6, 1.5);
      const depth = rng.range(0.35, 0.6);
      const length = rng.range(0.08, 0.3) * diagonal;
      let x: number;
      let y: number;
      let heading: number;
      if (!policy.avoidInk && m % 2 === 0 && grid.r.length > 0) {
        // Start beside a random sample and head across the stroke.
        const id = Math.floor(rng.next() * grid.r.length);
        const a = rng.range(0, 2 * Math.PI);
        const d = rng.range(15, 40);
        x = grid.xy[2 * id] + d * Math.cos(a);
        y = grid.xy[2 * id + 1] + d * Math.sin(a);
        heading = a + Math.PI + rng.range(-0.3, 0.3);
      } else {
        x = rng.range(0, width);
        y = rng.range(0, height);
        heading = rng.range(0, 2 * Math.PI);
      }
      if (policy.avoidInk && inkWithin(grid, x, y, clearance + lineWidth, policy.maxInkRadius)) continue;
      const points = walk(x, y, heading, length, scratch ? 0.01 : 0.06, width, height, grid, policy, clearance + lineWidth, rng);
      if (points.length * STEP < 30) continue;
      paintLine(dark, width, height, points, lineWidth / 2, depth);
      records.push({ width: lineWidth, points });
      if (!scratch && rng.next() < 0.35) {
        const at = points[rng.int(Math.floor(points.length / 4), Math.floor((3 * points.length) / 4))];
        const side = rng.next() < 0.5 ? -1 : 1;
        const branch = walk(at[0], at[1], heading + side * rng.range(0.5, 1.1), length * rng.range(0.25, 0.5),
          0.06, width, height, grid, policy, clearance + lineWidth, rng);
        if (branch.length >= 8) {
          const branchWidth = Math.max(0.6, 0.7 * lineWidth);
          paintLine(dark, width, height, branch, branchWidth / 2, depth * 0.85);
          records.push({ width: branchWidth, points: branch });
        }
      }
      break;
    }
  }
  return records;
}

/**
 * A wandering walk: the heading drifts around its starting value with a slowly changing,
 * mean-reverting bend plus jitter (`wander` rad per step), never more than ±1 rad off, so
 * cracks meander without curling up. Stops at the image edge, at `length` px, or, if ink
 * must be avoided, before coming within `clearance` px of a pen disk.
 */
function walk(
  x: number, y: number, heading: number, length: number, wander: number, width: number, height: number,
  grid: SampleGrid, policy: CrackPolicy, clearance: number, rng: Random,
): [number, number][] {
  const points: [number, number][] = [[x, y]];
  let bend = 0;
  let deviation = 0;
  for (let s = 0; s < length; s += STEP) {
    bend = 0.9 * bend + 0.3 * wander * rng.normal();
    deviation = Math.max(-1, Math.min(1, 0.995 * deviation + bend + wander * rng.normal()));
    x += STEP * Math.cos(heading + deviation);
    y += STEP * Math.sin(heading + deviation);
    if (x < 0 || y < 0 || x >= width || y >= height) break;
    if (policy.avoidInk && inkWithin(grid, x, y, clearance, policy.maxInkRadius)) break;
    points.push([x, y]);
  }
  return points;
}

/**
 * Paint a polyline of half-width `halfWidth` px with coverage clamp(hw − d + 0.5, 0, 1)
 * (d = distance to the polyline), thinning over the last 10 px at each end.
 */
function paintLine(
  dark: Float32Array, width: number, height: number, points: [number, number][], halfWidth: number, depth: number,
): void {
  const n = points.length;
  for (let k = 0; k + 1 < n; k++) {
    const [ax, ay] = points[k];
    const [bx, by] = points[k + 1];
    const taper = Math.min(1, (k * STEP) / 10, ((n - 1 - k) * STEP) / 10);
    const hw = halfWidth * (0.4 + 0.6 * taper);
    const reach = hw + 0.5;
    const i0 = Math.max(0, Math.floor(Math.min(ax, bx) - reach));
    const i1 = Math.min(width - 1, Math.floor(Math.max(ax, bx) + reach));
    const j0 = Math.max(0, Math.floor(Math.min(ay, by) - reach));
    const j1 = Math.min(height - 1, Math.floor(Math.max(ay, by) + reach));
    const ex = bx - ax;
    const ey = by - ay;
    const len2 = ex * ex + ey * ey || 1;
    for (let j = j0; j <= j1; j++) {
      const py = j + 0.5 - ay;
      for (let i = i0; i <= i1; i++) {
        const px = i + 0.5 - ax;
        let t = (px * ex + py * ey) / len2;
        if (t < 0) t = 0;
        else if (t > 1) t = 1;
        const dx = px - t * ex;
        const dy = py - t * ey;
        let c = hw + 0.5 - Math.sqrt(dx * dx + dy * dy);
        if (c <= 0) continue;
        if (c > 1) c = 1;
        const v = depth * c;
        const p = j * width + i;
        if (v > dark[p]) dark[p] = v;
      }
    }
  }
}
