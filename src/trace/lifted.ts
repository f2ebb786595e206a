/**
 * The exact discrete solver: a shortest path over states lifted to
 * position × direction × radius (× stage, one stage per span between two anchors),
 * found by A* with a consistent heuristic from a 2-D relaxation of the same costs.
 *
 * State s = (stage, cell, d, k): the pen arrived at the cell's pixel centre moving in
 * direction d (one of 16) with radius r_k. A move goes to the pixel one step along d'
 * with |d' − d| ≤ maxTurn (in direction indices) and |k' − k| ≤ 1, and costs, in
 * Float64 (energy.ts states the energy):
 *
 *   ℓ_{d'} · (λ + A · adh(p', d' mod 8, r_{k'})) + W · |r_{k'} − r_k| + C · Δθ(d, d')² / ℓ̄
 *
 * Start states (stage 0, start pixel, any d, any k) cost 0 (the first step has no
 * turn to pay). A state at the end pixel of a stage that is not the last has a single
 * zero-cost move into the next stage (same pixel, d and k). The goal is any state at
 * the last stage's end pixel.
 */
import type { GrayImage } from '../image/gray.ts';
import { ANGLE, DIRECTIONS, DX, DY, ORIENTATIONS, ORIENT_TX, ORIENT_TY, STEP_LENGTH, angleDiff } from './directions.ts';
import { cellAt, type Domain } from './domain.ts';
import { ChordProfile, chordAdherence, chordPresence, presenceRamp, type ChordModel, type Weights } from './energy.ts';
import { FlatHeap } from './heap.ts';
import type { CostBreakdown } from './types.ts';

export interface LiftedOptions {
  radiusMin: number;
  radiusMax: number;
  /** Spacing of the radius levels, px. Default 0.5. */
  radiusStep: number;
  /** Largest turn per step in direction indices (1 = 22.5° or so). Default 2. */
  maxTurn: number;
  weights: Weights;
  chord: ChordModel;
  /**
   * Per anchor, the radius level the pen must have there (a radius pinned by the user),
   * or −1 for free. Missing: all free.
   */
  pinnedLevels?: ArrayLike<number>;
}

export interface Stage {
  domain: Domain;
  startCell: number;
  goalCell: number;
  /** adh per (cell, orientation, radius level), Float32. */
  adh: Float32Array;
  /** Heuristic per (cell, direction): relaxed cost to go to the end of the last stage. */
  h: Float64Array;
  /** First state id of this stage. */
  offset: number;
}

export interface LiftedProblem {
  stages: Stage[];
  radii: Float64Array;
  K: number;
  totalStates: number;
  maxTurn: number;
  weights: Weights;
  /** C · Δθ² / ℓ̄ for each (d, d') pair, 16 × 16. */
  turnCost: Float64Array;
  /** Radius level pinned at each anchor (stages + 1 entries), −1 where free. */
  pinned: Int32Array;
}

export interface LiftedSolution {
  /** State ids from start to goal. */
  states: Int32Array;
  cost: CostBreakdown;
  /** States taken off the queue. */
  settled: number;
  /** States pushed onto the queue. */
  pushed: number;
}

/** Radius levels r_k = radiusMin + k · step, up to radiusMax. */
export function radiusLevels(min: number, max: number, step: number): Float64Array {
  const K = Math.max(1, Math.floor((max - min) / step + 1e-9) + 1);
  const radii = new Float64Array(K);
  for (let k = 0; k < K; k++) radii[k] = min + k * step;
  return radii;
}

/**
 * Builds the lifted problem over the given domains (one per stage); stage i runs from
 * anchor i to anchor i + 1, given as integer pixel columns/rows that must lie in it.
 */
