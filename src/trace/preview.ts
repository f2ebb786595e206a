/**
 * Live preview while following: once the start is set, a shortest-path tree grows
 * from it in time slices over a square neighbourhood, on a cheaper model than the
 * exact solve (position × 8 directions, the smoothed ink evidence instead of the pen
 * chord, no radius). The path to any pixel the tree has reached is then read off in
 * well under a millisecond per hundred px, and given a best pen radius per sample.
 *
 * The queue is a bucket queue (Dial's algorithm) with buckets no wider than the
 * smallest move cost, which keeps the order exact for Dijkstra without a heap.
 */
import { createGray } from '../image/gray.ts';
import { gaussianBlur } from '../image/filters.ts';
import { ChordProfile, chordAdherence, chordPresence, chordSupport, DEFAULT_CHORD, DEFAULT_WEIGHTS, type Weights } from './energy.ts';
import { DEFAULT_RADIUS } from './follow.ts';
import type { PreparedInk } from './prepare.ts';
import type { Point, StrokeSample } from './types.ts';

const DIRS = 8;
const PX = new Int32Array([1, 1, 0, -1, -1, -1, 0, 1]);
const PY = new Int32Array([0, 1, 1, 1, 0, -1, -1, -1]);
const PLEN = new Float64Array([1, Math.SQRT2, 1, Math.SQRT2, 1, Math.SQRT2, 1, Math.SQRT2]);

export interface PreviewOptions {
  /** Half-size of the square neighbourhood covered, px. Default 200 (a 400×400 area). */
  extent?: number;
  weights?: Partial<Weights>;
  radius?: [number, number];
}

export class PreviewTree {
  readonly x0: number;
  readonly y0: number;
  readonly w: number;
  readonly h: number;
  /** States settled so far, and in all. */
  settled = 0;
  readonly total: number;
  private readonly cost: Float32Array;
  private readonly dist: Float64Array;
  private readonly parent: Int32Array;
  private readonly done: Uint8Array;
  private readonly next: Int32Array;
  private readonly prev: Int32Array;
  private readonly bucketOf: Int32Array;
  private readonly heads: Int32Array;
  private readonly bucketWidth: number;
  private current = 0;
  private queued = 0;
  private cancelled = false;
  private readonly turn: Float64Array;
  private readonly prep: PreparedInk;
  private readonly radius: [number, number];
  private readonly profile: ChordProfile;

  constructor(prep: PreparedInk, start: Point, options: PreviewOptions = {}) {
    const ink = prep.evidence;
    const ext = options.extent ?? 200;
    const weights = { ...DEFAULT_WEIGHTS, ...options.weights };
    this.prep = prep;
    this.radius = options.radius ?? DEFAULT_RADIUS;
    this.profile = new ChordProfile(this.radius[1], DEFAULT_CHORD);
    const sx = Math.floor(start.x);
    const sy = Math.floor(start.y);
    this.x0 = Math.max(0, sx - ext);
    this.y0 = Math.max(0, sy - ext);
    const x1 = Math.min(ink.width - 1, sx + ext - 1);
    const y1 = Math.min(ink.height - 1, sy + ext - 1);
    this.w = x1 - this.x0 + 1;
    this.h = y1 - this.y0 + 1;
    const n = this.w * this.h;
    this.total = n * DIRS;
    // Move cost per px into each pixel: λ + A · offInk · (1 − smoothed evidence).
    const crop = new Float32Array(n);
    for (let y = 0; y < this.h; y++) {
      crop.set(ink.data.subarray((this.y0 + y) * ink.width + this.x0, (this.y0 + y) * ink.width + this.x0 + this.w), y * this.w);
    }
    const smooth = gaussianBlur(createGray(this.w, this.h, crop), 1, crop).data;
    this.cost = new Float32Array(n);
    const off = weights.adherence * DEFAULT_CHORD.offInk;
    for (let i = 0; i < n; i++) this.cost[i] = weights.length + off * (1 - smooth[i]);
    this.turn = new Float64Array(DIRS * DIRS);
    for (let a = 0; a < DIRS; a++) {
      for (let b = 0; b < DIRS; b++) {
        const k = Math.min((b - a + DIRS) % DIRS, (a - b + DIRS) % DIRS);
        const dt = (k * Math.PI) / 4;
        this.turn[a * DIRS + b] = (weights.curvature * dt * dt) / (0.5 * (PLEN[a] + PLEN[b]));
      }
    }
    this.dist = new Float64Array(this.total).fill(Infinity);
    this.parent = new Int32Array(this.total).fill(-1);
    this.done = new Uint8Array(this.total);
    this.next = new Int32Array(this.total);
    this.prev = new Int32Array(this.total);
    this.bucketOf = new Int32Array(this.total).fill(-1);
    this.bucketWidth = Math.max(1e-3, weights.length);
    let maxMove = 0;
    for (let d = 0; d < DIRS; d++) maxMove = Math.max(maxMove, PLEN[d] * (weights.length + off) + this.turn[d * DIRS + ((d + 1) % DIRS)]);
    this.heads = new Int32Array(Math.ceil(maxMove / this.bucketWidth) + 2).fill(-1);
    const s = (sy - this.y0) * this.w + (sx - this.x0);
    for (let d = 0; d < DIRS; d++) this.insert(s * DIRS + d, 0);
  }

