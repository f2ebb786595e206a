/**
 * The pen outline of a stroke: the region the pen disks cover along it (with the hull
 * between consecutive disks), as closed rings (flat x, y, x, y, … in px, counter-clockwise
 * in image coordinates, i.e. positive shoelace area) whose nonzero fill is that region.
 *
 * The ring is the traced boundary of the swept pen: the right-hand outer tangents of
 * consecutive disks going forward, an arc round the last disk, the left-hand tangents
 * coming back, an arc round the first disk. Where a side turns outwards the tangents are
 * joined by an arc; where it turns inwards they are cut at their crossing. Arcs are drawn
 * as circumscribed polylines (corners at most OUTLINE_TOLERANCE beyond the circle), so the
 * polygon always holds the circle.
 *
 * Where the centreline bends tighter than the pen radius the inner offset folds into a
 * "swallowtail" loop. An offset curve drawn through the fold would turn the loop against
 * the ring and punch a hole under the nonzero rule; here the inner side crosses each
 * folded disk by a chord through it, so the loop turns the ring's way and only adds a
 * second layer. The fold is then cut out where a bounded search (at most SEARCH_EDGES
 * edges back and forward) finds the crossing that closes it and the rest of the ring is
 * seen to cover it; a loop turned the other way (the open eye of a curl) or not covered
 * by the rest (the stroke's end beyond a tight loop) is real and stays.
 *
 * Cost: O(n) for a stroke of n samples, O(n·SEARCH_EDGES) only around tight folds.
 */
export interface PenSample {
  x: number;
  y: number;
  r: number;
}

/** A closed ring, flat [x0, y0, x1, y1, …]; the closing edge is implied. */
export type Ring = number[];

/** Largest distance the polygon of a disk may lie beyond the circle, px. */
export const OUTLINE_TOLERANCE = 0.1;

/** How many edges back and forward the search for a fold's crossing looks. */
const SEARCH_EDGES = 64;
/** Disks either side of a loop's own that may hold its corners. */
const INSIDE_WINDOW = 12;

// Scratch buffers, grown as needed and reused by every call (no allocation per sample).
let cap = 0;
let nk = 0; // kept disks of the current stroke
let kx = new Float64Array(0); // kept disks
let ky = new Float64Array(0);
let kr = new Float64Array(0);
let rnx = new Float64Array(0); // right-hand tangent normal of each step
let rny = new Float64Array(0);
let lnx = new Float64Array(0); // left-hand tangent normal of each step
let lny = new Float64Array(0);
let vcap = 0;
let vx = new Float64Array(0); // raw ring vertices
let vy = new Float64Array(0);
let vd = new Int32Array(0); // kept disk each vertex belongs to
let vt = new Int32Array(0); // kept disk of an unresolved inner fold starting here, or -1
let vn = 0;
let sx = new Float64Array(0); // cleaned ring (a stack)
let sy = new Float64Array(0);
let sd = new Int32Array(0);

function ensureDisks(n: number): void {
  if (n <= cap) return;
  cap = Math.max(n, cap * 2);
  kx = new Float64Array(cap); ky = new Float64Array(cap); kr = new Float64Array(cap);
  rnx = new Float64Array(cap); rny = new Float64Array(cap); lnx = new Float64Array(cap); lny = new Float64Array(cap);
}

function ensureVerts(n: number): void {
  if (n <= vcap) return;
  const old = vcap;
  vcap = Math.max(n, vcap * 2, 256);
  const grow = <T extends Float64Array | Int32Array>(a: T, make: (k: number) => T): T => {
    const b = make(vcap);
    b.set(a.subarray(0, old));
    return b;
  };
  vx = grow(vx, (k) => new Float64Array(k)); vy = grow(vy, (k) => new Float64Array(k));
  vd = grow(vd, (k) => new Int32Array(k)); vt = grow(vt, (k) => new Int32Array(k));
  sx = new Float64Array(vcap); sy = new Float64Array(vcap); sd = new Int32Array(vcap);
}

function push(x: number, y: number, disk: number, trigger: number): void {
  if (vn >= vcap) ensureVerts(vn + 1);
  vx[vn] = x; vy[vn] = y; vd[vn] = disk; vt[vn] = trigger; vn++;
}

/**
 * Circumscribed arc round disk k from unit normal (ax, ay), turning by `span` radians in
 * the positive sense: only the corners are written, since the tangent points between
 * them are collinear with their neighbours.
 */
