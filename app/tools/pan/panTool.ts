/**
 * Pan (hold Space, or the middle button): drag to move the view. The view is not part
 * of the document, so nothing here is undoable; Esc puts the view back where the drag
 * began.
 *
 *   idle ──down──▶ dragging ──up──▶ idle        Esc while dragging: back to the start.
 */
import { StateMachine, type StateNode } from '../machine.ts';
import type { Tool, ToolContext, ToolEvent } from '../types.ts';

export type PanState = 'idle' | 'dragging';

export function createPanTool(ctx: ToolContext): Tool {
  const { store } = ctx;
  const st = () => store.getState();
  let start: { panX: number; panY: number; sx: number; sy: number } | undefined;

  /**
   * Events come in image px, converted with the view as it is at that moment; the
   * screen position is what the drag is measured in, since the view moves under it.
   */
  function screen(ev: ToolEvent): { sx: number; sy: number } {
    const { zoom, panX, panY } = st();
    return { sx: ev.x * zoom + panX, sy: ev.y * zoom + panY };
  }

  const idle: StateNode = {
    enter() {},
    down(ev) {
      const { panX, panY } = st();
      start = { panX, panY, ...screen(ev) };
      return machine.go('dragging');
    },
    cancel() {},
  };

  const dragging: StateNode = {
    enter() {},
    move(ev) {
      if (!start) return;
      const { sx, sy } = screen(ev);
      st().setView({ panX: start.panX + sx - start.sx, panY: start.panY + sy - start.sy });
    },
    up(ev) {
      dragging.move!(ev);
      start = undefined;
      return machine.go('idle');
    },
    cancel() {
      if (start) st().setView({ panX: start.panX, panY: start.panY });
      start = undefined;
      return machine.go('idle');
    },
  };

  const machine = new StateMachine<PanState>('pan', store, { idle, dragging }, 'idle');

  return {
    name: 'pan',
    path: () => machine.path(),
    handle: (ev) => machine.handle(ev),
    cancel: () => machine.cancel(),
  };
}
