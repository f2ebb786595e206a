/**
 * The finished example project, built on a small test-set inscription: every stroke
 * traced close to the synthetic ground truth, letters equal to the truth's letters with
 * the truth's lines and reading order (this checks src/doc/layout.ts against an
 * independent source: the generator's own layout), the scale from the ruler, and the
 * same bytes for the same seed.
 */
import { describe, expect, it } from 'vitest';
import { readProjectFile, writeProjectFile } from '../src/doc/projectFile.ts';
import { restoredShare } from '../src/doc/rules.ts';
import { parseProject } from '../src/doc/schema.ts';
import { exampleProjectId, finishedExample } from '../src/example/finished.ts';
import { LETTER_LABELS, labelOf } from '../src/example/labels.ts';
import { decodeImage } from '../src/image/codec.ts';
import { scoreStroke } from '../src/score/index.ts';
import { ALPHABET, testSetRecipe } from '../src/synth/index.ts';
import { pngPhys } from './helpers/png.ts';

// A medium one of the test set: two lines of 5–6 letters at 640×400 px, built in ~1.5 s.
const RECIPE = testSetRecipe()[1];
const ex = finishedExample(RECIPE);
const { project, truth } = ex;

describe('letter labels', () => {
  it('cover the 16 names of the alphabet one to one', () => {
    const names = ALPHABET.map((t) => t.name);
    expect(names).toHaveLength(16);
    expect(Object.keys(LETTER_LABELS).sort()).toEqual([...names].sort());
    const labels = names.map(labelOf);
    expect(new Set(labels).size).toBe(16);
  });
  it('are the first letter, or the first two where first letters collide', () => {
    // The rule of the brief, computed here independently of the table.
    const names = ALPHABET.map((t) => t.name);
    for (const n of names) {
      const shared = names.filter((m) => m[0] === n[0]).length > 1;
      expect(labelOf(n)).toBe(shared ? n.slice(0, 2) : n[0]);
    }
    expect(labelOf('tark')).toBe('ta');
    expect(labelOf('thenn')).toBe('th');
    expect(() => labelOf('nosuch')).toThrow(/no letter named "nosuch"/);
  });
});

