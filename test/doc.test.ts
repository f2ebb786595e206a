/**
 * The document: project files round-trip exactly, damaged or foreign JSON is refused with
 * one clear sentence, and the rules keep the project's invariants.
 */
import { describe, expect, it } from 'vitest';
import { strToU8, zipSync } from 'fflate';
import type { Project, StrokeDoc } from '../src/doc/model.ts';
import { PROJECT_VERSION } from '../src/doc/model.ts';
import { readProjectFile, writeProjectFile } from '../src/doc/projectFile.ts';
import {
  addStroke, deleteStrokes, effectiveRestoredSpans, meanWidth, moveStroke, newProject, restoredShare,
  setDefaults, setHidden, settingsOf, strokeLength, updateStroke,
} from '../src/doc/rules.ts';
import { parseProject, ProjectFormatError } from '../src/doc/schema.ts';
import { encodeGrayPng } from '../src/image/codec.ts';
import { createGray } from '../src/image/gray.ts';

/** A straight stroke along y = `y` from x = 0 to x = n − 1, one sample per px. */
function stroke(id: string, y: number, n = 11, extra: Partial<StrokeDoc> = {}): StrokeDoc {
  const samples = Array.from({ length: n }, (_, i) => ({ x: i + 0.5, y, r: 1 + (i % 3) * 0.25, support: i % 4 === 0 ? 0.2 : 0.9 }));
  return {
    id, surfaceId: 'recto',
    anchors: [{ x: 0.5, y }, { x: (n - 1) / 2 + 0.5, y, r: 1.25 }, { x: n - 0.5, y }],
    samples, restoredSpans: [], overrides: [], hidden: false,
    cost: { adherence: 1.5, widthChange: 0.25, curvature: 0.125, length: 0.5, total: 2.375 },
    ...extra,
  };
}

function tinyPng(): Uint8Array {
  const img = createGray(4, 3, Float32Array.from({ length: 12 }, (_, i) => i / 11));
  return encodeGrayPng(img, { pxPerMm: 12.5 });
}

function project(): { project: Project; images: Map<string, Uint8Array> } {
  let p = newProject('Sherd ⟨α⟩ / test', { band: 'visible', file: 'images/visible.png', mime: 'image/png', width: 4, height: 3, bitDepth: 8 }, 12.5);
  p = addStroke(p, stroke('a', 1.5, 11, { restoredSpans: [{ from: 2, to: 4 }] }));
  p = addStroke(p, stroke('b', 5.5, 7, { overrides: [{ from: 1, to: 2, kind: 'restored' }], hidden: true }));
  p = addStroke(p, stroke('c', 9.5, 5, {
    settings: { weights: { adherence: 2, widthChange: 0.5, curvature: 8, length: 0.05 }, radius: [1, 4] },
  }));
  return { project: p, images: new Map([['images/visible.png', tinyPng()]]) };
}

function messageOf(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ProjectFormatError);
    return (e as Error).message;
  }
  throw new Error('expected a ProjectFormatError');
}

