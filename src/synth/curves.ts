/**
 * Smooth curve pieces for letter templates (lines, elliptical arcs, cubic Béziers),
 * polylines with round corners, and arc-length sampling of a chain of pieces.
 * Template coordinates: x right, y down, letter height 1 (the "unit box").
 */

export interface LineSegment {
  kind: 'line';
  x0: number; y0: number; x1: number; y1: number;
}

/** Elliptical arc: point(a) = (cx + rx cos a, cy + ry sin a), a from a0 to a1 (radians, y down). */
export interface ArcSegment {
  kind: 'arc';
  cx: number; cy: number; rx: number; ry: number; a0: number; a1: number;
}

export interface CubicSegment {
  kind: 'cubic';
  x0: number; y0: number; x1: number; y1: number;
  x2: number; y2: number; x3: number; y3: number;
}

export type Segment = LineSegment | ArcSegment | CubicSegment;

/** One pen movement: pieces that join end to start with a continuous tangent. */
export type StrokePath = Segment[];

export function line(x0: number, y0: number, x1: number, y1: number): LineSegment {
  return { kind: 'line', x0, y0, x1, y1 };
}

/** Elliptical arc; angles in degrees for readable templates (0° = +x, 90° = down). */
export function arc(cx: number, cy: number, rx: number, ry: number, deg0: number, deg1: number): ArcSegment {
  const k = Math.PI / 180;
  return { kind: 'arc', cx, cy, rx, ry, a0: deg0 * k, a1: deg1 * k };
}

export function cubic(
  x0: number, y0: number, x1: number, y1: number,
  x2: number, y2: number, x3: number, y3: number,
): CubicSegment {
  return { kind: 'cubic', x0, y0, x1, y1, x2, y2, x3, y3 };
}

/**
 * A polyline through `points` whose corners are replaced by tangent circular fillets of
 * radius `radius` (shrunk where a leg is too short), so the path turns smoothly: the
 * sharpest turn rate is 1/radius.
 */
export function rounded(points: ReadonlyArray<readonly [number, number]>, radius: number): StrokePath {
  if (points.length < 2) throw new RangeError('rounded: need at least two points');
  const out: Segment[] = [];
  let cx = points[0][0];
  let cy = points[0][1];
  for (let k = 1; k < points.length - 1; k++) {
    const [px, py] = points[k];
    const [qx, qy] = points[k + 1];
    const inLen = Math.hypot(px - points[k - 1][0], py - points[k - 1][1]);
    const outLen = Math.hypot(qx - px, qy - py);
    const ux = (px - points[k - 1][0]) / inLen;
    const uy = (py - points[k - 1][1]) / inLen;
    const vx = (qx - px) / outLen;
    const vy = (qy - py) / outLen;
    const cross = ux * vy - uy * vx;
    const dot = ux * vx + uy * vy;
    const turn = Math.atan2(cross, dot);
    if (Math.abs(turn) < 1e-9) continue;
    // The fillet may use at most half of each leg so that consecutive fillets never overlap.
    const half = Math.tan(Math.abs(turn) / 2);
    const t = Math.min(radius * half, 0.5 * inLen, 0.5 * outLen);
    const rho = t / half;
    const ax = px - ux * t;
    const ay = py - uy * t;
    const bx = px + vx * t;
    const by = py + vy * t;
    // Centre lies on the inner side of the turn, perpendicular to the incoming leg.
    const side = cross > 0 ? 1 : -1;
    const ccx = ax - uy * rho * side;
    const ccy = ay + ux * rho * side;
    out.push(line(cx, cy, ax, ay));
    const a0 = Math.atan2(ay - ccy, ax - ccx);
    out.push({ kind: 'arc', cx: ccx, cy: ccy, rx: rho, ry: rho, a0, a1: a0 + turn });
    cx = bx;
    cy = by;
  }
  const last = points[points.length - 1];
  out.push(line(cx, cy, last[0], last[1]));
  return out;
}

/** Point of a segment at parameter t in [0, 1], written into out[0..1]. */
export function segmentPoint(s: Segment, t: number, out: Float64Array): void {
  if (s.kind === 'line') {
    out[0] = s.x0 + (s.x1 - s.x0) * t;
    out[1] = s.y0 + (s.y1 - s.y0) * t;
  } else if (s.kind === 'arc') {
    const a = s.a0 + (s.a1 - s.a0) * t;
    out[0] = s.cx + s.rx * Math.cos(a);
    out[1] = s.cy + s.ry * Math.sin(a);
  } else {
    const u = 1 - t;
    const b0 = u * u * u;
    const b1 = 3 * u * u * t;
    const b2 = 3 * u * t * t;
    const b3 = t * t * t;
    out[0] = b0 * s.x0 + b1 * s.x1 + b2 * s.x2 + b3 * s.x3;
    out[1] = b0 * s.y0 + b1 * s.y1 + b2 * s.y2 + b3 * s.y3;
  }
}

