/**
 * The editor's store: one zustand store made of typed slices (document, view, tool,
 * jobs). Only the document's project is undoable (zundo, partialized to it); one
 * gesture (a drag, a finished follow) is one undo step through begin/endGesture.
 * A vanilla store, so the tools' tests drive it in Node; React reads it with useEditor.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { temporal, type TemporalState } from 'zundo';
import type { Anchor, Project } from '../../src/doc/model.ts';
import { deleteLetters, deleteStrokes, deleteTextMarks } from '../../src/doc/rules.ts';
import type { StrokeSample } from '../../src/trace/types.ts';

export type ToolName = 'pan' | 'follow' | 'refine' | 'calibrate' | 'letter';

/**
 * What a tool draws over the photo while a gesture is under way: the Calibrate line
 * along a ruler, the Letter tool's pick box, or a word divider or lacuna being placed (px).
 */
export type ToolGuide =
  | { kind: 'ruler'; x0: number; y0: number; x1: number; y1: number }
  | { kind: 'box'; x0: number; y0: number; x1: number; y1: number }
  | { kind: 'mark'; mark: 'divider' | 'lacuna'; x: number; y: number };

export interface DocumentSlice {
  project: Project | undefined;
  /** Image bytes by file path in the project (not undoable: images never change). */
  images: Map<string, Uint8Array>;
  /** Selected stroke ids. */
  selection: string[];
  /** Selected letters and text marks (word dividers, lacunae), by id; kept pruned like `selection`. */
  letterSelection: string[];
  /** The project as last saved to a file, to tell unsaved changes. */
  savedProject: Project | undefined;
  loadProject(project: Project, images: Map<string, Uint8Array>): void;
  /** Applies a document change; one undo step unless a gesture is open. */
  change(fn: (p: Project) => Project): void;
  beginGesture(): void;
  endGesture(): void;
  cancelGesture(): void;
  select(ids: string[], mode?: 'replace' | 'add' | 'toggle'): void;
  deleteSelection(): void;
  selectLetters(ids: string[], mode?: 'replace' | 'add' | 'toggle'): void;
  /** Deletes the selected letters and text marks (not their strokes): one undo step. */
  deleteLetterSelection(): void;
  undo(): void;
  redo(): void;
  markSaved(): void;
}

export interface ViewSlice {
  /** Screen px per image px. */
  zoom: number;
  /** Screen position of image point (0, 0). */
  panX: number;
  panY: number;
  overlay: boolean;
  overlayOpacity: number;
  showDuctus: boolean;
  /** Cursor in image px, when over the canvas. */
  cursor: { x: number; y: number } | undefined;
  setView(patch: Partial<Pick<ViewSlice, 'zoom' | 'panX' | 'panY' | 'overlay' | 'overlayOpacity' | 'showDuctus' | 'cursor'>>): void;
}

export interface ToolSlice {
  tool: ToolName;
  /** The active state path, e.g. 'follow.following' (for the status strip and tests). */
  toolPath: string;
  /** Anchors placed so far by the Follow tool. */
  pending: Anchor[];
  /** The live preview path, drawn over the photo. */
  preview: StrokeSample[] | undefined;
  /** The active tool's guide over the photo (ruler line, pick box, mark being placed). */
  guide: ToolGuide | undefined;
  setTool(tool: ToolName): void;
  setToolView(patch: Partial<Pick<ToolSlice, 'toolPath' | 'pending' | 'preview' | 'guide'>>): void;
}

export interface Job {
  label: string;
  /** 0..1 when known. */
  progress?: number;
  cancel?: () => void;
}

export interface JobsSlice {
  lastSolveMs: number | undefined;
  jobs: Record<string, Job>;
  /** A message for the person: errors from opening files, say. */
  message: { kind: 'error' | 'info'; text: string } | undefined;
  setJob(id: string, job: Job | undefined): void;
  setLastSolve(ms: number): void;
  setMessage(message: JobsSlice['message']): void;
}

export type EditorState = DocumentSlice & ViewSlice & ToolSlice & JobsSlice;
export type EditorStore = StoreApi<EditorState> & { temporal: StoreApi<TemporalState<{ project: Project | undefined }>> };

/** Keeps the selection to strokes that exist (after a delete, an undo, a load). */
function pruneSelection(project: Project | undefined, selection: string[]): string[] {
  if (!project) return [];
  const kept = selection.filter((id) => project.strokes[id]);
  return kept.length === selection.length ? selection : kept;
}

