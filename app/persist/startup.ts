/**
 * What the editor does when it opens: if the browser kept work that was never saved to a
 * file, ask whether to restore it (RestoreOffer.tsx shows the question); otherwise, or
 * when the person declines, load the demo. Autosave starts only once this is settled, so
 * the demo loading never overwrites the work that is being offered.
 */
import { createStore } from 'zustand/vanilla';
import type { UseStore } from 'idb-keyval';
import { parseProject, ProjectFormatError } from '../../src/doc/schema.ts';
import type { EditorStore } from '../store/store.ts';
import { editorStore } from '../store/useEditor.ts';
import { clearWork, readImages, readWork, startAutosave, workStore, type Autosave, type AutosaveOptions, type WorkRecord } from './autosave.ts';

export interface RestoreOfferState {
  /** The open question, or undefined when there is none. */
  offer: {
    title: string;
    /** When the work was last kept, ms since 1970. */
    changedAt: number;
    restore(): void;
    discard(): void;
  } | undefined;
}

/** The restore question, for RestoreOffer.tsx (and tests) to read and answer. */
export const restoreOfferStore = createStore<RestoreOfferState>(() => ({ offer: undefined }));

export interface StartupOptions {
  /** Default: the editor's store. */
  store?: EditorStore;
  /** Default: the editor's database. */
  db?: UseStore;
  /** Options for the autosave started at the end, or false to start none. */
  autosave?: Omit<AutosaveOptions, 'db'> | false;
}

const runs = new WeakMap<EditorStore, Promise<void>>();
const autosaves = new WeakMap<EditorStore, Autosave>();

/**
 * Settles what the editor opens with, then starts the autosave. Called by App once on
 * start; a second call for the same store returns the first one's promise (React's
 * development mode runs effects twice). Resolves when a project is loaded.
 */
export function startup(loadDemo: () => Promise<void>, options: StartupOptions = {}): Promise<void> {
  const store = options.store ?? editorStore;
  let run = runs.get(store);
  if (!run) {
    run = settle(store, loadDemo, options);
    runs.set(store, run);
  }
  return run;
}

/** The autosave that startup started for a store, if any. */
export function autosaveOf(store: EditorStore = editorStore): Autosave | undefined {
  return autosaves.get(store);
}

async function settle(store: EditorStore, loadDemo: () => Promise<void>, options: StartupOptions): Promise<void> {
  const db = options.db ?? workStore();
  try {
    let record: WorkRecord | undefined;
    try {
      record = await readWork(db);
    } catch {
      // No IndexedDB (a private window, say): there is nothing to offer.
      record = undefined;
    }
    if (!record?.unsaved) {
      await loadDemo();
      return;
    }
    const choice = await ask(record);
    if (choice === 'restore') {
      try {
        await restoreWork(store, record, db);
        return;
      } catch (e) {
        store.getState().setMessage({ kind: 'error', text: `The unsaved work could not be restored: ${(e as Error).message}` });
      }
    }
    await clearWork(db).catch(() => undefined);
    await loadDemo();
  } finally {
    if (options.autosave !== false) autosaves.set(store, startAutosave(store, { ...options.autosave, db }));
  }
}

function ask(record: WorkRecord): Promise<'restore' | 'discard'> {
  return new Promise((resolve) => {
    const answer = (choice: 'restore' | 'discard') => {
      restoreOfferStore.setState({ offer: undefined });
      resolve(choice);
    };
    restoreOfferStore.setState({
      offer: {
        title: record.title,
        changedAt: record.changedAt,
        restore: () => answer('restore'),
        discard: () => answer('discard'),
      },
    });
  });
}

/** Loads the kept work into the store; throws ProjectFormatError when it is damaged. */
export async function restoreWork(store: EditorStore, record: WorkRecord, db: UseStore = workStore()): Promise<void> {
  let json: unknown;
  try {
    json = JSON.parse(record.json);
  } catch {
    throw new ProjectFormatError('the kept project is not valid JSON.');
  }
  // The same checks as a project file: the browser's copy may be damaged or from a newer version.
  const project = parseProject(json);
  const images = (await readImages(project.id, db)) ?? new Map<string, Uint8Array>();
  for (const surface of project.surfaces) {
    for (const img of surface.images) {
      if (!images.has(img.file)) throw new ProjectFormatError(`the kept work lacks the image ${img.file}.`);
    }
  }
  store.getState().loadProject(project, images);
  // The work is still in no file: keep it flagged as unsaved.
  store.setState({ savedProject: undefined });
}
