/**
 * Ink evidence separates ink from bare surface: ROC AUC for visible-ink pixels against
 * background pixels on the synthetic test set (ground truth from the generator).
 * AUC is computed as the Mann–Whitney U statistic (Hanley & McNeil 1982), checked
 * first on that paper's worked example.
 */
import { describe, expect, it } from 'vitest';
import { createGray } from '../src/image/gray.ts';
import { inkEvidence } from '../src/ink/index.ts';
import { rocAuc } from '../src/score/roc.ts';
import { synthesize, testSetRecipe, type Difficulty } from '../src/synth/index.ts';

describe('rocAuc', () => {
  it('reproduces the worked example of Hanley & McNeil (1982): 0.893', () => {
    // 5-point ratings of 58 normal and 51 abnormal CT images (their Table 1, from memory):
    // normal 33, 6, 6, 11, 2; abnormal 3, 2, 2, 11, 33; reported area 0.893.
    const normal = [33, 6, 6, 11, 2];
    const abnormal = [3, 2, 2, 11, 33];
    const scores: number[] = [];
    const labels: number[] = [];
    normal.forEach((n, k) => { for (let i = 0; i < n; i++) { scores.push(k + 1); labels.push(0); } });
    abnormal.forEach((n, k) => { for (let i = 0; i < n; i++) { scores.push(k + 1); labels.push(1); } });
    expect(rocAuc(scores, labels)).toBeCloseTo(0.893, 3);
  });

  it('is 1 for perfect separation, ½ for a constant score, and ignores other labels', () => {
    expect(rocAuc([0.1, 0.2, 0.8, 0.9], [0, 0, 1, 1])).toBe(1);
    expect(rocAuc([0.5, 0.5, 0.5], [0, 1, 1])).toBe(0.5);
    expect(rocAuc([0.9, 0.1, 0.2, 0.8], [2, 0, 0, 1])).toBe(1);
  });
});

describe('ink evidence', () => {
  it('polarity: light ink on a dark ground scores like dark ink on a light ground', () => {
    const w = 40;
    const dark = new Float32Array(w * w).fill(0.8);
    for (let y = 18; y < 23; y++) for (let x = 5; x < 35; x++) dark[y * w + x] = 0.3;
    const light = dark.map((v) => 1 - v);
    const a = inkEvidence(createGray(w, w, dark));
    const b = inkEvidence(createGray(w, w, light), { polarity: 'light' });
    expect(a.data[20 * w + 20]).toBeGreaterThan(0.9);
    expect(a.data[5 * w + 20]).toBeLessThan(0.1);
    for (let i = 0; i < a.data.length; i++) expect(b.data[i]).toBeCloseTo(a.data[i], 5);
  });

  it('ROC AUC ≥ 0.95 for visible ink vs background on the test set, per difficulty', () => {
    const byDifficulty = new Map<Difficulty, { scores: number[]; labels: number[] }>();
    for (const recipe of testSetRecipe()) {
      const s = synthesize(recipe);
      const ev = inkEvidence(s.bands[0]);
      const entry = byDifficulty.get(s.truth.difficulty) ?? { scores: [], labels: [] };
      for (let p = 0; p < ev.data.length; p++) {
        // Visible ink: coverage ≥ ½; background: no ink at all (erased ink excluded).
        const label = s.inkMask[p] >= 0.5 ? 1 : s.fullInkMask[p] === 0 ? 0 : -1;
        if (label < 0) continue;
        entry.scores.push(ev.data[p]);
        entry.labels.push(label);
      }
      byDifficulty.set(s.truth.difficulty, entry);
    }
    const report: string[] = [];
    for (const [difficulty, { scores, labels }] of byDifficulty) {
      const auc = rocAuc(scores, labels);
      report.push(`${difficulty}: AUC ${auc.toFixed(4)}`);
      expect(auc, difficulty).toBeGreaterThanOrEqual(0.95);
    }
    console.log(`ink evidence ROC AUC (visible ink vs background): ${report.join(', ')}`);
    expect(byDifficulty.size).toBe(3);
  });
});
