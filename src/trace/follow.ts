/**
 * followStroke: from anchors (start, optional intermediate anchors, end) to a stroke.
 *
 * 1. A cheap first path per span between anchors (coarse.ts) places the search tube.
 * 2. The exact discrete optimum of the energy over the lifted states inside the tube
 *    (lifted.ts).
 * 3. Sub-pixel refinement of positions and radii, support per sample and restored
 *    spans (refine.ts).
 */
import { boxDomain, tubeDomain, type Domain } from './domain.ts';
import { DEFAULT_CHORD, DEFAULT_WEIGHTS, type ChordModel, type Weights } from './energy.ts';
import { coarsePath } from './coarse.ts';
import { buildLiftedProblem, decodeState, solveLifted, type LiftedProblem, type LiftedSolution } from './lifted.ts';
import type { PreparedInk } from './prepare.ts';
import { measureOnImage } from './measure.ts';
import { refinePath } from './refine.ts';
import type { Point, Stroke } from './types.ts';

/** Thrown for requests the solver cannot take; the message is one plain sentence. */
export class FollowError extends Error {
  override name = 'FollowError';
}

export interface FollowRequest {
  /**
   * Start, intermediate anchors in order, end; image px. At least two. An anchor's `r`
   * pins the pen radius there (px, within the radius range).
   */
  anchors: Array<Point & { r?: number }>;
  /** Pen radius range [min, max] in px. Default [1.5, 6]. */
  radius?: [number, number];
  /** Weights of the energy's terms; missing ones take DEFAULT_WEIGHTS. */
  weights?: Partial<Weights>;
  /** Chord model; missing fields take DEFAULT_CHORD. */
  chord?: Partial<ChordModel>;
  /**
   * Search domain: 'tube' (default) is the pixels within `tubeRadius` of the first
   * path; 'box' is the whole rectangle around the anchors widened by `margin`.
   */
  domain?: 'tube' | 'box';
  /** Half-width of the search tube, px. Default 5. */
  tubeRadius?: number;
  /** Margin of the first path's search box (and of a 'box' domain), px. Default 24. */
  margin?: number;
  /** Spacing of the refined samples, px (≤ 1). Default 1. */
  spacing?: number;
  /** Support below which the pen counts as off ink. Default 0.6. */
  supportThreshold?: number;
  /** Shortest reported restored span, px. Default 3. */
  minRestoredLength?: number;
  /** Skip the sub-pixel refinement (the samples are then the discrete states). */
  discreteOnly?: boolean;
  /**
   * Measure each inked sample's width and centre on the image band (measure.ts) when the
   * prepared ink holds the band. Default true; false keeps the energy's own optimum.
   */
  measure?: boolean;
}

export const DEFAULT_RADIUS: [number, number] = [1.5, 6];

export interface FollowStats {
  settled: number;
  pushed: number;
  states: number;
  cells: number;
  /** Milliseconds spent per phase. */
  ms: { first: number; build: number; search: number; refine: number };
}

export interface FollowResult extends Stroke {
  stats: FollowStats;
}

export interface FollowControl {
  /** Polled during the search; return true to cancel (followStroke then throws). */
  shouldStop?: () => boolean;
  /** Receives the lifted problem and solution (tests and the benchmark). */
  inspect?: (problem: LiftedProblem, solution: LiftedSolution) => void;
}

export class FollowCancelled extends Error {
  override name = 'FollowCancelled';
}

export function validateRequest(width: number, height: number, req: FollowRequest): void {
  if (!Array.isArray(req.anchors) || req.anchors.length < 2) throw new FollowError('a stroke needs a start and an end point.');
  const [rlo, rhi] = req.radius ?? DEFAULT_RADIUS;
  for (const a of req.anchors) {
    if (!Number.isFinite(a.x) || !Number.isFinite(a.y)) throw new FollowError('a point has a coordinate that is not a number.');
    if (a.r !== undefined && !(a.r >= rlo && a.r <= rhi)) {
      throw new FollowError(`a pinned radius of ${a.r} px lies outside the radius range ${rlo}–${rhi} px.`);
    }
    if (a.x < 0 || a.y < 0 || a.x >= width || a.y >= height) {
      throw new FollowError(`the point ${a.x},${a.y} lies outside the image (${width}×${height} px).`);
    }
  }
  for (let i = 1; i < req.anchors.length; i++) {
    const a = req.anchors[i - 1];
    const b = req.anchors[i];
    if (Math.floor(a.x) === Math.floor(b.x) && Math.floor(a.y) === Math.floor(b.y)) {
      throw new FollowError(i === req.anchors.length - 1 && i === 1
        ? 'the start and the end are the same point.'
        : `anchors ${i} and ${i + 1} are the same point.`);
    }
  }
  const [rmin, rmax] = req.radius ?? DEFAULT_RADIUS;
  if (!(rmin > 0) || !(rmax > rmin) || !Number.isFinite(rmax)) {
    throw new FollowError(`the radius range ${rmin},${rmax} is empty: it needs 0 < min < max.`);
  }
}

