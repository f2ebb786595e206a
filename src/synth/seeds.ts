/**
 * Independent random streams per stage of the generator, so that changing one stage's
 * settings (a degradation strength, say) never reshuffles another (the letter layout).
 */
import { createRandom, type Random } from '../util/random.ts';

/** Stages that draw their own random numbers. */
export const STREAM = {
  layout: 1,
  profile: 2,
  surface: 3,
  stains: 4,
  cracks: 5,
  noiseVisible: 6,
  noiseInfrared: 7,
  fadeField: 8,
  gaps: 9,
  look: 10,
  shading: 11,
} as const;

/** A well-mixed 32-bit seed for `stream` of the inscription seeded with `seed`. */
export function subSeed(seed: number, stream: number): number {
  // 32-bit finaliser (murmur3 style): nearby seeds and streams give unrelated states.
  let h = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(stream + 1, 0x85ebca77)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

export function streamRandom(seed: number, stream: number): Random {
  return createRandom(subSeed(seed, stream));
}