export function buildLiftedProblem(
  ink: GrayImage, domains: Domain[], anchorsX: ArrayLike<number>, anchorsY: ArrayLike<number>, options: LiftedOptions,
): LiftedProblem {
  const radii = radiusLevels(options.radiusMin, options.radiusMax, options.radiusStep);
  const K = radii.length;
  const { weights, chord } = options;
  const profile = new ChordProfile(radii[K - 1], chord);
  const turnCost = new Float64Array(DIRECTIONS * DIRECTIONS);
  for (let a = 0; a < DIRECTIONS; a++) {
    for (let b = 0; b < DIRECTIONS; b++) {
      const dt = angleDiff(ANGLE[a], ANGLE[b]);
      turnCost[a * DIRECTIONS + b] = (weights.curvature * dt * dt) / (0.5 * (STEP_LENGTH[a] + STEP_LENGTH[b]));
    }
  }
  const stages: Stage[] = [];
  let offset = 0;
  for (let s = 0; s < domains.length; s++) {
    const domain = domains[s];
    const startCell = cellAt(domain, anchorsX[s], anchorsY[s]);
    const goalCell = cellAt(domain, anchorsX[s + 1], anchorsY[s + 1]);
    if (startCell < 0 || goalCell < 0) throw new Error('internal: an anchor lies outside its search domain');
    const adh = adherenceTable(ink, domain, radii, chord, profile);
    stages.push({ domain, startCell, goalCell, adh, h: new Float64Array(0), offset });
    offset += domain.count * DIRECTIONS * K;
  }
  // Heuristics from the last stage back, so that each stage's end inherits the cost
  // to go of the next stage's start in the same direction (the transition keeps d).
  let carry: Float64Array | undefined;
  for (let s = stages.length - 1; s >= 0; s--) {
    const st = stages[s];
    st.h = relaxedCostToGo(st, K, options.maxTurn, turnCost, weights, carry);
    carry = st.h.subarray(st.startCell * DIRECTIONS, (st.startCell + 1) * DIRECTIONS);
  }
  const pinned = new Int32Array(domains.length + 1).fill(-1);
  if (options.pinnedLevels) for (let a = 0; a < pinned.length; a++) pinned[a] = options.pinnedLevels[a] ?? -1;
  return { stages, radii, K, totalStates: offset, maxTurn: options.maxTurn, weights, turnCost, pinned };
}

/**
 * adh per (cell, orientation, radius level) over a domain. This is the same
 * computation as ChordProfile + chordAdherence, inlined for speed: with radii and δ on
 * the chord's sample grid every integral is a lookup in the running sum (the general
 * path handles other radii).
 */
function adherenceTable(ink: GrayImage, domain: Domain, radii: Float64Array, chord: ChordModel, profile: ChordProfile): Float32Array {
  const K = radii.length;
  const n = domain.count;
  const adh = new Float32Array(n * ORIENTATIONS * K);
  const { half, h, f } = profile;
  const aligned = radii.every((r) => Math.abs(r / h - Math.round(r / h)) < 1e-9) &&
    Math.abs(chord.outerWidth / h - Math.round(chord.outerWidth / h)) < 1e-9 &&
    Math.abs(chord.coreRadius / h - Math.round(chord.coreRadius / h)) < 1e-9;
  const jr = new Int32Array(K);
  for (let k = 0; k < K; k++) jr[k] = Math.round(radii[k] / h);
  const jo = Math.round(chord.outerWidth / h);
  const jc = Math.round(chord.coreRadius / h);
  const offInk = chord.offInk;
  const kappa = chord.fitWeight;
  const otx = ORIENT_TX;
  const oty = ORIENT_TY;
  for (let c = 0; c < n; c++) {
    const x = domain.cellX[c] + 0.5;
    const y = domain.cellY[c] + 0.5;
    for (let o = 0; o < ORIENTATIONS; o++) {
      const base = (c * ORIENTATIONS + o) * K;
      profile.sample(ink, x, y, otx[o], oty[o]);
      if (!aligned) {
        const q = chordPresence(profile, chord);
        for (let k = 0; k < K; k++) adh[base + k] = chordAdherence(profile, radii[k], chord, q);
        continue;
      }
      const q = presenceRamp((f[half + jc] - f[half - jc]) / (2 * jc * h), chord);
      for (let k = 0; k < K; k++) {
        const a = half - jr[k];
        const b = half + jr[k];
        const inside = 2 * radii[k] - (f[b] - f[a]);
        const outer = f[b + jo] - f[b] + (f[a] - f[a - jo]);
        adh[base + k] = q * kappa * (inside + outer) + (1 - q) * offInk;
      }
    }
  }
  return adh;
}

