/**
 * Pointer and wheel input of the canvas. Presses, releases and double clicks go to the
 * active tool at once; moves are gathered and the newest is handed over once per
 * animation frame (never a solve per mouse event). Panning (Space held, or the middle
 * button) and zooming (wheel at the cursor; a pinch arrives as ctrl+wheel) move the view
 * directly, whatever the tool.
 */
import type { EditorStore } from '../store/store.ts';
import type { ToolEvent } from '../tools/types.ts';
import { probe } from './probe.ts';
import { activeTool, panHeld, subscribePanHeld } from './tools.ts';
import { screenToImage, zoomedAt } from './view.ts';

/** Wheel zoom per px of wheel travel; a pinch (ctrl+wheel) sends small deltas, so it gets more. */
const WHEEL_RATE = 0.0015;
const PINCH_RATE = 0.01;
/** Px per line, for wheels that count lines. */
const LINE_PX = 16;

function report(e: unknown): void {
  console.error('inkroute: a tool failed:', e);
}

export function attachPointer(el: HTMLElement, store: EditorStore): () => void {
  let pendingMove: PointerEvent | undefined;
  let frame = 0;
  let pan: { pointerId: number; sx: number; sy: number; panX: number; panY: number } | undefined;

  const local = (e: MouseEvent) => {
    const r = el.getBoundingClientRect();
    return { sx: e.clientX - r.left, sy: e.clientY - r.top };
  };
  const toImage = (e: MouseEvent) => {
    const { sx, sy } = local(e);
    return screenToImage(store.getState(), sx, sy);
  };
  const dispatch = (ev: ToolEvent) => {
    try {
      const r = activeTool()?.handle(ev);
      if (r) r.catch(report);
    } catch (e) {
      report(e);
    }
  };
  const cursor = () => {
    const tool = store.getState().tool;
    el.style.cursor = pan ? 'grabbing' : panHeld() || tool === 'pan' ? 'grab' : tool === 'follow' ? 'crosshair' : 'default';
  };

  const flushMove = () => {
    if (frame) cancelAnimationFrame(frame);
    frame = 0;
    const e = pendingMove;
    pendingMove = undefined;
    if (!e) return;
    const p = toImage(e);
    store.getState().setView({ cursor: p });
    dispatch({ type: 'move', x: p.x, y: p.y, shift: e.shiftKey });
  };

  const onDown = (e: PointerEvent) => {
    el.focus({ preventScroll: true });
    if (e.button === 1 || (e.button === 0 && panHeld())) {
      e.preventDefault();
      const s = store.getState();
      const { sx, sy } = local(e);
      pan = { pointerId: e.pointerId, sx, sy, panX: s.panX, panY: s.panY };
      try {
        el.setPointerCapture(e.pointerId);
      } catch {
        // Synthetic events have no capturable pointer; the drag still works inside the canvas.
      }
      cursor();
      return;
    }
    flushMove();
    try {
      el.setPointerCapture(e.pointerId);
    } catch {
      // As above.
    }
    const p = toImage(e);
    dispatch({ type: 'down', x: p.x, y: p.y, button: e.button, shift: e.shiftKey });
  };

  const onMove = (e: PointerEvent) => {
    probe.lastMoveAt = e.timeStamp;
    if (pan && e.pointerId === pan.pointerId) {
      const { sx, sy } = local(e);
      store.getState().setView({ panX: pan.panX + sx - pan.sx, panY: pan.panY + sy - pan.sy });
      return;
    }
    pendingMove = e;
    if (!frame) frame = requestAnimationFrame(flushMove);
  };

  const onUp = (e: PointerEvent) => {
    if (pan && e.pointerId === pan.pointerId) {
      pan = undefined;
      cursor();
      return;
    }
    flushMove();
    const p = toImage(e);
    dispatch({ type: 'up', x: p.x, y: p.y, button: e.button, shift: e.shiftKey });
  };

  const onDblClick = (e: MouseEvent) => {
    flushMove();
    const p = toImage(e);
    dispatch({ type: 'dblclick', x: p.x, y: p.y, button: e.button, shift: e.shiftKey });
  };

  const onWheel = (e: WheelEvent) => {
    e.preventDefault();
    const px = e.deltaMode === 1 ? e.deltaY * LINE_PX : e.deltaMode === 2 ? e.deltaY * el.clientHeight : e.deltaY;
    const factor = Math.exp(-px * (e.ctrlKey ? PINCH_RATE : WHEEL_RATE));
    const { sx, sy } = local(e);
    store.getState().setView(zoomedAt(store.getState(), factor, sx, sy));
    // The image point under the cursor stays put; the cursor readout follows the new view.
    store.getState().setView({ cursor: screenToImage(store.getState(), sx, sy) });
  };

  const onLeave = () => {
    if (!pan) store.getState().setView({ cursor: undefined });
  };
  // The middle button's autoscroll and the context menu would fight the canvas.
  const onAux = (e: MouseEvent) => {
    if (e.button === 1) e.preventDefault();
  };

  el.addEventListener('pointerdown', onDown);
  el.addEventListener('pointermove', onMove);
  el.addEventListener('pointerup', onUp);
  el.addEventListener('pointercancel', onUp);
  el.addEventListener('dblclick', onDblClick);
  el.addEventListener('wheel', onWheel, { passive: false });
  el.addEventListener('pointerleave', onLeave);
  el.addEventListener('mousedown', onAux);
  el.addEventListener('auxclick', onAux);
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.tool !== prev.tool) cursor();
  });
  const unsubscribePan = subscribePanHeld(cursor);
  cursor();
  return () => {
    if (frame) cancelAnimationFrame(frame);
    el.removeEventListener('pointerdown', onDown);
    el.removeEventListener('pointermove', onMove);
    el.removeEventListener('pointerup', onUp);
    el.removeEventListener('pointercancel', onUp);
    el.removeEventListener('dblclick', onDblClick);
    el.removeEventListener('wheel', onWheel);
    el.removeEventListener('pointerleave', onLeave);
    el.removeEventListener('mousedown', onAux);
    el.removeEventListener('auxclick', onAux);
    unsubscribe();
    unsubscribePan();
  };
}
