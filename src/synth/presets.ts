/**
 * How much an inscription is damaged, effect by effect, and the three presets.
 */
import type { Difficulty } from './types.ts';

/**
 * Strength of each degradation, 0 = off, 1 = strong (values a little above 1 are
 * accepted and push the effect further).
 */
export interface Degradation {
  /** Textured clay surface: multi-scale value noise and grain. */
  surface: number;
  /** Low-frequency illumination shading across the surface. */
  shading: number;
  /** Ink fading along strokes: contrast varies smoothly between 1 and 1 - 0.7 × fade. */
  fade: number;
  /** Smooth pen-radius variation along a stroke: up to ±35 % at 1. */
  widthVariation: number;
  /** Chance of abrasion gaps: ink erased over 5–40 px of arc, at least 8 px from the ends. */
  abrasion: number;
  /** Blotches darker than the ink (irregular blobs of radius 8–40 px); count grows with it. */
  stains: number;
  /** Cracks and scratches: thin (0.6–1.5 px) dark wandering lines; count grows with it. */
  cracks: number;
  /** Gaussian sensor noise, sigma = 0.03 × noise. */
  noise: number;
  /** JPEG-like 8×8 block DCT quantisation; 1 is about quality 15. */
  blockiness: number;
}

/** The degradation of each difficulty. */
export const DEGRADATION_PRESETS: Record<Difficulty, Degradation> = {
  easy: {
    surface: 0.4, shading: 0.3, fade: 0.25, widthVariation: 0.3, abrasion: 0.2,
    stains: 0.3, cracks: 0.3, noise: 0.25, blockiness: 0,
  },
  medium: {
    surface: 0.7, shading: 0.5, fade: 0.5, widthVariation: 0.5, abrasion: 0.45,
    stains: 0.6, cracks: 0.6, noise: 0.5, blockiness: 0.3,
  },
  hard: {
    surface: 1, shading: 0.8, fade: 0.85, widthVariation: 0.8, abrasion: 0.75,
    stains: 1, cracks: 1, noise: 0.9, blockiness: 0.65,
  },
};
