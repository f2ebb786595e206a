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
}

export function prepareInk(evidence: InkEvidence): PreparedInk {
  const coarse = gaussianBlur(downsample(evidence, COARSE_FACTOR, 'max'), 0.7);
  return { evidence, coarse, workspace: new LiftedWorkspace() };
}
