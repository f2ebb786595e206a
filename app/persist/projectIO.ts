/**
 * Project files and images in and out of the editor: saving NAME.inkroute as a download,
 * opening a project file or a photo, and files dropped on the window. Whatever goes
 * wrong while opening, the open project stays as it was and the person gets one message.
 */
import { readProjectFile, writeProjectFile } from '../../src/doc/projectFile.ts';
import { newProject } from '../../src/doc/rules.ts';
import { decodeImage, sniffFormat } from '../../src/image/codec.ts';
import type { EditorStore } from '../store/store.ts';
import { editorStore } from '../store/useEditor.ts';
import { engineIfStarted } from '../engine/instance.ts';
import { downloadBytes } from './download.ts';
import type { ImageProbe } from '../../src/worker/protocol.ts';

/** File name extension of project files. */
export const PROJECT_EXTENSION = '.inkroute';

/** What the Open chooser accepts. */
export const OPEN_ACCEPT = `${PROJECT_EXTENSION},.png,.jpg,.jpeg,image/png,image/jpeg`;

/** A file name from a title: characters that file systems reject become '-'. */
export function projectFileName(title: string): string {
  const safe = title.replace(/[\\/:*?"<>|\u0000-\u001f]+/g, '-').trim().replace(/^\.+/, '');
  return `${safe || 'untitled'}${PROJECT_EXTENSION}`;
}

/** The project file's bytes for the store's project; throws when there is none. */
export function projectFileBytes(store: EditorStore = editorStore): Uint8Array {
  const { project, images } = store.getState();
  if (!project) throw new Error('there is no open project to save.');
  return writeProjectFile({ project, images });
}

/**
 * Offers the open project as a download named `${title}.inkroute` and marks it saved.
 * Returns the file name, or undefined when nothing could be saved (a message says why).
 */
export function saveProjectFile(store: EditorStore = editorStore): string | undefined {
  const s = store.getState();
  if (!s.project) return undefined;
  let bytes: Uint8Array;
  try {
    bytes = projectFileBytes(store);
  } catch (e) {
    s.setMessage({ kind: 'error', text: `Could not save: ${(e as Error).message}` });
    return undefined;
  }
  const name = projectFileName(s.project.title);
  downloadBytes(name, bytes, 'application/zip');
  store.getState().markSaved();
  return name;
}

function message(store: EditorStore, kind: 'error' | 'info', text: string): void {
  store.getState().setMessage({ kind, text });
}

/** Reads a File's bytes (File.arrayBuffer; kept in one place for the tests' stand-ins). */
async function bytesOf(file: Blob): Promise<Uint8Array> {
  return new Uint8Array(await file.arrayBuffer());
}

/** Opens a .inkroute file; on any error the open project is left untouched. Returns success. */
export async function openProjectFile(file: File, store: EditorStore = editorStore): Promise<boolean> {
  try {
    const bundle = readProjectFile(await bytesOf(file));
    store.getState().loadProject(bundle.project, bundle.images);
    message(store, 'info', `Opened ${file.name}.`);
    return true;
  } catch (e) {
    message(store, 'error', `Could not open ${file.name}: ${(e as Error).message}`);
    return false;
  }
}

/** Title for a photo's new project: its file name without the extension. */
function titleFromFileName(name: string): string {
  return name.replace(/\.[^.]*$/, '') || name || 'untitled';
}

/**
 * Decodes a photo to check it: in the engine's worker when the editor runs (a 24 MP file
 * takes seconds, which the page must not spend), on this thread where there is no engine
 * (Node tests).
 */
async function probeImage(bytes: Uint8Array): Promise<ImageProbe> {
  const engine = engineIfStarted();
  if (engine) return engine.probeImageFile(bytes);
  const d = decodeImage(bytes);
  return { format: d.format, width: d.bands[0].width, height: d.bands[0].height, bands: d.bands.length, bitDepth: d.bitDepth, pxPerMm: d.pxPerMm };
}

let openCount = 0;

/**
 * Opens a photo (PNG or JPEG) as a new project with that image as its recto. The file is
 * decoded first (off the page's thread) to check it and read its size, bit depth and scale
 * (the resolution tag); meanwhile the status strip shows the job, which can be cancelled.
 * A bad, truncated or foreign file gives a message and the open project stays.
 */
export async function openImageFile(file: File, store: EditorStore = editorStore): Promise<boolean> {
  const job = `open-image-${++openCount}`;
  let cancelled = false;
  store.getState().setJob(job, { label: `Opening ${file.name}…`, cancel: () => { cancelled = true; store.getState().setJob(job, undefined); } });
  try {
    const bytes = await bytesOf(file);
    const decoded = await probeImage(bytes);
    if (cancelled) return false;
    const kind = sniffFormat(bytes) === 'jpeg' ? 'jpeg' : 'png';
    const band = decoded;
    const path = `images/visible.${kind === 'jpeg' ? 'jpg' : 'png'}`;
    const project = newProject(titleFromFileName(file.name), {
      band: 'visible',
      file: path,
      mime: kind === 'jpeg' ? 'image/jpeg' : 'image/png',
      width: band.width,
      height: band.height,
      bitDepth: decoded.bitDepth,
    }, decoded.pxPerMm);
    // The resolution tag is where the starting scale came from; Calibrate can check it.
    if (decoded.pxPerMm) project.surfaces[0].scaleSource = { kind: 'file', detail: kind === 'jpeg' ? 'JPEG JFIF density' : 'PNG pHYs' };
    store.getState().loadProject(project, new Map([[path, bytes]]));
    const scale = decoded.pxPerMm ? `scale ${decoded.pxPerMm.toFixed(1)} px/mm from the file` : 'not calibrated yet';
    message(store, 'info', `Opened ${file.name} (${band.width}×${band.height} px, ${decoded.bitDepth} bit, ${scale}).`);
    return true;
  } catch (e) {
    if (!cancelled) message(store, 'error', `Could not open ${file.name}: ${(e as Error).message}`);
    return false;
  } finally {
    store.getState().setJob(job, undefined);
  }
}

/** Project files are zips: their first bytes are 'PK\x03\x04'. */
function looksLikeZip(head: Uint8Array): boolean {
  return head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04;
}

/**
 * Opens any file the person hands over (the Open chooser, a drop): a project file by its
 * extension or its zip signature, everything else as a photo (which says clearly when it
 * is not one).
 */
export async function openFile(file: File, store: EditorStore = editorStore): Promise<boolean> {
  const isProject = file.name.toLowerCase().endsWith(PROJECT_EXTENSION) || looksLikeZip(await bytesOf(file.slice(0, 4)));
  return isProject ? openProjectFile(file, store) : openImageFile(file, store);
}

/**
 * Routes files dropped anywhere on the window to `open` (default openFile; the editor's
 * buttons ask first when there is unsaved work), the first file only: the editor holds
 * one project. Returns a function that removes the handlers.
 */
export function installFileDrop(
  target: Window = window, store: EditorStore = editorStore, open: (file: File) => void = (file) => void openFile(file, store),
): () => void {
  const hasFiles = (e: DragEvent) => Boolean(e.dataTransfer && [...e.dataTransfer.types].includes('Files'));
  const onDragOver = (e: DragEvent) => {
    if (!hasFiles(e)) return;
    // Without this the browser would navigate to the dropped file.
    e.preventDefault();
    if (e.dataTransfer) e.dataTransfer.dropEffect = 'copy';
  };
  const onDrop = (e: DragEvent) => {
    if (!hasFiles(e)) return;
    e.preventDefault();
    const files = e.dataTransfer?.files;
    if (!files || files.length === 0) return;
    open(files[0]);
  };
  target.addEventListener('dragover', onDragOver);
  target.addEventListener('drop', onDrop);
  return () => {
    target.removeEventListener('dragover', onDragOver);
    target.removeEventListener('drop', onDrop);
  };
}
