/**
 * The canvas's side of the tools: the ToolContext they see (hit tests in image px, a
 * tolerance of a few screen px), the active tool (made anew whenever store.tool changes,
 * the old one cancelled), and whether Space is held for panning.
 */
import type { EngineBridge } from '../engine/bridge.ts';
import type { EditorStore, ToolName } from '../store/store.ts';
import { hitAnchorIn, hitStrokeIn } from '../tools/hit.ts';
import { createTool } from '../tools/index.ts';
import type { AnchorHit, Tool, ToolContext } from '../tools/types.ts';
import { currentImage, currentSurface } from './view.ts';

/** Hit tolerance, screen px. */
export const HIT_TOLERANCE_PX = 6;

export function createToolContext(store: EditorStore, engine: EngineBridge): ToolContext {
  const surfaceId = () => currentSurface(store.getState().project)?.id ?? '';
  return {
    store,
    engine,
    imageId: () => currentImage(store.getState().project)?.id ?? '',
    tolerance: () => HIT_TOLERANCE_PX / store.getState().zoom,
    hitStroke: (x, y, tolerance) => {
      const p = store.getState().project;
      return p ? hitStrokeIn(p, surfaceId(), x, y, tolerance) : undefined;
    },
    hitAnchor: (x, y, tolerance) => {
      const p = store.getState().project;
      return p ? hitAnchorIn(p, surfaceId(), x, y, tolerance) : undefined;
    },
  };
}

let active: Tool | undefined;
let activeName: ToolName | undefined;
let spaceHeld = false;

/** The tool receiving the canvas's events (and Esc, Enter, Delete). */
export function activeTool(): Tool | undefined {
  return active;
}

/** The anchor Refine has selected, drawn filled. */
export function selectedAnchor(): AnchorHit | undefined {
  const t = active as (Tool & { selectedAnchor?: () => AnchorHit | undefined }) | undefined;
  return t?.selectedAnchor?.();
}

/** Switches tools: the active tool's gesture is cancelled first. */
export function switchTool(store: EditorStore, name: ToolName): void {
  if (store.getState().tool === name) return;
  active?.cancel();
  store.getState().setTool(name);
}

const panListeners = new Set<() => void>();

export function setPanHeld(held: boolean): void {
  if (held === spaceHeld) return;
  spaceHeld = held;
  for (const l of panListeners) l();
}

/** Calls `fn` when Space is pressed or released; returns the unsubscribe. */
export function subscribePanHeld(fn: () => void): () => void {
  panListeners.add(fn);
  return () => panListeners.delete(fn);
}

export function panHeld(): boolean {
  return spaceHeld;
}

/** Keeps the active tool in step with store.tool; returns the function that stops it. */
export function runTools(store: EditorStore, engine: EngineBridge): () => void {
  const ctx = createToolContext(store, engine);
  const sync = () => {
    const name = store.getState().tool;
    if (name === activeName && active) return;
    const old = active;
    activeName = name;
    active = createTool(name, ctx);
    // The old tool's cancel reports its own idle path to the store: put the new one back.
    old?.cancel();
    store.getState().setToolView({ toolPath: active.path() });
  };
  sync();
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.tool !== prev.tool) sync();
  });
  return () => {
    unsubscribe();
    active?.cancel();
    active = undefined;
    activeName = undefined;
  };
}
