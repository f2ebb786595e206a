/**
 * Refine (R): drag an anchor and the stroke re-solves live; click a selected stroke to
 * add an anchor there; Delete removes the last clicked anchor (never the start or the
 * end) or else the selected strokes. Every edit is one undo step.
 *
 *   idle ──down on an anchor or a stroke──▶ pointing ──moved > 2 screen px (anchor)──▶ dragging
 *     ▲          │ up: a click (select; on a selected stroke: add an anchor)      │ up
 *     │          ▼                                                                ▼
 *     └──────── idle ◀──────────────── solving (the last solve applied, committed)
 *   Esc anywhere ──▶ idle, the stroke exactly as before the gesture.
 */
import type { Anchor, StrokeDoc } from '../../../src/doc/model.ts';
import { settingsOf, updateStroke } from '../../../src/doc/rules.ts';
import type { SolveResult } from '../../engine/bridge.ts';
import { StateMachine, type StateNode } from '../machine.ts';
import { errorText, imageOfStroke, isSuperseded, solvedPatch } from '../shared.ts';
import type { AnchorHit, StrokeHit, Tool, ToolContext, ToolEvent } from '../types.ts';
import { anchorsWithInserted, anchorsWithout } from './edits.ts';

export type RefineState = 'idle' | 'pointing' | 'dragging' | 'solving';

/** Pointer travel that turns a press on an anchor into a drag, screen px. */
export const DRAG_THRESHOLD = 2;

type Outcome = { ok: true; result: SolveResult } | { ok: false; error: unknown };

function isPrimary(ev: ToolEvent): boolean {
  return ev.button === undefined || ev.button === 0;
}

function settle(p: Promise<SolveResult>): Promise<Outcome> {
  return p.then((result) => ({ ok: true as const, result }), (error: unknown) => ({ ok: false as const, error }));
}

export interface RefineTool extends Tool {
  /** The anchor clicked last (drawn as selected; Delete removes it). */
  selectedAnchor(): AnchorHit | undefined;
}

