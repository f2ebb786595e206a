/**
 * Closest points on polylines, the one geometric question the scores ask.
 * Polylines are kept as flat coordinate arrays so that scoring a whole inscription
 * allocates nothing per query.
 */

/** A polyline with a pen radius per vertex, as flat arrays (px). */
export interface RadiusPolyline {
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  readonly rs: Float64Array;
  /** Bounding box of the vertices, px: used to skip far polylines quickly. */
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
  /** Largest radius, px. */
  readonly rMax: number;
}

/** Where a query point meets a polyline: segment k..k+1 at parameter t in [0, 1]. */
export interface ClosestPoint {
  /** Distance from the query point to the polyline, px. */
  distance: number;
  /** Index of the segment's first vertex (0 for a single-vertex polyline). */
  segment: number;
  /** Position along the segment, 0 at vertex `segment`, 1 at the next one. */
  t: number;
  /** Radius interpolated linearly at the closest point, px. */
  r: number;
}

export function toRadiusPolyline(points: ReadonlyArray<{ x: number; y: number; r: number }>): RadiusPolyline {
  const n = points.length;
  if (n === 0) throw new RangeError('a polyline needs at least one sample');
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const rs = new Float64Array(n);
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity, rMax = 0;
  for (let i = 0; i < n; i++) {
    const p = points[i];
    xs[i] = p.x;
    ys[i] = p.y;
    rs[i] = p.r;
    if (p.x < x0) x0 = p.x;
    if (p.x > x1) x1 = p.x;
    if (p.y < y0) y0 = p.y;
    if (p.y > y1) y1 = p.y;
    if (p.r > rMax) rMax = p.r;
  }
  return { xs, ys, rs, x0, y0, x1, y1, rMax };
}

export function createClosestPoint(): ClosestPoint {
  return { distance: Infinity, segment: 0, t: 0, r: 0 };
}

/**
 * Closest point of the polyline to (px, py), written into `out` (also returned).
 * Ties keep the earliest segment, so a query on a shared vertex reports t = 1 on the
 * segment before it.
 */
export function closestOnPolyline(line: RadiusPolyline, px: number, py: number, out: ClosestPoint = createClosestPoint()): ClosestPoint {
  const { xs, ys, rs } = line;
  const n = xs.length;
  if (n === 1) {
    out.distance = Math.hypot(px - xs[0], py - ys[0]);
    out.segment = 0;
    out.t = 0;
    out.r = rs[0];
    return out;
  }
  let best = Infinity;
  let bestK = 0;
  let bestT = 0;
  for (let k = 0; k < n - 1; k++) {
    const ax = xs[k], ay = ys[k];
    const dx = xs[k + 1] - ax, dy = ys[k + 1] - ay;
    const len2 = dx * dx + dy * dy;
    let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
    if (t < 0) t = 0;
    else if (t > 1) t = 1;
    const ex = ax + t * dx - px, ey = ay + t * dy - py;
    const d2 = ex * ex + ey * ey;
    if (d2 < best) {
      best = d2;
      bestK = k;
      bestT = t;
    }
  }
  out.distance = Math.sqrt(best);
  out.segment = bestK;
  out.t = bestT;
  out.r = rs[bestK] + bestT * (rs[bestK + 1] - rs[bestK]);
  return out;
}

/** Lower bound of the distance from (px, py) to anything inside the polyline's box, px. */
export function distanceToBox(line: RadiusPolyline, px: number, py: number): number {
  const dx = px < line.x0 ? line.x0 - px : px > line.x1 ? px - line.x1 : 0;
  const dy = py < line.y0 ? line.y0 - py : py > line.y1 ? py - line.y1 : 0;
  return Math.hypot(dx, dy);
}