/** Keeps the letter selection to letters and text marks that exist. */
function pruneLetterSelection(project: Project | undefined, selection: string[]): string[] {
  if (!project) return [];
  const kept = selection.filter((id) => project.letters[id] || project.textMarks[id]);
  return kept.length === selection.length ? selection : kept;
}

/** Both selections pruned for `project`. */
function pruned(project: Project | undefined, s: Pick<DocumentSlice, 'selection' | 'letterSelection'>) {
  return { selection: pruneSelection(project, s.selection), letterSelection: pruneLetterSelection(project, s.letterSelection) };
}

function pick(cur: string[], ids: string[], mode: 'replace' | 'add' | 'toggle'): string[] {
  if (mode === 'replace') return [...new Set(ids)];
  if (mode === 'add') return [...new Set([...cur, ...ids])];
  const s = new Set(cur);
  for (const id of ids) if (s.has(id)) s.delete(id); else s.add(id);
  return [...s];
}

export function createEditorStore(): EditorStore {
  let gestureStart: Project | undefined;
  let inGesture = false;
  const store = createStore<EditorState>()(
    temporal(
      (set, get) => ({
        // document
        project: undefined,
        images: new Map(),
        selection: [],
        letterSelection: [],
        savedProject: undefined,
        loadProject: (project, images) => {
          set({ project, images, selection: [], letterSelection: [], savedProject: project });
          store.temporal.getState().clear();
        },
        change: (fn) => {
          const p = get().project;
          if (!p) return;
          const next = fn(p);
          if (next === p) return;
          set({ project: next, ...pruned(next, get()) });
        },
        beginGesture: () => {
          if (inGesture) return;
          inGesture = true;
          gestureStart = get().project;
          store.temporal.getState().pause();
        },
        endGesture: () => {
          if (!inGesture) return;
          inGesture = false;
          const final = get().project;
          const start = gestureStart;
          gestureStart = undefined;
          if (final === start) {
            store.temporal.getState().resume();
            return;
          }
          // Record one step whose past is the state before the gesture.
          set({ project: start });
          store.temporal.getState().resume();
          set({ project: final, ...pruned(final, get()) });
        },
        cancelGesture: () => {
          if (!inGesture) return;
          inGesture = false;
          set({ project: gestureStart, ...pruned(gestureStart, get()) });
          gestureStart = undefined;
          store.temporal.getState().resume();
        },
        select: (ids, mode = 'replace') => {
          const cur = get().selection;
          let next: string[];
          if (mode === 'replace') next = [...new Set(ids)];
          else if (mode === 'add') next = [...new Set([...cur, ...ids])];
          else {
            const s = new Set(cur);
            for (const id of ids) if (s.has(id)) s.delete(id); else s.add(id);
            next = [...s];
          }
          set({ selection: pruneSelection(get().project, next) });
        },
        deleteSelection: () => {
          const ids = get().selection;
          if (ids.length === 0) return;
          get().change((p) => deleteStrokes(p, ids));
        },
        selectLetters: (ids, mode = 'replace') => {
          set({ letterSelection: pruneLetterSelection(get().project, pick(get().letterSelection, ids, mode)) });
        },
        deleteLetterSelection: () => {
          const ids = get().letterSelection;
          if (ids.length === 0) return;
          get().change((p) => deleteTextMarks(deleteLetters(p, ids), ids));
        },
        undo: () => {
          if (inGesture) get().cancelGesture();
          store.temporal.getState().undo();
          set(pruned(get().project, get()));
        },
        redo: () => {
          store.temporal.getState().redo();
          set(pruned(get().project, get()));
        },
        markSaved: () => set({ savedProject: get().project }),
        // view
        zoom: 1,
        panX: 0,
        panY: 0,
        overlay: false,
        overlayOpacity: 0.5,
        showDuctus: false,
        cursor: undefined,
        setView: (patch) => set(patch),
        // tool
        tool: 'follow',
        toolPath: 'follow.idle',
        pending: [],
        preview: undefined,
        guide: undefined,
        setTool: (tool) => set({ tool, toolPath: `${tool}.idle`, pending: [], preview: undefined, guide: undefined }),
        setToolView: (patch) => set(patch),
        // jobs
        lastSolveMs: undefined,
        jobs: {},
        message: undefined,
        setJob: (id, job) => {
          const jobs = { ...get().jobs };
          if (job) jobs[id] = job;
          else delete jobs[id];
          set({ jobs });
        },
        setLastSolve: (ms) => set({ lastSolveMs: ms }),
        setMessage: (message) => set({ message }),
      }),
      {
        partialize: (s) => ({ project: s.project }),
        equality: (a, b) => a.project === b.project,
        limit: 500,
      },
    ),
  ) as EditorStore;
  return store;
}
