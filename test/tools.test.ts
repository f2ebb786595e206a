/**
 * The canvas tools' state machines, driven headless through the harness with the real
 * store and the in-process engine: each tool's happy path with real values, cancel at
 * every state (project and history unchanged), one undo step per gesture, and the keys.
 */
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { afterEach, describe, expect, it } from 'vitest';
import { KeySheet } from '../app/tools/KeySheet.tsx';
import { handleKey, KEY_BINDINGS, keyLabel, type KeyApi, type KeyInput } from '../app/tools/keys.ts';
import { markSpan, overridesWithSpan, pinRadius, spanMarking } from '../app/tools/index.ts';
import type { Tool, ToolEvent } from '../app/tools/types.ts';
import { effectiveRestoredSpans } from '../src/doc/rules.ts';
import type { StrokeDoc } from '../src/doc/model.ts';
import { createToolHarness, distToPolyline, truthStrokes, type ToolHarness } from './helpers/toolHarness.ts';

const { arc, bar } = truthStrokes();
const arcStart = arc[0];
const arcMid = arc[300];
const arcEnd = arc[arc.length - 1];

let harness: ToolHarness | undefined;
async function setup(): Promise<ToolHarness> {
  harness = await createToolHarness();
  return harness;
}
afterEach(() => {
  harness?.dispose();
  harness = undefined;
});

function worstDistance(stroke: Pick<StrokeDoc, 'samples'>, truth: { x: number; y: number }[]): number {
  return Math.max(...stroke.samples.map((s) => distToPolyline(truth, s.x, s.y)));
}

function nearestSampleDistance(stroke: Pick<StrokeDoc, 'samples'>, x: number, y: number): number {
  return Math.min(...stroke.samples.map((s) => Math.hypot(s.x - x, s.y - y)));
}

/** Follows the arc through start, middle and end; returns the new stroke. */
async function followArc(h: ToolHarness): Promise<StrokeDoc> {
  h.use('follow');
  h.click(arcStart.x, arcStart.y);
  h.click(arcMid.x, arcMid.y);
  h.dblclick(arcEnd.x, arcEnd.y);
  await h.settle();
  const s = h.strokes().at(-1)!;
  expect(s.anchors).toHaveLength(3);
  return s;
}

