/**
 * The Calibrate and Letter tools driven headless through the harness (real store, real
 * document rules): their happy paths with real values, cancel at every state (project and
 * history unchanged), bad input (a message, nothing changed), one undo step per gesture,
 * and the store rules added with them (the letter selection kept pruned; deleting a
 * stroke of a letter).
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { CalibrateTool } from '../app/tools/calibrate/calibrateTool.ts';
import { handleKey, KEY_BINDINGS, type KeyInput } from '../app/tools/keys.ts';
import type { LetterTool } from '../app/tools/letter/letterTool.ts';
import { strokesInBox } from '../app/tools/letter/pick.ts';
import { scaleSourceText } from '../app/panels/StatusStrip.tsx';
import { openImageFile } from '../app/persist/projectIO.ts';
import { createEditorStore } from '../app/store/store.ts';
import type { Project, StrokeDoc } from '../src/doc/model.ts';
import { encodeGrayPng } from '../src/image/codec.ts';
import { createGray } from '../src/image/gray.ts';
import { addStroke } from '../src/doc/rules.ts';
import { transcription } from '../src/export/transcription.ts';
import { createToolHarness, truthStrokes, type ToolHarness } from './helpers/toolHarness.ts';

const { arc, bar } = truthStrokes();

let harness: ToolHarness | undefined;
afterEach(() => {
  harness?.dispose();
  harness = undefined;
});

/** The harness with the two true strokes of its image in the document (samples as drawn, full support). */
async function setup(): Promise<ToolHarness> {
  const h = await createToolHarness();
  harness = h;
  const stroke = (id: string, pts: typeof arc): StrokeDoc => ({
    id, surfaceId: 'recto', anchors: [{ x: pts[0].x, y: pts[0].y }, { x: pts.at(-1)!.x, y: pts.at(-1)!.y }],
    samples: pts.map((p) => ({ x: p.x, y: p.y, r: p.r, support: 1 })), restoredSpans: [], overrides: [], hidden: false,
    cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 },
  });
  const p = addStroke(addStroke(h.project(), stroke('arc', arc)), stroke('bar', bar));
  h.store.getState().loadProject(p, h.store.getState().images);
  return h;
}

function surfaceOf(p: Project) {
  return p.surfaces[0];
}

/** What must not change when a gesture is cancelled. */
function snapshot(h: ToolHarness) {
  return { project: h.project(), history: h.history() };
}

