/**
 * Keeps the open project in the browser (IndexedDB through idb-keyval), so a closed tab
 * or a crash loses at most about a second of work. One slot: the newest project only.
 *
 * Layout of the database `inkroute`, object store `work`:
 * - `work`: a {@link WorkRecord} (the project as JSON plus what startup needs to offer it),
 * - `images:<projectId>`: the image bytes of that project, written once per project (they
 *   never change, and rewriting megabytes on every edit would be wasteful).
 */
import { createStore, delMany, get, keys, set, setMany, type UseStore } from 'idb-keyval';
import type { EditorState, EditorStore } from '../store/store.ts';

/** The project last kept in the browser. */
export interface WorkRecord {
  projectId: string;
  title: string;
  /** When this record was written (ms since 1970); the "from <time>" of the offer. */
  changedAt: number;
  /** True when the project differs from the one last saved to (or opened from) a file. */
  unsaved: boolean;
  /** project.json as text; parsed with parseProject when restored. */
  json: string;
}

export type ImageEntries = [file: string, bytes: Uint8Array][];

export const WORK_KEY = 'work';
export const imagesKey = (projectId: string) => `images:${projectId}`;

let defaultDb: UseStore | undefined;
/** The editor's database; created lazily so that importing this file opens nothing. */
export function workStore(): UseStore {
  defaultDb ??= createStore('inkroute', 'work');
  return defaultDb;
}

/** The flag of unsaved work: the project is not the one last saved or opened. */
export function hasUnsavedWork(s: Pick<EditorState, 'project' | 'savedProject'>): boolean {
  return s.project !== undefined && s.project !== s.savedProject;
}

export async function readWork(db: UseStore = workStore()): Promise<WorkRecord | undefined> {
  return get<WorkRecord>(WORK_KEY, db);
}

export async function readImages(projectId: string, db: UseStore = workStore()): Promise<Map<string, Uint8Array> | undefined> {
  const entries = await get<ImageEntries>(imagesKey(projectId), db);
  return entries ? new Map(entries) : undefined;
}

/** Forgets the kept work and its images. */
export async function clearWork(db: UseStore = workStore()): Promise<void> {
  const all = await keys(db);
  await delMany(all.filter((k) => k === WORK_KEY || String(k).startsWith('images:')), db);
}

/**
 * A view that shares a larger buffer would be stored with the whole buffer (structured
 * clone copies the ArrayBuffer), e.g. an image unzipped from a project file: copy it out.
 */
function compact(bytes: Uint8Array): Uint8Array {
  return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : bytes.slice();
}

export interface AutosaveOptions {
  /** Database to write to; default the editor's own (`inkroute` / `work`). */
  db?: UseStore;
  /**
   * Longest wait from a change to its write, ms. Default 600. The first change of a burst
   * starts the clock and later ones ride along, so a burst writes once and a steady
   * stream of changes (a long drag) still writes every `delayMs`.
   */
  delayMs?: number;
  /** Called when a write fails (quota, private mode); default: a message in the store. */
  onError?: (e: unknown) => void;
}

export interface Autosave {
  /** Writes now if anything is pending; resolves once the write is done. */
  flush(): Promise<void>;
  /** Stops watching (pending work is flushed first). */
  stop(): Promise<void>;
  /** Number of writes of the work record so far (for tests and the status strip). */
  writes(): number;
}

/** Starts keeping the store's project in IndexedDB; call once the startup question is settled. */
export function startAutosave(store: EditorStore, options: AutosaveOptions = {}): Autosave {
  const db = options.db ?? workStore();
  const delayMs = options.delayMs ?? 600;
  const onError = options.onError ?? ((e: unknown) => {
    store.getState().setMessage({ kind: 'error', text: `Unsaved work cannot be kept in this browser (${(e as Error)?.message ?? e}).` });
  });
  let timer: ReturnType<typeof setTimeout> | undefined;
  let dirty = false;
  let writing: Promise<void> = Promise.resolve();
  let writeCount = 0;
  let failedOnce = false;
  // Images are kept per project id; the Map's identity tells a reload of other images.
  let imagesFor: { projectId: string; images: Map<string, Uint8Array> } | undefined;

  const write = async (): Promise<void> => {
    const s = store.getState();
    const project = s.project;
    if (!project) return;
    const record: WorkRecord = {
      projectId: project.id,
      title: project.title,
      changedAt: Date.now(),
      unsaved: hasUnsavedWork(s),
      json: JSON.stringify(project),
    };
    const needImages = !imagesFor || imagesFor.projectId !== project.id || imagesFor.images !== s.images;
    if (needImages) {
      const entries: ImageEntries = [...s.images].map(([file, bytes]) => [file, compact(bytes)]);
      // One transaction: a restore never finds the record without its images.
      await setMany([[imagesKey(project.id), entries], [WORK_KEY, record]], db);
      imagesFor = { projectId: project.id, images: s.images };
      const stale = (await keys(db)).filter((k) => String(k).startsWith('images:') && k !== imagesKey(project.id));
      if (stale.length) await delMany(stale, db);
    } else {
      await set(WORK_KEY, record, db);
    }
    writeCount++;
  };

  const runWrite = (): Promise<void> => {
    if (timer !== undefined) clearTimeout(timer);
    timer = undefined;
    if (!dirty) return writing;
    dirty = false;
    // Writes are chained so an older one never lands after a newer one.
    writing = writing.then(write).catch((e) => {
      if (!failedOnce) onError(e);
      failedOnce = true;
    });
    return writing;
  };

  const schedule = (now = false) => {
    dirty = true;
    if (now) {
      void runWrite();
      return;
    }
    timer ??= setTimeout(() => void runWrite(), delayMs);
  };

  const unsubscribe = store.subscribe((s, prev) => {
    if (s.project === prev.project && s.savedProject === prev.savedProject && s.images === prev.images) return;
    // A save or an open changes what startup must offer: record that at once.
    schedule(s.savedProject !== prev.savedProject);
  });

  // A tab being closed or put away may not live out the timer: write now.
  const onPageHide = () => void runWrite();
  const onVisibility = () => {
    if (document.visibilityState === 'hidden') void runWrite();
  };
  if (typeof window !== 'undefined') {
    window.addEventListener('pagehide', onPageHide);
    document.addEventListener('visibilitychange', onVisibility);
  }

  return {
    flush: runWrite,
    stop: async () => {
      unsubscribe();
      if (typeof window !== 'undefined') {
        window.removeEventListener('pagehide', onPageHide);
        document.removeEventListener('visibilitychange', onVisibility);
      }
      await runWrite();
    },
    writes: () => writeCount,
  };
}