describe('Follow tool', () => {
  it('click the start, move (live preview on the ink), double click the end: one stroke, one undo step', async () => {
    const h = await setup();
    h.use('follow');
    const before = h.project();
    expect(h.tool.path()).toBe('follow.idle');

    h.click(arcStart.x, arcStart.y);
    expect(h.tool.path()).toBe('follow.following');
    expect(h.store.getState().toolPath).toBe('follow.following');
    expect(h.store.getState().pending).toEqual([{ x: arcStart.x, y: arcStart.y }]);

    h.move(arcEnd.x, arcEnd.y);
    await h.settle();
    const preview = h.store.getState().preview!;
    expect(preview.length).toBeGreaterThan(100);
    expect(worstDistance({ samples: preview }, arc)).toBeLessThan(1.5);
    expect(Math.hypot(preview.at(-1)!.x - arcEnd.x, preview.at(-1)!.y - arcEnd.y)).toBeLessThan(1);
    expect(h.project()).toBe(before); // nothing in the document yet

    h.dblclick(arcEnd.x, arcEnd.y);
    expect(h.tool.path()).toBe('follow.solving');
    await h.settle();
    expect(h.tool.path()).toBe('follow.idle');

    const strokes = h.strokes();
    expect(strokes).toHaveLength(1);
    const s = strokes[0];
    expect(s.anchors).toEqual([{ x: arcStart.x, y: arcStart.y }, { x: arcEnd.x, y: arcEnd.y }]);
    expect(s.samples[0].x).toBeCloseTo(arcStart.x, 6);
    expect(s.samples[0].y).toBeCloseTo(arcStart.y, 6);
    expect(s.samples.at(-1)!.x).toBeCloseTo(arcEnd.x, 6);
    expect(s.samples.at(-1)!.y).toBeCloseTo(arcEnd.y, 6);
    expect(worstDistance(s, arc)).toBeLessThan(1);
    expect(s.restoredSpans).toEqual([]);
    expect(s.settings).toBeUndefined(); // the project's defaults
    expect(h.store.getState().selection).toEqual([s.id]);
    expect(h.store.getState().pending).toEqual([]);
    expect(h.store.getState().preview).toBeUndefined();
    expect(h.store.getState().lastSolveMs).toBeGreaterThan(0);
    expect(h.history()).toBe(1);

    const after = h.project();
    h.store.getState().undo();
    expect(h.project()).toEqual(before);
    expect(h.strokes()).toHaveLength(0);
    h.store.getState().redo();
    expect(h.project()).toEqual(after);
  });

  it('passes exactly through an anchor clicked between, and finishes on Enter', async () => {
    const h = await setup();
    h.use('follow');
    h.click(arcStart.x, arcStart.y);
    h.move(arcMid.x, arcMid.y);
    await h.settle(); // frames pass between a move and the next click
    h.click(arcMid.x, arcMid.y);
    expect(h.store.getState().pending).toHaveLength(2);
    h.move(arcEnd.x, arcEnd.y);
    await h.settle();
    h.click(arcEnd.x, arcEnd.y);
    await h.settle();
    expect(h.tool.path()).toBe('follow.following'); // a click adds an anchor; it does not finish
    expect(h.store.getState().pending).toHaveLength(3);
    // The preview covers both spans: the closed one and the one to the pointer.
    expect(h.store.getState().preview!.length).toBeGreaterThan(100);
    h.key('Enter');
    await h.settle();
    const [s] = h.strokes();
    expect(s.anchors).toEqual([arcStart, arcMid, arcEnd].map((p) => ({ x: p.x, y: p.y })));
    expect(nearestSampleDistance(s, arcMid.x, arcMid.y)).toBeLessThan(1e-6);
    expect(worstDistance(s, arc)).toBeLessThan(1);
    expect(h.history()).toBe(1);
  });

  it('a second click on (nearly) the last point finishes instead of adding a zero-length span', async () => {
    const h = await setup();
    h.use('follow');
    h.click(arcStart.x, arcStart.y);
    h.click(arcEnd.x, arcEnd.y);
    h.click(arcEnd.x + 0.8, arcEnd.y - 0.6);
    await h.settle();
    expect(h.store.getState().message).toBeUndefined();
    expect(h.strokes()).toHaveLength(1);
    expect(h.strokes()[0].anchors).toHaveLength(2);
    expect(h.history()).toBe(1);
  });

  it('Backspace takes back the last anchor; taking back the start returns to idle with nothing changed', async () => {
    const h = await setup();
    h.use('follow');
    const before = h.project();
    h.click(arcStart.x, arcStart.y);
    h.click(arcMid.x, arcMid.y);
    h.key('Backspace');
    expect(h.tool.path()).toBe('follow.following');
    expect(h.store.getState().pending).toEqual([{ x: arcStart.x, y: arcStart.y }]);
    // Following goes on from the start: the next click and Enter make a two-anchor stroke.
    h.click(arcEnd.x, arcEnd.y);
    h.key('Backspace');
    h.key('Backspace');
    expect(h.tool.path()).toBe('follow.idle');
    expect(h.store.getState().pending).toEqual([]);
    expect(h.store.getState().preview).toBeUndefined();
    await h.settle();
    expect(h.project()).toBe(before);
    expect(h.history()).toBe(0);
  });

  it('Enter with only the start placed says what is missing and keeps following', async () => {
    const h = await setup();
    h.use('follow');
    h.click(arcStart.x, arcStart.y);
    h.key('Enter');
    expect(h.tool.path()).toBe('follow.following');
    expect(h.store.getState().message?.kind).toBe('info');
    expect(h.strokes()).toHaveLength(0);
  });

  describe('Esc cancels at every state, leaving the project and the history unchanged', () => {
    async function expectUnchanged(h: ToolHarness, before: unknown) {
      await h.settle();
      expect(h.tool.path()).toBe('follow.idle');
      expect(h.project()).toBe(before);
      expect(h.history()).toBe(0);
      expect(h.store.getState().pending).toEqual([]);
      expect(h.store.getState().preview).toBeUndefined();
    }

    it('idle', async () => {
      const h = await setup();
      h.use('follow');
      const before = h.project();
      h.key('Escape');
      await expectUnchanged(h, before);
    });

    it('following, start only (a late preview answer shows nothing)', async () => {
      const h = await setup();
      h.use('follow');
      const before = h.project();
      h.click(arcStart.x, arcStart.y);
      h.move(arcEnd.x, arcEnd.y);
      h.key('Escape');
      await expectUnchanged(h, before);
    });

    it('following, with anchors', async () => {
      const h = await setup();
      h.use('follow');
      const before = h.project();
      h.click(arcStart.x, arcStart.y);
      h.click(arcMid.x, arcMid.y);
      h.move(arcEnd.x, arcEnd.y);
      await h.settle();
      expect(h.store.getState().preview).toBeDefined();
      h.key('Escape');
      await expectUnchanged(h, before);
    });

    it('solving: the late result adds no stroke', async () => {
      const h = await setup();
      h.use('follow');
      const before = h.project();
      h.click(arcStart.x, arcStart.y);
      h.dblclick(arcEnd.x, arcEnd.y);
      expect(h.tool.path()).toBe('follow.solving');
      h.key('Escape');
      await expectUnchanged(h, before);
      expect(h.store.getState().selection).toEqual([]);
      // And the tool works again afterwards.
      h.click(arcStart.x, arcStart.y);
      h.dblclick(arcEnd.x, arcEnd.y);
      await h.settle();
      expect(h.strokes()).toHaveLength(1);
      expect(h.history()).toBe(1);
    });

    it('leaving the tool cancels like Esc', async () => {
      const h = await setup();
      h.use('follow');
      const before = h.project();
      h.click(arcStart.x, arcStart.y);
      h.click(arcMid.x, arcMid.y);
      h.use('refine');
      await h.settle();
      expect(h.project()).toBe(before);
      expect(h.store.getState().pending).toEqual([]);
      expect(h.store.getState().preview).toBeUndefined();
    });
  });

  it('a failed solve says why and goes back to following with the anchors kept', async () => {
    const h = await setup();
    h.use('follow');
    const solve = h.engine.solve.bind(h.engine);
    h.engine.solve = () => Promise.reject(new Error('no path joins these points inside the search area.'));
    h.click(arcStart.x, arcStart.y);
    h.click(arcMid.x, arcMid.y);
    h.key('Enter');
    await h.settle();
    expect(h.tool.path()).toBe('follow.following');
    expect(h.store.getState().message).toEqual({ kind: 'error', text: expect.stringContaining('no path joins') });
    expect(h.store.getState().pending).toHaveLength(2);
    expect(h.strokes()).toHaveLength(0);
    h.engine.solve = solve;
    h.dblclick(arcEnd.x, arcEnd.y);
    await h.settle();
    expect(h.strokes()).toHaveLength(1);
    expect(h.strokes()[0].anchors).toHaveLength(3);
    expect(h.store.getState().message).toBeUndefined();
  });

  it('ignores clicks outside the image and with other buttons', async () => {
    const h = await setup();
    h.use('follow');
    h.click(-5, 10);
    h.click(30, 30, { button: 1 });
    expect(h.tool.path()).toBe('follow.idle');
  });
});

