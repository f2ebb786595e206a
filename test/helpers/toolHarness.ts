/**
 * A headless harness for the canvas tools: a real editor store, a project on a small
 * rendered inscription, the in-process engine (the worker's client and host over a
 * loopback port, so answers are asynchronous and coalesced as in the page), and pointer
 * and key events in image px. Every event's work is tracked, so `settle()` waits until
 * the solves and previews it started have landed.
 */
import type { EngineBridge } from '../../app/engine/bridge.ts';
import { createLocalEngine } from '../../app/engine/local.ts';
import { createEditorStore, type EditorStore, type ToolName } from '../../app/store/store.ts';
import { createTool } from '../../app/tools/index.ts';
import { hitAnchorIn, hitStrokeIn } from '../../app/tools/hit.ts';
import type { Tool, ToolContext, ToolEvent } from '../../app/tools/types.ts';
import type { Project, StrokeDoc } from '../../src/doc/model.ts';
import { newProject } from '../../src/doc/rules.ts';
import { createRandom } from '../../src/util/random.ts';
import { renderCoverage, sampleCurve, type PenPoint } from './render.ts';

export const WIDTH = 160;
export const HEIGHT = 100;

/** The rendered strokes (ground truth): an arc, and a straight stroke with a 15 px gap. */
export function truthStrokes(): { arc: PenPoint[]; bar: PenPoint[]; barGap: [number, number] } {
  const arc = sampleCurve((t) => ({ x: 20 + 120 * t, y: 30 + 6 * t + 10 * Math.sin(Math.PI * t), r: 2.5 }), 600);
  const bar = sampleCurve((t) => ({ x: 30 + 100 * t, y: 76 - 6 * t, r: 2 }), 500);
  return { arc, bar, barGap: [72, 87] };
}

/** Luma 0..1 of dark ink on a light, slightly noisy ground. */
export function renderLuma(seed = 7): Float32Array {
  const { arc, bar, barGap } = truthStrokes();
  const inked = bar.filter((p) => p.x < barGap[0] || p.x > barGap[1]);
  const cover = renderCoverage(WIDTH, HEIGHT, [arc, inked]).data;
  const rnd = createRandom(seed);
  const luma = new Float32Array(cover.length);
  for (let i = 0; i < luma.length; i++) luma[i] = Math.min(1, Math.max(0, 0.85 - 0.6 * cover[i] + 0.02 * rnd.normal()));
  return luma;
}

export { distToPolyline } from './render.ts';

export interface PointerOptions {
  shift?: boolean;
  button?: number;
}

export interface ToolHarness {
  store: EditorStore;
  engine: EngineBridge;
  ctx: ToolContext;
  imageId: string;
  /** The active tool (set with use). */
  tool: Tool;
  /** Makes `name` the active tool (cancelling the previous one, as the editor does). */
  use(name: ToolName): Tool;
  down(x: number, y: number, o?: PointerOptions): void;
  move(x: number, y: number, o?: PointerOptions): void;
  up(x: number, y: number, o?: PointerOptions): void;
  /** down + up at one point. */
  click(x: number, y: number, o?: PointerOptions): void;
  /** What a browser sends for a double click: down, up, down, up, dblclick. */
  dblclick(x: number, y: number, o?: PointerOptions): void;
  /** down at `from`, `steps` moves along the line, up at `to`. */
  drag(from: { x: number; y: number }, to: { x: number; y: number }, steps?: number, o?: PointerOptions): void;
  key(key: string): void;
  /** Waits until the work of every event so far (solves, preview paths) has landed. */
  settle(): Promise<void>;
  project(): Project;
  strokes(): StrokeDoc[];
  /** Undo steps recorded. */
  history(): number;
  dispose(): void;
}

function nextTask(): Promise<void> {
  return new Promise((r) => setTimeout(r, 0));
}

export async function createToolHarness(options: { tolerance?: number } = {}): Promise<ToolHarness> {
  const store = createEditorStore();
  const engine = createLocalEngine();
  const project = newProject('harness', { band: 'visible', file: 'images/visible.png', mime: 'image/png', width: WIDTH, height: HEIGHT, bitDepth: 8 });
  const imageId = project.surfaces[0].images[0].id;
  store.getState().loadProject(project, new Map([['images/visible.png', new Uint8Array(0)]]));
  await engine.loadImage(imageId, WIDTH, HEIGHT, renderLuma());

  const tolerance = options.tolerance ?? 3;
  const surfaceId = project.surfaces[0].id;
  const ctx: ToolContext = {
    store,
    engine,
    imageId: () => imageId,
    tolerance: () => tolerance,
    hitStroke: (x, y, t) => {
      const p = store.getState().project;
      return p && hitStrokeIn(p, surfaceId, x, y, t);
    },
    hitAnchor: (x, y, t) => {
      const p = store.getState().project;
      return p && hitAnchorIn(p, surfaceId, x, y, t);
    },
  };

  const pending = new Set<Promise<unknown>>();
  const failures: unknown[] = [];
  let tool: Tool = createTool('follow', ctx);
  const send = (ev: ToolEvent): void => {
    const r = tool.handle(ev);
    if (r instanceof Promise) {
      pending.add(r);
      // Handled here so a failure is not unhandled; settle() reports it.
      r.then(() => pending.delete(r), (e: unknown) => {
        pending.delete(r);
        failures.push(e);
      });
    }
  };
  const pointer = (type: ToolEvent['type'], x: number, y: number, o: PointerOptions = {}): void => {
    store.getState().setView({ cursor: { x, y } });
    send({ type, x, y, shift: o.shift, button: o.button ?? 0 });
  };

  const h: ToolHarness = {
    store,
    engine,
    ctx,
    imageId,
    get tool() {
      return tool;
    },
    use(name) {
      tool.cancel();
      store.getState().setTool(name);
      tool = createTool(name, ctx);
      return tool;
    },
    down: (x, y, o) => pointer('down', x, y, o),
    move: (x, y, o) => pointer('move', x, y, o),
    up: (x, y, o) => pointer('up', x, y, o),
    click(x, y, o) {
      h.down(x, y, o);
      h.up(x, y, o);
    },
    dblclick(x, y, o) {
      h.click(x, y, o);
      h.click(x, y, o);
      pointer('dblclick', x, y, o);
    },
    drag(from, to, steps = 6, o) {
      h.down(from.x, from.y, o);
      for (let i = 1; i <= steps; i++) h.move(from.x + ((to.x - from.x) * i) / steps, from.y + ((to.y - from.y) * i) / steps, o);
      h.up(to.x, to.y, o);
    },
    key(key) {
      const c = store.getState().cursor ?? { x: 0, y: 0 };
      send({ type: 'key', key, x: c.x, y: c.y });
    },
    async settle() {
      for (let round = 0; round < 1000; round++) {
        if (pending.size > 0) await Promise.allSettled([...pending]);
        if (failures.length > 0) throw failures.shift();
        // Answers cross the loopback on later tasks; a few empty turns show nothing is left.
        await nextTask();
        await nextTask();
        if (pending.size === 0) return;
      }
      throw new Error('the tools did not settle');
    },
    project: () => store.getState().project!,
    strokes: () => {
      const p = store.getState().project!;
      return p.surfaces.flatMap((s) => s.strokeOrder.map((id) => p.strokes[id]));
    },
    history: () => store.temporal.getState().pastStates.length,
    dispose: () => engine.dispose(),
  };
  return h;
}