/**
 * Exact cost-to-go on a relaxation that keeps position and direction but drops the
 * radius: every move is priced with the least adherence over all radii at its end and
 * no width change; turns cost what they cost in the lifted graph. Each lifted move
 * costs at least its relaxed image, so the result is an admissible and consistent
 * heuristic. `carry` gives the cost to go at the end cell per direction (the next
 * stage's heuristic at its start), zero for the last stage.
 */
function relaxedCostToGo(
  st: Stage, K: number, maxTurn: number, turnCost: Float64Array, w: Weights, carry?: Float64Array,
): Float64Array {
  const { domain, goalCell, adh } = st;
  const n = domain.count;
  const dx = DX;
  const dy = DY;
  const stepLength = STEP_LENGTH;
  const { cellOf, cellX, cellY, x0, y0, w: bw, h: bh } = domain;
  const minAdh = new Float64Array(n * ORIENTATIONS);
  for (let i = 0; i < n * ORIENTATIONS; i++) {
    let m = Infinity;
    for (let k = 0; k < K; k++) if (adh[i * K + k] < m) m = adh[i * K + k];
    minAdh[i] = m;
  }
  const N = n * DIRECTIONS;
  const h = new Float64Array(N).fill(Infinity);
  const done = new Uint8Array(N);
  const heap = new FlatHeap(Math.max(64, N));
  for (let d = 0; d < DIRECTIONS; d++) {
    const v = carry ? carry[d] : 0;
    h[goalCell * DIRECTIONS + d] = v;
    heap.push(goalCell * DIRECTIONS + d, v);
  }
  while (heap.length > 0) {
    const id = heap.pop();
    if (done[id]) continue;
    done[id] = 1;
    const c2 = id >> 4;
    const d2 = id & 15;
    // Predecessors (c, d) reach (c2, d2) by one step along d2 from c = c2 − v_{d2}.
    const lx = cellX[c2] - dx[d2] - x0;
    const ly = cellY[c2] - dy[d2] - y0;
    if (lx < 0 || ly < 0 || lx >= bw || ly >= bh) continue;
    const c = cellOf[ly * bw + lx];
    if (c < 0 || c === goalCell) continue; // the end cell has no moves of its own
    const step = stepLength[d2] * (w.length + w.adherence * minAdh[c2 * ORIENTATIONS + (d2 & 7)]);
    const hv = h[id] + step;
    for (let dd = -maxTurn; dd <= maxTurn; dd++) {
      const d = (d2 - dd + DIRECTIONS) & 15;
      const u = c * DIRECTIONS + d;
      if (done[u]) continue;
      const cand = hv + turnCost[d * DIRECTIONS + d2];
      if (cand < h[u]) {
        h[u] = cand;
        heap.push(u, cand);
      }
    }
  }
  return h;
}

/** Reusable buffers for solves, grown as needed. */
export class LiftedWorkspace {
  g = new Float64Array(0);
  parent = new Int32Array(0);
  closed = new Uint8Array(0);
  heap = new FlatHeap(1 << 16);

  ensure(n: number): void {
    if (this.g.length < n) {
      const cap = Math.ceil(n * 1.25);
      this.g = new Float64Array(cap);
      this.parent = new Int32Array(cap);
      this.closed = new Uint8Array(cap);
    }
    this.g.fill(Infinity, 0, n);
    this.closed.fill(0, 0, n);
    this.heap.clear();
  }
}

export interface DecodedState {
  stage: number;
  cell: number;
  d: number;
  k: number;
  /** Pixel column and row. */
  x: number;
  y: number;
}

export function decodeState(p: LiftedProblem, id: number): DecodedState {
  let s = p.stages.length - 1;
  while (s > 0 && id < p.stages[s].offset) s--;
  const st = p.stages[s];
  const local = id - st.offset;
  const k = local % p.K;
  const t = (local - k) / p.K;
  const d = t % DIRECTIONS;
  const cell = (t - d) / DIRECTIONS;
  return { stage: s, cell, d, k, x: st.domain.cellX[cell], y: st.domain.cellY[cell] };
}

export function encodeState(p: LiftedProblem, stage: number, cell: number, d: number, k: number): number {
  return p.stages[stage].offset + (cell * DIRECTIONS + d) * p.K + k;
}