describe('Refine tool', () => {
  it('dragging an anchor re-solves live; the drop is one undo step that undo and redo replay exactly', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.use('refine');
    const historyBefore = h.history();
    const target = { x: arcMid.x + 1, y: arcMid.y + 3 };

    h.down(arcMid.x, arcMid.y);
    expect(h.tool.path()).toBe('refine.pointing');
    expect(h.store.getState().selection).toEqual([original.id]);
    h.move(arcMid.x + 1.2, arcMid.y + 1.2);
    expect(h.tool.path()).toBe('refine.pointing'); // 1.7 px: not a drag yet
    h.move(arcMid.x + 1.5, arcMid.y + 2);
    expect(h.tool.path()).toBe('refine.dragging');
    h.move(target.x, target.y);
    await h.settle();
    // Live: the stroke already passes the pointer, within the open gesture (no step yet).
    const live = h.project().strokes[original.id];
    expect(live.anchors[1]).toEqual(target);
    expect(nearestSampleDistance(live, target.x, target.y)).toBeLessThan(1);
    expect(h.history()).toBe(historyBefore);

    h.up(target.x, target.y);
    expect(h.tool.path()).toBe('refine.solving');
    await h.settle();
    expect(h.tool.path()).toBe('refine.idle');
    const moved = h.project().strokes[original.id];
    expect(moved.anchors).toEqual([original.anchors[0], target, original.anchors[2]]);
    expect(nearestSampleDistance(moved, target.x, target.y)).toBeLessThan(1);
    expect(moved.samples).not.toEqual(original.samples);
    expect(h.history()).toBe(historyBefore + 1);

    h.store.getState().undo();
    expect(h.project().strokes[original.id]).toEqual(original);
    h.store.getState().redo();
    expect(h.project().strokes[original.id]).toEqual(moved);
  });

  it('Esc in idle and while pointing changes nothing', async () => {
    const h = await setup();
    await followArc(h);
    h.use('refine');
    const before = h.project();
    const historyBefore = h.history();
    h.key('Escape');
    expect(h.tool.path()).toBe('refine.idle');
    h.down(arcMid.x, arcMid.y);
    expect(h.tool.path()).toBe('refine.pointing');
    h.key('Escape');
    expect(h.tool.path()).toBe('refine.idle');
    h.move(arcMid.x + 10, arcMid.y + 10); // after Esc the press is over: no drag starts
    h.up(arcMid.x + 10, arcMid.y + 10);
    await h.settle();
    expect(h.tool.path()).toBe('refine.idle');
    expect(h.project()).toBe(before);
    expect(h.history()).toBe(historyBefore);
  });

  it('Esc while dragging puts the stroke back exactly, and late solves change nothing', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.use('refine');
    const before = h.project();
    const historyBefore = h.history();
    h.down(arcEnd.x, arcEnd.y);
    h.move(arcEnd.x - 4, arcEnd.y + 4);
    await h.settle();
    expect(h.project().strokes[original.id]).not.toEqual(original);
    h.move(arcEnd.x - 8, arcEnd.y + 6);
    h.key('Escape');
    expect(h.tool.path()).toBe('refine.idle');
    await h.settle();
    expect(h.project()).toBe(before);
    expect(h.project().strokes[original.id]).toEqual(original);
    expect(h.history()).toBe(historyBefore);
  });

  it('Esc while the dropped anchor is still solving cancels the whole drag', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.use('refine');
    const historyBefore = h.history();
    h.drag(arcMid, { x: arcMid.x, y: arcMid.y - 3 });
    expect(h.tool.path()).toBe('refine.solving');
    h.key('Escape');
    await h.settle();
    expect(h.project().strokes[original.id]).toEqual(original);
    expect(h.history()).toBe(historyBefore);
  });

  it('a press on an anchor that moves 2 px or less is a click: it selects, changes nothing', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.store.getState().select([]);
    h.use('refine');
    const before = h.project();
    h.down(arcMid.x, arcMid.y);
    h.move(arcMid.x + 1.2, arcMid.y + 1.2);
    h.up(arcMid.x + 1.2, arcMid.y + 1.2);
    await h.settle();
    expect(h.tool.path()).toBe('refine.idle');
    expect(h.project()).toBe(before);
    expect(h.store.getState().selection).toEqual([original.id]);
  });

  it('a click on a selected stroke inserts an anchor between the right neighbours (one step); the first click only selects', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.store.getState().select([]);
    h.use('refine');
    const historyBefore = h.history();
    const q = arc[450]; // between the middle and the end anchors
    h.click(q.x, q.y);
    await h.settle();
    expect(h.store.getState().selection).toEqual([original.id]);
    expect(h.project().strokes[original.id]).toBe(original);

    h.click(q.x, q.y);
    expect(h.tool.path()).toBe('refine.solving');
    await h.settle();
    const s = h.project().strokes[original.id];
    expect(s.anchors).toHaveLength(4);
    expect(s.anchors[0]).toEqual(original.anchors[0]);
    expect(s.anchors[1]).toEqual(original.anchors[1]);
    expect(s.anchors[3]).toEqual(original.anchors[2]);
    expect(distToPolyline(arc, s.anchors[2].x, s.anchors[2].y)).toBeLessThan(1);
    expect(s.anchors[2].x).toBeGreaterThan(arcMid.x);
    expect(s.anchors[2].x).toBeLessThan(arcEnd.x);
    expect(nearestSampleDistance(s, s.anchors[2].x, s.anchors[2].y)).toBeLessThan(1e-6);
    expect(worstDistance(s, arc)).toBeLessThan(1);
    expect(h.history()).toBe(historyBefore + 1);
    expect((h.tool as Tool & { selectedAnchor(): unknown }).selectedAnchor()).toEqual({ strokeId: original.id, anchorIndex: 2 });
  });

  it('Delete removes the last clicked anchor (one step); with the start or end clicked it deletes the selected strokes', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.use('refine');
    const historyBefore = h.history();
    h.click(arcMid.x, arcMid.y);
    h.key('Delete');
    expect(h.tool.path()).toBe('refine.solving');
    await h.settle();
    const s = h.project().strokes[original.id];
    expect(s.anchors).toEqual([original.anchors[0], original.anchors[2]]);
    expect(worstDistance(s, arc)).toBeLessThan(1);
    expect(h.history()).toBe(historyBefore + 1);

    h.click(arcEnd.x, arcEnd.y);
    h.key('Delete');
    await h.settle();
    expect(h.strokes()).toHaveLength(0);
    expect(h.history()).toBe(historyBefore + 2);
    h.store.getState().undo();
    expect(h.project().strokes[original.id]).toEqual(s);
  });

  it('shift-click adds strokes to the selection; Delete then removes them all in one step', async () => {
    const h = await setup();
    const a = await followArc(h);
    h.use('follow');
    h.click(bar[0].x, bar[0].y);
    h.dblclick(bar.at(-1)!.x, bar.at(-1)!.y);
    await h.settle();
    const b = h.strokes()[1];
    h.use('refine');
    h.store.getState().select([]);
    h.click(arc[100].x, arc[100].y);
    h.click(bar[100].x, bar[100].y, { shift: true });
    expect(h.store.getState().selection).toEqual([a.id, b.id]);
    const historyBefore = h.history();
    h.key('Delete');
    expect(h.strokes()).toHaveLength(0);
    expect(h.history()).toBe(historyBefore + 1);
    h.click(5, 95); // empty surface: clears the selection
    expect(h.store.getState().selection).toEqual([]);
  });

  it('Esc while an inserted anchor is solving changes nothing', async () => {
    const h = await setup();
    const original = await followArc(h);
    h.use('refine');
    const historyBefore = h.history();
    const q = arc[150];
    h.click(q.x, q.y); // selected already (Follow selects the new stroke): inserts
    expect(h.tool.path()).toBe('refine.solving');
    h.key('Escape');
    await h.settle();
    expect(h.project().strokes[original.id]).toBe(original);
    expect(h.history()).toBe(historyBefore);
  });

  it('pinRadius pins and frees the pen radius at an anchor, one re-solved step each', async () => {
    const h = await setup();
    const original = await followArc(h);
    const asked: unknown[] = [];
    const solve = h.engine.solve.bind(h.engine);
    h.engine.solve = (imageId, anchors, settings, key) => {
      asked.push({ anchors, key });
      return solve(imageId, anchors, settings, key);
    };
    const deps = { store: h.store, engine: h.engine };
    const historyBefore = h.history();
    await pinRadius(original.id, 1, 3.5, deps);
    const pinned = h.project().strokes[original.id];
    expect(pinned.anchors[1]).toEqual({ x: arcMid.x, y: arcMid.y, r: 3.5 });
    expect(asked).toEqual([{ anchors: pinned.anchors, key: original.id }]);
    expect(pinned.samples).not.toEqual(original.samples);
    expect(h.history()).toBe(historyBefore + 1);

    await pinRadius(original.id, 1, 99, deps); // clamped to the radius range
    expect(h.project().strokes[original.id].anchors[1].r).toBe(h.project().defaults.radius[1]);
    await pinRadius(original.id, 1, undefined, deps);
    const freed = h.project().strokes[original.id];
    expect(freed.anchors[1]).toEqual({ x: arcMid.x, y: arcMid.y });
    expect(freed.samples).toEqual(original.samples); // the same solve as before the pin
    expect(h.history()).toBe(historyBefore + 3);
    h.store.getState().undo();
    h.store.getState().undo();
    expect(h.project().strokes[original.id]).toEqual(pinned);
    h.store.getState().undo();
    expect(h.project().strokes[original.id]).toEqual(original);
  });

  it('markSpan marks and unmarks spans by hand, one step each, and no step when nothing changes', async () => {
    const h = await setup();
    const original = await followArc(h);
    const deps = { store: h.store };
    const base = h.history();
    markSpan(original.id, 20, 10, 'restored', deps);
    let s = h.project().strokes[original.id];
    expect(s.overrides).toEqual([{ from: 10, to: 20, kind: 'restored' }]);
    expect(effectiveRestoredSpans(s)).toEqual([{ from: 10, to: 20 }]);
    markSpan(original.id, 15, 17, 'inked', deps);
    s = h.project().strokes[original.id];
    expect(s.overrides).toEqual([
      { from: 10, to: 14, kind: 'restored' }, { from: 15, to: 17, kind: 'inked' }, { from: 18, to: 20, kind: 'restored' },
    ]);
    expect(effectiveRestoredSpans(s)).toEqual([{ from: 10, to: 14 }, { from: 18, to: 20 }]);
    expect(h.history()).toBe(base + 2);
    markSpan(original.id, 15, 17, 'inked', deps);
    expect(h.history()).toBe(base + 2);
    markSpan(original.id, 0, 1e6, undefined, deps);
    expect(h.project().strokes[original.id].overrides).toEqual([]);
    expect(h.history()).toBe(base + 3);
    h.store.getState().undo();
    h.store.getState().undo();
    h.store.getState().undo();
    expect(h.project().strokes[original.id]).toEqual(original);
  });

  it('a hand-marked span stays on the same part of the stroke when a drag re-solves it', async () => {
    const h = await setup();
    const original = await followArc(h);
    markSpan(original.id, 30, 40, 'restored', { store: h.store });
    const at = original.samples[30];
    h.use('refine');
    h.drag(arcEnd, { x: arcEnd.x - 6, y: arcEnd.y + 1 });
    await h.settle();
    const s = h.project().strokes[original.id];
    expect(s.overrides).toHaveLength(1);
    const o = s.overrides[0];
    expect(Math.hypot(s.samples[o.from].x - at.x, s.samples[o.from].y - at.y)).toBeLessThan(1);
    expect(o.to - o.from).toBeGreaterThanOrEqual(8);
  });

  it('overridesWithSpan keeps the marks sorted, disjoint and merged', () => {
    const stroke = { samples: new Array(50).fill({ x: 0, y: 0, r: 1, support: 1 }), overrides: [] };
    const a = overridesWithSpan(stroke, 5, 9, 'restored');
    const b = overridesWithSpan({ ...stroke, overrides: a }, 10, 12, 'restored');
    expect(b).toEqual([{ from: 5, to: 12, kind: 'restored' }]);
    expect(overridesWithSpan({ ...stroke, overrides: b }, 7, 8, undefined)).toEqual([
      { from: 5, to: 6, kind: 'restored' }, { from: 9, to: 12, kind: 'restored' },
    ]);
    expect(overridesWithSpan(stroke, 40, 99, 'inked')).toEqual([{ from: 40, to: 49, kind: 'inked' }]);
  });

  it('spanMarking tells a span marked wholly by one kind from a partly marked or unmarked one', () => {
    const stroke = { overrides: [{ from: 5, to: 12, kind: 'restored' as const }, { from: 13, to: 20, kind: 'inked' as const }] };
    expect(spanMarking(stroke, 0, 4)).toBe('measured');
    expect(spanMarking(stroke, 5, 12)).toBe('restored');
    expect(spanMarking(stroke, 12, 6)).toBe('restored');
    expect(spanMarking(stroke, 14, 20)).toBe('inked');
    expect(spanMarking(stroke, 4, 12)).toBe('mixed'); // one sample unmarked
    expect(spanMarking(stroke, 10, 15)).toBe('mixed'); // two kinds
  });
});

