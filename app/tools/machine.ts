/**
 * The small state machine every tool is made of: named child states, each handling
 * enter, the pointer events, cancel (always defined: Esc, or the tool being left) and
 * complete (Enter). The active path ('follow.following') is mirrored into the store so
 * the status strip and the tests can read it.
 */
import type { EditorStore, ToolName } from '../store/store.ts';
import type { ToolEvent } from './types.ts';

type Result = void | Promise<void>;

export interface StateNode {
  enter?(): Result;
  down?(ev: ToolEvent): Result;
  move?(ev: ToolEvent): Result;
  up?(ev: ToolEvent): Result;
  dblclick?(ev: ToolEvent): Result;
  /** Keys other than Escape and Enter (Backspace, Delete, …). */
  key?(ev: ToolEvent): Result;
  /** Leaves the state and restores whatever it changed. */
  cancel(): Result;
  /** Finishes the gesture (Enter). */
  complete?(): Result;
}

export class StateMachine<S extends string> {
  private current: S;

  constructor(
    readonly tool: ToolName,
    private readonly store: EditorStore,
    private readonly states: Record<S, StateNode>,
    initial: S,
  ) {
    this.current = initial;
  }

  get state(): S {
    return this.current;
  }

  path(): string {
    return `${this.tool}.${this.current}`;
  }

  /** Moves to `to` and runs its enter; the returned promise settles with enter's work. */
  go(to: S): Result {
    this.current = to;
    this.store.getState().setToolView({ toolPath: this.path() });
    return this.states[to].enter?.();
  }

  handle(ev: ToolEvent): Result {
    const s = this.states[this.current];
    switch (ev.type) {
      case 'down': return s.down?.(ev);
      case 'move': return s.move?.(ev);
      case 'up': return s.up?.(ev);
      case 'dblclick': return s.dblclick?.(ev);
      case 'key':
        if (ev.key === 'Escape') return s.cancel();
        if (ev.key === 'Enter') return s.complete?.();
        return s.key?.(ev);
    }
  }

  cancel(): void {
    void this.states[this.current].cancel();
  }
}