/** An upper bound of a segment's length in template units (for choosing a flattening step). */
export function segmentLengthBound(s: Segment): number {
  if (s.kind === 'line') return Math.hypot(s.x1 - s.x0, s.y1 - s.y0);
  if (s.kind === 'arc') return Math.abs(s.a1 - s.a0) * Math.max(s.rx, s.ry);
  return Math.hypot(s.x1 - s.x0, s.y1 - s.y0) + Math.hypot(s.x2 - s.x1, s.y2 - s.y1) +
    Math.hypot(s.x3 - s.x2, s.y3 - s.y2);
}

/** Affine map from template units to image px: x' = a x + b y + c, y' = d x + e y + f. */
export interface Affine {
  a: number; b: number; c: number; d: number; e: number; f: number;
}

/** A dense centreline in px: interleaved x, y pairs. */
export interface Polyline {
  xy: Float64Array;
  count: number;
}

/**
 * Flatten a stroke path through an affine map into a dense polyline (points at most
 * `stepPx` apart, default 0.1 px), fine enough that resampling it at 0.5 px is exact
 * to well under a hundredth of a pixel.
 */
export function flattenPath(path: StrokePath, map: Affine, stepPx = 0.1): Polyline {
  // Scale of the map bounds how much a template length grows in px.
  const gain = Math.max(Math.hypot(map.a, map.d), Math.hypot(map.b, map.e)) + Math.abs(map.b) + Math.abs(map.d);
  const counts = path.map((s) => Math.max(2, Math.ceil((segmentLengthBound(s) * gain) / stepPx) + 1));
  const total = counts.reduce((acc, n) => acc + n, 0);
  const xy = new Float64Array(total * 2);
  const p = new Float64Array(2);
  let k = 0;
  for (let si = 0; si < path.length; si++) {
    const n = counts[si];
    // Skip the first point of later pieces: it repeats the previous piece's end.
    for (let i = si === 0 ? 0 : 1; i < n; i++) {
      segmentPoint(path[si], i / (n - 1), p);
      xy[k++] = map.a * p[0] + map.b * p[1] + map.c;
      xy[k++] = map.d * p[0] + map.e * p[1] + map.f;
    }
  }
  return { xy, count: k / 2 };
}

/** Arc length of a polyline, px. */
export function polylineLength(line: Polyline): number {
  const { xy, count } = line;
  let len = 0;
  for (let i = 1; i < count; i++) len += Math.hypot(xy[2 * i] - xy[2 * i - 2], xy[2 * i + 1] - xy[2 * i - 1]);
  return len;
}

/**
 * Resample a polyline at equal arc-length steps of at most `maxStep` px (default 0.5),
 * first and last points kept. Returns the points and the step actually used.
 */
export function resampleEven(line: Polyline, maxStep = 0.5): { xy: Float64Array; count: number; step: number } {
  const total = polylineLength(line);
  const intervals = Math.max(1, Math.ceil(total / maxStep));
  const step = total / intervals;
  const out = new Float64Array((intervals + 1) * 2);
  const { xy, count } = line;
  out[0] = xy[0];
  out[1] = xy[1];
  let seg = 1;
  let segStart = 0; // arc length at point seg - 1
  let segLen = count > 1 ? Math.hypot(xy[2] - xy[0], xy[3] - xy[1]) : 0;
  for (let k = 1; k < intervals; k++) {
    const target = k * step;
    while (seg < count - 1 && segStart + segLen < target) {
      segStart += segLen;
      seg++;
      segLen = Math.hypot(xy[2 * seg] - xy[2 * seg - 2], xy[2 * seg + 1] - xy[2 * seg - 1]);
    }
    const t = segLen > 0 ? Math.min(1, (target - segStart) / segLen) : 0;
    out[2 * k] = xy[2 * seg - 2] + (xy[2 * seg] - xy[2 * seg - 2]) * t;
    out[2 * k + 1] = xy[2 * seg - 1] + (xy[2 * seg + 1] - xy[2 * seg - 1]) * t;
  }
  out[2 * intervals] = xy[2 * count - 2];
  out[2 * intervals + 1] = xy[2 * count - 1];
  return { xy: out, count: intervals + 1, step };
}