describe('Pan tool', () => {
  /** The canvas's conversion: screen px to image px with the view as it is now. */
  function toImage(h: ToolHarness, sx: number, sy: number) {
    const { zoom, panX, panY } = h.store.getState();
    return { x: (sx - panX) / zoom, y: (sy - panY) / zoom };
  }
  function at(h: ToolHarness, type: 'down' | 'move' | 'up', sx: number, sy: number) {
    const p = toImage(h, sx, sy);
    h[type](p.x, p.y);
  }

  it('a drag moves the view by the pointer travel in screen px; nothing is undoable', async () => {
    const h = await setup();
    h.store.getState().setView({ zoom: 2, panX: 10, panY: 20 });
    h.use('pan');
    at(h, 'down', 100, 100);
    expect(h.tool.path()).toBe('pan.dragging');
    at(h, 'move', 110, 95);
    at(h, 'move', 125, 85);
    at(h, 'up', 130, 80);
    expect(h.tool.path()).toBe('pan.idle');
    expect(h.store.getState().panX).toBeCloseTo(40, 9);
    expect(h.store.getState().panY).toBeCloseTo(0, 9);
    expect(h.history()).toBe(0);
  });

  it('Esc while dragging puts the view back where it was', async () => {
    const h = await setup();
    h.store.getState().setView({ zoom: 1.5, panX: -30, panY: 12 });
    h.use('pan');
    at(h, 'down', 50, 50);
    at(h, 'move', 90, 10);
    h.key('Escape');
    expect(h.tool.path()).toBe('pan.idle');
    expect(h.store.getState().panX).toBe(-30);
    expect(h.store.getState().panY).toBe(12);
    h.key('Escape'); // idle: cancel is defined and does nothing
    expect(h.store.getState().panX).toBe(-30);
  });
});

