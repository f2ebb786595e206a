/**
 * What the editor asks of the engine. In the page this is the Web Worker bridge
 * (engine/worker.ts); in Node tests an in-process engine (engine/local.ts) with the same
 * behaviour. The UI thread never runs the solver.
 */
import type { Anchor, SolverSettings } from '../../src/doc/model.ts';
import type { Point, Stroke, StrokeSample } from '../../src/trace/types.ts';
import type { ImageProbe } from '../../src/worker/protocol.ts';

export interface SolveResult {
  stroke: Stroke;
  /** Time of the solve in the engine, ms. */
  ms: number;
}

export interface EngineBridge {
  /** Hands one band's luma (0..1) to the engine, which computes and keeps its ink evidence. */
  loadImage(imageId: string, width: number, height: number, data: Float32Array): Promise<void>;
  /**
   * Hands an image file (PNG or JPEG bytes) to the engine, which decodes band `band`
   * (default 0) off the page's thread and computes its ink evidence; the caller keeps its bytes.
   */
  loadImageFile(imageId: string, bytes: Uint8Array, band?: number): Promise<void>;
  /** Decodes an image file off the page's thread to check it and read its size, depth and resolution tag. */
  probeImageFile(bytes: Uint8Array): Promise<ImageProbe>;
  /** Starts growing a preview tree from `start`; replaces any earlier one. */
  startPreview(imageId: string, start: Point, settings: SolverSettings): void;
  /**
   * The preview path from the start to `to`. Calls made faster than the engine answers
   * are coalesced: only the newest is answered, the older promises resolve undefined.
   */
  previewTo(to: Point): Promise<StrokeSample[] | undefined>;
  stopPreview(): void;
  /**
   * The exact solve through the anchors (pinned radii respected). A newer solve with the
   * same `key` (e.g. the stroke id being dragged) supersedes an older one, which then
   * rejects with an error named 'Superseded'.
   */
  solve(imageId: string, anchors: Anchor[], settings: SolverSettings, key?: string): Promise<SolveResult>;
  /** The ink evidence as 8-bit values 0..255, for the overlay. */
  evidence(imageId: string): Promise<{ width: number; height: number; data: Uint8ClampedArray }>;
  dispose(): void;
}
