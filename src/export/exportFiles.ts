/**
 * All exports behind one call: the CLI (`inkroute export`) and the editor's Export dialog
 * both use it, so the same project gives byte-identical files. Everything is built in
 * memory; the caller writes the files only once every one of them was made.
 */
import type { ProjectBundle } from '../doc/projectFile.ts';
import { paleographicChart } from './chart.ts';
import { facsimileSvg } from './facsimile.ts';
import { letterSet } from './letterset.ts';
import { facsimilePng } from './png.ts';
import { teiTranscription } from './tei.ts';
import { webAnnotations } from './annotations.ts';
import {
  EXPORT_FILES, ExportError, type ExportImages, type ExportInput, type ExportKind, type FacsimileOptions, type LetterSetOptions,
  type PngOptions,
} from './types.ts';

/** Options of each export that has any; the others take the project alone. */
export interface ExportOptions {
  /** For the SVG facsimile. */
  facsimile?: FacsimileOptions;
  /** For the PNG facsimile. */
  png?: PngOptions;
  /** For the letter set (letters.zip). */
  letters?: LetterSetOptions;
}

/**
 * Makes the asked exports. Returns the files by their names from {@link EXPORT_FILES}
 * ('facsimile.svg', …), in the order asked; text files are UTF-8. A kind asked twice is
 * made once. Throws the exporters' {@link ExportError} for input they cannot export.
 */
export function exportFiles(input: ExportInput, kinds: readonly ExportKind[], options: ExportOptions = {}): Map<string, Uint8Array> {
  const out = new Map<string, Uint8Array>();
  for (const kind of kinds) {
    const name = EXPORT_FILES[kind];
    if (name === undefined) throw new ExportError(`there is no export called "${String(kind)}".`);
    if (out.has(name)) continue;
    out.set(name, makeOne(input, kind, options));
  }
  return out;
}

const utf8 = new TextEncoder();

function makeOne(input: ExportInput, kind: ExportKind, options: ExportOptions): Uint8Array {
  switch (kind) {
    case 'svg':
      return utf8.encode(facsimileSvg(input, options.facsimile));
    case 'png':
      return facsimilePng(input, options.png);
    case 'letters':
      return letterSet(input, options.letters);
    case 'chart':
      return utf8.encode(paleographicChart(input));
    case 'tei':
      return utf8.encode(teiTranscription(input));
    case 'annotations':
      return utf8.encode(webAnnotations(input));
  }
}

/**
 * The export input of a project bundle (as readProjectFile gives it): its images keyed by
 * image id instead of file path. `surfaceId` picks the surface (default the first); an id
 * the project does not have is an {@link ExportError}.
 */
export function exportInputFromBundle(bundle: ProjectBundle, surfaceId?: string): ExportInput {
  const { project } = bundle;
  if (surfaceId !== undefined && !project.surfaces.some((s) => s.id === surfaceId)) {
    throw new ExportError(`the project has no surface ${surfaceId} (it has ${project.surfaces.map((s) => s.name || s.id).join(', ')}).`);
  }
  const images: ExportImages = {};
  for (const surface of project.surfaces) {
    for (const ref of surface.images) {
      const bytes = bundle.images.get(ref.file);
      if (!bytes) throw new ExportError(`the project lacks the image file ${ref.file}.`);
      images[ref.id] = { bytes, mime: ref.mime };
    }
  }
  return surfaceId === undefined ? { project, images } : { project, images, surfaceId };
}
