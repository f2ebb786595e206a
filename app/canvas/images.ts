/**
 * The images of the open project, ready to draw and to trace: for each image, the photo
 * as a pyramid (decoded by the browser, so colour photos keep their colour), its luma
 * handed to the engine (decoded by src/image, the same code as the CLI and the tests, so
 * the solver sees the same values everywhere), and the ink evidence back from the engine
 * as the amber overlay. Made once per image; dropped when the project no longer names it.
 */
import type { ImageRef, Project } from '../../src/doc/model.ts';
import type { EngineBridge } from '../engine/bridge.ts';
import type { EditorStore } from '../store/store.ts';
import { buildPyramid, evidenceCanvas, type Pyramid } from './pyramid.ts';

/** The ink evidence overlay's colour, amber #e0a030. */
export const OVERLAY_RGB: [number, number, number] = [0xe0, 0xa0, 0x30];

export interface SurfaceImage {
  readonly imageId: string;
  readonly width: number;
  readonly height: number;
  photo: Pyramid | undefined;
  overlay: Pyramid | undefined;
  /** Settles when the engine holds the image and its ink evidence (rejects when it cannot). */
  readonly engineReady: Promise<void>;
  /** Why the image could not be shown or traced, for the person. */
  error: string | undefined;
}

const entries = new Map<string, SurfaceImage>();
const listeners = new Set<() => void>();

function changed(): void {
  for (const l of listeners) l();
}

/** Calls `fn` whenever an image gets its photo or overlay; returns the unsubscribe. */
export function subscribeImages(fn: () => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

export function imageEntry(imageId: string | undefined): SurfaceImage | undefined {
  return imageId === undefined ? undefined : entries.get(imageId);
}

/** Yields to the browser once, so the photo is drawn before a long decode starts. */

/**
 * The image, started if new: the photo drawn first, then the engine's copy and the
 * overlay. `onError` hears each failure once.
 */
export function ensureImage(ref: ImageRef, bytes: Uint8Array | undefined, engine: EngineBridge, onError: (text: string) => void): SurfaceImage {
  const known = entries.get(ref.id);
  if (known) return known;
  let markReady!: () => void;
  let markFailed!: (e: Error) => void;
  const engineReady = new Promise<void>((resolve, reject) => {
    markReady = resolve;
    markFailed = reject;
  });
  // Failures are reported through onError; nobody has to await this one.
  engineReady.catch(() => undefined);
  const entry: SurfaceImage = { imageId: ref.id, width: ref.width, height: ref.height, photo: undefined, overlay: undefined, engineReady, error: undefined };
  entries.set(ref.id, entry);
  const fail = (what: string, e: unknown) => {
    const text = `${what}: ${(e as Error)?.message ?? String(e)}`;
    if (!entry.error) {
      entry.error = text;
      onError(text);
    }
    changed();
  };
  if (!bytes) {
    const e = new Error(`the image ${ref.file} is missing from the project.`);
    fail('The photo could not be shown', e);
    markFailed(e);
    return entry;
  }
  void (async () => {
    try {
      const bitmap = await createImageBitmap(new Blob([bytes as Uint8Array<ArrayBuffer>], { type: ref.mime }));
      if (entries.get(ref.id) !== entry) return bitmap.close();
      entry.photo = buildPyramid(bitmap, bitmap.width, bitmap.height);
      changed();
    } catch (e) {
      fail('The photo could not be shown', e);
    }
    try {
      // The engine decodes the file itself: a 24 MP photo takes seconds, off this thread.
      await engine.loadImageFile(ref.id, bytes);
      markReady();
      const ev = await engine.evidence(ref.id);
      if (entries.get(ref.id) !== entry) return;
      entry.overlay = buildPyramid(evidenceCanvas(ev.width, ev.height, ev.data, OVERLAY_RGB), ev.width, ev.height);
      changed();
    } catch (e) {
      fail('The image could not be prepared for tracing', e);
      markFailed(e as Error);
    }
  })();
  return entry;
}

/**
 * Shows a canvas as an image with no engine behind it (the test hook's large synthetic
 * surface): drawing only, tracing on it fails with a message.
 */
export function provideImage(ref: ImageRef, source: HTMLCanvasElement): SurfaceImage {
  const entry: SurfaceImage = {
    imageId: ref.id, width: ref.width, height: ref.height,
    photo: buildPyramid(source, source.width, source.height), overlay: undefined,
    engineReady: Promise.reject(new Error('this image is for display only')), error: undefined,
  };
  entry.engineReady.catch(() => undefined);
  entries.set(ref.id, entry);
  changed();
  return entry;
}

/** Drops the images not in `keep` (their canvases go with them). */
export function retainImages(keep: ReadonlySet<string>): void {
  let dropped = false;
  for (const [id, e] of entries) {
    if (keep.has(id)) continue;
    const first = e.photo?.levels[0].source;
    if (first instanceof ImageBitmap) first.close();
    entries.delete(id);
    dropped = true;
  }
  if (dropped) changed();
}

/**
 * Keeps the images in step with the store's project: the current image is made ready
 * (photo, engine, overlay), images no longer in the project are dropped, and `onNewImage`
 * hears when the current image changes (the canvas fits the new one to the window).
 */
export function followProjectImages(
  store: EditorStore,
  engine: EngineBridge,
  currentImage: (p: Project | undefined) => ImageRef | undefined,
  onNewImage: (ref: ImageRef) => void,
): () => void {
  let shown: string | undefined;
  const sync = () => {
    const { project, images } = store.getState();
    const ref = currentImage(project);
    const keep = new Set<string>();
    for (const s of project?.surfaces ?? []) for (const im of s.images) keep.add(im.id);
    retainImages(keep);
    if (!ref) {
      shown = undefined;
      return;
    }
    if (!entries.has(ref.id)) {
      ensureImage(ref, images.get(ref.file), engine, (text) => store.getState().setMessage({ kind: 'error', text }));
    }
    if (ref.id !== shown) {
      shown = ref.id;
      onNewImage(ref);
    }
  };
  sync();
  return store.subscribe((s, prev) => {
    if (s.project !== prev.project || s.images !== prev.images) sync();
  });
}
