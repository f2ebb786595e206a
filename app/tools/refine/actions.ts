/**
 * Refine's actions for the Details panel: pin the pen radius at an anchor, mark a span
 * restored or inked. Each is one undo step; pinning re-solves the stroke first and
 * changes the document once, with the solved result.
 */
import type { EngineBridge } from '../../engine/bridge.ts';
import { getEngine } from '../../engine/instance.ts';
import { editorStore } from '../../store/useEditor.ts';
import type { EditorStore } from '../../store/store.ts';
import type { SpanOverride } from '../../../src/doc/model.ts';
import { settingsOf, updateStroke } from '../../../src/doc/rules.ts';
import { errorText, imageOfStroke, isSuperseded, solvedPatch } from '../shared.ts';
import { anchorsWithRadius, overridesWithSpan } from './edits.ts';

export interface ActionDeps {
  store: EditorStore;
  engine: EngineBridge;
}

/** The editor's own store and engine; tests pass theirs. */
function editorDeps(): ActionDeps {
  return { store: editorStore, engine: getEngine() };
}

/**
 * Pins the pen radius at anchor `anchorIndex` of stroke `strokeId` to `r` px (clamped
 * to the stroke's radius range), or frees it when `r` is undefined, and re-solves.
 * Resolves once the stroke is updated (one undo step); a failed solve leaves the
 * stroke as it was and says why in the store's message.
 */
export async function pinRadius(strokeId: string, anchorIndex: number, r: number | undefined, deps: ActionDeps = editorDeps()): Promise<void> {
  const { store, engine } = deps;
  const p = store.getState().project;
  const stroke = p?.strokes[strokeId];
  if (!p || !stroke) return;
  if (r !== undefined && !(Number.isFinite(r) && r > 0)) {
    store.getState().setMessage({ kind: 'error', text: `A pen radius must be a positive number of px, not ${r}.` });
    return;
  }
  const settings = settingsOf(p, strokeId);
  const anchors = anchorsWithRadius(stroke, anchorIndex, r, settings.radius);
  const imageId = imageOfStroke(p, stroke);
  if (!imageId) return;
  let result;
  try {
    result = await engine.solve(imageId, anchors, settings, strokeId);
  } catch (err) {
    if (!isSuperseded(err)) store.getState().setMessage({ kind: 'error', text: `The stroke could not be re-solved: ${errorText(err)}` });
    return;
  }
  const now = store.getState().project?.strokes[strokeId];
  if (!now) return; // deleted meanwhile
  store.getState().change((q) => updateStroke(q, strokeId, { anchors, ...solvedPatch(now, result) }));
  store.getState().setLastSolve(result.ms);
}

/**
 * Marks samples `from`..`to` (inclusive) of stroke `strokeId` as restored or inked by
 * hand, or removes the marks there when `kind` is undefined. One undo step; no step when
 * nothing changes.
 */
export function markSpan(
  strokeId: string, from: number, to: number, kind: SpanOverride['kind'] | undefined, deps: Pick<ActionDeps, 'store'> = { store: editorStore },
): void {
  const { store } = deps;
  const stroke = store.getState().project?.strokes[strokeId];
  if (!stroke) return;
  const overrides = overridesWithSpan(stroke, from, to, kind);
  if (JSON.stringify(overrides) === JSON.stringify(stroke.overrides)) return;
  store.getState().change((q) => updateStroke(q, strokeId, { overrides }));
}