/** Ids of the start states (all cost 0). */
export function startStates(p: LiftedProblem): number[] {
  const ids: number[] = [];
  for (let d = 0; d < DIRECTIONS; d++) {
    for (let k = 0; k < p.K; k++) if (levelAllowed(p, 0, k)) ids.push(encodeState(p, 0, p.stages[0].startCell, d, k));
  }
  return ids;
}

/** Whether radius level k is allowed at anchor a (free, or the pinned level). */
export function levelAllowed(p: LiftedProblem, a: number, k: number): boolean {
  return p.pinned[a] < 0 || p.pinned[a] === k;
}

export function isGoal(p: LiftedProblem, id: number): boolean {
  const s = decodeState(p, id);
  const last = p.stages.length - 1;
  return s.stage === last && s.cell === p.stages[s.stage].goalCell && levelAllowed(p, last + 1, s.k);
}

/**
 * Calls `visit(to, cost)` for every move out of state `id`. The search inlines the same
 * rule for speed; this form serves the reference tests and the cost breakdown.
 */
export function forEachMove(p: LiftedProblem, id: number, visit: (to: number, cost: number) => void): void {
  const s = decodeState(p, id);
  const st = p.stages[s.stage];
  if (s.cell === st.goalCell) {
    // The end of a stage moves only into the next stage, with the pinned radius if any.
    if (s.stage + 1 < p.stages.length && levelAllowed(p, s.stage + 1, s.k)) {
      const next = p.stages[s.stage + 1];
      visit(encodeState(p, s.stage + 1, next.startCell, s.d, s.k), 0);
    }
    return;
  }
  for (let dd = -p.maxTurn; dd <= p.maxTurn; dd++) {
    const d2 = (s.d + dd + DIRECTIONS) % DIRECTIONS;
    const c2 = cellAt(st.domain, s.x + DX[d2], s.y + DY[d2]);
    if (c2 < 0) continue;
    for (let k2 = Math.max(0, s.k - 1); k2 <= Math.min(p.K - 1, s.k + 1); k2++) {
      visit(encodeState(p, s.stage, c2, d2, k2), moveCost(p, s.stage, s.d, s.k, c2, d2, k2).total);
    }
  }
}

/** The cost of one move by term (the move must be legal). */
export function moveCost(
  p: LiftedProblem, stage: number, d: number, k: number, c2: number, d2: number, k2: number,
): CostBreakdown {
  const w = p.weights;
  const st = p.stages[stage];
  const len = STEP_LENGTH[d2];
  const adherence = len * w.adherence * st.adh[(c2 * ORIENTATIONS + (d2 & 7)) * p.K + k2];
  const length = len * w.length;
  const widthChange = w.widthChange * Math.abs(p.radii[k2] - p.radii[k]);
  const curvature = p.turnCost[d * DIRECTIONS + d2];
  // Summed in the same order as the search so both give identical Float64 totals.
  return { adherence, widthChange, curvature, length, total: length + curvature + adherence + widthChange };
}

/**
 * A* over the lifted states. Returns the optimal state path, or undefined when the goal
 * cannot be reached inside the domains. `shouldStop` is polled every 1024 settled
 * states (for cancellation).
 */
