/**
 * Scores a traced stroke against the ground truth of a synthetic inscription.
 *
 * Definitions (all distances in px, image coordinates):
 * - **centreline error** of a truth sample: its distance to the result polyline
 *   (point to nearest segment).
 * - **radius error** of a truth sample: |r of the result, interpolated linearly at that
 *   closest point, − the truth sample's r|.
 * - **visible** samples: truth samples outside every gap of the truth stroke.
 * - **short gap**: a truth gap whose arc length (sum of the truth segments from its first
 *   to its last sample) is at most {@link SHORT_GAP_MAX_PX}. Only short gaps are scored:
 *   longer erasures are not expected to be bridged by a single solve.
 * - **gap overlap**: the share of a gap's truth samples whose closest result point lies
 *   inside one of `result.restoredSpans`. A closest point on segment k..k+1 counts as
 *   inside when both k and k+1 are in the span, or when the nearer of the two (k when
 *   t < 0.5, else k+1) is.
 * - **off** result sample: its distance to its own truth centreline is more than
 *   max({@link OFF_MIN_PX}, local truth r + {@link OFF_MARGIN_PX}), with the truth r
 *   interpolated at the closest point.
 * - the stroke **leaves for another** when an off sample lies within (other r + 1 px) of
 *   another truth stroke's centreline, other r interpolated there.
 * - **max deviation**: the largest distance of a result sample to its own truth
 *   centreline.
 * - the **95th percentile** interpolates linearly between order statistics at rank
 *   0.95 · (n − 1) of the sorted values.
 *
 * Figures without samples to average (a stroke with no gaps, say) are NaN.
 */
import type { TruthStroke } from '../synth/types.ts';
import type { SampleSpan, Stroke, StrokeSample } from '../trace/types.ts';
import { closestOnPolyline, createClosestPoint, distanceToBox, toRadiusPolyline, type RadiusPolyline } from './polyline.ts';

/** Gaps up to this arc length are scored, px. */
export const SHORT_GAP_MAX_PX = 30;
/** A result sample closer than this to its own centreline is never off, px. */
export const OFF_MIN_PX = 3;
/** Margin over the local pen radius before a sample is off (and before it is on another stroke), px. */
export const OFF_MARGIN_PX = 1;

/** The part of a traced stroke the scores read: centreline samples with radius, and restored spans. */
export type ScoredStroke = {
  samples: ReadonlyArray<Pick<StrokeSample, 'x' | 'y' | 'r'>>;
  restoredSpans: ReadonlyArray<SampleSpan>;
};

export interface GapScore {
  /** First and last truth sample index of the gap (inclusive). */
  from: number;
  to: number;
  /** Arc length of the gap along the truth centreline, px. */
  arcLength: number;
  /** Mean centreline error over the gap's truth samples, px. */
  meanCentreline: number;
  /** Share of the gap's truth samples whose closest result point is in a restored span, 0..1. */
  overlap: number;
}

export interface StrokeScore {
  /** Id of the truth stroke scored against. */
  truthId: string;
  /** Centreline error of each visible truth sample, px, in truth order. */
  visibleCentrelineErrors: number[];
  /** Radius error of each visible truth sample, px, in truth order. */
  visibleRadiusErrors: number[];
  meanCentreline: number;
  p95Centreline: number;
  meanRadius: number;
  /** The short gaps, in truth order. */
  gaps: GapScore[];
  /** Centreline error of each truth sample in a short gap, px. */
  gapCentrelineErrors: number[];
  meanGapCentreline: number;
  /** Result samples that are off their own truth centreline. */
  offSamples: number;
  /** Whether an off sample sits on another truth stroke. */
  leavesForAnother: boolean;
  /** Ids of the truth strokes the result strays onto, without repeats. */
  leftFor: string[];
  /** Largest distance of a result sample to its own truth centreline, px. */
  maxDeviation: number;
}

export interface ScoreSummary {
  strokes: number;
  /** Visible truth samples pooled over all strokes. */
  visibleSamples: number;
  /** Pooled over all visible truth samples, px. */
  meanCentreline: number;
  p95Centreline: number;
  meanRadius: number;
  /** Number of short gaps over all strokes. */
  shortGaps: number;
  /** Pooled over the truth samples of all short gaps, px. */
  meanGapCentreline: number;
  /** Smallest and mean gap overlap over all short gaps, 0..1. */
  minGapOverlap: number;
  meanGapOverlap: number;
  /** Strokes that leave for another truth stroke, and their truth ids. */
  leaving: number;
  leavingIds: string[];
  /** Largest max deviation over all strokes, px. */
  maxDeviation: number;
}

/** Mean of the values; NaN for none. */
export function mean(values: ArrayLike<number>): number {
  if (values.length === 0) return NaN;
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i];
  return s / values.length;
}

