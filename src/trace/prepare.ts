/**
 * Per-image precomputation for the solver, done once per image and shared by every
 * stroke traced on it: a half-resolution smoothed copy of the ink evidence for the cheap
 * first path, and reusable search buffers.
 */
import { downsample, gaussianBlur } from '../image/filters.ts';
import type { GrayImage } from '../image/gray.ts';
import type { InkEvidence } from '../ink/index.ts';
import { LiftedWorkspace } from './lifted.ts';

/** Scale of the coarse grid used for the first path. */
export const COARSE_FACTOR = 2;

export interface PreparedInk {
  readonly evidence: InkEvidence;
  /** Ink evidence reduced by the maximum over 2×2 blocks (thin lines survive), smoothed (σ = 0.7 coarse px). */
  readonly coarse: GrayImage;
  /** Buffers reused by successive solves on this image (not thread-safe). */
  readonly workspace: LiftedWorkspace;
  /** The image band the evidence came from, for measuring widths on it (measure.ts); optional. */
  readonly image?: GrayImage;
  /** Whether the ink is darker ('dark', default) or lighter than its ground in `image`. */
  readonly polarity?: 'dark' | 'light';
}

/**
 * Prepares an image's ink evidence for solving. Pass the band it came from (and its ink
 * polarity) so that solves measure each stroke's width and centre on the band itself.
 */
export function prepareInk(evidence: InkEvidence, image?: GrayImage, polarity: 'dark' | 'light' = 'dark'): PreparedInk {
  const coarse = gaussianBlur(downsample(evidence, COARSE_FACTOR, 'max'), 0.7);
  if (image && (image.width !== evidence.width || image.height !== evidence.height)) {
    throw new RangeError(`the image band is ${image.width}×${image.height} px but its ink evidence ${evidence.width}×${evidence.height} px`);
  }
  return { evidence, coarse, workspace: new LiftedWorkspace(), image, polarity };
}
