/**
 * Sub-pixel refinement of the exact discrete path: the pixel path is resampled at
 * ≤ 1 px spacing, lightly smoothed, then each sample's position (along its normal) and
 * radius are improved by coordinate descent on the continuous form of the same energy
 * (energy.ts), with the anchors' positions held fixed. The only change is that |Δr| is
 * smoothed to √(Δr² + ε²) so that a width change across an inkless span is spread evenly.
 */
import type { GrayImage } from '../image/gray.ts';
import { ChordProfile, chordAdherence, chordPresence, chordSupport, type ChordModel, type Weights } from './energy.ts';
import type { SampleSpan, StrokeSample } from './types.ts';

export interface RefineOptions {
  weights: Weights;
  chord: ChordModel;
  radiusMin: number;
  radiusMax: number;
  /** Sample spacing, px (≤ 1). Default 1. */
  spacing: number;
  /** Support below which a sample counts as unsupported by ink. Default 0.6. */
  supportThreshold: number;
  /** Shortest run of unsupported samples reported as a restored span, px. Default 3. */
  minRestoredLength: number;
  /** Per anchor (in fixedAt order), a pinned pen radius, px; undefined where free. */
  pinnedR?: (number | undefined)[];
}

/** ε of the smoothed |Δr|, px. */
const EPS_R = 0.05;

interface Work {
  x: Float64Array;
  y: Float64Array;
  r: Float64Array;
  fixed: Uint8Array;
  n: number;
}

/**
 * Resamples a polyline with radii so that each span between consecutive fixed points
 * (indices in `fixedAt`) is split into equal steps of at most `spacing` px.
 */
function resample(px: number[], py: number[], pr: number[], fixedAt: number[], spacing: number): Work {
  const xs: number[] = [];
  const ys: number[] = [];
  const rs: number[] = [];
  const fixed: number[] = [];
  for (let s = 0; s + 1 < fixedAt.length; s++) {
    const a = fixedAt[s];
    const b = fixedAt[s + 1];
    const cum: number[] = [0];
    for (let i = a + 1; i <= b; i++) cum.push(cum[cum.length - 1] + Math.hypot(px[i] - px[i - 1], py[i] - py[i - 1]));
    const total = cum[cum.length - 1];
    const steps = Math.max(1, Math.ceil(total / spacing - 1e-9));
    let seg = 0;
    for (let j = 0; j < steps; j++) {
      const t = (total * j) / steps;
      while (seg < cum.length - 2 && cum[seg + 1] < t) seg++;
      const l = cum[seg + 1] - cum[seg];
      const u = l > 0 ? (t - cum[seg]) / l : 0;
      const i = a + seg;
      xs.push(px[i] + (px[i + 1] - px[i]) * u);
      ys.push(py[i] + (py[i + 1] - py[i]) * u);
      rs.push(pr[i] + (pr[i + 1] - pr[i]) * u);
      fixed.push(j === 0 ? 1 : 0);
    }
  }
  const last = fixedAt[fixedAt.length - 1];
  xs.push(px[last]);
  ys.push(py[last]);
  rs.push(pr[last]);
  fixed.push(1);
  return {
    x: Float64Array.from(xs), y: Float64Array.from(ys), r: Float64Array.from(rs), fixed: Uint8Array.from(fixed), n: xs.length,
  };
}

/** Binomial smoothing [1 2 1]/4 of positions and radii; fixed samples keep their position. */
function smooth(w: Work, passes: number): void {
  const { x, y, r, fixed, n } = w;
  const tx = new Float64Array(n);
  const ty = new Float64Array(n);
  const tr = new Float64Array(n);
  for (let p = 0; p < passes; p++) {
    for (let i = 0; i < n; i++) {
      if (fixed[i] || i === 0 || i === n - 1) {
        tx[i] = x[i];
        ty[i] = y[i];
      } else {
        tx[i] = 0.25 * (x[i - 1] + 2 * x[i] + x[i + 1]);
        ty[i] = 0.25 * (y[i - 1] + 2 * y[i] + y[i + 1]);
      }
      const a = r[i > 0 ? i - 1 : i];
      const b = r[i < n - 1 ? i + 1 : i];
      tr[i] = 0.25 * (a + 2 * r[i] + b);
    }
    x.set(tx);
    y.set(ty);
    r.set(tr);
  }
}