describe('project file', () => {
  it('round-trips a project with strokes: deep-equal project, identical image bytes', () => {
    const { project: p, images } = project();
    const bytes = writeProjectFile({ project: p, images });
    const back = readProjectFile(bytes);
    expect(back.project).toEqual(p);
    expect([...back.images.keys()]).toEqual(['images/visible.png']);
    expect(Buffer.from(back.images.get('images/visible.png')!).equals(Buffer.from(images.get('images/visible.png')!))).toBe(true);
    // Same project, same bytes: the file does not depend on when it was written.
    expect(Buffer.from(writeProjectFile({ project: p, images })).equals(Buffer.from(bytes))).toBe(true);
    // And a second round trip changes nothing either (the schema may order keys its own way).
    const again = writeProjectFile(back);
    expect(Buffer.from(writeProjectFile(readProjectFile(again))).equals(Buffer.from(again))).toBe(true);
  });

  it('keeps exact float values of samples (no rounding in the JSON)', () => {
    const { project: p, images } = project();
    const odd = updateStroke(p, 'a', { samples: p.strokes.a.samples.map((s, i) => ({ ...s, x: s.x + Math.PI * 1e-7 * i, r: 1 / 3 })) });
    const back = readProjectFile(writeProjectFile({ project: odd, images }));
    expect(back.project.strokes.a.samples).toEqual(odd.strokes.a.samples);
  });

  it('refuses a file that is not a zip, one without project.json, and one missing an image', () => {
    expect(messageOf(() => readProjectFile(strToU8('hello, not a zip')))).toMatch(/damaged or not a zip/);
    expect(messageOf(() => readProjectFile(zipSync({ 'notes.txt': strToU8('x') })))).toMatch(/no project\.json/);
    const { project: p } = project();
    const noImage = zipSync({ 'project.json': strToU8(JSON.stringify(p)) });
    expect(messageOf(() => readProjectFile(noImage))).toMatch(/lacks the image images\/visible\.png/);
    expect(messageOf(() => readProjectFile(zipSync({ 'project.json': strToU8('{"format": "inkroute-pro') })))).toMatch(/not valid JSON/);
  });

  it('refuses a truncated project file', () => {
    const { project: p, images } = project();
    const bytes = writeProjectFile({ project: p, images });
    expect(messageOf(() => readProjectFile(bytes.subarray(0, Math.floor(bytes.length / 2))))).toMatch(/damaged or not a zip/);
  });
});

describe('parseProject', () => {
  const good = () => JSON.parse(JSON.stringify(project().project));

  it('accepts a valid project as it is', () => {
    const p = good();
    expect(parseProject(p)).toEqual(p);
  });

  it('refuses foreign JSON: not an object, no format tag', () => {
    expect(messageOf(() => parseProject(null))).toBe('project.json is not a JSON object.');
    expect(messageOf(() => parseProject([1, 2]))).toMatch(/not an inkroute project/);
    expect(messageOf(() => parseProject({ type: 'FeatureCollection', features: [] }))).toMatch(/not an inkroute project/);
  });

  it('refuses a newer version, naming both versions', () => {
    const p = { ...good(), version: PROJECT_VERSION + 1 };
    const m = messageOf(() => parseProject(p));
    expect(m).toMatch(/newer inkroute/);
    expect(m).toContain(`file version ${PROJECT_VERSION + 1}`);
    expect(m).toContain(`reads up to ${PROJECT_VERSION}`);
    expect(messageOf(() => parseProject({ ...good(), version: 'one' }))).toMatch(/no valid version/);
  });

  it('refuses damaged content with the path of the first problem', () => {
    const nan = good();
    nan.strokes.a.samples[3].x = 'NaN';
    expect(messageOf(() => parseProject(nan))).toMatch(/invalid at strokes\.a\.samples\.3\.x/);

    const radius = good();
    radius.defaults.radius = [4, 2];
    expect(messageOf(() => parseProject(radius))).toMatch(/defaults\.radius.*0 < min < max/);

    const span = good();
    span.strokes.a.restoredSpans = [{ from: 5, to: 2 }];
    expect(messageOf(() => parseProject(span))).toMatch(/ends before it starts/);

    const missing = good();
    delete missing.surfaces;
    expect(messageOf(() => parseProject(missing))).toMatch(/invalid at surfaces/);
  });

  it('refuses an order naming a stroke that is not there, or one on the wrong surface', () => {
    const dangling = good();
    dangling.surfaces[0].strokeOrder.push('ghost');
    expect(messageOf(() => parseProject(dangling))).toMatch(/lists a stroke ghost/);

    const wrong = good();
    wrong.strokes.a.surfaceId = 'verso';
    expect(messageOf(() => parseProject(wrong))).toMatch(/stroke a is listed on a surface it does not belong to/);
  });
});

