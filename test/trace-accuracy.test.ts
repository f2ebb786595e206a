/**
 * Accuracy of followStroke against the ground truth of the synthetic test set, with
 * the true endpoints given and default weights. The figures are printed.
 */
import { describe, expect, it } from 'vitest';
import { inkEvidence } from '../src/ink/index.ts';
import { formatSummary, scoreStroke, summarizeScores, type StrokeScore } from '../src/score/index.ts';
import { synthesize, testSetRecipe } from '../src/synth/index.ts';
import { followStroke, prepareInk } from '../src/trace/index.ts';

describe('stroke accuracy on the synthetic test set', () => {
  const scores: StrokeScore[] = [];
  const recipes = testSetRecipe();
  // Result samples marked restored although their nearest truth sample is visible ink
  // more than 3 px from any gap: a restored mark there would mislead.
  let falseRestored = 0;
  let resultSamples = 0;

  it('traces every stroke of the test set from its true endpoints', () => {
    for (const recipe of recipes) {
      const s = synthesize(recipe);
      const prep = prepareInk(inkEvidence(s.bands[0]), s.bands[0]);
      for (const truth of s.truth.strokes) {
        const a = truth.samples[0];
        const b = truth.samples[truth.samples.length - 1];
        const res = followStroke(prep, { anchors: [{ x: a.x, y: a.y }, { x: b.x, y: b.y }] });
        const others = s.truth.strokes.filter((o) => o !== truth);
        const sc = scoreStroke(res, truth, others);
        resultSamples += res.samples.length;
        for (const span of res.restoredSpans) {
          for (let i = span.from; i <= span.to; i++) {
            const p = res.samples[i];
            let best = Infinity;
            let at = 0;
            truth.samples.forEach((t, k) => {
              const d = (t.x - p.x) ** 2 + (t.y - p.y) ** 2;
              if (d < best) { best = d; at = k; }
            });
            if (!truth.gaps.some((g) => at >= g.from - 6 && at <= g.to + 6)) falseRestored++;
          }
        }
        scores.push({ ...sc, truthId: `seed ${recipe.seed} ${recipe.difficulty} ${truth.id}` });
      }
    }
    expect(scores.length).toBeGreaterThanOrEqual(60);
    console.log(`accuracy over ${scores.length} strokes:\n${formatSummary(summarizeScores(scores))}`);
  });

  it('visible ink: centreline mean ≤ 0.5 px, p95 ≤ 1.5 px; radius mean abs error ≤ 0.45 px', () => {
    const sum = summarizeScores(scores);
    expect(sum.visibleSamples).toBeGreaterThan(1000);
    expect(sum.meanCentreline).toBeLessThanOrEqual(0.5);
    expect(sum.p95Centreline).toBeLessThanOrEqual(1.5);
    expect(sum.meanRadius).toBeLessThanOrEqual(0.45);
  });

  it('gaps up to 30 px: mean error ≤ 1.2 px, each reported as a restored span (≥ 80 % overlap)', () => {
    const sum = summarizeScores(scores);
    expect(sum.shortGaps).toBeGreaterThanOrEqual(5);
    expect(sum.meanGapCentreline).toBeLessThanOrEqual(1.2);
    const weak = scores.flatMap((s) => s.gaps.filter((g) => g.overlap < 0.8).map((g) => `${s.truthId} ${JSON.stringify(g)}`));
    expect(weak, weak.join('\n')).toEqual([]);
  });

  it('marks restored spans on visible ink rarely (≤ 1 % of samples)', () => {
    const share = falseRestored / resultSamples;
    console.log(`restored marks on visible ink: ${(100 * share).toFixed(2)} % of ${resultSamples} samples`);
    expect(resultSamples).toBeGreaterThan(10_000);
    expect(share).toBeLessThanOrEqual(0.01);
  });

  it('no stroke leaves its own stroke for another one', () => {
    const sum = summarizeScores(scores);
    expect(sum.leavingIds).toEqual([]);
  });
});

describe('stroke accuracy on the built-in demo inscription, both bands', () => {
  it('meets the same figures at the demo scale (pen radii 3–5 px)', async () => {
    const { demoOptions } = await import('../src/synth/index.ts');
    const s = synthesize(demoOptions());
    const lines: string[] = [];
    for (let band = 0; band < s.bands.length; band++) {
      const prep = prepareInk(inkEvidence(s.bands[band]), s.bands[band]);
      const scores = s.truth.strokes.map((t) => scoreStroke(
        followStroke(prep, { anchors: [t.samples[0], t.samples[t.samples.length - 1]] }), t, s.truth.strokes.filter((o) => o !== t)));
      const sum = summarizeScores(scores);
      lines.push(`${s.truth.bands[band]} band:\n${formatSummary(sum)}`);
      expect(sum.meanCentreline).toBeLessThanOrEqual(0.5);
      expect(sum.p95Centreline).toBeLessThanOrEqual(1.5);
      expect(sum.meanRadius).toBeLessThanOrEqual(0.45);
      expect(sum.meanGapCentreline).toBeLessThanOrEqual(1.2);
      expect(sum.minGapOverlap).toBeGreaterThanOrEqual(0.8);
      expect(sum.leavingIds).toEqual([]);
    }
    console.log(`demo inscription, ${s.truth.strokes.length} strokes:\n${lines.join('\n')}`);
  });
});