  private insert(id: number, key: number): void {
    const B = this.heads.length;
    if (this.bucketOf[id] >= 0) this.unlink(id);
    const b = Math.floor(key / this.bucketWidth) % B;
    this.dist[id] = key;
    this.bucketOf[id] = b;
    this.prev[id] = -1;
    this.next[id] = this.heads[b];
    if (this.heads[b] >= 0) this.prev[this.heads[b]] = id;
    this.heads[b] = id;
    this.queued++;
  }

  private unlink(id: number): void {
    const b = this.bucketOf[id];
    const p = this.prev[id];
    const nx = this.next[id];
    if (p >= 0) this.next[p] = nx;
    else this.heads[b] = nx;
    if (nx >= 0) this.prev[nx] = p;
    this.bucketOf[id] = -1;
    this.queued--;
  }

  /** True once every reachable state of the neighbourhood is settled. */
  get complete(): boolean {
    return this.queued === 0;
  }

  /** Stops growth for good. */
  cancel(): void {
    this.cancelled = true;
  }

  /**
   * Grows the tree for about `budgetMs` milliseconds; returns true when it is complete
   * (or cancelled).
   */
  grow(budgetMs: number): boolean {
    const t0 = performance.now();
    const B = this.heads.length;
    const { heads, dist, done, parent, cost, turn, w, h } = this;
    while (this.queued > 0 && !this.cancelled) {
      for (let batch = 0; batch < 2048 && this.queued > 0; batch++) {
        while (heads[this.current % B] < 0) this.current++;
        const id = heads[this.current % B];
        this.unlink(id);
        done[id] = 1;
        this.settled++;
        const cell = (id / DIRS) | 0;
        const d = id - cell * DIRS;
        const x = cell % w;
        const y = (cell - x) / w;
        const g = dist[id];
        for (let dd = -1; dd <= 1; dd++) {
          const d2 = (d + dd + DIRS) % DIRS;
          const nx = x + PX[d2];
          const ny = y + PY[d2];
          if (nx < 0 || ny < 0 || nx >= w || ny >= h) continue;
          const c2 = ny * w + nx;
          const id2 = c2 * DIRS + d2;
          if (done[id2]) continue;
          const ng = g + PLEN[d2] * cost[c2] + turn[d * DIRS + d2];
          if (ng < dist[id2]) {
            parent[id2] = id;
            this.insert(id2, ng);
          }
        }
      }
      if (performance.now() - t0 >= budgetMs) break;
    }
    return this.queued === 0 || this.cancelled;
  }

  /** The settled state that reaches pixel (x, y) most cheaply, or −1. */
  private bestAt(x: number, y: number): number {
    const lx = Math.floor(x) - this.x0;
    const ly = Math.floor(y) - this.y0;
    if (lx < 0 || ly < 0 || lx >= this.w || ly >= this.h) return -1;
    const cell = ly * this.w + lx;
    let best = -1;
    for (let d = 0; d < DIRS; d++) {
      const id = cell * DIRS + d;
      if (this.done[id] && (best < 0 || this.dist[id] < this.dist[best])) best = id;
    }
    return best;
  }

  covers(x: number, y: number): boolean {
    return this.bestAt(x, y) >= 0;
  }

  /**
   * The preview path from the start to (x, y), lightly smoothed, with the best pen
   * radius per sample; undefined when the tree has not reached that pixel yet.
   */
  pathTo(x: number, y: number): StrokeSample[] | undefined {
    let id = this.bestAt(x, y);
    if (id < 0) return undefined;
    const xs: number[] = [];
    const ys: number[] = [];
    for (; id >= 0; id = this.parent[id]) {
      const cell = (id / DIRS) | 0;
      xs.push(this.x0 + (cell % this.w) + 0.5);
      ys.push(this.y0 + Math.floor(cell / this.w) + 0.5);
    }
    xs.reverse();
    ys.reverse();
    const n = xs.length;
    for (let pass = 0; pass < 2; pass++) {
      for (let i = 1; i < n - 1; i++) {
        xs[i] = 0.25 * xs[i - 1] + 0.5 * xs[i] + 0.25 * xs[i + 1];
        ys[i] = 0.25 * ys[i - 1] + 0.5 * ys[i] + 0.25 * ys[i + 1];
      }
    }
    const [rmin, rmax] = this.radius;
    const profile = this.profile;
    const out: StrokeSample[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const a = Math.max(0, i - 1);
      const b = Math.min(n - 1, i + 1);
      const l = Math.hypot(xs[b] - xs[a], ys[b] - ys[a]) || 1;
      profile.sample(this.prep.evidence, xs[i], ys[i], (xs[b] - xs[a]) / l, (ys[b] - ys[a]) / l);
      const q = chordPresence(profile, DEFAULT_CHORD);
      let bestR = rmin;
      let best = Infinity;
      for (let r = rmin; r <= rmax + 1e-9; r += 0.5) {
        const e = chordAdherence(profile, r, DEFAULT_CHORD, q);
        if (e < best) {
          best = e;
          bestR = r;
        }
      }
      out[i] = { x: xs[i], y: ys[i], r: bestR, support: chordSupport(profile, bestR) };
    }
    return out;
  }
}

export function startPreview(prep: PreparedInk, start: Point, options?: PreviewOptions): PreviewTree {
  return new PreviewTree(prep, start, options);
}


