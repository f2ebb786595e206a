/**
 * What every export takes and gives. Exports are pure functions of the project and the
 * image files' bytes (no clock, no randomness, no DOM), so the CLI and the editor write
 * byte-identical files from the same project.
 */
import type { Project } from '../doc/model.ts';

/** The image files of a project by image id, as stored in the .inkroute file. */
export interface ExportImages {
  [imageId: string]: { bytes: Uint8Array; mime: 'image/png' | 'image/jpeg' };
}

export interface ExportInput {
  project: Project;
  images: ExportImages;
  /** Surface to export; default the first. */
  surfaceId?: string;
}

/** How restored spans are drawn: dashed outline, or a grey fill. */
export type RestoredStyle = 'dashed' | 'grey';

export interface FacsimileOptions {
  /** Drawing size against the object: 1 = 1:1, 2 = 2:1. Default 1. */
  scale?: number;
  restoredStyle?: RestoredStyle;
  /** Letter labels beside their letters. Default false. */
  labels?: boolean;
  /** Line numbers in the margin. Default false. */
  lineNumbers?: boolean;
  /** Length of the scale bar, mm; 0 for none. Default a round length (1, 2 or 5 × 10ⁿ mm) near a fifth of the object's width. */
  scaleBarMm?: number;
  /** Embed the photo (this band's image id) under the drawing. Default none. */
  photoImageId?: string;
}

export interface PngOptions extends FacsimileOptions {
  /** Dots per inch of the raster: 300, 600, 1200 (any positive number is accepted). */
  dpi?: number;
  /** Black on white, or black on transparent. Default 'white'. */
  background?: 'white' | 'transparent';
}

export interface LetterSetOptions {
  /** Margin around each letter's crop, mm (px when the surface is not calibrated). Default 2. */
  margin?: number;
}

/** Bad input for an export, in one plain sentence (an uncalibrated surface, no letters…). */
export class ExportError extends Error {
  override name = 'ExportError';
}

/** The export file names (../shared/naming.md). */
export const EXPORT_FILES = {
  svg: 'facsimile.svg',
  png: 'facsimile.png',
  letters: 'letters.zip',
  chart: 'chart.svg',
  tei: 'transcription.tei.xml',
  annotations: 'annotations.jsonld',
} as const;
export type ExportKind = keyof typeof EXPORT_FILES;