export function createRefineTool(ctx: ToolContext): RefineTool {
  const { store, engine } = ctx;
  const st = () => store.getState();

  let selected: AnchorHit | undefined;
  /** Bumped when a gesture ends: late solves of an earlier gesture are dropped. */
  let session = 0;
  let press: { x: number; y: number; shift: boolean; anchor?: AnchorHit; stroke?: StrokeHit; moved: boolean } | undefined;
  let drag: {
    strokeId: string;
    index: number;
    original: StrokeDoc;
    imageId: string;
    last: { x: number; y: number } | undefined;
    /** Sequence of the newest solve asked for, and of the newest applied. */
    asked: number;
    applied: number;
    latest: Promise<Outcome> | undefined;
  } | undefined;
  /** The edit the solving state waits for, and how it is committed. */
  let edit: { outcome: Promise<Outcome>; gesture: boolean; apply?: (r: SolveResult) => void } | undefined;

  function say(kind: 'error' | 'info', text: string): void {
    st().setMessage({ kind, text });
  }

  function toIdle(): void {
    press = undefined;
    drag = undefined;
    edit = undefined;
    void machine.go('idle');
  }

  /** Re-solves `strokeId` through `anchors` and commits it as one step (state solving). */
  function startEdit(strokeId: string, anchors: Anchor[]): void | Promise<void> {
    const p = st().project;
    const stroke = p?.strokes[strokeId];
    const imageId = p && stroke ? imageOfStroke(p, stroke) : undefined;
    if (!p || !stroke || !imageId) return toIdle();
    const outcome = settle(engine.solve(imageId, anchors, settingsOf(p, strokeId), strokeId));
    edit = {
      outcome,
      gesture: false,
      apply: (result) => {
        const now = st().project?.strokes[strokeId];
        if (now) st().change((q) => updateStroke(q, strokeId, { anchors, ...solvedPatch(now, result) }));
      },
    };
    return machine.go('solving');
  }

  const idle: StateNode = {
    enter() {},
    down(ev) {
      if (!isPrimary(ev) || !st().project) return;
      const tol = ctx.tolerance();
      const anchor = ctx.hitAnchor(ev.x, ev.y, tol);
      if (anchor) {
        selected = anchor;
        st().select([anchor.strokeId], ev.shift ? 'add' : 'replace');
        press = { x: ev.x, y: ev.y, shift: !!ev.shift, anchor, moved: false };
        return machine.go('pointing');
      }
      const stroke = ctx.hitStroke(ev.x, ev.y, tol);
      if (stroke) {
        press = { x: ev.x, y: ev.y, shift: !!ev.shift, stroke, moved: false };
        return machine.go('pointing');
      }
      selected = undefined;
      if (!ev.shift) st().select([]);
    },
    key(ev) {
      if (ev.key !== 'Delete' && ev.key !== 'Backspace') return;
      const p = st().project;
      const sel = selected;
      const stroke = sel && p?.strokes[sel.strokeId];
      const anchors = stroke && sel ? anchorsWithout(stroke, sel.anchorIndex) : undefined;
      selected = undefined;
      if (stroke && anchors) return startEdit(stroke.id, anchors);
      st().deleteSelection();
    },
    cancel() {
      selected = undefined;
      toIdle();
    },
  };

  const pointing: StateNode = {
    enter() {},
    move(ev) {
      if (!press) return toIdle();
      const threshold = DRAG_THRESHOLD / Math.max(1e-6, st().zoom);
      if (Math.hypot(ev.x - press.x, ev.y - press.y) <= threshold) return;
      press.moved = true;
      if (!press.anchor) return; // a drag along a stroke's body does nothing
      const p = st().project;
      const stroke = p?.strokes[press.anchor.strokeId];
      const imageId = p && stroke ? imageOfStroke(p, stroke) : undefined;
      if (!stroke || !imageId) return toIdle();
      drag = {
        strokeId: stroke.id, index: press.anchor.anchorIndex, original: stroke, imageId,
        last: undefined, asked: 0, applied: 0, latest: undefined,
      };
      st().beginGesture();
      void machine.go('dragging');
      return dragging.move!(ev);
    },
    up() {
      const hit = press?.stroke;
      const moved = press?.moved;
      const shift = press?.shift;
      press = undefined;
      if (!hit || moved) return toIdle();
      // A click on a stroke body.
      selected = undefined;
      if (shift) {
        st().select([hit.strokeId], 'add');
        return toIdle();
      }
      if (!st().selection.includes(hit.strokeId)) {
        // The first click selects; only a click on a selected stroke adds an anchor, so
        // picking a stroke never changes it.
        st().select([hit.strokeId]);
        return toIdle();
      }
      const stroke = st().project?.strokes[hit.strokeId];
      const inserted = stroke && anchorsWithInserted(stroke, hit.sampleIndex);
      if (!inserted) return toIdle();
      selected = { strokeId: hit.strokeId, anchorIndex: inserted.index };
      return startEdit(hit.strokeId, inserted.anchors);
    },
    cancel: toIdle,
  };

  const dragging: StateNode = {
    enter() {},
    move(ev) {
      const d = drag;
      const p = st().project;
      if (!d || !p || !p.strokes[d.strokeId]) return;
      d.last = { x: ev.x, y: ev.y };
      const anchors = d.original.anchors.map((a, i) => (i === d.index ? { ...a, x: ev.x, y: ev.y } : a));
      // The anchor follows the pointer at once; the samples follow when the solve answers.
      st().change((q) => updateStroke(q, d.strokeId, { anchors }));
      const seq = ++d.asked;
      const s = session;
      const outcome = settle(engine.solve(d.imageId, anchors, settingsOf(p, d.strokeId), d.strokeId)).then((o) => {
        if (o.ok && s === session && seq > d.applied && st().project?.strokes[d.strokeId]) {
          d.applied = seq;
          // Marks are remapped from the stroke as it was before the drag, so they do not drift.
          st().change((q) => updateStroke(q, d.strokeId, solvedPatch(d.original, o.result)));
        }
        return o;
      });
      d.latest = outcome;
      return outcome.then(() => undefined);
    },
    up(ev) {
      const d = drag;
      if (!d) return toIdle();
      if (!d.last || d.last.x !== ev.x || d.last.y !== ev.y) void dragging.move!(ev);
      edit = { outcome: d.latest!, gesture: true };
      return machine.go('solving');
    },
    cancel() {
      session++;
      st().cancelGesture();
      toIdle();
    },
  };

  const solving: StateNode = {
    async enter() {
      const e = edit;
      if (!e) return toIdle();
      const s = session;
      const o = await e.outcome;
      if (s !== session) return; // cancelled meanwhile: nothing of it stays
      if (o.ok) {
        e.apply?.(o.result);
        if (e.gesture) st().endGesture();
        st().setLastSolve(o.result.ms);
      } else {
        if (e.gesture) st().cancelGesture();
        if (!isSuperseded(o.error)) say('error', `The stroke could not be re-solved: ${errorText(o.error)}`);
      }
      toIdle();
    },
    cancel() {
      session++;
      if (edit?.gesture) st().cancelGesture();
      toIdle();
    },
  };

  const machine = new StateMachine<RefineState>('refine', store, { idle, pointing, dragging, solving }, 'idle');

  return {
    name: 'refine',
    path: () => machine.path(),
    handle: (ev) => machine.handle(ev),
    cancel: () => machine.cancel(),
    selectedAnchor: () => selected,
  };
}
