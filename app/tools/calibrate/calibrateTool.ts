/**
 * Calibrate (C): press, drag along a ruler or scale bar in the photo and release; then
 * type the ruler's length in mm (the form in CalibrateForm.tsx calls `submit`). The
 * surface's scale becomes line length px / mm, one undo step.
 *
 *   idle ──down──▶ dragging ──up (line ≥ 5 px)──▶ asking ──submit(mm > 0)──▶ idle
 *                     │ up on a shorter line: a message, idle      │ down: a new line
 *   Esc anywhere (or Cancel) ──▶ idle, with no change to the document.
 */
import { setScale } from '../../../src/doc/rules.ts';
import { StateMachine, type StateNode } from '../machine.ts';
import { surfaceOfImage } from '../shared.ts';
import type { Tool, ToolContext, ToolEvent } from '../types.ts';

export type CalibrateState = 'idle' | 'dragging' | 'asking';

/** Shortest line accepted, image px: shorter, one pixel of error is a big share of it. */
export const MIN_RULER_PX = 5;

export interface RulerLine {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export interface CalibrateTool extends Tool {
  /** The line drawn, while dragging or asking. */
  line(): RulerLine | undefined;
  /**
   * Sets the scale from the drawn line and `mmText`, the ruler's length in mm. Bad input
   * gives a message and changes nothing (the form stays); returns whether it was set.
   */
  submit(mmText: string): boolean;
}

/** Length of a line, px. */
export function lineLength(l: RulerLine): number {
  return Math.hypot(l.x1 - l.x0, l.y1 - l.y0);
}

/** The mm typed, or a one-sentence reason it is not usable. */
export function parseMm(text: string): { mm: number } | { error: string } {
  const t = text.trim().replace(',', '.');
  if (t === '') return { error: 'Type the ruler\'s length in mm first.' };
  const mm = Number(t);
  if (!Number.isFinite(mm)) return { error: `"${text.trim()}" is not a number; type the ruler's length in mm, e.g. 30.` };
  if (mm <= 0) return { error: 'The ruler\'s length must be more than 0 mm.' };
  return { mm };
}

function isPrimary(ev: ToolEvent): boolean {
  return ev.button === undefined || ev.button === 0;
}

export function createCalibrateTool(ctx: ToolContext): CalibrateTool {
  const { store } = ctx;
  const st = () => store.getState();
  let line: RulerLine | undefined;

  function show(): void {
    st().setToolView({ guide: line ? { kind: 'ruler', ...line } : undefined });
  }

  function toIdle(): void {
    line = undefined;
    show();
    void machine.go('idle');
  }

  function start(ev: ToolEvent): void | Promise<void> {
    if (!isPrimary(ev) || !st().project) return;
    line = { x0: ev.x, y0: ev.y, x1: ev.x, y1: ev.y };
    show();
    return machine.go('dragging');
  }

  const idle: StateNode = { down: start, cancel: toIdle };

  const dragging: StateNode = {
    move(ev) {
      if (!line) return toIdle();
      line = { ...line, x1: ev.x, y1: ev.y };
      show();
    },
    up(ev) {
      if (!line) return toIdle();
      line = { ...line, x1: ev.x, y1: ev.y };
      const len = lineLength(line);
      if (len < MIN_RULER_PX) {
        st().setMessage({ kind: 'error', text: `The line is ${len.toFixed(1)} px long; drag along the ruler for at least ${MIN_RULER_PX} px.` });
        return toIdle();
      }
      show();
      return machine.go('asking');
    },
    cancel: toIdle,
  };

  const asking: StateNode = {
    // A press on the photo while the form waits draws the line anew.
    down: start,
    complete() {
      st().setMessage({ kind: 'info', text: 'Type the ruler\'s length in mm, then press Set scale.' });
    },
    cancel: toIdle,
  };

  const machine = new StateMachine<CalibrateState>('calibrate', store, { idle, dragging, asking }, 'idle');

  return {
    name: 'calibrate',
    path: () => machine.path(),
    handle: (ev) => machine.handle(ev),
    cancel: () => machine.cancel(),
    line: () => (line ? { ...line } : undefined),
    submit(mmText) {
      const p = st().project;
      const surface = p && surfaceOfImage(p, ctx.imageId())?.surface;
      if (machine.state !== 'asking' || !line || !p || !surface) {
        st().setMessage({ kind: 'error', text: 'Draw a line along the ruler first.' });
        return false;
      }
      const parsed = parseMm(mmText);
      if ('error' in parsed) {
        st().setMessage({ kind: 'error', text: parsed.error });
        return false;
      }
      const px = lineLength(line);
      const pxPerMm = px / parsed.mm;
      const l = line;
      st().change((q) => setScale(q, surface.id, pxPerMm, { kind: 'ruler', x0: l.x0, y0: l.y0, x1: l.x1, y1: l.y1, mm: parsed.mm }));
      st().setMessage({ kind: 'info', text: `Scale set to ${pxPerMm.toFixed(2)} px/mm (${px.toFixed(1)} px along ${parsed.mm} mm).` });
      toIdle();
      return true;
    },
  };
}
