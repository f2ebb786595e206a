/**
 * The document model: a project holds surfaces (recto, verso), each with its image bands,
 * its scale and its strokes. Plain data only (it is saved as JSON and crosses to the
 * worker); the rules that change it live in rules.ts. Coordinates are image pixels of the
 * surface (x right, y down, pixel centres at i + 0.5); radii in px.
 */
import type { Weights } from '../trace/energy.ts';
import type { CostBreakdown, SampleSpan, StrokeSample } from '../trace/types.ts';

/** Version of project.json; bump it with a migration in schema.ts. */
export const PROJECT_VERSION = 2;

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

/**
 * Where a surface's scale came from: a line drawn along a ruler in the photo (its ends in
 * px and its length in mm), or the resolution tag of the image file.
 */
export type ScaleSource =
  | { kind: 'ruler'; x0: number; y0: number; x1: number; y1: number; mm: number }
  | { kind: 'file'; detail: string };

export interface Surface {
  id: string;
  /** 'recto', 'verso', or a name of the user's. */
  name: string;
  images: ImageRef[];
  /** Scale, px per mm, once calibrated. */
  pxPerMm?: number;
  /** How pxPerMm was set; undefined for older projects and the demo's given scale. */
  scaleSource?: ScaleSource;
  /** Stroke ids in ductus order (the order of writing). */
  strokeOrder: string[];
}

/** Reading of a letter: certain, or not (Leiden: a dot below). */
export type Reading = 'clear' | 'doubtful';

/** Where a letter or text mark stands in the text: its line and its place in the line. */
export interface TextPlace {
  /** Line number on its surface, from 1. */
  line: number;
  /** True when the user put it on this line by hand; the automatic layout keeps it there. */
  lineByHand: boolean;
  /** Place within the line in reading direction, from 1 (kept by rules.ts layoutText). */
  order: number;
}

/** A group of strokes read as one character. */
export interface Letter extends TextPlace {
  id: string;
  surfaceId: string;
  /** The strokes of the letter, at least one, in ductus order. */
  strokeIds: string[];
  /** What it reads as: Unicode text, usually one character of the inscription's script. */
  label: string;
  reading: Reading;
  /** The letter is restored (supplied by the editor, not read): Leiden square brackets. */
  restored: boolean;
}

/**
 * A mark in the text that is not a letter: a word divider, or a lacuna (a lost stretch)
 * with the estimated number of lost letters (undefined: unknown). Placed at a point, px.
 */
export interface TextMark extends TextPlace {
  id: string;
  surfaceId: string;
  kind: 'divider' | 'lacuna';
  x: number;
  y: number;
  lost?: number;
}

/** What the project says of the inscription as a text. */
export interface Inscription {
  /** Unicode Script property value of the writing (e.g. 'Phoenician'): the label palette. */
  script: string;
  direction: 'ltr' | 'rtl';
  /** Free description (Dublin Core description in the exports). */
  description: string;
  /** Who made the facsimile (Dublin Core creator); may be empty. */
  creator: string;
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
  inscription: Inscription;
  letters: Record<string, Letter>;
  textMarks: Record<string, TextMark>;
}