/**
 * Where the discrete path crosses a span without ink it runs straight along a lattice
 * direction, up to a couple of px off the true course, and coordinate descent would
 * straighten such a span only slowly. Each unsupported run is therefore first replaced
 * by the cubic Hermite curve that joins the inked ends with their tangents (the
 * small-deflection minimiser of bending energy), radii interpolated linearly.
 */
function bridgeUnsupported(ink: GrayImage, w: Work, options: RefineOptions): void {
  const { x, y, r, fixed, n } = w;
  const profile = new ChordProfile(options.radiusMax, options.chord);
  const low = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const a = i > 0 ? i - 1 : i;
    const b = i < n - 1 ? i + 1 : i;
    const l = Math.hypot(x[b] - x[a], y[b] - y[a]) || 1;
    profile.sample(ink, x[i], y[i], (x[b] - x[a]) / l, (y[b] - y[a]) / l);
    low[i] = chordSupport(profile, r[i]) < options.supportThreshold ? 1 : 0;
  }
  const reach = 5; // samples used for the tangent on either side
  let i = 1;
  while (i < n - 1) {
    if (!low[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n - 1 && low[j + 1]) j++;
    const a = i - 1;
    const b = j + 1;
    let inner = false;
    for (let k = i; k <= j; k++) if (fixed[k]) inner = true;
    if (!inner && j - i + 1 >= 3) {
      const a0 = Math.max(0, a - reach);
      const b1 = Math.min(n - 1, b + reach);
      let tax = x[a] - x[a0];
      let tay = y[a] - y[a0];
      let tbx = x[b1] - x[b];
      let tby = y[b1] - y[b];
      const la = Math.hypot(tax, tay) || 1;
      const lb = Math.hypot(tbx, tby) || 1;
      const L = Math.hypot(x[b] - x[a], y[b] - y[a]);
      tax = (tax / la) * L;
      tay = (tay / la) * L;
      tbx = (tbx / lb) * L;
      tby = (tby / lb) * L;
      const xa = x[a], ya = y[a], xb = x[b], yb = y[b], ra = r[a], rb = r[b];
      for (let k = i; k <= j; k++) {
        const t = (k - a) / (b - a);
        const t2 = t * t;
        const t3 = t2 * t;
        const h00 = 2 * t3 - 3 * t2 + 1;
        const h10 = t3 - 2 * t2 + t;
        const h01 = -2 * t3 + 3 * t2;
        const h11 = t3 - t2;
        x[k] = h00 * xa + h10 * tax + h01 * xb + h11 * tbx;
        y[k] = h00 * ya + h10 * tay + h01 * yb + h11 * tby;
        r[k] = ra + (rb - ra) * t;
      }
    }
    i = j + 1;
  }
}

export interface RefinedStroke {
  samples: StrokeSample[];
  restoredSpans: SampleSpan[];
}

/**
 * Refines a discrete path (pixel centres and radii; `fixedAt` lists the indices of the
 * anchors, whose exact positions are in ax/ay) into stroke samples.
 */
