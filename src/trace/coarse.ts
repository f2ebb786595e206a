/**
 * The cheap first path: a shortest 8-connected path on the half-resolution smoothed
 * ink evidence, priced like the solver's adherence with a typical width fit: per px
 * λ + A · (q · κ · typicalFit + (1 − q) · offInk), q the presence ramp of the evidence.
 * It only places the search tube; the exact solve decides the stroke.
 */
import { cellAt, boxDomain } from './domain.ts';
import { presenceRamp, type ChordModel, type Weights } from './energy.ts';
import { FlatHeap } from './heap.ts';
import { COARSE_FACTOR, type PreparedInk } from './prepare.ts';

/** In + Out of a pen well placed on real ink with soft edges, px (a typical value). */
const TYPICAL_FIT = 1.5;

const NX = [1, 1, 0, -1, -1, -1, 0, 1];
const NY = [0, 1, 1, 1, 0, -1, -1, -1];

/**
 * Full-resolution pixel path (columns, rows) from pixel (ax, ay) to (bx, by).
 * The search is confined to the anchors' bounding box widened by `margin` px.
 */
export function coarsePath(
  prep: PreparedInk, ax: number, ay: number, bx: number, by: number, weights: Weights, chord: ChordModel, margin: number,
): { x: Int32Array; y: Int32Array } {
  // Curved strokes bulge away from the chord between their ends: widen the box with
  // the distance, and again whenever the path runs along the box's edge.
  let m = Math.max(margin, 0.6 * Math.hypot(bx - ax, by - ay));
  for (let attempt = 0; ; attempt++) {
    const res = coarsePathInBox(prep, ax, ay, bx, by, weights, chord, m);
    if (!res.touchesEdge || attempt >= 2) return res;
    m *= 2;
  }
}

function coarsePathInBox(
  prep: PreparedInk, ax: number, ay: number, bx: number, by: number, weights: Weights, chord: ChordModel, margin: number,
): { x: Int32Array; y: Int32Array; touchesEdge: boolean } {
  const f = COARSE_FACTOR;
  const cimg = prep.coarse;
  const sx = Math.min(cimg.width - 1, Math.floor(ax / f));
  const sy = Math.min(cimg.height - 1, Math.floor(ay / f));
  const tx = Math.min(cimg.width - 1, Math.floor(bx / f));
  const ty = Math.min(cimg.height - 1, Math.floor(by / f));
  const m = Math.ceil(margin / f);
  const dom = boxDomain(cimg.width, cimg.height, Math.min(sx, tx) - m, Math.min(sy, ty) - m, Math.max(sx, tx) + m, Math.max(sy, ty) + m);
  const n = dom.count;
  const g = new Float64Array(n).fill(Infinity);
  const parent = new Int32Array(n).fill(-1);
  const done = new Uint8Array(n);
  const heap = new FlatHeap(1024);
  const start = cellAt(dom, sx, sy);
  const goal = cellAt(dom, tx, ty);
  const lam = weights.length;
  const A = weights.adherence;
  // Per-pixel price of arriving, from the presence ramp of the coarse evidence.
  const price = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    const q = presenceRamp(cimg.data[dom.cellY[c] * cimg.width + dom.cellX[c]], chord);
    price[c] = lam + A * (q * chord.fitWeight * TYPICAL_FIT + (1 - q) * chord.offInk);
  }
  g[start] = 0;
  heap.push(start, lam * f * Math.hypot(tx - sx, ty - sy));
  while (heap.length > 0) {
    const c = heap.pop();
    if (done[c]) continue;
    done[c] = 1;
    if (c === goal) break;
    const x = dom.cellX[c];
    const y = dom.cellY[c];
    for (let i = 0; i < 8; i++) {
      const c2 = cellAt(dom, x + NX[i], y + NY[i]);
      if (c2 < 0 || done[c2]) continue;
      const x2 = x + NX[i];
      const y2 = y + NY[i];
      const len = (i & 1 ? Math.SQRT2 : 1) * f;
      const ng = g[c] + len * price[c2];
      if (ng < g[c2]) {
        g[c2] = ng;
        parent[c2] = c;
        heap.push(c2, ng + lam * f * Math.hypot(tx - x2, ty - y2));
      }
    }
  }
  const cx: number[] = [];
  const cy: number[] = [];
  let touchesEdge = false;
  for (let c = goal; c >= 0; c = parent[c]) {
    const x = dom.cellX[c];
    const y = dom.cellY[c];
    if ((x === dom.x0 && x > 0) || (y === dom.y0 && y > 0) ||
        (x === dom.x0 + dom.w - 1 && x < cimg.width - 1) || (y === dom.y0 + dom.h - 1 && y < cimg.height - 1)) {
      touchesEdge = true;
    }
    cx.push(x);
    cy.push(y);
  }
  cx.reverse();
  cy.reverse();
  // Back to full resolution, with the exact anchor pixels at both ends.
  const px = new Int32Array(cx.length + 2);
  const py = new Int32Array(cy.length + 2);
  px[0] = ax;
  py[0] = ay;
  for (let i = 0; i < cx.length; i++) {
    px[i + 1] = cx[i] * f + (f >> 1);
    py[i + 1] = cy[i] * f + (f >> 1);
  }
  px[px.length - 1] = bx;
  py[py.length - 1] = by;
  return { x: px, y: py, touchesEdge };
}
