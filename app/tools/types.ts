/**
 * Tools are small explicit state machines (one folder each). The canvas turns pointer
 * and key events into ToolEvents in image pixels, gathers pointer moves to one per
 * animation frame, and hands them to the active tool. Every state defines cancel (Esc).
 */
import type { EngineBridge } from '../engine/bridge.ts';
import type { EditorStore, ToolName } from '../store/store.ts';

export interface ToolEvent {
  type: 'down' | 'move' | 'up' | 'dblclick' | 'key';
  /** Image px. */
  x: number;
  y: number;
  button?: number;
  shift?: boolean;
  /** For 'key': KeyboardEvent.key ('Enter', 'Escape', 'Backspace', 'Delete', …). */
  key?: string;
}

export interface StrokeHit {
  strokeId: string;
  /** Nearest sample of the stroke. */
  sampleIndex: number;
}

export interface AnchorHit {
  strokeId: string;
  anchorIndex: number;
}

export interface ToolContext {
  store: EditorStore;
  engine: EngineBridge;
  /** The image the tools work on (the surface's first band). */
  imageId(): string;
  /** Tolerance for hits, image px (a few screen px at the current zoom). */
  tolerance(): number;
  hitStroke(x: number, y: number, tolerance: number): StrokeHit | undefined;
  hitAnchor(x: number, y: number, tolerance: number): AnchorHit | undefined;
}

export interface Tool {
  readonly name: ToolName;
  /** Active state path, e.g. 'follow.following'. */
  path(): string;
  handle(ev: ToolEvent): void | Promise<void>;
  /** Leaves any gesture, restoring what it changed. */
  cancel(): void;
}