function arc(k: number, ax: number, ay: number, span: number): void {
  const r = kr[k];
  // Largest piece whose corner stays within the tolerance: r / cos(δ/2) − r ≤ tol.
  const dMax = 2 * Math.acos(r / (r + OUTLINE_TOLERANCE));
  const m = Math.max(1, Math.ceil(span / dMax - 1e-9));
  const d = span / m;
  const R = r / Math.cos(d / 2);
  const c1 = Math.cos(d / 2), s1 = Math.sin(d / 2);
  let ux = ax * c1 - ay * s1, uy = ax * s1 + ay * c1;
  const cd = Math.cos(d), sdd = Math.sin(d);
  for (let i = 0; i < m; i++) {
    push(kx[k] + R * ux, ky[k] + R * uy, k, -1);
    const nx = ux * cd - uy * sdd;
    uy = ux * sdd + uy * cd;
    ux = nx;
  }
}

/**
 * One side of the ring along disks a → b (step normals taken from nx, ny at the step's
 * lower index), starting on the tangent line of the first step. `dir` is +1 forward
 * (right-hand side) or −1 backward (left-hand side, whose normals serve the reversed
 * steps).
 */
function side(a: number, b: number, dir: 1 | -1, nx: Float64Array, ny: Float64Array): void {
  for (let k = a + dir; k !== b; k += dir) {
    const sPrev = dir > 0 ? k - 1 : k; // step arriving at disk k
    const sNext = dir > 0 ? k : k - 1; // step leaving it
    const ax = nx[sPrev], ay = ny[sPrev], bx = nx[sNext], by = ny[sNext];
    const cross = ax * by - ay * bx;
    const dot = ax * bx + ay * by;
    if (cross >= 0) {
      const r = kr[k];
      const q = r / (r + OUTLINE_TOLERANCE);
      if (dot > 0 && dot >= 2 * q * q - 1) {
        // One corner holds the arc (its turn is below 2·acos(r / (r + tol))): the miter
        // point r·(a + b) / (1 + a·b), with no trigonometry on this, the common, path.
        const f = r / (1 + dot);
        push(kx[k] + f * (ax + bx), ky[k] + f * (ay + by), k, -1);
      } else {
        // Straight on (span 0) or an exact reversal (span π: both sides go round the tip).
        arc(k, ax, ay, cross > 0 ? Math.atan2(cross, dot) : dot < 0 ? Math.PI : 0);
      }
      continue;
    }
    // Inner side: cut the tangent arriving (from the last vertex to Q) and the one leaving
    // (P to the next disk's tangent point) at their crossing.
    const r = kr[k];
    const qx = kx[k] + r * ax, qy = ky[k] + r * ay;
    const px = kx[k] + r * bx, py = ky[k] + r * by;
    const n = k + dir;
    const ex = kx[n] + kr[n] * bx, ey = ky[n] + kr[n] * by;
    const ox = vx[vn - 1], oy = vy[vn - 1];
    const d1x = qx - ox, d1y = qy - oy, d2x = ex - px, d2y = ey - py;
    const den = d1x * d2y - d1y * d2x;
    if (den !== 0) {
      const t = ((px - ox) * d2y - (py - oy) * d2x) / den;
      const u = ((px - ox) * d1y - (py - oy) * d1x) / den;
      if (t >= 0 && t <= 1 && u >= 0 && u <= 1) {
        push(ox + t * d1x, oy + t * d1y, k, -1);
        continue;
      }
    }
    // The tangents miss each other: a fold begins here. Keep both tangent points (the
    // chord between them lies inside disk k) and leave the loop to the crossing search.
    push(qx, qy, k, -1);
    push(px, py, k, k);
  }
}

function segCross(
  ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number, out: Float64Array,
): boolean {
  const rx = bx - ax, ry = by - ay, qx = dx - cx, qy = dy - cy;
  const den = rx * qy - ry * qx;
  if (den === 0) return false;
  const t = ((cx - ax) * qy - (cy - ay) * qx) / den;
  const u = ((cx - ax) * ry - (cy - ay) * rx) / den;
  if (t <= 0 || t >= 1 || u <= 0 || u >= 1) return false;
  out[0] = ax + t * rx;
  out[1] = ay + t * ry;
  return true;
}

const hit = new Float64Array(2);

/** Crossing-number winding of (px, py) for the edge (ax, ay) → (bx, by). */
function windEdge(ax: number, ay: number, bx: number, by: number, px: number, py: number): number {
  if (ay <= py) {
    if (by > py && (bx - ax) * (py - ay) - (px - ax) * (by - ay) > 0) return 1;
  } else if (by <= py && (bx - ax) * (py - ay) - (px - ax) * (by - ay) < 0) return -1;
  return 0;
}

