/**
 * The editor's keys, in one table that both handleKey and the key sheet read, so the
 * sheet never disagrees with what the keys do.
 */
import type { EditorStore, ToolName } from '../store/store.ts';
import type { Tool } from './types.ts';

export type KeyAction =
  | { kind: 'tool'; tool: ToolName }
  /** Pan while the key is held. */
  | { kind: 'panHold' }
  /** Handed to the active tool as a ToolEvent of type 'key'. */
  | { kind: 'forward' }
  | { kind: 'undo' }
  | { kind: 'redo' }
  | { kind: 'keySheet' };

export interface KeyChord {
  /** KeyboardEvent.key values, compared without case. */
  keys: readonly string[];
  /** Ctrl (Cmd on a Mac) held. */
  mod: boolean;
  /** Shift held; 'any' where the key itself needs Shift on some layouts ('?'). */
  shift: boolean | 'any';
  /** The key's name on the sheet. */
  name: string;
}

export interface KeyBinding {
  chords: readonly KeyChord[];
  /** What the key does, for the sheet. */
  does: string;
  action: KeyAction;
}

function chord(name: string, keys: string[], mod = false, shift: boolean | 'any' = 'any'): KeyChord {
  return { name, keys, mod, shift };
}

/** Every key of the editor (naming.md, "Tools and keys"). */
export const KEY_BINDINGS: readonly KeyBinding[] = [
  { chords: [chord('F', ['f'])], does: 'Follow: click the start of a stroke, click between to add anchors, click the end twice (or press Enter)', action: { kind: 'tool', tool: 'follow' } },
  { chords: [chord('R', ['r'])], does: 'Refine: drag anchors, click a selected stroke to add one; the stroke re-solves live', action: { kind: 'tool', tool: 'refine' } },
  { chords: [chord('C', ['c'])], does: 'Calibrate: drag along a ruler in the photo, then type its length in mm', action: { kind: 'tool', tool: 'calibrate' } },
  { chords: [chord('L', ['l'])], does: 'Letter: click, Shift+click or box the strokes of a letter, Enter makes the letter; click a letter to select it', action: { kind: 'tool', tool: 'letter' } },
  { chords: [chord('Space', [' '])], does: 'Pan while held (or drag with the middle button)', action: { kind: 'panHold' } },
  { chords: [chord('Esc', ['escape', 'esc'])], does: 'Cancel what is under way', action: { kind: 'forward' } },
  { chords: [chord('Enter', ['enter'])], does: 'Finish: the stroke (Follow), the letter of the picked strokes (Letter)', action: { kind: 'forward' } },
  { chords: [chord('Backspace', ['backspace'])], does: 'Take back the last anchor while following', action: { kind: 'forward' } },
  { chords: [chord('Delete', ['delete', 'del'])], does: 'Remove the selected anchor, or else the selected letters and marks (Letter), or else the selected strokes', action: { kind: 'forward' } },
  { chords: [chord('Ctrl+Z', ['z'], true, false)], does: 'Undo (during a gesture: cancel it)', action: { kind: 'undo' } },
  { chords: [chord('Ctrl+Shift+Z', ['z'], true, true), chord('Ctrl+Y', ['y'], true, false)], does: 'Redo', action: { kind: 'redo' } },
  { chords: [chord('?', ['?'])], does: 'Show or hide this sheet', action: { kind: 'keySheet' } },
];

/** The sheet's wording of a binding's keys, e.g. 'Ctrl+Shift+Z or Ctrl+Y'. */
export function keyLabel(binding: KeyBinding): string {
  return binding.chords.map((c) => c.name).join(' or ');
}

export interface KeyInput {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey?: boolean;
  /** 'keydown' unless said otherwise; only Space's release matters. */
  type?: 'keydown' | 'keyup';
  /** The focused element, to leave typing in inputs alone. */
  target?: unknown;
}

export interface KeyApi {
  store: EditorStore;
  /** The tool that receives Esc, Enter, Backspace and Delete. */
  activeTool(): Tool | undefined;
  /** Switches tools; default: cancel the active tool's gesture, then store.setTool. */
  switchTool?(tool: ToolName): void;
  toggleKeySheet(): void;
}

export interface KeyOutcome {
  /** The key was used: the caller calls preventDefault. */
  handled: boolean;
  /** Space: true when pressed (pan while held), false when released; else undefined. */
  panHeld?: boolean;
  /** The binding that matched. */
  binding?: KeyBinding;
}

const TEXT_INPUTS = new Set(['', 'text', 'search', 'number', 'email', 'url', 'password', 'tel', 'date', 'time']);

/** True when keys belong to a field the person is typing in (sliders and buttons do not count). */
export function isTyping(target: unknown): boolean {
  if (!target || typeof target !== 'object') return false;
  const el = target as { tagName?: string; type?: string; isContentEditable?: boolean };
  if (el.isContentEditable) return true;
  const tag = (el.tagName ?? '').toUpperCase();
  if (tag === 'TEXTAREA' || tag === 'SELECT') return true;
  return tag === 'INPUT' && TEXT_INPUTS.has((el.type ?? '').toLowerCase());
}

function matches(c: KeyChord, e: KeyInput): boolean {
  if (!c.keys.includes(e.key.toLowerCase())) return false;
  if ((e.ctrlKey || e.metaKey) !== c.mod || e.altKey) return false;
  return c.shift === 'any' || c.shift === e.shiftKey;
}

export function findBinding(e: KeyInput): KeyBinding | undefined {
  return KEY_BINDINGS.find((b) => b.chords.some((c) => matches(c, e)));
}

/** A tool mid-gesture, whose gesture undo and redo cancel instead of stepping the history. */
function busy(tool: Tool | undefined): tool is Tool {
  return !!tool && !tool.path().endsWith('.idle');
}

/** Maps a key event to its action; the caller adds the listener and calls preventDefault. */
export function handleKey(e: KeyInput, api: KeyApi): KeyOutcome {
  if (isTyping(e.target)) return { handled: false };
  const binding = findBinding(e);
  if (!binding) return { handled: false };
  const { action } = binding;
  if (e.type === 'keyup') return action.kind === 'panHold' ? { handled: true, panHeld: false, binding } : { handled: false };
  const s = api.store.getState();
  const tool = api.activeTool();
  switch (action.kind) {
    case 'tool':
      if (s.tool !== action.tool) {
        if (api.switchTool) api.switchTool(action.tool);
        else {
          tool?.cancel();
          s.setTool(action.tool);
        }
      }
      break;
    case 'panHold':
      return { handled: true, panHeld: true, binding };
    case 'forward': {
      if (!tool) return { handled: false };
      const at = s.cursor ?? { x: 0, y: 0 };
      const key = e.key === 'Esc' ? 'Escape' : e.key === 'Del' ? 'Delete' : e.key;
      void tool.handle({ type: 'key', key, x: at.x, y: at.y, shift: e.shiftKey });
      break;
    }
    case 'undo':
      // Mid-gesture, Ctrl+Z takes back the gesture only, not a finished step as well.
      if (busy(tool)) tool.cancel();
      else s.undo();
      break;
    case 'redo':
      if (busy(tool)) tool.cancel();
      else s.redo();
      break;
    case 'keySheet':
      api.toggleKeySheet();
      break;
  }
  return { handled: true, binding };
}
