/**
 * Behaviour the energy is built for, on small rendered strokes with known geometry
 * (invented test shapes, ground truth by construction): steady width and direction
 * across a gap, a crack that does not pull the path off, neighbours three radii
 * apart that are not confused; plus the request checks, cancellation and the live
 * preview tree.
 */
import { describe, expect, it } from 'vitest';
import { createGray } from '../src/image/gray.ts';
import { FollowCancelled, FollowError, followStroke, prepareInk, startPreview } from '../src/trace/index.ts';
import { createRandom } from '../src/util/random.ts';
import { distToPolyline, renderCoverage, sampleCurve, type PenPoint } from './helpers/render.ts';

function addNoise(img: ReturnType<typeof createGray>, seed: number, sigma: number) {
  const rnd = createRandom(seed);
  for (let i = 0; i < img.data.length; i++) img.data[i] = Math.min(1, Math.max(0, img.data[i] + sigma * rnd.normal()));
  return img;
}

const distTo = (pts: PenPoint[], x: number, y: number): number => distToPolyline(pts, x, y);

describe('followStroke behaviour', () => {
  it('carries on across a 30 px abrasion gap with steady width and direction, and reports it restored', () => {
    const line = sampleCurve((t) => ({ x: 20 + 160 * t, y: 60 + 20 * t, r: 3 }), 800);
    const inked = line.filter((p) => p.x < 85 || p.x > 115); // a ~30 px gap
    const ink = addNoise(renderCoverage(200, 120, [inked]), 2, 0.05);
    const res = followStroke(prepareInk(ink), { anchors: [line[0], line[line.length - 1]] });
    const inGap = res.samples.filter((s) => s.x > 88 && s.x < 112);
    expect(inGap.length).toBeGreaterThan(15);
    for (const s of inGap) {
      expect(distTo(line, s.x, s.y)).toBeLessThan(1);
      expect(Math.abs(s.r - 3)).toBeLessThan(0.5);
    }
    expect(res.restoredSpans.length).toBe(1);
    const span = res.restoredSpans[0];
    const a = res.samples[span.from];
    const b = res.samples[span.to];
    expect(a.x).toBeGreaterThan(83);
    expect(a.x).toBeLessThan(91);
    expect(b.x).toBeGreaterThan(109);
    expect(b.x).toBeLessThan(117);
  });

  it('is not pulled off by a crack crossing the stroke', () => {
    const stroke = sampleCurve((t) => ({ x: 20 + 160 * t, y: 60, r: 2.5 }), 800);
    const crack = sampleCurve((t) => ({ x: 60 + 80 * t, y: 10 + 100 * t, r: 0.6 }), 800);
    const ink = addNoise(renderCoverage(200, 120, [stroke, crack]), 3, 0.04);
    const res = followStroke(prepareInk(ink), { anchors: [stroke[0], stroke[stroke.length - 1]] });
    const worst = Math.max(...res.samples.map((s) => distTo(stroke, s.x, s.y)));
    expect(worst).toBeLessThan(0.8);
    expect(res.restoredSpans).toEqual([]);
  });

  it('does not confuse two curving parallel strokes three radii apart, whichever is traced', () => {
    const r = 2.5;
    const a = sampleCurve((t) => ({ x: 20 + 160 * t, y: 50 + 8 * Math.sin(3 * t), r }), 800);
    const b = a.map((p) => ({ ...p, y: p.y + 3 * r, r: 2 }));
    const ink = addNoise(renderCoverage(200, 100, [a, b]), 4, 0.08);
    const prep = prepareInk(ink);
    for (const [own, other] of [[a, b], [b, a]]) {
      const res = followStroke(prep, { anchors: [own[0], own[own.length - 1]] });
      const worst = Math.max(...res.samples.map((s) => distTo(own, s.x, s.y)));
      expect(worst).toBeLessThan(1);
      expect(Math.min(...res.samples.map((s) => distTo(other, s.x, s.y)))).toBeGreaterThan(3 * r - 1.5);
    }
  });

  it('passes through intermediate anchors, in order', () => {
    const ink = addNoise(createGray(120, 120, new Float32Array(120 * 120)), 5, 0.02);
    const anchors = [{ x: 10.5, y: 10.5 }, { x: 100.5, y: 20.5 }, { x: 30.5, y: 100.5 }];
    const res = followStroke(prepareInk(ink), { anchors });
    const at = anchors.map((p) => res.samples.findIndex((s) => Math.hypot(s.x - p.x, s.y - p.y) < 1e-9));
    expect(at[0]).toBe(0);
    expect(at[1]).toBeGreaterThan(0);
    expect(at[2]).toBe(res.samples.length - 1);
    for (let i = 1; i < res.samples.length; i++) {
      const d = Math.hypot(res.samples[i].x - res.samples[i - 1].x, res.samples[i].y - res.samples[i - 1].y);
      expect(d).toBeLessThanOrEqual(1.0 + 1e-9);
    }
  });

  it('keeps a pinned pen radius at its anchor exactly', () => {
    const line = sampleCurve((t) => ({ x: 10 + 100 * t, y: 30, r: 3 }), 400);
    const ink = addNoise(renderCoverage(120, 60, [line]), 8, 0.03);
    const prep = prepareInk(ink);
    const free = followStroke(prep, { anchors: [line[0], line[line.length - 1]] });
    expect(Math.abs(free.samples[0].r - 3)).toBeLessThan(0.5);
    const pinned = followStroke(prep, { anchors: [{ ...line[0], r: 2 }, { x: 60.5, y: 30.2, r: 4.2 }, line[line.length - 1]] });
    expect(pinned.samples[0].r).toBe(2);
    const mid = pinned.samples.find((s) => Math.hypot(s.x - 60.5, s.y - 30.2) < 1e-9)!;
    expect(mid.r).toBe(4.2);
    // Away from the pins the measured width comes back.
    const far = pinned.samples.filter((s) => s.x > 85 && s.x < 100);
    for (const s of far) expect(Math.abs(s.r - 3)).toBeLessThan(0.5);
    expect(() => followStroke(prep, { anchors: [{ ...line[0], r: 9 }, line[line.length - 1]] })).toThrow(/pinned radius/);
  });

  it('rejects bad requests with a plain message', () => {
    const prep = prepareInk(createGray(50, 40));
    const bad = (req: Parameters<typeof followStroke>[1], text: RegExp) =>
      expect(() => followStroke(prep, req)).toThrow(text);
    bad({ anchors: [{ x: 5, y: 5 }] }, /start and an end/);
    bad({ anchors: [{ x: 5, y: 5 }, { x: 60, y: 5 }] }, /outside the image/);
    bad({ anchors: [{ x: 5.2, y: 5.1 }, { x: 5.7, y: 5.9 }] }, /same point/);
    bad({ anchors: [{ x: 5, y: 5 }, { x: 30, y: 5 }], radius: [3, 3] }, /radius range/);
    bad({ anchors: [{ x: 5, y: 5 }, { x: Number.NaN, y: 5 }] }, /not a number/);
    expect(() => followStroke(prep, { anchors: [{ x: 5, y: 5 }] })).toThrow(FollowError);
  });

  it('can be cancelled during the search', () => {
    const ink = addNoise(createGray(300, 300, new Float32Array(300 * 300).fill(0.2)), 6, 0.2);
    let polls = 0;
    expect(() => followStroke(prepareInk(ink), { anchors: [{ x: 5, y: 5 }, { x: 290, y: 290 }] }, {
      shouldStop: () => ++polls > 1,
    })).toThrow(FollowCancelled);
    expect(polls).toBeGreaterThan(1);
  });
});

