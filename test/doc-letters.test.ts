/**
 * The document rules for letters, text marks, scale and the inscription, the automatic
 * lines and reading order (layout.ts), the v1 → v2 migration and parseProject's refusal of
 * a stroke in two letters. The expected lines and orders are worked out by hand from the
 * literal positions below.
 */
import { describe, expect, it } from 'vitest';
import type { Project, StrokeDoc } from '../src/doc/model.ts';
import { textLines } from '../src/doc/layout.ts';
import {
  addStroke, addTextMark, deleteLetters, deleteStrokes, makeLetter, newProject, setInscription, setScale, strokeFromSolve,
  updateLetter,
} from '../src/doc/rules.ts';
import { parseProject, ProjectFormatError } from '../src/doc/schema.ts';

/** An upright stroke of pen radius 1.5 px from (x, y) down to (x, y + 20): its box is 23 px tall. */
function upright(id: string, x: number, y: number, surfaceId = 'recto'): StrokeDoc {
  const samples = Array.from({ length: 21 }, (_, i) => ({ x, y: y + i, r: 1.5, support: 1 }));
  return strokeFromSolve(id, surfaceId, [{ x, y }, { x, y: y + 20 }], {
    samples, restoredSpans: [], cost: { adherence: 0, widthChange: 0, curvature: 0, length: 20, total: 20 },
  });
}

/**
 * Two lines: line 1 centres near y = 20 (strokes a, b, c at x = 10, 40, 70, y jittered by
 * a few px), line 2 near y = 70 (d at x = 20, e at x = 60). Letter height 23 px, so the
 * line break is 0.6 × 23 = 13.8 px: the jitter stays within a line, the 50 px between
 * lines breaks.
 */
function base(): Project {
  let p = newProject('Sherd OT-17 (synthetic), the Orvane terraces', {
    band: 'visible', file: 'images/visible.png', mime: 'image/png', width: 100, height: 100, bitDepth: 8,
  });
  p = addStroke(p, upright('a', 10, 10));
  p = addStroke(p, upright('b', 40, 13));
  p = addStroke(p, upright('c', 70, 7));
  p = addStroke(p, upright('d', 20, 60));
  p = addStroke(p, upright('e', 60, 62));
  p = addStroke(p, upright('e2', 62, 62));
  return p;
}

function lettered(direction: 'ltr' | 'rtl' = 'ltr'): Project {
  let p = setInscription(base(), { direction });
  for (const [id, strokes] of [['A', ['a']], ['B', ['b']], ['C', ['c']], ['D', ['d']], ['E', ['e2', 'e']]] as const) {
    p = makeLetter(p, strokes, { label: id.toLowerCase() }, id).project;
  }
  return p;
}

const place = (p: Project) => Object.fromEntries(Object.values(p.letters).map((l) => [l.id, [l.line, l.order]]));

describe('makeLetter and layoutText', () => {
  it('puts letters on lines by height and orders them left to right', () => {
    const p = lettered('ltr');
    expect(place(p)).toEqual({ A: [1, 1], B: [1, 2], C: [1, 3], D: [2, 1], E: [2, 2] });
    // Strokes kept in ductus order (the surface's order), whatever order they were given in.
    expect(p.letters.E.strokeIds).toEqual(['e', 'e2']);
    expect(p.letters.A).toMatchObject({ label: 'a', reading: 'clear', restored: false, lineByHand: false, surfaceId: 'recto' });
    expect(textLines(p, 'recto').map((l) => l.items.map((it) => (it.kind === 'letter' ? it.letter.id : it.mark.id)))).toEqual([
      ['A', 'B', 'C'], ['D', 'E'],
    ]);
  });

  it('orders right to left for an rtl inscription, and re-lays out when the direction changes', () => {
    const p = lettered('rtl');
    expect(place(p)).toEqual({ A: [1, 3], B: [1, 2], C: [1, 1], D: [2, 2], E: [2, 1] });
    expect(place(setInscription(p, { direction: 'ltr' }))).toEqual({ A: [1, 1], B: [1, 2], C: [1, 3], D: [2, 1], E: [2, 2] });
  });

  it('takes a stroke out of its old letter, and drops a letter left empty', () => {
    let p = lettered();
    p = makeLetter(p, ['e'], { label: 'x', reading: 'doubtful' }, 'X').project;
    expect(p.letters.E.strokeIds).toEqual(['e2']);
    expect(p.letters.X).toMatchObject({ strokeIds: ['e'], reading: 'doubtful' });
    p = makeLetter(p, ['a', 'b'], {}, 'AB').project;
    expect(p.letters.A).toBeUndefined();
    expect(p.letters.B).toBeUndefined();
    expect(p.letters.AB.strokeIds).toEqual(['a', 'b']);
  });

  it('refuses no strokes and strokes of two surfaces', () => {
    const p = lettered();
    expect(() => makeLetter(p, [])).toThrow('a letter needs at least one stroke');
    expect(() => makeLetter(p, ['nosuch'])).toThrow('a letter needs at least one stroke');
    let q: Project = { ...p, surfaces: [...p.surfaces, { ...p.surfaces[0], id: 'verso', name: 'verso', strokeOrder: [] }] };
    q = addStroke(q, upright('v', 10, 10, 'verso'));
    expect(() => makeLetter(q, ['a', 'v'])).toThrow('the strokes of a letter must lie on one surface');
  });
});

