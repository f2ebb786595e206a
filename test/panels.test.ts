/**
 * The Details panel's settings gesture without a browser: a slider drag with its live
 * re-solves is one undo step, outdated solves never land, and the defaults change alone.
 */
import { describe, expect, it } from 'vitest';
import type { EngineBridge, SolveResult } from '../app/engine/bridge.ts';
import { resolveStroke, SettingsEdit } from '../app/panels/resolve.ts';
import { createEditorStore, type EditorStore } from '../app/store/store.ts';
import type { Anchor, SolverSettings, StrokeDoc } from '../src/doc/model.ts';
import { addStroke, newProject, settingsOf, updateStroke } from '../src/doc/rules.ts';

/** An engine whose solve answers after `ms` with a path whose radius is the adherence weight. */
function fakeEngine(ms = 15, fail?: string) {
  const latest = new Map<string, number>();
  const calls: { anchors: Anchor[]; settings: SolverSettings }[] = [];
  let n = 0;
  const engine = {
    async solve(_imageId: string, anchors: Anchor[], settings: SolverSettings, key?: string): Promise<SolveResult> {
      const id = ++n;
      if (key) latest.set(key, id);
      calls.push({ anchors, settings });
      await new Promise((r) => setTimeout(r, ms));
      if (fail) throw new Error(fail);
      if (key && latest.get(key) !== id) throw Object.assign(new Error('superseded'), { name: 'Superseded' });
      const r = settings.weights.adherence;
      return {
        ms: 7,
        stroke: {
          samples: [{ x: anchors[0].x, y: anchors[0].y, r, support: 1 }, { x: anchors[1].x, y: anchors[1].y, r, support: 0.2 }],
          restoredSpans: [{ from: 1, to: 1 }],
          cost: { adherence: r, widthChange: 0, curvature: 0, length: 1, total: r + 1 },
        },
      };
    },
  } as unknown as EngineBridge;
  return { engine, calls };
}

function stroke(id: string): StrokeDoc {
  return {
    id, surfaceId: 'recto', anchors: [{ x: 1, y: 1 }, { x: 9, y: 1 }],
    samples: [{ x: 1, y: 1, r: 0.5, support: 1 }, { x: 9, y: 1, r: 0.5, support: 1 }],
    restoredSpans: [], overrides: [], hidden: false,
    cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 },
  };
}

function loaded(): EditorStore {
  const store = createEditorStore();
  const p = newProject('t', { band: 'visible', file: 'images/a.png', mime: 'image/png', width: 20, height: 20, bitDepth: 8 });
  store.getState().loadProject(addStroke(p, stroke('a')), new Map([['images/a.png', new Uint8Array([1])]]));
  return store;
}

const withAdherence = (s: SolverSettings, a: number): SolverSettings => ({ ...s, weights: { ...s.weights, adherence: a } });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('settings gesture', () => {
  it('a slider drag with its live re-solves is one undo step', async () => {
    const store = loaded();
    const { engine, calls } = fakeEngine();
    const edit = new SettingsEdit(store, (id) => resolveStroke(id, { store, engine }));
    const start = store.getState().project!;
    const base = settingsOf(start, 'a');
    edit.press();
    const solves: Promise<void>[] = [];
    for (const a of [1.5, 2, 2.5]) {
      solves.push(edit.apply({ kind: 'strokes', ids: ['a'] }, withAdherence(base, a)));
      await sleep(2);
    }
    edit.release();
    await Promise.all(solves);
    expect(calls.length).toBe(3);
    const st = store.getState().project!.strokes.a;
    expect(st.settings?.weights.adherence).toBe(2.5);
    // Only the newest solve landed.
    expect(st.samples.map((s) => s.r)).toEqual([2.5, 2.5]);
    expect(st.restoredSpans).toEqual([{ from: 1, to: 1 }]);
    expect(store.getState().lastSolveMs).toBe(7);
    expect(store.getState().jobs).toEqual({});
    expect(store.temporal.getState().pastStates.length).toBe(1);
    store.getState().undo();
    expect(store.getState().project).toBe(start);
  });

  it('the gesture stays open until the last solve lands, even after the pointer is up', async () => {
    const store = loaded();
    const { engine } = fakeEngine(40);
    const edit = new SettingsEdit(store, (id) => resolveStroke(id, { store, engine }));
    const base = settingsOf(store.getState().project!, 'a');
    edit.press();
    const solved = edit.apply({ kind: 'strokes', ids: ['a'] }, withAdherence(base, 3));
    edit.release();
    await sleep(5);
    expect(store.temporal.getState().pastStates.length).toBe(0);
    await solved;
    expect(store.temporal.getState().pastStates.length).toBe(1);
    expect(store.getState().project!.strokes.a.samples[0].r).toBe(3);
  });

  it('a keyboard step (no press) is a gesture of its own', async () => {
    const store = loaded();
    const { engine } = fakeEngine();
    const edit = new SettingsEdit(store, (id) => resolveStroke(id, { store, engine }));
    const base = settingsOf(store.getState().project!, 'a');
    await edit.apply({ kind: 'strokes', ids: ['a'] }, withAdherence(base, 1.2));
    await edit.apply({ kind: 'strokes', ids: ['a'] }, withAdherence(base, 1.4));
    expect(store.temporal.getState().pastStates.length).toBe(2);
    store.getState().undo();
    expect(store.getState().project!.strokes.a.settings?.weights.adherence).toBe(1.2);
    expect(store.getState().project!.strokes.a.samples[0].r).toBe(1.2);
  });

  it('the defaults for new strokes change alone, solving nothing', async () => {
    const store = loaded();
    const { engine, calls } = fakeEngine();
    const edit = new SettingsEdit(store, (id) => resolveStroke(id, { store, engine }));
    const p0 = store.getState().project!;
    await edit.apply({ kind: 'defaults' }, { ...p0.defaults, radius: [2, 9] });
    await sleep(0);
    expect(calls.length).toBe(0);
    expect(store.getState().project!.defaults.radius).toEqual([2, 9]);
    expect(store.getState().project!.strokes.a).toBe(p0.strokes.a);
    expect(store.temporal.getState().pastStates.length).toBe(1);
  });

  it('a solve whose stroke changed meanwhile is dropped; a failing solve says why', async () => {
    const store = loaded();
    const { engine } = fakeEngine(20);
    const pending = resolveStroke('a', { store, engine });
    store.getState().change((p) => updateStroke(p, 'a', { anchors: [{ x: 2, y: 2 }, { x: 8, y: 2 }] }));
    expect(await pending).toBe(false);
    expect(store.getState().project!.strokes.a.samples[0].r).toBe(0.5);

    const broken = fakeEngine(1, 'the radius range 3,2 is empty: it needs 0 < min < max.');
    expect(await resolveStroke('a', { store, engine: broken.engine })).toBe(false);
    expect(store.getState().message).toEqual({ kind: 'error', text: expect.stringContaining('radius range 3,2 is empty') });
    expect(await resolveStroke('ghost', { store, engine })).toBe(false);
  });
});