describe('rules', () => {
  it('deleteStrokes removes strokes from the project and from the ductus order', () => {
    const { project: p } = project();
    const q = deleteStrokes(p, ['b', 'nope']);
    expect(Object.keys(q.strokes).sort()).toEqual(['a', 'c']);
    expect(q.surfaces[0].strokeOrder).toEqual(['a', 'c']);
    // The input is not changed, and deleting nothing returns the same project.
    expect(p.surfaces[0].strokeOrder).toEqual(['a', 'b', 'c']);
    expect(deleteStrokes(p, ['nope'])).toBe(p);
    expect(() => parseProject(JSON.parse(JSON.stringify(q)))).not.toThrow();
  });

  it('moveStroke reorders within the surface, clamping the position', () => {
    const { project: p } = project();
    expect(moveStroke(p, 'a', 2).surfaces[0].strokeOrder).toEqual(['b', 'c', 'a']);
    expect(moveStroke(p, 'c', 0).surfaces[0].strokeOrder).toEqual(['c', 'a', 'b']);
    expect(moveStroke(p, 'b', 99).surfaces[0].strokeOrder).toEqual(['a', 'c', 'b']);
    expect(moveStroke(p, 'b', -3).surfaces[0].strokeOrder).toEqual(['b', 'a', 'c']);
    expect(() => moveStroke(p, 'ghost', 0)).toThrow(/no stroke ghost/);
  });

  it('setHidden, setDefaults and settingsOf', () => {
    const { project: p } = project();
    const q = setHidden(p, ['a', 'b'], true);
    expect([q.strokes.a.hidden, q.strokes.b.hidden, q.strokes.c.hidden]).toEqual([true, true, false]);
    const d = setDefaults(p, { weights: { adherence: 3, widthChange: 1, curvature: 2, length: 0.05 }, radius: [2, 5] });
    expect(settingsOf(d, 'a')).toEqual(d.defaults);
    expect(settingsOf(d, 'c')).toEqual(p.strokes.c.settings);
  });

  it('effectiveRestoredSpans applies hand-marked overrides over the measured spans', () => {
    const base = stroke('x', 0, 12, { restoredSpans: [{ from: 2, to: 5 }, { from: 9, to: 10 }] });
    expect(effectiveRestoredSpans(base)).toEqual([{ from: 2, to: 5 }, { from: 9, to: 10 }]);
    // An 'inked' override clears part of a span; a 'restored' one marks a new span.
    const marked = { ...base, overrides: [{ from: 3, to: 4, kind: 'inked' as const }, { from: 7, to: 7, kind: 'restored' as const }] };
    expect(effectiveRestoredSpans(marked)).toEqual([{ from: 2, to: 2 }, { from: 5, to: 5 }, { from: 7, to: 7 }, { from: 9, to: 10 }]);
    // Overrides that touch measured spans merge with them; ones past the end are clipped.
    const merged = { ...base, overrides: [{ from: 6, to: 8, kind: 'restored' as const }, { from: 10, to: 40, kind: 'inked' as const }] };
    expect(effectiveRestoredSpans(merged)).toEqual([{ from: 2, to: 9 }]);
  });

  it('restoredShare is the share of the centreline length in the shown restored spans', () => {
    // 11 samples one px apart: 10 px long; samples 2..4 are 2 px of it.
    const s = stroke('x', 0, 11, { restoredSpans: [{ from: 2, to: 4 }] });
    expect(strokeLength(s)).toBeCloseTo(10, 12);
    expect(restoredShare(s)).toBeCloseTo(0.2, 12);
    expect(restoredShare({ ...s, overrides: [{ from: 0, to: 10, kind: 'inked' }] })).toBe(0);
    expect(restoredShare({ ...s, overrides: [{ from: 0, to: 10, kind: 'restored' }] })).toBeCloseTo(1, 12);
    // A single restored sample covers no length.
    expect(restoredShare({ ...s, restoredSpans: [{ from: 5, to: 5 }] })).toBe(0);
  });

  it('meanWidth is twice the mean radius', () => {
    const s = stroke('x', 0, 3); // radii 1, 1.25, 1.5
    expect(meanWidth(s)).toBeCloseTo(2.5, 12);
    expect(meanWidth({ samples: [] })).toBe(0);
  });
});