describe('Calibrate tool', () => {
  it('drag along a ruler, type its mm: pxPerMm = line px / mm with the ruler as source, one undo step', async () => {
    const h = await setup();
    const tool = h.use('calibrate') as CalibrateTool;
    expect(tool.path()).toBe('calibrate.idle');
    // A 3-4-5 right triangle (common practice): from (20, 10) to (80, 90) is exactly 100 px.
    h.down(20, 10);
    expect(tool.path()).toBe('calibrate.dragging');
    h.move(50, 50);
    expect(h.store.getState().guide).toEqual({ kind: 'ruler', x0: 20, y0: 10, x1: 50, y1: 50 });
    h.up(80, 90);
    expect(tool.path()).toBe('calibrate.asking');
    expect(h.store.getState().toolPath).toBe('calibrate.asking');
    expect(h.project().surfaces[0].pxPerMm).toBeUndefined(); // nothing set before the mm are typed
    const history = h.history();

    expect(tool.submit(' 25 ')).toBe(true);
    const s = surfaceOf(h.project());
    expect(s.pxPerMm).toBeCloseTo(4, 12);
    expect(s.scaleSource).toEqual({ kind: 'ruler', x0: 20, y0: 10, x1: 80, y1: 90, mm: 25 });
    expect(h.history()).toBe(history + 1);
    expect(tool.path()).toBe('calibrate.idle');
    expect(h.store.getState().guide).toBeUndefined();

    h.store.getState().undo();
    expect(surfaceOf(h.project()).pxPerMm).toBeUndefined();
    h.store.getState().redo();
    expect(surfaceOf(h.project()).pxPerMm).toBeCloseTo(4, 12);

    // A decimal comma is read as a point: 100 px along 12,5 mm is 8 px/mm.
    h.drag({ x: 20, y: 10 }, { x: 80, y: 90 });
    expect(tool.submit('12,5')).toBe(true);
    expect(surfaceOf(h.project()).pxPerMm).toBeCloseTo(8, 12);
  });

  it('Esc cancels at every state, and leaving the tool cancels too: no change, no history', async () => {
    const h = await setup();
    const tool = h.use('calibrate') as CalibrateTool;
    const before = snapshot(h);
    h.key('Escape');
    expect(tool.path()).toBe('calibrate.idle');
    h.down(10, 10);
    h.move(60, 10);
    h.key('Escape');
    expect(tool.path()).toBe('calibrate.idle');
    expect(h.store.getState().guide).toBeUndefined();
    h.up(60, 10); // the release after the cancel does nothing
    expect(tool.path()).toBe('calibrate.idle');
    h.drag({ x: 10, y: 10 }, { x: 90, y: 10 });
    expect(tool.path()).toBe('calibrate.asking');
    h.key('Escape');
    expect(tool.path()).toBe('calibrate.idle');
    expect(h.store.getState().guide).toBeUndefined();
    h.drag({ x: 10, y: 10 }, { x: 90, y: 10 });
    tool.cancel();
    expect(tool.path()).toBe('calibrate.idle');
    expect(tool.submit('30')).toBe(false); // the line is gone with the cancel
    expect(snapshot(h)).toEqual(before);
  });

  it('bad input gets a clear message and changes nothing: 0, negative, not a number, empty, a line under 5 px', async () => {
    const h = await setup();
    const tool = h.use('calibrate') as CalibrateTool;
    const before = snapshot(h);
    h.drag({ x: 10, y: 10 }, { x: 90, y: 10 });
    for (const bad of ['0', '-3', 'abc', '', '1e999']) {
      h.store.getState().setMessage(undefined);
      expect(tool.submit(bad)).toBe(false);
      const m = h.store.getState().message;
      expect(m?.kind).toBe('error');
      expect(m!.text).toMatch(/mm|number/);
      expect(tool.path()).toBe('calibrate.asking'); // the form stays for a second try
    }
    expect(snapshot(h)).toEqual(before);

    h.key('Escape');
    h.drag({ x: 10, y: 10 }, { x: 13, y: 14 }); // exactly 5 px: accepted
    expect(tool.path()).toBe('calibrate.asking');
    h.key('Escape');
    h.drag({ x: 10, y: 10 }, { x: 13, y: 13 }); // 4.2 px: refused
    expect(tool.path()).toBe('calibrate.idle');
    expect(h.store.getState().message?.text).toMatch(/4\.2 px long/);
    expect(snapshot(h)).toEqual(before);
  });
});