export function refinePath(
  ink: GrayImage, px: number[], py: number[], pr: number[], fixedAt: number[], options: RefineOptions,
): RefinedStroke {
  const w = resample(px, py, pr, fixedAt, options.spacing);
  // Which resampled samples carry a pinned radius (fixed samples come in anchor order).
  const pinR = new Float64Array(w.n).fill(NaN);
  if (options.pinnedR) {
    for (let i = 0, a = 0; i < w.n; i++) {
      if (!w.fixed[i]) continue;
      const r = options.pinnedR[a++];
      if (r !== undefined) pinR[i] = r;
    }
  }
  bridgeUnsupported(ink, w, options);
  smooth(w, 3);
  const { x, y, r, fixed, n } = w;
  const { weights, chord } = options;
  const profile = new ChordProfile(options.radiusMax + 1, chord);
  const A = weights.adherence;
  const lam = weights.length;
  const W = weights.widthChange;
  const C = weights.curvature;
  const tx = new Float64Array(n);
  const ty = new Float64Array(n);
  // adhCache[i]: the adherence term of step i (arrival at sample i) for the current
  // positions, radii and tangents; NaN when stale.
  const adhCache = new Float64Array(n).fill(NaN);

  const tangent = (i: number): void => {
    if (i < 0 || i >= n) return;
    const a = i > 0 ? i - 1 : i;
    const b = i < n - 1 ? i + 1 : i;
    const dx = x[b] - x[a];
    const dy = y[b] - y[a];
    const l = Math.hypot(dx, dy) || 1;
    tx[i] = dx / l;
    ty[i] = dy / l;
  };
  const sabs = (v: number): number => Math.sqrt(v * v + EPS_R * EPS_R);
  const stepLen = (i: number): number => Math.hypot(x[i] - x[i - 1], y[i] - y[i - 1]);
  /** Adherence (and length) term of step i with the current state. */
  // How far beyond the pen's edge the chord must be sampled: the outer band and one step.
  const reach = chord.outerWidth + 0.5;
  const adhTerm = (i: number): number => {
    if (i <= 0 || i >= n) return 0;
    profile.sample(ink, x[i], y[i], tx[i], ty[i], Math.max(r[i], chord.coreRadius) + reach);
    return stepLen(i) * (lam + A * chordAdherence(profile, r[i], chord, chordPresence(profile, chord)));
  };
  const cachedAdh = (i: number): number => {
    if (i <= 0 || i >= n) return 0;
    if (Number.isNaN(adhCache[i])) adhCache[i] = adhTerm(i);
    return adhCache[i];
  };
  const turnTerm = (i: number): number => {
    if (i <= 0 || i >= n - 1) return 0;
    const ax = x[i] - x[i - 1];
    const ay = y[i] - y[i - 1];
    const bx = x[i + 1] - x[i];
    const by = y[i + 1] - y[i];
    const la = Math.hypot(ax, ay);
    const lb = Math.hypot(bx, by);
    if (la === 0 || lb === 0) return 0;
    const dt = Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
    return (C * dt * dt) / (0.5 * (la + lb));
  };
  /** The terms that depend on sample i's position: steps i−1..i+1 and their turns. */
  const localCached = (i: number): number =>
    cachedAdh(i - 1) + cachedAdh(i) + cachedAdh(i + 1) + turnTerm(i - 1) + turnTerm(i) + turnTerm(i + 1);
  const localFresh = (i: number): number =>
    adhTerm(i - 1) + adhTerm(i) + adhTerm(i + 1) + turnTerm(i - 1) + turnTerm(i) + turnTerm(i + 1);

  for (let i = 0; i < n; i++) tangent(i);
  const posSteps = [0.5, 0.25, 0.125, 0.0625];
  const radSteps = [0.25, 0.125, 0.0625, 0.03125];
  for (let level = 0; level < posSteps.length; level++) {
    for (let sweep = 0; sweep < 2; sweep++) {
      // Positions, along the normal.
      const sp = posSteps[level];
      for (let i = 1; i < n - 1; i++) {
        if (fixed[i]) continue;
        const nx = -ty[i];
        const ny = tx[i];
        const x0 = x[i];
        const y0 = y[i];
        let best = localCached(i);
        let bestOff = 0;
        for (let side = -1; side <= 1; side += 2) {
          const off = side * sp;
          x[i] = x0 + nx * off;
          y[i] = y0 + ny * off;
          tangent(i - 1);
          tangent(i);
          tangent(i + 1);
          const e = localFresh(i);
          if (e < best - 1e-12) {
            best = e;
            bestOff = off;
          }
        }
        x[i] = x0 + nx * bestOff;
        y[i] = y0 + ny * bestOff;
        tangent(i - 1);
        tangent(i);
        tangent(i + 1);
        if (bestOff !== 0) {
          adhCache[i - 1] = NaN;
          adhCache[i] = NaN;
          adhCache[i + 1] = NaN;
        }
      }
      // Radii: the chord profile does not depend on r, so sample it once per sample.
      const sr = radSteps[level];
      for (let i = 1; i < n; i++) {
        if (!Number.isNaN(pinR[i])) {
          r[i] = pinR[i];
          continue;
        }
        profile.sample(ink, x[i], y[i], tx[i], ty[i], Math.max(r[i] + sr, chord.coreRadius) + reach);
        const qi = chordPresence(profile, chord);
        const li = stepLen(i) * A;
        const cost = (rv: number): number =>
          li * chordAdherence(profile, rv, chord, qi) + W * sabs(rv - r[i - 1]) + (i < n - 1 ? W * sabs(r[i + 1] - rv) : 0);
        const ri = r[i];
        let best = cost(ri);
        let bestR = ri;
        for (let side = -1; side <= 1; side += 2) {
          const rv = ri + side * sr;
          if (rv < options.radiusMin || rv > options.radiusMax) continue;
          const e = cost(rv);
          if (e < best - 1e-12) {
            best = e;
            bestR = rv;
          }
        }
        if (bestR !== ri) {
          r[i] = bestR;
          adhCache[i] = NaN;
        }
      }
      // Step 0 has no adherence term of its own: its radius follows step 1 unless pinned.
      r[0] = Number.isNaN(pinR[0]) ? r[n > 1 ? 1 : 0] : pinR[0];
    }
  }

  // Moving samples along their normals changes their spacing: resample the refined
  // line so that no step exceeds the spacing, anchors kept in place.
  const fixedIdx: number[] = [];
  for (let i = 0; i < n; i++) if (fixed[i]) fixedIdx.push(i);
  const out = resample(Array.from(x), Array.from(y), Array.from(r), fixedIdx, options.spacing);
  const samples: StrokeSample[] = new Array(out.n);
  for (let i = 0; i < out.n; i++) {
    const a = i > 0 ? i - 1 : i;
    const b = i < out.n - 1 ? i + 1 : i;
    const l = Math.hypot(out.x[b] - out.x[a], out.y[b] - out.y[a]) || 1;
    profile.sample(ink, out.x[i], out.y[i], (out.x[b] - out.x[a]) / l, (out.y[b] - out.y[a]) / l);
    samples[i] = { x: out.x[i], y: out.y[i], r: out.r[i], support: chordSupport(profile, out.r[i]) };
  }
  return { samples, restoredSpans: findRestoredSpans(samples, options.supportThreshold, options.minRestoredLength) };
}

/**
 * Runs of samples whose support, averaged with its two neighbours (against pixel
 * noise), is below the threshold, at least minLength px long.
 */
export function findRestoredSpans(samples: StrokeSample[], threshold: number, minLength: number): SampleSpan[] {
  const spans: SampleSpan[] = [];
  const n = samples.length;
  const low = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const a = samples[k > 0 ? k - 1 : k].support;
    const b = samples[k < n - 1 ? k + 1 : k].support;
    low[k] = (a + samples[k].support + b) / 3 < threshold ? 1 : 0;
  }
  let i = 0;
  while (i < n) {
    if (!low[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && low[j + 1]) j++;
    let len = 0;
    for (let k = i + 1; k <= j; k++) len += Math.hypot(samples[k].x - samples[k - 1].x, samples[k].y - samples[k - 1].y);
    if (len >= minLength) spans.push({ from: i, to: j });
    i = j + 1;
  }
  return spans;
}