/** Percentile q in [0, 1], linear between order statistics at rank q · (n − 1); NaN for none. */
export function percentile(values: ArrayLike<number>, q: number): number {
  const n = values.length;
  if (n === 0) return NaN;
  const sorted = Float64Array.from(values).sort();
  const rank = q * (n - 1);
  const lo = Math.floor(rank);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (rank - lo) * (sorted[hi] - sorted[lo]);
}

/** Arc length of the truth centreline from sample `from` to sample `to`, px. */
export function arcLength(samples: ReadonlyArray<{ x: number; y: number }>, from: number, to: number): number {
  let s = 0;
  for (let i = Math.max(from, 0) + 1; i <= to && i < samples.length; i++) {
    s += Math.hypot(samples[i].x - samples[i - 1].x, samples[i].y - samples[i - 1].y);
  }
  return s;
}

/**
 * Whether a closest point on segment k..k+1 at t lies inside a restored span (see the
 * module notes). When both ends are in a span the nearer one is too, so testing the
 * nearer end alone covers both rules.
 */
export function closestInRestored(spans: ReadonlyArray<SampleSpan>, segment: number, t: number, sampleCount: number): boolean {
  const nearest = t < 0.5 ? segment : Math.min(segment + 1, sampleCount - 1);
  for (const s of spans) if (nearest >= s.from && nearest <= s.to) return true;
  return false;
}

/**
 * Scores one traced stroke against its truth stroke.
 * @param result the traced stroke (a `Stroke`, or anything with its samples and restored spans)
 * @param truth the truth stroke it should follow
 * @param others the other truth strokes of the inscription; `truth` itself may be among them
 *   and is skipped
 */
export function scoreStroke(result: ScoredStroke, truth: TruthStroke, others: ReadonlyArray<TruthStroke>): StrokeScore {
  if (result.samples.length === 0) throw new RangeError('the traced stroke has no samples');
  if (truth.samples.length === 0) throw new RangeError(`truth stroke ${truth.id} has no samples`);
  const res = toRadiusPolyline(result.samples);
  const own = toRadiusPolyline(truth.samples);
  const cp = createClosestPoint();
  const n = truth.samples.length;

  // Mark gap samples once; then each truth sample is measured once against the result.
  const inGap = new Uint8Array(n);
  for (const g of truth.gaps) for (let i = Math.max(g.from, 0); i <= g.to && i < n; i++) inGap[i] = 1;
  const centreline = new Float64Array(n);
  const inRestored = new Uint8Array(n);
  const visibleCentrelineErrors: number[] = [];
  const visibleRadiusErrors: number[] = [];
  for (let i = 0; i < n; i++) {
    const s = truth.samples[i];
    closestOnPolyline(res, s.x, s.y, cp);
    centreline[i] = cp.distance;
    inRestored[i] = closestInRestored(result.restoredSpans, cp.segment, cp.t, result.samples.length) ? 1 : 0;
    if (!inGap[i]) {
      visibleCentrelineErrors.push(cp.distance);
      visibleRadiusErrors.push(Math.abs(cp.r - s.r));
    }
  }

  const gaps: GapScore[] = [];
  const gapCentrelineErrors: number[] = [];
  for (const g of truth.gaps) {
    const from = Math.max(g.from, 0);
    const to = Math.min(g.to, n - 1);
    if (to < from) continue;
    const len = arcLength(truth.samples, from, to);
    if (len > SHORT_GAP_MAX_PX) continue;
    let sum = 0;
    let inside = 0;
    for (let i = from; i <= to; i++) {
      sum += centreline[i];
      inside += inRestored[i];
      gapCentrelineErrors.push(centreline[i]);
    }
    const count = to - from + 1;
    gaps.push({ from, to, arcLength: len, meanCentreline: sum / count, overlap: inside / count });
  }

  const rivals: { id: string; line: RadiusPolyline }[] = [];
  for (const o of others) {
    if (o === truth || o.id === truth.id || o.samples.length === 0) continue;
    rivals.push({ id: o.id, line: toRadiusPolyline(o.samples) });
  }
  let offSamples = 0;
  let maxDeviation = 0;
  const leftFor = new Set<string>();
  for (let j = 0; j < result.samples.length; j++) {
    const x = res.xs[j], y = res.ys[j];
    closestOnPolyline(own, x, y, cp);
    if (cp.distance > maxDeviation) maxDeviation = cp.distance;
    if (cp.distance <= Math.max(OFF_MIN_PX, cp.r + OFF_MARGIN_PX)) continue;
    offSamples++;
    for (const rival of rivals) {
      // The box test skips strokes that cannot be within their widest pen of this sample.
      if (distanceToBox(rival.line, x, y) > rival.line.rMax + OFF_MARGIN_PX) continue;
      closestOnPolyline(rival.line, x, y, cp);
      if (cp.distance <= cp.r + OFF_MARGIN_PX) leftFor.add(rival.id);
    }
  }

  return {
    truthId: truth.id,
    visibleCentrelineErrors,
    visibleRadiusErrors,
    meanCentreline: mean(visibleCentrelineErrors),
    p95Centreline: percentile(visibleCentrelineErrors, 0.95),
    meanRadius: mean(visibleRadiusErrors),
    gaps,
    gapCentrelineErrors,
    meanGapCentreline: mean(gapCentrelineErrors),
    offSamples,
    leavesForAnother: leftFor.size > 0,
    leftFor: [...leftFor],
    maxDeviation,
  };
}

