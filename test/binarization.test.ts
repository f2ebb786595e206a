/**
 * Binarization figures on tiny literal grids worked out by hand: F-measure as DIBCO
 * defines it, DRD as Lu, Kot & Shi (2004) define it.
 */
import { describe, expect, it } from 'vitest';
import { binarize, drd, DRD_WEIGHTS, fMeasure, nonUniformBlocks } from '../src/score/binarization.ts';

/** A mask from rows of '#' (ink) and '.' (background). */
function grid(rows: string[]): { mask: Uint8Array; width: number; height: number } {
  const width = rows[0].length, height = rows.length;
  const mask = new Uint8Array(width * height);
  rows.forEach((r, y) => [...r].forEach((ch, x) => { mask[y * width + x] = ch === '#' ? 1 : 0; }));
  return { mask, width, height };
}

const TRUTH = grid([
  '........',
  '........',
  '........',
  '...##...',
  '...##...',
  '........',
  '........',
  '........',
]);

describe('DRD weight matrix', () => {
  it('is the normalised reciprocal distance (Lu, Kot & Shi 2004)', () => {
    // Unnormalised sum: 4·1 + 4/√2 + 4/2 + 8/√5 + 4/√8 = 13.82035 (worked by hand).
    const sum = 4 + 4 / Math.SQRT2 + 2 + 8 / Math.sqrt(5) + 4 / Math.sqrt(8);
    expect(sum).toBeCloseTo(13.82035, 5);
    // Values as printed in the paper's matrix to four places (from memory): 0.0256, 0.0324, 0.0362, 0.0512, 0.0724.
    const w = (i: number, j: number) => DRD_WEIGHTS[i * 5 + j];
    expect(w(2, 2)).toBe(0);
    expect(w(2, 3)).toBeCloseTo(0.0724, 4);
    expect(w(1, 1)).toBeCloseTo(0.0512, 4);
    expect(w(0, 2)).toBeCloseTo(0.0362, 4);
    expect(w(0, 1)).toBeCloseTo(0.0324, 4);
    expect(w(0, 0)).toBeCloseTo(0.0256, 4);
    expect(w(2, 3)).toBeCloseTo(1 / sum, 12);
    expect(DRD_WEIGHTS.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    // Symmetric under the eight symmetries of the square.
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) {
      expect(w(i, j)).toBe(w(j, i));
      expect(w(i, j)).toBe(w(4 - i, j));
    }
  });
});

describe('F-measure (DIBCO)', () => {
  it('one extra pixel beside a 2 × 2 square: P = 4/5, R = 1, F = 88.89', () => {
    const res = grid(['........', '........', '........', '...###..', '...##...', '........', '........', '........']);
    const f = fMeasure(res.mask, TRUTH.mask);
    // TP 4, FP 1, FN 0: F = 2 · 0.8 · 1 / 1.8 × 100 = 88.888… (by hand).
    expect([f.tp, f.fp, f.fn]).toEqual([4, 1, 0]);
    expect(f.precision).toBeCloseTo(0.8, 12);
    expect(f.recall).toBe(1);
    expect(f.f).toBeCloseTo(800 / 9, 10);
  });

  it('one missed and one extra pixel: P = R = 3/4, F = 75', () => {
    const res = grid(['........', '........', '........', '....##..', '...##...', '........', '........', '........']);
    const f = fMeasure(res.mask, TRUTH.mask);
    expect([f.tp, f.fp, f.fn]).toEqual([3, 1, 1]);
    expect(f.f).toBeCloseTo(75, 10);
  });

  it('nothing found gives 0, a perfect result 100', () => {
    expect(fMeasure(new Uint8Array(64), TRUTH.mask).f).toBe(0);
    expect(fMeasure(TRUTH.mask, TRUTH.mask).f).toBe(100);
  });
});

describe('DRD (Lu, Kot & Shi 2004)', () => {
  const W = DRD_WEIGHTS;
  it('an extra pixel right of a 2 × 2 square', () => {
    const res = grid(['........', '........', '........', '...###..', '...##...', '........', '........', '........']);
    // The flipped pixel (row 3, col 5) is ink in the result; its 5 × 5 neighbours that are
    // background in the truth weigh 1 − (weights of the true ink around it): ink at
    // distance 1 (3,4), √2 (4,4), 2 (3,3), √5 (4,3): 1 − (0.072357 + 0.051164 + 0.036179
    // + 0.032359) = 0.807941. One 8 × 8 block, not uniform: NUBN = 1. (by hand)
    expect(nonUniformBlocks(TRUTH.mask, 8, 8)).toBe(1);
    const expected = 1 - (W[2 * 5 + 1] + W[3 * 5 + 1] + W[2 * 5 + 0] + W[3 * 5 + 0]);
    expect(expected).toBeCloseTo(0.807941, 5);
    expect(drd(res.mask, TRUTH.mask, 8, 8)).toBeCloseTo(0.807941, 5);
  });

  it('a missed corner of the square', () => {
    const res = grid(['........', '........', '........', '....#...', '...##...', '........', '........', '........']);
    // Flipped pixel (3,3) is background in the result: it costs the weights of the true
    // ink around it: (3,4) at 1, (4,3) at 1, (4,4) at √2: 2 · 0.072357 + 0.051164 = 0.195878.
    expect(drd(res.mask, TRUTH.mask, 8, 8)).toBeCloseTo(0.195878, 5);
  });

  it('divides by the non-uniform 8 × 8 blocks only', () => {
    // 16 × 8: the square's block is non-uniform, the right-hand block is all background.
    const wide = grid([
      '................', '................', '................', '...##...........',
      '...##...........', '................', '................', '................',
    ]);
    expect(nonUniformBlocks(wide.mask, 16, 8)).toBe(1);
    const res = Uint8Array.from(wide.mask);
    res[3 * 16 + 12] = 1; // a lone extra pixel far from ink: all 24 neighbours background, cost 1
    expect(drd(res, wide.mask, 16, 8)).toBeCloseTo(1, 12);
    expect(drd(wide.mask, wide.mask, 16, 8)).toBe(0);
  });

  it('binarize keeps coverage ≥ 0.5', () => {
    expect([...binarize([0, 0.49, 0.5, 1])]).toEqual([0, 0, 1, 1]);
  });
});
