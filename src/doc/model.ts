/**
 * The document model: a project holds surfaces (recto, verso), each with its image bands,
 * its scale and its strokes. Plain data only (it is saved as JSON and crosses to the
 * worker); the rules that change it live in rules.ts. Coordinates are image pixels of the
 * surface (x right, y down, pixel centres at i + 0.5); radii in px.
 */
import type { Weights } from '../trace/energy.ts';
import type { CostBreakdown, SampleSpan, StrokeSample } from '../trace/types.ts';

/** Version of project.json; bump it with a migration in schema.ts. */
export const PROJECT_VERSION = 1;

export interface ImageRef {
  id: string;
  /** Band name: 'visible', 'infrared', … */
  band: string;
  /** Path of the file inside the project file, e.g. 'images/visible.png'. */
  file: string;
  mime: 'image/png' | 'image/jpeg';
  width: number;
  height: number;
  bitDepth: number;
}

/** A point the user fixed on a stroke; `r` pins the pen radius there (px). */
export interface Anchor {
  x: number;
  y: number;
  r?: number;
}

export interface SolverSettings {
  weights: Weights;
  /** Pen radius range [min, max], px. */
  radius: [number, number];
}

/** A span marked by hand as restored or inked, overriding the measured support. */
export interface SpanOverride extends SampleSpan {
  kind: 'restored' | 'inked';
}

export interface StrokeDoc {
  id: string;
  surfaceId: string;
  /** Start, intermediate anchors, end. */
  anchors: Anchor[];
  /** Settings of this stroke; undefined: the project's defaults. */
  settings?: SolverSettings;
  samples: StrokeSample[];
  restoredSpans: SampleSpan[];
  overrides: SpanOverride[];
  cost: CostBreakdown;
  hidden: boolean;
}

export interface Surface {
  id: string;
  /** 'recto', 'verso', or a name of the user's. */
  name: string;
  images: ImageRef[];
  /** Scale, px per mm, once calibrated. */
  pxPerMm?: number;
  /** Stroke ids in ductus order (the order of writing). */
  strokeOrder: string[];
}

export interface Project {
  format: 'inkroute-project';
  version: typeof PROJECT_VERSION;
  id: string;
  title: string;
  /** ISO 8601 times. */
  createdAt: string;
  modifiedAt: string;
  defaults: SolverSettings;
  surfaces: Surface[];
  strokes: Record<string, StrokeDoc>;
}