describe('Letter tool', () => {
  it('click, Shift+click to add and remove, Enter: one letter of the picked strokes, one undo step', async () => {
    const h = await setup();
    const tool = h.use('letter') as LetterTool;
    const onArc = arc[300];
    const onBar = bar[100];
    h.click(onArc.x, onArc.y);
    expect(h.store.getState().selection).toEqual(['arc']);
    h.click(onBar.x, onBar.y, { shift: true });
    expect(h.store.getState().selection).toEqual(['arc', 'bar']);
    h.click(onArc.x, onArc.y, { shift: true });
    expect(h.store.getState().selection).toEqual(['bar']);
    h.click(onArc.x, onArc.y, { shift: true });
    const history = h.history();
    h.key('Enter');
    const letters = Object.values(h.project().letters);
    expect(letters).toHaveLength(1);
    expect(letters[0].strokeIds).toEqual(['arc', 'bar']); // ductus order, not pick order
    expect(h.history()).toBe(history + 1);
    expect(h.store.getState().letterSelection).toEqual([letters[0].id]);
    expect(h.store.getState().selection).toEqual([]);
    expect(tool.path()).toBe('letter.idle');

    h.store.getState().undo();
    expect(h.project().letters).toEqual({});
    expect(h.store.getState().letterSelection).toEqual([]); // pruned with the letter
    expect(h.history()).toBe(history);
    h.store.getState().redo();
    expect(Object.keys(h.project().letters)).toEqual([letters[0].id]);

    // Enter with nothing picked says so and adds nothing.
    h.store.getState().select([]);
    const now = snapshot(h);
    h.key('Enter');
    expect(h.store.getState().message?.text).toMatch(/Pick the strokes/);
    expect(snapshot(h)).toEqual(now);
  });

  it('a box takes the strokes whose centreline lies mostly inside it', async () => {
    const h = await setup();
    const p = h.project();
    // The bar runs from x = 30 to 130: a box to x = 100 holds 70 % of it, to x = 60 only 30 %.
    expect(strokesInBox(p, 'recto', [0, 60, 100, 99])).toEqual(['bar']);
    expect(strokesInBox(p, 'recto', [0, 60, 60, 99])).toEqual([]);
    expect(strokesInBox(p, 'recto', [0, 0, 159, 99])).toEqual(['arc', 'bar']);

    const tool = h.use('letter') as LetterTool;
    // Around the arc (y 30..46) but not the bar (y 70..76).
    h.down(5, 20);
    expect(tool.path()).toBe('letter.pointing');
    h.move(100, 40);
    expect(tool.path()).toBe('letter.boxing');
    expect(h.store.getState().guide).toEqual({ kind: 'box', x0: 5, y0: 20, x1: 100, y1: 40 });
    h.move(150, 55);
    h.up(150, 55);
    expect(tool.path()).toBe('letter.idle');
    expect(h.store.getState().guide).toBeUndefined();
    expect(h.store.getState().selection).toEqual(['arc']);
    // Shift adds a second box's strokes.
    h.drag({ x: 20, y: 60 }, { x: 150, y: 90 }, 6, { shift: true });
    expect(h.store.getState().selection).toEqual(['arc', 'bar']);
    expect(tool.makeLetter()).toBeDefined();
    expect(Object.values(h.project().letters)[0].strokeIds).toEqual(['arc', 'bar']);
  });

  it('a click inside a letter box off the strokes selects the letter; Delete removes it and keeps its strokes', async () => {
    const h = await setup();
    h.use('letter');
    h.click(arc[300].x, arc[300].y);
    h.key('Enter');
    const id = Object.keys(h.project().letters)[0];
    h.click(150, 95); // nothing there
    expect(h.store.getState().letterSelection).toEqual([]);
    // (80, 31): inside the arc's box (y 27.5..45.5), 12 px from its centreline at y 43.
    h.click(80, 31);
    expect(h.store.getState().letterSelection).toEqual([id]);
    expect(h.store.getState().selection).toEqual([]);
    const history = h.history();
    h.key('Delete');
    expect(h.project().letters).toEqual({});
    expect(h.strokes().map((s) => s.id)).toEqual(['arc', 'bar']);
    expect(h.history()).toBe(history + 1);
  });

  it('word dividers and lacunae: a click places one, a lacuna asks its lost letters; the transcription shows them', async () => {
    const h = await setup();
    const tool = h.use('letter') as LetterTool;
    // Two letters, one per line: the arc (line 1) and the bar (line 2).
    h.click(bar[100].x, bar[100].y);
    h.key('Enter');
    const barLetter = Object.keys(h.project().letters)[0];
    h.click(arc[300].x, arc[300].y);
    h.key('Enter');
    const arcLetter = Object.keys(h.project().letters).find((k) => k !== barLetter)!;
    h.store.getState().change((p) => ({ ...p, letters: {
      ...p.letters,
      [arcLetter]: { ...p.letters[arcLetter], label: 'A', reading: 'doubtful' },
      [barLetter]: { ...p.letters[barLetter], label: 'B' },
    } }));

    tool.startPlacing('divider');
    expect(tool.path()).toBe('letter.placing');
    h.move(150, 40);
    expect(h.store.getState().guide).toEqual({ kind: 'mark', mark: 'divider', x: 150, y: 40 });
    let history = h.history();
    h.click(150, 40); // right of the arc, on its line
    expect(tool.path()).toBe('letter.idle');
    expect(h.history()).toBe(history + 1);
    const marks = Object.values(h.project().textMarks);
    expect(marks).toMatchObject([{ kind: 'divider', x: 150, y: 40 }]);
    expect(h.store.getState().letterSelection).toEqual([marks[0].id]);

    tool.startPlacing('lacuna');
    h.click(10, 74); // left of the bar, on its line
    expect(tool.path()).toBe('letter.asking');
    history = h.history();
    for (const bad of ['0', '-2', '2.5', 'some']) {
      expect(tool.submitLost(bad)).toBe(false);
      expect(h.store.getState().message?.kind).toBe('error');
    }
    expect(h.history()).toBe(history);
    expect(tool.submitLost('3')).toBe(true);
    expect(h.history()).toBe(history + 1);
    tool.startPlacing('lacuna');
    h.click(150, 76);
    expect(tool.submitLost('  ')).toBe(true); // empty: unknown

    // Leiden conventions: dot below for a doubtful reading, [c.N] and [...] for lacunae, · for a divider.
    expect(transcription(h.project(), 'recto')).toEqual([
      { line: 1, text: 'A\u0323 \u00b7' },
      { line: 2, text: '[c.3]B[...]' },
    ]);
  });

  it('Esc cancels at every state: pointing, boxing, placing, asking, and idle lets go of the picks', async () => {
    const h = await setup();
    const tool = h.use('letter') as LetterTool;
    h.click(arc[300].x, arc[300].y);
    const before = snapshot(h);
    h.down(5, 20);
    expect(tool.path()).toBe('letter.pointing');
    h.key('Escape');
    expect(tool.path()).toBe('letter.idle');
    expect(h.store.getState().selection).toEqual(['arc']); // a cancelled press changes no pick
    h.down(5, 60);
    h.move(150, 90);
    expect(tool.path()).toBe('letter.boxing');
    h.key('Escape');
    expect(tool.path()).toBe('letter.idle');
    expect(h.store.getState().guide).toBeUndefined();
    h.up(150, 90);
    expect(h.store.getState().selection).toEqual(['arc']);
    tool.startPlacing('divider');
    h.key('Escape');
    expect(tool.path()).toBe('letter.idle');
    h.click(40, 40);
    expect(h.project().textMarks).toEqual({});
    tool.startPlacing('lacuna');
    h.click(40, 40);
    expect(tool.path()).toBe('letter.asking');
    h.key('Escape');
    expect(tool.path()).toBe('letter.idle');
    expect(tool.submitLost('2')).toBe(false);
    tool.startPlacing('lacuna');
    h.click(40, 40);
    tool.cancel(); // leaving the tool
    expect(tool.path()).toBe('letter.idle');
    expect(snapshot(h)).toEqual(before);
    h.key('Escape');
    expect(h.store.getState().selection).toEqual([]);
    expect(snapshot(h)).toEqual(before);
  });
});