export function solveLifted(p: LiftedProblem, ws: LiftedWorkspace, shouldStop?: () => boolean): LiftedSolution | undefined {
  const { stages, K, maxTurn, weights, turnCost, radii } = p;
  const dx = DX;
  const dy = DY;
  const stepLength = STEP_LENGTH;
  ws.ensure(p.totalStates);
  const { g, parent, closed, heap } = ws;
  const lam = weights.length;
  const A = weights.adherence;
  const last = stages.length - 1;
  const wStep = new Float64Array(K * 3);
  for (let k = 0; k < K; k++) {
    for (let dk = -1; dk <= 1; dk++) {
      const k2 = k + dk;
      wStep[k * 3 + dk + 1] = k2 >= 0 && k2 < K ? weights.widthChange * Math.abs(radii[k2] - radii[k]) : 0;
    }
  }
  const st0 = stages[0];
  const pinned = p.pinned;
  let pushed = 0;
  for (let d = 0; d < DIRECTIONS; d++) {
    for (let k = 0; k < K; k++) {
      if (pinned[0] >= 0 && pinned[0] !== k) continue;
      pushed++;
      const id = st0.offset + (st0.startCell * DIRECTIONS + d) * K + k;
      g[id] = 0;
      parent[id] = -1;
      heap.push(id, st0.h[st0.startCell * DIRECTIONS + d]);
    }
  }
  let settled = 0;
  let goal = -1;
  let stage = 0;
  let st = st0;
  while (heap.length > 0) {
    const id = heap.pop();
    if (closed[id]) continue;
    closed[id] = 1;
    settled++;
    if ((settled & 1023) === 0 && shouldStop && shouldStop()) return undefined;
    // Find the stage (ids are grouped by stage, and stages are few).
    if (id < st.offset || (stage < last && id >= stages[stage + 1].offset)) {
      stage = last;
      while (stage > 0 && id < stages[stage].offset) stage--;
      st = stages[stage];
    }
    const local = id - st.offset;
    const k = local % K;
    const t = (local - k) / K;
    const d = t & 15;
    const cell = t >> 4;
    const gid = g[id];
    if (cell === st.goalCell) {
      // Arriving with another radius than the one pinned here is a dead end.
      if (pinned[stage + 1] >= 0 && pinned[stage + 1] !== k) continue;
      if (stage === last) {
        goal = id;
        break;
      }
      const nx = stages[stage + 1];
      const id2 = nx.offset + (nx.startCell * DIRECTIONS + d) * K + k;
      if (gid < g[id2]) {
        g[id2] = gid;
        parent[id2] = id;
        heap.push(id2, gid + nx.h[nx.startCell * DIRECTIONS + d]);
        pushed++;
      }
      continue;
    }
    const dom = st.domain;
    const x = dom.cellX[cell] - dom.x0;
    const y = dom.cellY[cell] - dom.y0;
    const adh = st.adh;
    const h = st.h;
    const kLo = k > 0 ? k - 1 : 0;
    const kHi = k < K - 1 ? k + 1 : K - 1;
    for (let dd = -maxTurn; dd <= maxTurn; dd++) {
      const d2 = (d + dd + DIRECTIONS) & 15;
      const lx = x + dx[d2];
      const ly = y + dy[d2];
      if (lx < 0 || ly < 0 || lx >= dom.w || ly >= dom.h) continue;
      const c2 = dom.cellOf[ly * dom.w + lx];
      if (c2 < 0) continue;
      const len = stepLength[d2];
      const base = len * lam + turnCost[d * DIRECTIONS + d2];
      const adhBase = (c2 * ORIENTATIONS + (d2 & 7)) * K;
      const idBase = st.offset + (c2 * DIRECTIONS + d2) * K;
      const h2 = h[c2 * DIRECTIONS + d2];
      for (let k2 = kLo; k2 <= kHi; k2++) {
        const id2 = idBase + k2;
        if (closed[id2]) continue;
        const ng = gid + (base + len * A * adh[adhBase + k2] + wStep[k * 3 + k2 - k + 1]);
        if (ng < g[id2]) {
          g[id2] = ng;
          parent[id2] = id;
          heap.push(id2, ng + h2);
          pushed++;
        }
      }
    }
  }
  if (goal < 0) return undefined;
  let n = 0;
  for (let s = goal; s >= 0; s = parent[s]) n++;
  const states = new Int32Array(n);
  for (let s = goal, i = n - 1; s >= 0; s = parent[s], i--) states[i] = s;
  return { states, cost: pathCost(p, states), settled, pushed };
}

/** Sums the cost of a state path by term (Float64, in path order). */
export function pathCost(p: LiftedProblem, states: Int32Array): CostBreakdown {
  const sum: CostBreakdown = { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 };
  for (let i = 1; i < states.length; i++) {
    const a = decodeState(p, states[i - 1]);
    const b = decodeState(p, states[i]);
    if (b.stage !== a.stage) continue; // the zero-cost stage transition
    const c = moveCost(p, a.stage, a.d, a.k, b.cell, b.d, b.k);
    sum.adherence += c.adherence;
    sum.widthChange += c.widthChange;
    sum.curvature += c.curvature;
    sum.length += c.length;
    sum.total += c.total;
  }
  return sum;
}