describe('live preview tree', () => {
  const stroke = sampleCurve((t) => ({ x: 30 + 240 * t, y: 150 + 50 * Math.sin(2.5 * t), r: 2.5 }), 1500);
  const ink = addNoise(renderCoverage(300, 300, [stroke]), 7, 0.04);
  const prep = prepareInk(ink);

  it('grows in time slices over a 400×400 neighbourhood (clipped to the image) and reads paths off it', () => {
    const tree = startPreview(prep, stroke[0]);
    let slices = 0;
    while (!tree.grow(5)) slices++;
    expect(slices).toBeGreaterThan(1);
    expect(tree.complete).toBe(true);
    const end = stroke.filter((p) => p.x < 225).at(-1)!; // the tree reaches 200 px from the start
    const path = tree.pathTo(end.x, end.y)!;
    expect(path.length).toBeGreaterThan(180);
    expect(Math.hypot(path[0].x - (Math.floor(stroke[0].x) + 0.5), path[0].y - (Math.floor(stroke[0].y) + 0.5))).toBeLessThan(1e-9);
    const mean = path.reduce((s, p) => s + distTo(stroke, p.x, p.y), 0) / path.length;
    expect(mean).toBeLessThan(1);
    const meanR = path.reduce((s, p) => s + p.r, 0) / path.length;
    expect(Math.abs(meanR - 2.5)).toBeLessThan(0.6);
  });

  it('covers only what it has reached, and stops when cancelled', () => {
    const tree = startPreview(prep, stroke[0]);
    tree.grow(0); // one batch
    expect(tree.covers(stroke[0].x + 1, stroke[0].y)).toBe(true);
    expect(tree.covers(295, 5)).toBe(false);
    expect(tree.pathTo(295, 5)).toBeUndefined();
    tree.cancel();
    expect(tree.grow(50)).toBe(true);
    expect(tree.complete).toBe(false);
  });
});
