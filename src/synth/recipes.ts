/**
 * Ready-made option sets: the built-in demo inscription and the small test set that the
 * solver's accuracy tests run on.
 */
import type { SynthOptions } from './options.ts';
import type { Difficulty } from './types.ts';

/** Seed of the built-in demo inscription. */
export const DEMO_SEED = 917031;

/**
 * The demo: 2400×1600 px, 3 lines of 9–12 letters (27–36 letters), visible and
 * infrared bands, medium damage, written right to left.
 */
export function demoOptions(): SynthOptions {
  return {
    seed: DEMO_SEED,
    width: 2400,
    height: 1600,
    lines: 3,
    lettersPerLine: [9, 12],
    difficulty: 'medium',
    bands: 2,
    direction: 'rtl',
    title: 'Sherd OT-17, the Orvane terraces',
  };
}

/** Seeds of the test set, paired in order with TEST_SET_DIFFICULTIES. */
const TEST_SET_SEEDS = [4101, 4207, 4313, 4419, 4523, 4631];
const TEST_SET_DIFFICULTIES: Difficulty[] = ['easy', 'medium', 'hard', 'easy', 'medium', 'hard'];

/**
 * The test set: six 640×400 px images (two lines of 5–6 letters, one band), two per
 * difficulty; about 120 strokes in all, each image generated in well under 0.5 s.
 */
export function testSetRecipe(): SynthOptions[] {
  return TEST_SET_SEEDS.map((seed, k) => ({
    seed,
    width: 640,
    height: 400,
    lines: 2,
    lettersPerLine: [5, 6] as [number, number],
    difficulty: TEST_SET_DIFFICULTIES[k],
    bands: 1 as const,
    direction: 'rtl' as const,
  }));
}
