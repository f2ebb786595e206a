/**
 * Ground truth of a synthetic inscription. Coordinates are image pixels (x right,
 * y down, pixel centres at i + 0.5); radii in pixels.
 */
export type Difficulty = 'easy' | 'medium' | 'hard';

/** One point of a true centreline with the pen radius there. */
export interface TruthSample {
  x: number;
  y: number;
  /** Pen radius, px. */
  r: number;
  /** Ink contrast at this point, 0..1 (1 = full ink, 0.3 = badly faded). */
  contrast: number;
}

/** An inclusive range of sample indices. */
export interface IndexSpan {
  from: number;
  to: number;
}

export interface TruthStroke {
  id: string;
  /** Id of the letter this stroke belongs to. */
  letterId: string;
  /** Centreline samples, about 0.5 px apart along the arc, in writing direction. */
  samples: TruthSample[];
  /** Spans where the ink was erased (abrasion gaps): no visible ink there. */
  gaps: IndexSpan[];
}

export interface TruthLetter {
  id: string;
  /** The invented letter's name in our invented alphabet. */
  name: string;
  /** Line number, from 1. */
  line: number;
  /** Order within the line in reading direction, from 1. */
  order: number;
  strokeIds: string[];
  /** Bounding box in px: [x0, y0, x1, y1]. */
  box: [number, number, number, number];
}

export interface InscriptionTruth {
  format: 'inkroute-synth-truth';
  version: 1;
  seed: number;
  difficulty: Difficulty;
  /** The invented find this inscription belongs to. */
  title: string;
  width: number;
  height: number;
  /** Scale of the surface: pixels per millimetre. */
  pxPerMm: number;
  /** Reading direction of the invented script. */
  direction: 'ltr' | 'rtl';
  /** Names of the bands, in order (e.g. 'visible', 'infrared'). */
  bands: string[];
  /** A ruler drawn on the photo: its two ends and its length in mm. */
  ruler: { x0: number; y0: number; x1: number; y1: number; mm: number };
  letters: TruthLetter[];
  strokes: TruthStroke[];
  /** Base pen radius of the inscription, px (each stroke varies around it). */
  penRadius?: number;
  /** Nominal letter height, px. */
  letterHeight?: number;
  /** The ruler's card [x0, y0, x1, y1], px: not inscription surface. */
  rulerBox?: [number, number, number, number];
  /** Strength of each degradation applied (see Degradation in synth/presets.ts). */
  degradation?: Record<string, number>;
  /** Marks painted on the surface that are not ink. */
  damage?: TruthDamage;
}

/** Stains and cracks of a synthetic inscription (not ink; a tracer should ignore them). */
export interface TruthDamage {
  /** Centre and largest radius, px. */
  stains: { x: number; y: number; radius: number }[];
  /** Centreline points and width, px. */
  cracks: { width: number; points: [number, number][] }[];
}