describe('store rules of letters', () => {
  it('deleting a stroke of a letter: the letter keeps the rest, one undo brings both back; its last stroke takes it along', async () => {
    const h = await setup();
    h.use('letter');
    h.store.getState().select(['arc', 'bar']);
    h.key('Enter');
    const id = Object.keys(h.project().letters)[0];
    const history = h.history();
    h.store.getState().select(['arc']);
    h.store.getState().selectLetters([]);
    h.key('Delete'); // no letter selected: the picked strokes go
    expect(h.strokes().map((s) => s.id)).toEqual(['bar']);
    expect(h.project().letters[id].strokeIds).toEqual(['bar']);
    expect(h.history()).toBe(history + 1);
    h.store.getState().undo();
    expect(h.strokes().map((s) => s.id)).toEqual(['arc', 'bar']);
    expect(h.project().letters[id].strokeIds).toEqual(['arc', 'bar']);

    h.store.getState().selectLetters([id]);
    h.store.getState().select(['arc', 'bar']);
    h.store.getState().deleteSelection();
    expect(h.project().letters).toEqual({});
    expect(h.store.getState().letterSelection).toEqual([]);
    h.store.getState().undo();
    expect(h.project().letters[id].strokeIds).toEqual(['arc', 'bar']);
  });

  it('the letter selection keeps only letters and marks that exist, and a new project clears it', async () => {
    const h = await setup();
    h.store.getState().selectLetters(['nothing']);
    expect(h.store.getState().letterSelection).toEqual([]);
    h.use('letter');
    h.store.getState().select(['bar']);
    h.key('Enter');
    const id = Object.keys(h.project().letters)[0];
    h.store.getState().selectLetters([id, 'nothing'], 'add');
    expect(h.store.getState().letterSelection).toEqual([id]);
    h.store.getState().selectLetters([id], 'toggle');
    expect(h.store.getState().letterSelection).toEqual([]);
    h.store.getState().selectLetters([id]);
    h.store.getState().loadProject(h.project(), h.store.getState().images);
    expect(h.store.getState().letterSelection).toEqual([]);
  });

  it('C and L switch to Calibrate and Letter (naming.md keys), and the sheet lists them', async () => {
    const h = await setup();
    const k = (key: string): KeyInput => ({ key, ctrlKey: false, metaKey: false, shiftKey: false });
    const api = { store: h.store, activeTool: () => h.tool, toggleKeySheet: () => {} };
    handleKey(k('c'), api);
    expect(h.store.getState().tool).toBe('calibrate');
    handleKey(k('L'), api);
    expect(h.store.getState().tool).toBe('letter');
    const sheet = KEY_BINDINGS.map((b) => b.chords.map((c) => c.name).join(' ')).join(' ');
    expect(sheet.split(' ')).toEqual(expect.arrayContaining(['C', 'L']));
  });
});

