/** The store's rules: one gesture is one undo step; deletes prune the selection. */
import { describe, expect, it } from 'vitest';
import { createEditorStore } from '../app/store/store.ts';
import { addStroke, newProject } from '../src/doc/rules.ts';
import type { StrokeDoc } from '../src/doc/model.ts';

function stroke(id: string, x: number): StrokeDoc {
  return {
    id, surfaceId: 'recto', anchors: [{ x, y: 1 }, { x: x + 5, y: 1 }],
    samples: [{ x, y: 1, r: 2, support: 1 }, { x: x + 5, y: 1, r: 2, support: 1 }],
    restoredSpans: [], overrides: [], hidden: false,
    cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 },
  };
}

function loaded() {
  const store = createEditorStore();
  const p = newProject('t', { band: 'visible', file: 'images/a.png', mime: 'image/png', width: 50, height: 40, bitDepth: 8 });
  store.getState().loadProject(p, new Map([['images/a.png', new Uint8Array([1])]]));
  return store;
}

describe('editor store', () => {
  it('records one undo step per change and per gesture', () => {
    const store = loaded();
    const s = store.getState();
    s.change((p) => addStroke(p, stroke('a', 1)));
    expect(Object.keys(store.getState().project!.strokes)).toEqual(['a']);
    s.beginGesture();
    s.change((p) => addStroke(p, stroke('b', 10)));
    s.change((p) => addStroke(p, stroke('c', 20)));
    s.endGesture();
    expect(store.temporal.getState().pastStates.length).toBe(2);
    store.getState().undo();
    expect(Object.keys(store.getState().project!.strokes)).toEqual(['a']);
    store.getState().undo();
    expect(Object.keys(store.getState().project!.strokes)).toEqual([]);
    store.getState().redo();
    store.getState().redo();
    expect(Object.keys(store.getState().project!.strokes).sort()).toEqual(['a', 'b', 'c']);
  });

  it('a cancelled gesture leaves the project and the history as they were', () => {
    const store = loaded();
    const before = store.getState().project;
    store.getState().beginGesture();
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    store.getState().cancelGesture();
    expect(store.getState().project).toBe(before);
    expect(store.temporal.getState().pastStates.length).toBe(0);
  });

  it('deleting a stroke removes it from the selection, and undo keeps the selection valid', () => {
    const store = loaded();
    store.getState().change((p) => addStroke(addStroke(p, stroke('a', 1)), stroke('b', 10)));
    store.getState().select(['a', 'b']);
    store.getState().select(['b'], 'toggle');
    expect(store.getState().selection).toEqual(['a']);
    store.getState().deleteSelection();
    expect(store.getState().selection).toEqual([]);
    expect(store.getState().project!.surfaces[0].strokeOrder).toEqual(['b']);
    store.getState().select(['b']);
    store.getState().undo(); // back to a and b
    store.getState().undo(); // before both: b no longer exists
    expect(store.getState().selection).toEqual([]);
  });

  it('undo after save: the saved mark stays on the saved project', () => {
    const store = loaded();
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    store.getState().markSaved();
    const saved = store.getState().project;
    store.getState().undo();
    expect(store.getState().savedProject).toBe(saved);
    expect(store.getState().project).not.toBe(saved);
    store.getState().redo();
    expect(store.getState().project).toBe(saved);
  });
});
