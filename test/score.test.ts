import { describe, expect, it } from 'vitest';
import {
  closestInRestored, formatSummary, matchTruthStroke, percentile, scoreStroke, summarizeScores,
  type ScoredStroke,
} from '../src/score/index.ts';
import type { IndexSpan, TruthStroke } from '../src/synth/types.ts';

/** A horizontal truth stroke at height y from x0 to x1, samples every `step` px. */
function truthLine(id: string, y: number, x0: number, x1: number, r = 2, gaps: IndexSpan[] = [], step = 0.5): TruthStroke {
  const samples = [];
  for (let x = x0; x <= x1 + 1e-9; x += step) samples.push({ x, y, r, contrast: 1 });
  return { id, letterId: 'L1', samples, gaps };
}

function result(points: Array<[number, number, number?]>, restoredSpans: IndexSpan[] = []): ScoredStroke {
  return { samples: points.map(([x, y, r]) => ({ x, y, r: r ?? 2 })), restoredSpans };
}

describe('percentile', () => {
  it('interpolates between order statistics', () => {
    expect(percentile([5, 1, 4, 2, 3], 0.95)).toBeCloseTo(4.8, 12);
    expect(percentile([7], 0.95)).toBe(7);
    expect(percentile([], 0.95)).toBeNaN();
  });
});

describe('scoreStroke: visible samples', () => {
  it('a straight result offset by exactly 0.5 px has mean and p95 error 0.5', () => {
    const truth = truthLine('s1', 10, 0, 20);
    const s = scoreStroke(result([[0, 10.5], [10, 10.5], [20, 10.5]]), truth, []);
    expect(s.visibleCentrelineErrors).toHaveLength(41);
    expect(s.meanCentreline).toBeCloseTo(0.5, 12);
    expect(s.p95Centreline).toBeCloseTo(0.5, 12);
    expect(s.meanRadius).toBe(0);
    expect(s.maxDeviation).toBeCloseTo(0.5, 12);
    expect(s.offSamples).toBe(0);
    expect(s.leavesForAnother).toBe(false);
  });

  it('radius error uses the result radius interpolated at the closest point', () => {
    // Result radius runs 1 → 3 along x 0 → 20; truth radius is 2 everywhere, so the
    // error is |1 + x/10 − 2| = |x − 10| / 10, whose sum over x = 0, 0.5, …, 20 is 21, over 41 samples.
    const truth = truthLine('s1', 10, 0, 20);
    const s = scoreStroke(result([[0, 10, 1], [20, 10, 3]]), truth, []);
    expect(s.meanCentreline).toBe(0);
    expect(s.meanRadius).toBeCloseTo(21 / 41, 12);
  });

  it('gap samples are left out of the visible figures', () => {
    // Samples 10..20 (x 5..10) are a gap; the result bows to y = 13 only there.
    const truth = truthLine('s1', 10, 0, 20, 2, [{ from: 10, to: 20 }]);
    const s = scoreStroke(result([[0, 10], [5, 10], [5, 13], [10, 13], [10, 10], [20, 10]]), truth, []);
    expect(s.visibleCentrelineErrors).toHaveLength(30);
    expect(s.meanCentreline).toBe(0);
    expect(s.gaps).toHaveLength(1);
    // A gap sample at x is min(x − 5, 10 − x, 3) px from the detour: 0, 0.5, 1, …, 2.5, …, 0.5, 0.
    expect(s.meanGapCentreline).toBeCloseTo(12.5 / 11, 12);
  });
});

describe('scoreStroke: gaps and restored spans', () => {
  it('maps closest points to restored spans by segment and nearest end', () => {
    // Gap: samples 10..20, x = 5, 5.5, …, 10. Restored span: result samples 2..3 (x 6 and 8).
    // x = 5.0 is nearest result sample 1 (4.2): outside. x = 10 is nearest sample 4 (11.2):
    // outside. The nine samples from 5.5 to 9.5 are inside.
    const truth = truthLine('s1', 10, 0, 20, 2, [{ from: 10, to: 20 }]);
    const r = result([[0, 10], [4.2, 10], [6, 10], [8, 10], [11.2, 10], [20, 10]], [{ from: 2, to: 3 }]);
    const s = scoreStroke(r, truth, []);
    expect(s.gaps).toEqual([{ from: 10, to: 20, arcLength: 5, meanCentreline: 0, overlap: 9 / 11 }]);
  });

  it('closestInRestored follows the nearer end of the segment', () => {
    const spans = [{ from: 2, to: 3 }];
    expect(closestInRestored(spans, 1, 0.44, 6)).toBe(false);
    expect(closestInRestored(spans, 1, 0.72, 6)).toBe(true);
    expect(closestInRestored(spans, 2, 0.9, 6)).toBe(true);
    expect(closestInRestored(spans, 3, 0.5, 6)).toBe(false);
    expect(closestInRestored(spans, 3, 0.49, 6)).toBe(true);
  });

  it('gaps longer than 30 px are not scored', () => {
    // Gap over samples 10..80: arc length 35 px.
    const truth = truthLine('s1', 10, 0, 50, 2, [{ from: 10, to: 80 }]);
    const s = scoreStroke(result([[0, 10], [50, 10]]), truth, []);
    expect(s.gaps).toEqual([]);
    expect(s.meanGapCentreline).toBeNaN();
    expect(s.visibleCentrelineErrors).toHaveLength(101 - 71);
  });
});