function strictlyInside(x: number, y: number, k0: number, k1: number): boolean {
  for (let k = k0; k <= k1; k++) {
    const rr = kr[k] * (1 - 1e-6) - 1e-9;
    if (rr > 0 && (x - kx[k]) ** 2 + (y - ky[k]) ** 2 < rr * rr) return true;
  }
  return false;
}

/**
 * Whether the loop X, s[i+1..top] is a fold that can go: it turns the ring's way (so it
 * only adds a second layer, never a hole), each of its corners lies strictly inside a pen
 * disk nearby, and the rest of the ring (s[0..i], X, the raw vertices still to come from
 * `next`) covers its centroid. The open eye of a curl turns the other way; a real part of
 * the outline (a stroke's end beyond a tight loop) has corners on the edge of the ink.
 */
function foldToCut(i: number, top: number, hx: number, hy: number, start: number, next: number): boolean {
  let area = 0, cx = 0, cy = 0;
  let lo = sd[top], hi = sd[top];
  let px = hx, py = hy;
  for (let j = i + 1; j <= top + 1; j++) {
    const x = j <= top ? sx[j] : hx, y = j <= top ? sy[j] : hy;
    const c = px * y - x * py;
    area += c; cx += (px + x) * c; cy += (py + y) * c;
    if (j <= top) {
      if (sd[j] < lo) lo = sd[j];
      if (sd[j] > hi) hi = sd[j];
    }
    px = x; py = y;
  }
  if (!(area > 1e-12)) return false;
  const gx = cx / (3 * area), gy = cy / (3 * area);
  // Every corner of the loop but the crossing (which is on the edge) strictly inside some
  // pen disk nearby: the loop is inside the ink, not a piece of its edge.
  const k0 = Math.max(0, lo - INSIDE_WINDOW), k1 = Math.min(nk - 1, hi + INSIDE_WINDOW);
  for (let j = i + 1; j <= top; j++) if (!strictlyInside(sx[j], sy[j], k0, k1)) return false;
  let w = 0;
  for (let j = 0; j < i; j++) w += windEdge(sx[j], sy[j], sx[j + 1], sy[j + 1], gx, gy);
  w += windEdge(sx[i], sy[i], hx, hy, gx, gy);
  let ax = hx, ay = hy;
  for (let step = next; step < vn; step++) {
    const idx = (start + step) % vn;
    w += windEdge(ax, ay, vx[idx], vy[idx], gx, gy);
    ax = vx[idx]; ay = vy[idx];
  }
  w += windEdge(ax, ay, sx[0], sy[0], gx, gy);
  return w >= 1;
}

/**
 * Cleans the raw ring into the stack: starting at a vertex of its convex hull (which no
 * fold can hold), and after each fold's start, looks for the crossing that closes the
 * fold and cuts the fold out when foldToCut allows. Returns the stack size.
 */
function clean(): number {
  let start = 0;
  for (let i = 1; i < vn; i++) if (vx[i] < vx[start] || (vx[i] === vx[start] && vy[i] < vy[start])) start = i;
  let top = -1;
  let pendingAt = -1; // stack index where the oldest open fold began
  let sinceTrigger = 0;
  for (let step = 0; step <= vn; step++) {
    const idx = (start + step) % vn;
    const x = vx[idx], y = vy[idx];
    if (top >= 1 && pendingAt >= 0) {
      const lo = Math.max(0, pendingAt - SEARCH_EDGES);
      // Prefer the crossing furthest back: it closes the whole fold at once.
      const tx = sx[top], ty = sy[top];
      const bx0 = tx < x ? tx : x, bx1 = tx < x ? x : tx, by0 = ty < y ? ty : y, by1 = ty < y ? y : ty;
      for (let i = lo; i <= top - 2; i++) {
        // Boxes first: most edges of the window are nowhere near the new one.
        const ax = sx[i], ay = sy[i], cx = sx[i + 1], cy = sy[i + 1];
        if ((ax < bx0 && cx < bx0) || (ax > bx1 && cx > bx1) || (ay < by0 && cy < by0) || (ay > by1 && cy > by1)) continue;
        if (!segCross(sx[i], sy[i], sx[i + 1], sy[i + 1], sx[top], sy[top], x, y, hit)) continue;
        if (!foldToCut(i, top, hit[0], hit[1], start, step)) continue;
        top = i + 1;
        sx[top] = hit[0]; sy[top] = hit[1]; sd[top] = sd[i];
        // A cut from before the fold began closes it; one inside it leaves the fold open.
        pendingAt = i < pendingAt ? -1 : Math.min(pendingAt, top);
        break;
      }
    }
    if (step === vn) break;
    top++;
    sx[top] = x; sy[top] = y; sd[top] = vd[idx];
    if (vt[idx] >= 0) {
      if (pendingAt < 0) pendingAt = top;
      sinceTrigger = 0;
    } else if (pendingAt >= 0 && ++sinceTrigger > SEARCH_EDGES) {
      // Nothing closes this fold nearby (a hairpin's legs lie side by side): it stays, and
      // it does no harm, since a fold only ever adds a second layer.
      pendingAt = -1;
    }
  }
  return top + 1;
}

