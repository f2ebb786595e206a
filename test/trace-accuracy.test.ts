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

  it('traces every stroke of the test set from its true endpoints', () => {
    for (const recipe of recipes) {
      const s = synthesize(recipe);
      const prep = prepareInk(inkEvidence(s.bands[0]));
      for (const truth of s.truth.strokes) {
        const a = truth.samples[0];
        const b = truth.samples[truth.samples.length - 1];
        const res = followStroke(prep, { anchors: [{ x: a.x, y: a.y }, { x: b.x, y: b.y }] });
        const others = s.truth.strokes.filter((o) => o !== truth);
        const sc = scoreStroke(res, truth, others);
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

  it('no stroke leaves its own stroke for another one', () => {
    const sum = summarizeScores(scores);
    expect(sum.leavingIds).toEqual([]);
  });
});