describe('scoreStroke: leaving the own stroke', () => {
  const a = truthLine('a', 10, 0, 40);
  const b = truthLine('b', 16, 0, 40);

  it('flags a trace that veers onto a parallel neighbour', () => {
    const veer = result([[0, 10], [15, 10], [18, 16], [30, 16], [33, 10], [40, 10]]);
    const s = scoreStroke(veer, a, [a, b]);
    expect(s.offSamples).toBe(2);
    expect(s.leavesForAnother).toBe(true);
    expect(s.leftFor).toEqual(['b']);
    expect(s.maxDeviation).toBeCloseTo(6, 12);
  });

  it('does not flag a faithful trace, nor the neighbour itself', () => {
    expect(scoreStroke(result([[0, 10], [40, 10]]), a, [a, b]).leavesForAnother).toBe(false);
    expect(scoreStroke(result([[0, 16], [40, 16]]), b, [a, b]).leavesForAnother).toBe(false);
  });

  it('counts off samples that land on no other stroke without flagging them', () => {
    const far = truthLine('far', 30, 0, 40);
    const s = scoreStroke(result([[0, 10], [20, 14.5], [40, 10]]), a, [a, far]);
    expect(s.offSamples).toBe(1);
    expect(s.leavesForAnother).toBe(false);
    expect(s.maxDeviation).toBeCloseTo(4.5, 12);
  });

  it('a sample 3 px off a thin stroke is not off (the 3 px floor), 3.1 px is', () => {
    const thin = truthLine('thin', 10, 0, 40, 1);
    expect(scoreStroke(result([[0, 10], [20, 13], [40, 10]]), thin, []).offSamples).toBe(0);
    expect(scoreStroke(result([[0, 10], [20, 13.1], [40, 10]]), thin, []).offSamples).toBe(1);
  });
});

describe('matchTruthStroke', () => {
  const a = truthLine('a', 10, 0, 40);
  const b = truthLine('b', 16, 0, 40);
  it('matches by endpoints in either direction', () => {
    expect(matchTruthStroke(result([[0.5, 16.2], [39, 15.8]]), [a, b])?.id).toBe('b');
    expect(matchTruthStroke(result([[40, 10.4], [1, 10]]), [a, b])?.id).toBe('a');
    expect(matchTruthStroke(result([]), [a, b])).toBeUndefined();
    expect(matchTruthStroke(result([[0, 0]]), [])).toBeUndefined();
  });
});

describe('summarizeScores', () => {
  it('pools samples, takes min and mean of gap overlaps, counts leaving strokes', () => {
    const a = truthLine('a', 10, 0, 20);
    const b = truthLine('b', 40, 0, 5, 2, [{ from: 2, to: 5 }]);
    const c = truthLine('c', 16, 0, 40);
    const sa = scoreStroke(result([[0, 10.5], [20, 10.5]]), a, [a, b, c]); // 41 samples at 0.5
    const sb = scoreStroke(result([[0, 41], [1, 41], [2, 41], [5, 41]], [{ from: 2, to: 3 }]), b, [a, b, c]);
    const sc = scoreStroke(result([[0, 16], [10, 16], [14, 10], [16, 10], [20, 16], [40, 16]]), c, [a, b, c]);
    expect(sb.visibleCentrelineErrors).toHaveLength(7);
    expect(sb.gaps[0].overlap).toBeCloseTo(3 / 4, 12);
    const sum = summarizeScores([sa, sb, sc]);
    expect(sum.strokes).toBe(3);
    expect(sum.visibleSamples).toBe(41 + 7 + 81);
    const pooled = [...sa.visibleCentrelineErrors, ...sb.visibleCentrelineErrors, ...sc.visibleCentrelineErrors];
    expect(sum.meanCentreline).toBeCloseTo(pooled.reduce((x, y) => x + y, 0) / pooled.length, 12);
    expect(sum.shortGaps).toBe(1);
    expect(sum.minGapOverlap).toBeCloseTo(0.75, 12);
    expect(sum.meanGapOverlap).toBeCloseTo(0.75, 12);
    expect(sum.leaving).toBe(1);
    expect(sum.leavingIds).toEqual(['c']);
    expect(sum.maxDeviation).toBeCloseTo(6, 12);

    const text = formatSummary(sum);
    expect(text.split('\n')).toHaveLength(6);
    expect(text).toContain('strokes scored: 3');
    expect(text).toContain('strokes leaving for another: 1 (c)');
    expect(text).toContain('restored overlap min 75 %, mean 75 %');
  });

  it('an empty list gives NaN figures that print as n/a', () => {
    const sum = summarizeScores([]);
    expect(sum.meanCentreline).toBeNaN();
    expect(formatSummary(sum)).toContain('mean n/a');
  });
});