describe('keys', () => {
  function keyApi(h: ToolHarness) {
    const seen: ToolEvent[] = [];
    let sheet = 0;
    const recorder: Tool = {
      name: 'follow',
      path: () => 'follow.idle',
      handle: (ev) => {
        seen.push(ev);
      },
      cancel: () => {},
    };
    let active: Tool = recorder;
    const api: KeyApi = { store: h.store, activeTool: () => active, toggleKeySheet: () => sheet++ };
    return { api, seen, sheets: () => sheet, setActive: (t: Tool) => (active = t) };
  }
  const k = (key: string, mods: Partial<KeyInput> = {}): KeyInput => ({ key, ctrlKey: false, metaKey: false, shiftKey: false, ...mods });

  it('F and R switch tools; Space held is a pan flag; ? toggles the sheet', async () => {
    const h = await setup();
    const { api, sheets } = keyApi(h);
    expect(handleKey(k('r'), api)).toMatchObject({ handled: true });
    expect(h.store.getState().tool).toBe('refine');
    expect(h.store.getState().toolPath).toBe('refine.idle');
    handleKey(k('F', { shiftKey: true }), api);
    expect(h.store.getState().tool).toBe('follow');
    expect(handleKey(k(' '), api)).toMatchObject({ handled: true, panHeld: true });
    expect(handleKey(k(' ', { type: 'keyup' }), api)).toMatchObject({ handled: true, panHeld: false });
    expect(handleKey(k('?', { shiftKey: true }), api).handled).toBe(true);
    expect(sheets()).toBe(1);
    expect(handleKey(k('f', { ctrlKey: true }), api).handled).toBe(false); // the browser's find
    expect(handleKey(k('x'), api).handled).toBe(false);
  });

  it('Esc, Enter, Backspace and Delete go to the active tool as key events at the cursor', async () => {
    const h = await setup();
    const { api, seen } = keyApi(h);
    h.store.getState().setView({ cursor: { x: 12, y: 34 } });
    for (const key of ['Escape', 'Enter', 'Backspace', 'Delete']) expect(handleKey(k(key), api).handled).toBe(true);
    expect(seen.map((e) => [e.type, e.key, e.x, e.y])).toEqual([
      ['key', 'Escape', 12, 34], ['key', 'Enter', 12, 34], ['key', 'Backspace', 12, 34], ['key', 'Delete', 12, 34],
    ]);
  });

  it('Ctrl+Z undoes, Ctrl+Shift+Z and Ctrl+Y redo (Cmd too); mid-gesture Ctrl+Z cancels the gesture only', async () => {
    const h = await setup();
    const { api, setActive } = keyApi(h);
    await followArc(h);
    await followArc(h);
    expect(h.strokes()).toHaveLength(2);
    handleKey(k('z', { ctrlKey: true }), api);
    expect(h.strokes()).toHaveLength(1);
    handleKey(k('z', { metaKey: true }), api);
    expect(h.strokes()).toHaveLength(0);
    handleKey(k('Z', { ctrlKey: true, shiftKey: true }), api);
    expect(h.strokes()).toHaveLength(1);
    handleKey(k('y', { ctrlKey: true }), api);
    expect(h.strokes()).toHaveLength(2);

    // Following with anchors placed: Ctrl+Z drops the gesture, not the last stroke.
    setActive(h.use('follow'));
    h.click(arcStart.x, arcStart.y);
    h.click(arcMid.x, arcMid.y);
    handleKey(k('z', { ctrlKey: true }), api);
    expect(h.tool.path()).toBe('follow.idle');
    expect(h.store.getState().pending).toEqual([]);
    expect(h.strokes()).toHaveLength(2);
  });

  it('keys typed in a text field are left alone; a focused slider is not a text field', async () => {
    const h = await setup();
    const { api, seen } = keyApi(h);
    await followArc(h);
    const text = { tagName: 'INPUT', type: 'text' };
    expect(handleKey(k('z', { ctrlKey: true, target: text }), api).handled).toBe(false);
    expect(handleKey(k('r', { target: { tagName: 'TEXTAREA' } }), api).handled).toBe(false);
    expect(handleKey(k('Delete', { target: { tagName: 'DIV', isContentEditable: true } }), api).handled).toBe(false);
    expect(h.strokes()).toHaveLength(1);
    expect(h.store.getState().tool).toBe('follow');
    expect(seen).toEqual([]);
    expect(handleKey(k('r', { target: { tagName: 'INPUT', type: 'range' } }), api).handled).toBe(true);
    expect(h.store.getState().tool).toBe('refine');
  });

  it('the key sheet lists every binding of the table handleKey reads', () => {
    expect(renderToStaticMarkup(createElement(KeySheet, { open: false, onClose: () => {} }))).toBe('');
    const html = renderToStaticMarkup(createElement(KeySheet, { open: true, onClose: () => {} }));
    expect(html).toContain('role="dialog"');
    for (const b of KEY_BINDINGS) {
      expect(html).toContain(keyLabel(b).replace(/&/g, '&amp;'));
      // Every chord on the sheet does what the sheet says.
      for (const c of b.chords) {
        for (const key of c.keys) {
          const e = k(key, { ctrlKey: c.mod, shiftKey: c.shift === true });
          expect(KEY_BINDINGS.find((x) => x.chords.some((y) => y.keys.includes(e.key.toLowerCase()) && y.mod === e.ctrlKey && (y.shift === 'any' || y.shift === e.shiftKey)))).toBe(b);
        }
      }
    }
  });
});
