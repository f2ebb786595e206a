/**
 * Follow (F): click the start of a stroke, click between to add anchors, then finish
 * with a second click on the last point, a double click, or Enter. While following, a
 * live preview runs from the last anchor to the pointer; finishing runs the exact solve
 * and adds the stroke as one undo step.
 *
 *   idle ──down──▶ following ──click on the last point / dblclick / Enter──▶ solving ──▶ idle
 *                   │  down elsewhere: one more anchor; Backspace: one less (none: idle)
 *   Esc anywhere ──▶ idle, with no change to the document.
 */
import type { Anchor, Project } from '../../../src/doc/model.ts';
import { addStroke, newId, strokeFromSolve } from '../../../src/doc/rules.ts';
import type { StrokeSample } from '../../../src/trace/types.ts';
import type { JobsSlice } from '../../store/store.ts';
import { StateMachine, type StateNode } from '../machine.ts';
import { errorText, isSuperseded, samePoint, surfaceOfImage } from '../shared.ts';
import type { Tool, ToolContext, ToolEvent } from '../types.ts';

export type FollowState = 'idle' | 'following' | 'solving';

/** Key of the Follow tool's solves, so a newer finish supersedes a cancelled one. */
const SOLVE_KEY = 'follow';

function isPrimary(ev: ToolEvent): boolean {
  return ev.button === undefined || ev.button === 0;
}

export function createFollowTool(ctx: ToolContext): Tool {
  const { store, engine } = ctx;
  const st = () => store.getState();

  // The gesture's data, shared by the states.
  let anchors: Anchor[] = [];
  /** Preview of each span already closed by an anchor, so the whole path stays in view. */
  let spans: StrokeSample[][] = [];
  /** Preview from the last anchor to the pointer. */
  let current: StrokeSample[] | undefined;
  /** Bumped when a gesture ends: late answers for an earlier gesture are dropped. */
  let session = 0;
  /** Bumped at each new preview tree: answers from the replaced tree are dropped. */
  let epoch = 0;
  let ownMessage: JobsSlice['message'];

  const project = (): Project | undefined => st().project;

  function inside(p: Project, x: number, y: number): boolean {
    const found = surfaceOfImage(p, ctx.imageId());
    if (!found) return false;
    return x >= 0 && y >= 0 && x < found.image.width && y < found.image.height;
  }

  function show(): void {
    const parts = current ? [...spans, current] : spans;
    st().setToolView({ pending: anchors.slice(), preview: parts.length ? parts.flat() : undefined });
  }

  function restartPreview(p: Project): void {
    epoch++;
    current = undefined;
    const last = anchors[anchors.length - 1];
    engine.startPreview(ctx.imageId(), { x: last.x, y: last.y }, p.defaults);
  }

  function say(kind: 'error' | 'info', text: string): void {
    ownMessage = { kind, text };
    st().setMessage(ownMessage);
  }

  /** Ends any gesture: no preview, no pending anchors, nothing added. */
  function reset(): void {
    session++;
    epoch++;
    anchors = [];
    spans = [];
    current = undefined;
    engine.stopPreview();
    st().setToolView({ pending: [], preview: undefined });
    void machine.go('idle');
  }

  const idle: StateNode = {
    enter() {},
    down(ev) {
      const p = project();
      if (!isPrimary(ev) || !p || !inside(p, ev.x, ev.y)) return;
      anchors = [{ x: ev.x, y: ev.y }];
      spans = [];
      return machine.go('following');
    },
    cancel: reset,
  };

  const following: StateNode = {
    enter() {
      const p = project();
      if (!p) return reset();
      restartPreview(p);
      show();
    },
    move(ev) {
      const s = session;
      const e = epoch;
      return engine.previewTo({ x: ev.x, y: ev.y }).then((path) => {
        // Coalesced (undefined) or outdated answers leave the shown preview as it is.
        if (!path || s !== session || e !== epoch || machine.state !== 'following') return;
        current = path;
        show();
      });
    },
    down(ev) {
      const p = project();
      if (!isPrimary(ev) || !p) return;
      // A second click on the last point finishes: it would be a zero-length span.
      if (samePoint(ev, anchors[anchors.length - 1], ctx.tolerance())) return following.complete!();
      if (!inside(p, ev.x, ev.y)) return;
      spans.push(current ?? []);
      anchors.push({ x: ev.x, y: ev.y });
      restartPreview(p);
      show();
    },
    dblclick() {
      return following.complete!();
    },
    key(ev) {
      if (ev.key !== 'Backspace') return;
      anchors.pop();
      spans.pop();
      const p = project();
      if (anchors.length === 0 || !p) return reset();
      restartPreview(p);
      show();
    },
    cancel: reset,
    complete() {
      if (anchors.length < 2) {
        say('info', 'Click the end of the stroke first.');
        return;
      }
      return machine.go('solving');
    },
  };

  const solving: StateNode = {
    async enter() {
      const p = project();
      if (!p) return reset();
      const s = session;
      const imageId = ctx.imageId();
      const fixed = anchors.map((a) => ({ x: a.x, y: a.y }));
      // The tree is not needed any more; the preview stays drawn until the stroke replaces it.
      engine.stopPreview();
      let result;
      try {
        result = await engine.solve(imageId, fixed, p.defaults, SOLVE_KEY);
      } catch (err) {
        if (s !== session || isSuperseded(err)) return;
        say('error', `The stroke could not be traced: ${errorText(err)}`);
        // Back to following with the anchors kept, so one click fixes the problem.
        return machine.go('following');
      }
      if (s !== session) return; // cancelled while solving: the late result adds nothing
      const now = project();
      if (!now) return reset();
      const surfaceId = surfaceOfImage(now, imageId)?.surface.id ?? now.surfaces[0].id;
      const stroke = strokeFromSolve(newId('s'), surfaceId, fixed, result.stroke);
      st().change((q) => addStroke(q, stroke));
      st().setLastSolve(result.ms);
      st().select([stroke.id]);
      if (ownMessage && st().message === ownMessage) st().setMessage(undefined);
      reset();
    },
    cancel: reset,
  };

  const machine = new StateMachine<FollowState>('follow', store, { idle, following, solving }, 'idle');

  return {
    name: 'follow',
    path: () => machine.path(),
    handle: (ev) => machine.handle(ev),
    cancel: () => machine.cancel(),
  };
}
