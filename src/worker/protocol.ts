/**
 * The messages between the editor and its engine (a Web Worker in the page, the same
 * host in-process in Node tests). Plain data only, so they cross postMessage as they are;
 * the large typed arrays (luma, evidence) travel by transfer, not by copy.
 *
 * Every request that expects an answer carries an `id` chosen by the sender; the answer
 * repeats it. Solves also carry a `jobId`, which `cancel` names.
 */
import type { Anchor, SolverSettings } from '../doc/model.ts';
import type { Point, Stroke, StrokeSample } from '../trace/types.ts';

/** Hands one band's luma (0..1, row-major) to the engine; answered by 'loaded'. */
export interface LoadImageRequest {
  type: 'load-image';
  id: number;
  imageId: string;
  width: number;
  height: number;
  /** width × height samples; transferred. */
  luma: Float32Array;
}

/**
 * Hands an image file (PNG or JPEG bytes) to the engine, which decodes it itself, so a
 * large photo is never decoded on the page's thread; answered by 'loaded' (or 'error'
 * with the decoder's message). `band` picks the band of a multi-band file (default 0).
 */
export interface LoadFileRequest {
  type: 'load-file';
  id: number;
  imageId: string;
  /** The file's bytes; transferred. */
  bytes: Uint8Array;
  band?: number;
}

/** Decodes an image file to check it and read its header figures; answered by 'probed'. Nothing is kept. */
export interface ProbeFileRequest {
  type: 'probe-file';
  id: number;
  /** The file's bytes; transferred. */
  bytes: Uint8Array;
}

/** Asks for the ink evidence of a loaded image as 8-bit values; answered by 'evidence'. */
export interface EvidenceRequest {
  type: 'evidence';
  id: number;
  imageId: string;
}

/** Starts growing a preview tree from `start`, replacing any earlier one. No answer. */
export interface PreviewStartRequest {
  type: 'preview-start';
  /** Names this preview; later path requests and answers carry it. */
  previewId: number;
  imageId: string;
  start: Point;
  settings: SolverSettings;
}

/**
 * Asks for the preview path to `to`. Answered as soon as the tree has reached that pixel,
 * or with no path once it is clear it never will (outside the tree, or the tree is complete).
 */
export interface PreviewPathRequest {
  type: 'preview-path';
  id: number;
  previewId: number;
  to: Point;
}

/** Drops the preview tree. No answer. */
export interface PreviewStopRequest {
  type: 'preview-stop';
  previewId: number;
}

/** The exact solve through the anchors; answered by 'solved' or 'error'. */
export interface SolveRequest {
  type: 'solve';
  id: number;
  jobId: string;
  imageId: string;
  anchors: Anchor[];
  settings: SolverSettings;
}

/** Drops a queued solve; its answer (if it is already running) is an error named 'Cancelled'. */
export interface CancelRequest {
  type: 'cancel';
  jobId: string;
}

export type EngineRequest =
  | LoadImageRequest | LoadFileRequest | ProbeFileRequest | EvidenceRequest | PreviewStartRequest | PreviewPathRequest
  | PreviewStopRequest | SolveRequest | CancelRequest;

export interface LoadedReply {
  type: 'loaded';
  id: number;
  imageId: string;
  /** Time to compute the ink evidence and the solver's preparation, ms. */
  ms: number;
}

/** What a decoded file is: its size, bands, bit depth and the scale of its resolution tag. */
export interface ImageProbe {
  format: 'png' | 'jpeg';
  width: number;
  height: number;
  bands: number;
  bitDepth: number;
  /** From the file's resolution tag (PNG pHYs, JPEG JFIF density), px per mm. */
  pxPerMm?: number;
}

export interface ProbedReply extends ImageProbe {
  type: 'probed';
  id: number;
}

export interface EvidenceReply {
  type: 'evidence';
  id: number;
  imageId: string;
  width: number;
  height: number;
  /** Evidence × 255, row-major; transferred. */
  data: Uint8ClampedArray;
}

export interface PreviewPathReply {
  type: 'preview-path';
  id: number;
  previewId: number;
  /** Undefined when the tree does not reach `to`. */
  path: StrokeSample[] | undefined;
}

export interface SolvedReply {
  type: 'solved';
  id: number;
  jobId: string;
  stroke: Stroke;
  /** Time of the solve (both passes when a radius is pinned), ms. */
  ms: number;
}

export interface ErrorReply {
  type: 'error';
  id: number;
  jobId?: string;
  /** The error's name: 'FollowError' for requests the solver cannot take, 'Cancelled', … */
  name: string;
  /** One plain sentence. */
  message: string;
}

export type EngineReply = LoadedReply | ProbedReply | EvidenceReply | PreviewPathReply | SolvedReply | ErrorReply;

/** Sends one message, handing over the listed buffers. */
export type PostReply = (reply: EngineReply, transfer: ArrayBuffer[]) => void;