/**
 * Aggregates per-stroke scores: centreline and radius figures pooled over samples (each
 * truth sample weighs the same, whatever its stroke), gap overlaps as min and mean over
 * all short gaps, and the count of strokes that leave for another.
 */
export function summarizeScores(list: ReadonlyArray<StrokeScore>): ScoreSummary {
  const centre: number[] = [];
  const radius: number[] = [];
  const gapCentre: number[] = [];
  const overlaps: number[] = [];
  const leavingIds: string[] = [];
  let maxDeviation = list.length ? 0 : NaN;
  for (const s of list) {
    for (const v of s.visibleCentrelineErrors) centre.push(v);
    for (const v of s.visibleRadiusErrors) radius.push(v);
    for (const v of s.gapCentrelineErrors) gapCentre.push(v);
    for (const g of s.gaps) overlaps.push(g.overlap);
    if (s.leavesForAnother) leavingIds.push(s.truthId);
    if (s.maxDeviation > maxDeviation) maxDeviation = s.maxDeviation;
  }
  return {
    strokes: list.length,
    visibleSamples: centre.length,
    meanCentreline: mean(centre),
    p95Centreline: percentile(centre, 0.95),
    meanRadius: mean(radius),
    shortGaps: overlaps.length,
    meanGapCentreline: mean(gapCentre),
    minGapOverlap: overlaps.length ? Math.min(...overlaps) : NaN,
    meanGapOverlap: mean(overlaps),
    leaving: leavingIds.length,
    leavingIds,
    maxDeviation,
  };
}

function px(v: number): string {
  return Number.isFinite(v) ? `${v.toFixed(2)} px` : 'n/a';
}

function share(v: number): string {
  return Number.isFinite(v) ? `${(v * 100).toFixed(0)} %` : 'n/a';
}

/** The summary as a few lines of plain text, without a trailing newline. */
export function formatSummary(summary: ScoreSummary): string {
  const s = summary;
  const leaving = s.leaving ? ` (${s.leavingIds.join(', ')})` : '';
  return [
    `strokes scored: ${s.strokes}`,
    `visible centreline error: mean ${px(s.meanCentreline)}, p95 ${px(s.p95Centreline)} over ${s.visibleSamples} samples`,
    `visible radius error: mean ${px(s.meanRadius)}`,
    `short gaps (≤ ${SHORT_GAP_MAX_PX} px): ${s.shortGaps}, centreline error mean ${px(s.meanGapCentreline)}, ` +
      `restored overlap min ${share(s.minGapOverlap)}, mean ${share(s.meanGapOverlap)}`,
    `strokes leaving for another: ${s.leaving}${leaving}`,
    `max deviation from own centreline: ${px(s.maxDeviation)}`,
  ].join('\n');
}

/**
 * The truth stroke whose endpoints best match the result's first and last sample: the
 * least sum of the two endpoint distances, the truth taken in either direction.
 * Undefined when the result has no samples or there are no truth strokes.
 */
export function matchTruthStroke(result: ScoredStroke | Stroke, truths: ReadonlyArray<TruthStroke>): TruthStroke | undefined {
  const rs = result.samples;
  if (rs.length === 0) return undefined;
  const a = rs[0];
  const b = rs[rs.length - 1];
  let best: TruthStroke | undefined;
  let bestCost = Infinity;
  for (const t of truths) {
    if (t.samples.length === 0) continue;
    const p = t.samples[0];
    const q = t.samples[t.samples.length - 1];
    const forward = Math.hypot(a.x - p.x, a.y - p.y) + Math.hypot(b.x - q.x, b.y - q.y);
    const backward = Math.hypot(a.x - q.x, a.y - q.y) + Math.hypot(b.x - p.x, b.y - p.y);
    const cost = Math.min(forward, backward);
    if (cost < bestCost) {
      bestCost = cost;
      best = t;
    }
  }
  return best;
}
