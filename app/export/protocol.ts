/**
 * Messages between the Export dialog and its worker (export.worker.ts). The image bytes
 * go over once per project (`images`); every job then carries the project (small) and
 * its options. Files come back as bytes by file name, transferred, not copied.
 */
import type { Project } from '../../src/doc/model.ts';
import type { ExportKind, FacsimileOptions } from '../../src/export/types.ts';
import type { ExportOptions } from '../../src/export/exportFiles.ts';

export type ExportRequest =
  /** The project's image bytes by file path; kept by the worker until the next `images`. */
  | { type: 'images'; images: Map<string, Uint8Array> }
  /** The files of `kinds`, written with exportFiles. */
  | { type: 'files'; id: number; project: Project; surfaceId?: string; kinds: ExportKind[]; options: ExportOptions }
  /** facsimile.svg as text, for the preview. */
  | { type: 'preview'; id: number; project: Project; surfaceId?: string; options: FacsimileOptions };

export type ExportReply =
  | { type: 'files'; id: number; files: [string, Uint8Array][] }
  | { type: 'preview'; id: number; svg: string }
  /** `exportError`: bad input (ExportError), its message is for the person; otherwise a fault. */
  | { type: 'error'; id: number; message: string; exportError: boolean };