/** A File of PNG bytes (copied into a plain ArrayBuffer, as Blob parts must be). */
function pngFile(bytes: Uint8Array, name: string): File {
  return new File([new Uint8Array(bytes)], name, { type: 'image/png' });
}

describe('the scale a photo brings with it', () => {
  it('a PNG with a pHYs tag opens with that scale, its source the file; the strip says to check it with Calibrate', async () => {
    // PNG specification: pHYs in pixels per metre with unit 1; 12 500 px/m is 12.5 px/mm.
    const img = createGray(8, 6, new Float32Array(48).fill(0.5));
    const store = createEditorStore();
    expect(await openImageFile(pngFile(encodeGrayPng(img, { pxPerMm: 12.5 }), 'tagged.png'), store)).toBe(true);
    const s = store.getState().project!.surfaces[0];
    expect(s.pxPerMm).toBeCloseTo(12.5, 12);
    expect(s.scaleSource).toEqual({ kind: 'file', detail: 'PNG pHYs' });
    expect(scaleSourceText(s.scaleSource)).toMatch(/resolution tag \(PNG pHYs\); check it with Calibrate/);
    expect(scaleSourceText({ kind: 'ruler', x0: 0, y0: 0, x1: 1, y1: 0, mm: 30 })).toMatch(/ruler \(30 mm\)/);

    // Without the tag: no scale and no source, until Calibrate sets them.
    expect(await openImageFile(pngFile(encodeGrayPng(img), 'plain.png'), store)).toBe(true);
    const plain = store.getState().project!.surfaces[0];
    expect(plain.pxPerMm).toBeUndefined();
    expect(plain.scaleSource).toBeUndefined();
  });
});