describe('the finished example', () => {
  it('traces every truth stroke with mean centreline distance ≤ 1 px', () => {
    expect(Object.keys(project.strokes)).toHaveLength(truth.strokes.length);
    const means: number[] = [];
    for (const ts of truth.strokes) {
      const st = project.strokes[`s-${ts.id}`];
      expect(st, ts.id).toBeDefined();
      // Error against the generator's ground truth (src/score, pooled over visible samples).
      const sc = scoreStroke(st, ts, truth.strokes);
      means.push(sc.meanCentreline);
      expect(sc.meanCentreline, ts.id).toBeLessThanOrEqual(1);
      expect(sc.leavesForAnother, ts.id).toBe(false);
      expect(st.anchors).toEqual([
        { x: ts.samples[0].x, y: ts.samples[0].y },
        { x: ts.samples.at(-1)!.x, y: ts.samples.at(-1)!.y },
      ]);
    }
    console.log(`example: ${means.length} strokes, worst mean centreline ${Math.max(...means).toFixed(3)} px, ` +
      `average ${(means.reduce((a, b) => a + b, 0) / means.length).toFixed(3)} px`);
    expect(project.surfaces[0].strokeOrder).toEqual(truth.strokes.map((s) => `s-${s.id}`));
  });

  it('has the truth letters: the same strokes, labels, lines and reading order', () => {
    expect(Object.keys(project.letters)).toHaveLength(truth.letters.length);
    for (const tl of truth.letters) {
      const l = project.letters[`l-${tl.id}`];
      expect(l, tl.id).toBeDefined();
      expect([...l.strokeIds].sort()).toEqual(tl.strokeIds.map((id) => `s-${id}`).sort());
      expect(l.label).toBe(labelOf(tl.name));
      // layout.ts against the generator's lines and order (reading direction rtl here).
      expect({ id: tl.id, line: l.line, order: l.order }).toEqual({ id: tl.id, line: tl.line, order: tl.order });
      expect(l.lineByHand).toBe(false);
    }
    expect(truth.direction).toBe('rtl');
    expect(project.inscription).toMatchObject({ script: 'Latin', direction: 'rtl', creator: '' });
    expect(project.inscription.description).toMatch(/synthetic/);
    expect(project.title).toBe(truth.title);
  });

  it('has the truth lines and order for a left-to-right inscription too', () => {
    const ltr = finishedExample({ ...testSetRecipe()[0], direction: 'ltr' });
    expect(ltr.truth.direction).toBe('ltr');
    expect(ltr.project.inscription.direction).toBe('ltr');
    const got = Object.values(ltr.project.letters).map((l) => ({ id: l.id, line: l.line, order: l.order })).sort((a, b) => (a.id < b.id ? -1 : 1));
    const want = ltr.truth.letters.map((t) => ({ id: `l-${t.id}`, line: t.line, order: t.order })).sort((a, b) => (a.id < b.id ? -1 : 1));
    expect(got).toEqual(want);
  });

  it('reads the two letters with the most restored ink as doubtful, the rest clear', () => {
    const letters = Object.values(project.letters);
    const doubtful = letters.filter((l) => l.reading === 'doubtful');
    expect(doubtful).toHaveLength(2);
    const worst = (ids: string[]) => Math.max(...ids.map((id) => restoredShare(project.strokes[id])));
    const leastDoubtful = Math.min(...doubtful.map((l) => worst(l.strokeIds)));
    for (const l of letters.filter((x) => x.reading === 'clear')) expect(worst(l.strokeIds)).toBeLessThanOrEqual(leastDoubtful);
    expect(leastDoubtful).toBeGreaterThan(0);
  });

  it('is calibrated from the ruler to the truth scale (1e-6 relative)', () => {
    const s = project.surfaces[0];
    expect(s.scaleSource).toEqual({ kind: 'ruler', ...truth.ruler });
    expect(Math.abs(s.pxPerMm! / truth.pxPerMm - 1)).toBeLessThanOrEqual(1e-6);
  });

  it('stores each band as a PNG with the scale in pHYs', () => {
    const [ref] = project.surfaces[0].images;
    const bytes = ex.images.get(ref.file)!;
    const dec = decodeImage(bytes);
    expect([dec.bands[0].width, dec.bands[0].height]).toEqual([truth.width, truth.height]);
    // PNG specification 11.3.5.3 pHYs: pixels per unit, unit 1 = metre.
    const px = Math.round(truth.pxPerMm * 1000);
    expect(pngPhys(bytes)).toEqual({ x: px, y: px, unit: 1 });
    expect(ex.masks.inkMask).toHaveLength(truth.width * truth.height);
  });

  it('gives byte-identical .inkroute files for the same seed, and another id for other options', () => {
    const again = finishedExample(RECIPE);
    const a = writeProjectFile({ project, images: ex.images });
    const b = writeProjectFile({ project: again.project, images: again.images });
    expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true);
    expect(project.modifiedAt).toBe('2026-01-01T00:00:00.000Z');
    expect(project.id).toBe(exampleProjectId(RECIPE));
    expect(exampleProjectId({ ...RECIPE, difficulty: 'hard' })).not.toBe(project.id);
    expect(exampleProjectId('demo')).not.toBe(project.id);
  });

  it('survives writeProjectFile / readProjectFile and parseProject unchanged', () => {
    const back = readProjectFile(writeProjectFile({ project, images: ex.images }));
    expect(back.project).toEqual(project);
    expect(parseProject(JSON.parse(JSON.stringify(back.project)))).toEqual(project);
    for (const [path, bytes] of ex.images) expect(Buffer.from(back.images.get(path)!).equals(Buffer.from(bytes))).toBe(true);
  });
});
