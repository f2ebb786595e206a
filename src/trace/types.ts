/**
 * Types of the stroke solver. Coordinates are image pixels (x right, y down, pixel
 * centres at i + 0.5); radii in pixels.
 */

/** A point fixed by the user: start, end or an intermediate anchor. */
export interface Point {
  x: number;
  y: number;
}

/** One centreline sample of a traced stroke. */
export interface StrokeSample {
  x: number;
  y: number;
  /** Pen radius, px. */
  r: number;
  /** Share of the pen's chord across the direction of travel that lies on ink, 0..1. */
  support: number;
}

/** An inclusive range of sample indices. */
export interface SampleSpan {
  from: number;
  to: number;
}

/** The solver's energy split by term (all in the same units: weighted cost). */
export interface CostBreakdown {
  adherence: number;
  widthChange: number;
  curvature: number;
  length: number;
  total: number;
}

export interface Stroke {
  samples: StrokeSample[];
  /** Spans where no visible ink supports the pen. */
  restoredSpans: SampleSpan[];
  /** Cost of the exact discrete optimum, by term. */
  cost: CostBreakdown;
}
