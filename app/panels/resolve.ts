/**
 * Re-solving a stroke after its settings change, and the slider gesture around it: one
 * drag of a slider is one undo step, including the solves it started, so undo brings
 * back both the old settings and the old path.
 */
import type { SolverSettings } from '../../src/doc/model.ts';
import { setDefaults, settingsOf, updateStroke } from '../../src/doc/rules.ts';
import type { EngineBridge } from '../engine/bridge.ts';
import { getEngine } from '../engine/instance.ts';
import type { EditorStore } from '../store/store.ts';
import { editorStore } from '../store/useEditor.ts';
import { errorText, imageOfStroke, isSuperseded, solvedPatch } from '../tools/shared.ts';

export interface ResolveOptions {
  /** Default: the editor's store. */
  store?: EditorStore;
  /** Default: getEngine(), the editor's worker. */
  engine?: EngineBridge;
}

let jobToken = 0;
const jobOwner = new Map<string, number>();

/**
 * Solves the stroke again through its anchors with its current settings and writes the
 * new path into the project. Resolves true when the result was applied; false when the
 * stroke is gone, a newer solve superseded this one, or the stroke changed meanwhile (its
 * own newer solve will land), or the solve failed (a message says why).
 */
export async function resolveStroke(strokeId: string, options: ResolveOptions = {}): Promise<boolean> {
  const store = options.store ?? editorStore;
  const project = store.getState().project;
  const stroke = project?.strokes[strokeId];
  if (!project || !stroke) return false;
  const imageId = imageOfStroke(project, stroke);
  if (!imageId) return false;
  const settings = settingsOf(project, strokeId);
  const jobId = `solve:${strokeId}`;
  const token = ++jobToken;
  jobOwner.set(jobId, token);
  store.getState().setJob(jobId, { label: 'Solving a stroke' });
  try {
    const engine = options.engine ?? getEngine();
    // The stroke id as key: a newer solve of the same stroke (the next slider step) wins.
    const result = await engine.solve(imageId, stroke.anchors, settings, strokeId);
    const now = store.getState().project;
    const current = now?.strokes[strokeId];
    // Anchors moved or settings changed while solving: this path no longer fits them.
    if (!now || !current || current.anchors !== stroke.anchors || !sameSettings(settingsOf(now, strokeId), settings)) return false;
    store.getState().change((p) => updateStroke(p, strokeId, solvedPatch(current, result)));
    store.getState().setLastSolve(result.ms);
    return true;
  } catch (e) {
    if (!isSuperseded(e)) store.getState().setMessage({ kind: 'error', text: `Could not solve the stroke again: ${errorText(e)}` });
    return false;
  } finally {
    // A newer solve of the same stroke owns the job now: leave it be.
    if (jobOwner.get(jobId) === token) {
      jobOwner.delete(jobId);
      store.getState().setJob(jobId, undefined);
    }
  }
}

export function sameSettings(a: SolverSettings, b: SolverSettings): boolean {
  return a === b || (
    a.weights.adherence === b.weights.adherence && a.weights.widthChange === b.weights.widthChange &&
    a.weights.curvature === b.weights.curvature && a.weights.length === b.weights.length &&
    a.radius[0] === b.radius[0] && a.radius[1] === b.radius[1]
  );
}

/** Where a settings change goes: the selected strokes, or the defaults for new strokes. */
export type SettingsTarget = { kind: 'strokes'; ids: string[] } | { kind: 'defaults' };

/**
 * The gesture of a settings control. press() on pointer down, release() on pointer up,
 * apply() on each change. A change without a press (the keyboard) is a gesture of its
 * own. The gesture stays open until the solves it started have landed.
 */
export class SettingsEdit {
  private pressed = false;
  private open = false;
  private inflight = 0;

  constructor(
    private readonly store: EditorStore = editorStore,
    private readonly resolve: (id: string) => Promise<unknown> = (id) => resolveStroke(id, { store }),
  ) {}

  press(): void {
    this.pressed = true;
    this.ensureOpen();
  }

  release(): void {
    this.pressed = false;
    this.maybeClose();
  }

  /** Applies new settings to the target; strokes are re-solved live. */
  apply(target: SettingsTarget, settings: SolverSettings): Promise<void> {
    this.ensureOpen();
    const s = this.store.getState();
    const solves: Promise<unknown>[] = [];
    if (target.kind === 'defaults') {
      s.change((p) => setDefaults(p, settings));
    } else {
      s.change((p) => target.ids.reduce((q, id) => (q.strokes[id] ? updateStroke(q, id, { settings: structuredClone(settings) }) : q), p));
      for (const id of target.ids) solves.push(this.track(this.resolve(id)));
    }
    // A keyboard step has no release: close once its solves are in.
    queueMicrotask(() => this.maybeClose());
    return Promise.all(solves).then(() => undefined);
  }

  /** Lets strokes follow the defaults again, re-solving them; one undo step. */
  useDefaults(ids: string[]): Promise<void> {
    this.ensureOpen();
    this.store.getState().change((p) => ids.reduce((q, id) => (q.strokes[id]?.settings ? updateStroke(q, id, { settings: undefined }) : q), p));
    const solves = ids.map((id) => this.track(this.resolve(id)));
    queueMicrotask(() => this.maybeClose());
    return Promise.all(solves).then(() => undefined);
  }

  private track(p: Promise<unknown>): Promise<unknown> {
    this.inflight++;
    return p.finally(() => {
      this.inflight--;
      this.maybeClose();
    });
  }

  private ensureOpen(): void {
    if (this.open) return;
    this.open = true;
    this.store.getState().beginGesture();
  }

  private maybeClose(): void {
    if (!this.open || this.pressed || this.inflight > 0) return;
    this.open = false;
    this.store.getState().endGesture();
  }
}