describe('updateLetter, deleteLetters, deleteStrokes', () => {
  it('changes label and reading without moving; a line set by hand stays put', () => {
    let p = updateLetter(lettered(), 'B', { label: 'β', reading: 'doubtful' });
    expect(p.letters.B).toMatchObject({ label: 'β', reading: 'doubtful', line: 1, order: 2 });
    p = updateLetter(p, 'C', { line: 2 });
    expect(p.letters.C.lineByHand).toBe(true);
    // C (x = 70) joins line 2 after D (20) and E (61).
    expect(place(p)).toEqual({ A: [1, 1], B: [1, 2], C: [2, 3], D: [2, 1], E: [2, 2] });
    expect(() => updateLetter(p, 'nosuch', { label: 'q' })).toThrow('no letter nosuch');
  });

  it('deleteLetters renumbers the rest and keeps the strokes', () => {
    const p = deleteLetters(lettered(), ['A', 'nosuch']);
    expect(place(p)).toEqual({ B: [1, 1], C: [1, 2], D: [2, 1], E: [2, 2] });
    expect(p.strokes.a).toBeDefined();
  });

  it('deleteStrokes prunes letters: a letter loses the stroke, a letter left empty goes', () => {
    const p = deleteStrokes(lettered(), ['e', 'b']);
    expect(p.letters.E.strokeIds).toEqual(['e2']);
    expect(p.letters.B).toBeUndefined();
    expect(place(p)).toEqual({ A: [1, 1], C: [1, 2], D: [2, 1], E: [2, 2] });
    expect(() => parseProject(JSON.parse(JSON.stringify(p)))).not.toThrow();
  });
});

describe('addTextMark', () => {
  it('places a divider in reading order among the letters of its line', () => {
    const { project: p, id } = addTextMark(lettered(), 'recto', 'divider', { x: 55, y: 20 }, undefined, 'M');
    expect(id).toBe('M');
    expect(p.textMarks.M).toMatchObject({ kind: 'divider', line: 1, order: 3 });
    expect(p.textMarks.M.lost).toBeUndefined();
    expect(place(p)).toMatchObject({ A: [1, 1], B: [1, 2], C: [1, 4] });
  });

  it('keeps the number of lost letters of a lacuna, and refuses one that is not a whole number above 0', () => {
    const { project: p } = addTextMark(lettered(), 'recto', 'lacuna', { x: 90, y: 71 }, 3, 'L');
    expect(p.textMarks.L).toMatchObject({ kind: 'lacuna', lost: 3, line: 2, order: 3 });
    for (const bad of [0, -2, 1.5, Number.NaN]) {
      expect(() => addTextMark(lettered(), 'recto', 'lacuna', { x: 1, y: 1 }, bad)).toThrow(/whole number above 0/);
    }
    expect(() => addTextMark(lettered(), 'nosuch', 'divider', { x: 1, y: 1 })).toThrow('no surface nosuch');
  });
});

describe('setScale', () => {
  it('sets px per mm with its ruler source, and refuses a scale that is not positive', () => {
    const src = { kind: 'ruler' as const, x0: 10, y0: 90, x1: 60, y1: 90, mm: 5 };
    const p = setScale(base(), 'recto', 10, src);
    expect(p.surfaces[0]).toMatchObject({ pxPerMm: 10, scaleSource: src });
    expect(p.surfaces[0].scaleSource).not.toBe(src);
    for (const bad of [0, -1, Number.NaN, Infinity]) expect(() => setScale(base(), 'recto', bad, src)).toThrow(RangeError);
    expect(() => setScale(base(), 'verso', 10, src)).toThrow('no surface verso');
  });
});

describe('project versions and letter rules in parseProject', () => {
  it('reads a v1 project.json (strokes only) with no letters and a Latin ltr inscription', () => {
    const v2 = JSON.parse(JSON.stringify(base())) as Record<string, unknown>;
    const { inscription: _i, letters: _l, textMarks: _m, ...rest } = v2;
    const v1 = { ...rest, version: 1 };
    const p = parseProject(v1);
    expect(p.version).toBe(2);
    expect(p.letters).toEqual({});
    expect(p.textMarks).toEqual({});
    expect(p.inscription).toEqual({ script: 'Latin', direction: 'ltr', description: '', creator: '' });
    expect(Object.keys(p.strokes)).toEqual(['a', 'b', 'c', 'd', 'e', 'e2']);
  });

  it('refuses a stroke in two letters', () => {
    const p = JSON.parse(JSON.stringify(lettered())) as Project;
    p.letters.B.strokeIds = ['b', 'a'];
    expect(() => parseProject(p)).toThrow(ProjectFormatError);
    expect(() => parseProject(p)).toThrow('stroke a belongs to two letters (A and B).');
  });

  it('refuses a letter with a stroke the project does not have', () => {
    const p = JSON.parse(JSON.stringify(lettered())) as Project;
    p.letters.A.strokeIds = ['gone'];
    expect(() => parseProject(p)).toThrow('letter A has a stroke gone that the project does not have.');
  });
});