export function followStroke(prep: PreparedInk, req: FollowRequest, control: FollowControl = {}): FollowResult {
  const ink = prep.evidence;
  validateRequest(ink.width, ink.height, req);
  const weights: Weights = { ...DEFAULT_WEIGHTS, ...req.weights };
  const chord: ChordModel = { ...DEFAULT_CHORD, ...req.chord };
  const [radiusMin, radiusMax] = req.radius ?? DEFAULT_RADIUS;
  const tubeRadius = req.tubeRadius ?? 5;
  const margin = req.margin ?? 24;
  const ax = req.anchors.map((a) => Math.floor(a.x));
  const ay = req.anchors.map((a) => Math.floor(a.y));

  const t0 = performance.now();
  const domains: Domain[] = [];
  for (let s = 0; s + 1 < ax.length; s++) {
    if (req.domain === 'box') {
      domains.push(boxDomain(ink.width, ink.height, Math.min(ax[s], ax[s + 1]) - margin, Math.min(ay[s], ay[s + 1]) - margin,
        Math.max(ax[s], ax[s + 1]) + margin, Math.max(ay[s], ay[s + 1]) + margin));
    } else {
      const path = coarsePath(prep, ax[s], ay[s], ax[s + 1], ay[s + 1], weights, chord, margin);
      domains.push(tubeDomain(ink.width, ink.height, path.x, path.y, tubeRadius));
    }
  }
  const t1 = performance.now();
  if (control.shouldStop?.()) throw new FollowCancelled('the solve was cancelled.');
  const radiusStep = 0.5;
  const pinnedLevels = req.anchors.map((a) => (a.r === undefined ? -1
    : Math.max(0, Math.min(Math.floor((radiusMax - radiusMin) / radiusStep + 1e-9), Math.round((a.r - radiusMin) / radiusStep)))));
  const problem = buildLiftedProblem(ink, domains, ax, ay, {
    radiusMin, radiusMax, radiusStep, maxTurn: 2, weights, chord, pinnedLevels,
  });
  const t2 = performance.now();
  if (control.shouldStop?.()) throw new FollowCancelled('the solve was cancelled.');
  const solution = solveLifted(problem, prep.workspace, control.shouldStop);
  if (!solution) {
    if (control.shouldStop?.()) throw new FollowCancelled('the solve was cancelled.');
    throw new FollowError('no path joins these points inside the search area.');
  }
  control.inspect?.(problem, solution);
  const t3 = performance.now();

  // Discrete path → pixel centres; drop the duplicate state of each stage transition.
  const px: number[] = [];
  const py: number[] = [];
  const pr: number[] = [];
  const fixedAt: number[] = [0];
  let prevStage = 0;
  for (let i = 0; i < solution.states.length; i++) {
    const s = decodeState(problem, solution.states[i]);
    if (s.stage !== prevStage) {
      prevStage = s.stage;
      fixedAt.push(px.length - 1);
      continue;
    }
    px.push(s.x + 0.5);
    py.push(s.y + 0.5);
    pr.push(problem.radii[s.k]);
  }
  fixedAt.push(px.length - 1);
  // The anchors' exact sub-pixel positions replace their pixel centres.
  const pinnedR: (number | undefined)[] = [];
  for (let a = 0; a < fixedAt.length; a++) {
    px[fixedAt[a]] = req.anchors[a].x;
    py[fixedAt[a]] = req.anchors[a].y;
    const r = req.anchors[a].r;
    pinnedR.push(r === undefined ? undefined : Math.max(radiusMin, Math.min(radiusMax, r)));
    if (r !== undefined) pr[fixedAt[a]] = pinnedR[a]!;
  }
  let stroke;
  if (req.discreteOnly) {
    stroke = { samples: px.map((x, i) => ({ x, y: py[i], r: pr[i], support: NaN })), restoredSpans: [] };
  } else {
    stroke = refinePath(ink, px, py, pr, fixedAt, {
      weights, chord, radiusMin, radiusMax, pinnedR,
      spacing: Math.min(1, req.spacing ?? 1),
      supportThreshold: req.supportThreshold ?? 0.6,
      minRestoredLength: req.minRestoredLength ?? 3,
    });
    if (prep.image && req.measure !== false) {
      // Anchor samples stay exactly where the anchors are; pinned radii stay as pinned.
      const fixed: number[] = [];
      const pinned: number[] = [];
      let from = 0;
      for (const a of req.anchors) {
        for (let i = from; i < stroke.samples.length; i++) {
          const q = stroke.samples[i];
          if (q.x === a.x && q.y === a.y) {
            fixed.push(i);
            if (a.r !== undefined) pinned.push(i);
            from = i;
            break;
          }
        }
      }
      measureOnImage(prep.image, stroke.samples, stroke.restoredSpans, { fixed, pinned, polarity: prep.polarity });
    }
  }
  const t4 = performance.now();
  let cells = 0;
  for (const d of domains) cells += d.count;
  return {
    ...stroke,
    cost: solution.cost,
    stats: {
      settled: solution.settled, pushed: solution.pushed, states: problem.totalStates, cells,
      ms: { first: t1 - t0, build: t2 - t1, search: t3 - t2, refine: t4 - t3 },
    },
  };
}