function ringOf(a: number, b: number, out: Ring[]): void {
  if (b === a) {
    vn = 0;
    ensureVerts(64);
    arc(a, 1, 0, 2 * Math.PI);
    const ring: Ring = new Array(vn * 2);
    for (let i = 0; i < vn; i++) { ring[2 * i] = vx[i]; ring[2 * i + 1] = vy[i]; }
    out.push(ring);
    return;
  }
  vn = 0;
  // Start cap round disk a, from the left normal of the first step to its right normal.
  {
    const ax = lnx[a], ay = lny[a], bx = rnx[a], by = rny[a];
    let span = Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
    if (span <= 0) span += 2 * Math.PI;
    arc(a, ax, ay, span);
  }
  side(a, b, 1, rnx, rny);
  {
    const s = b - 1;
    const ax = rnx[s], ay = rny[s], bx = lnx[s], by = lny[s];
    let span = Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
    if (span <= 0) span += 2 * Math.PI;
    arc(b, ax, ay, span);
  }
  side(b, a, -1, lnx, lny);
  const n = clean();
  let area = 0;
  if (n > 0) for (let i = 0, j = n - 1; i < n; j = i++) area += sx[j] * sy[i] - sx[i] * sy[j];
  if (!(area > 0)) {
    // Defensive: a ring turned inside out is split in two rings that share a disk, each
    // exact on its own (not seen in the tests).
    const k = (a + b) >> 1;
    if (k > a && k < b) {
      ringOf(a, k, out);
      ringOf(k, b, out);
      return;
    }
    // Two disks only: the raw ring is a convex hull and always right.
  }
  const ring: Ring = new Array(n * 2);
  for (let i = 0; i < n; i++) { ring[2 * i] = sx[i]; ring[2 * i + 1] = sy[i]; }
  out.push(ring);
}

/**
 * Outline of samples from..to (inclusive) of a stroke, px: normally one ring; more where
 * the stroke folds too tightly for one. An empty range gives no ring.
 */
export function penOutline(samples: readonly PenSample[], from = 0, to = samples.length - 1): Ring[] {
  from = Math.max(0, from);
  to = Math.min(samples.length - 1, to);
  if (to < from) return [];
  ensureDisks(to - from + 1);
  // Keep the disks no neighbour holds: a held disk adds nothing, and the tangents of a
  // pair need d > |r₁ − r₀|.
  let m = 0;
  for (let i = from; i <= to; i++) {
    const s = samples[i];
    const r = s.r > 0 ? s.r : 0;
    if (!Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(r)) continue;
    let held = false;
    while (m > 0) {
      const ex = s.x - kx[m - 1], ey = s.y - ky[m - 1];
      const d = Math.sqrt(ex * ex + ey * ey);
      if (d + r <= kr[m - 1] + 1e-9) { held = true; break; }
      if (d + kr[m - 1] <= r + 1e-9) { m--; continue; }
      break;
    }
    if (held) continue;
    kx[m] = s.x; ky[m] = s.y; kr[m] = r; m++;
  }
  nk = m;
  const out: Ring[] = [];
  if (m === 0) return out;
  if (m === 1 && kr[0] === 0) return out;
  for (let j = 0; j + 1 < m; j++) {
    const dx = kx[j + 1] - kx[j], dy = ky[j + 1] - ky[j];
    const d = Math.sqrt(dx * dx + dy * dy);
    const ux = dx / d, uy = dy / d;
    const c = (kr[j] - kr[j + 1]) / d;
    const h = Math.sqrt(Math.max(0, 1 - c * c));
    // perp(u) = (−uy, ux); right = c·u − h·perp(u), left = c·u + h·perp(u).
    rnx[j] = c * ux + h * uy; rny[j] = c * uy - h * ux;
    lnx[j] = c * ux - h * uy; lny[j] = c * uy + h * ux;
  }
  ensureVerts(64);
  ringOf(0, m - 1, out);
  return out;
}
