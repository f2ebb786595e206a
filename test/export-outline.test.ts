/**
 * The traced pen outline: its nonzero fill holds every pen disk, and its boundary keeps
 * close to the pen (no point more than 0.25 px beyond the nearest disk), over random
 * smooth and sharply turning strokes and the degenerate ones.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { OUTLINE_TOLERANCE, penOutline, type PenSample, type Ring } from '../src/export/outline.ts';

/** Nonzero winding number of (x, y) over the rings (crossing rule, common practice). */
function winding(rings: readonly Ring[], x: number, y: number): number {
  let w = 0;
  for (const ring of rings) {
    const n = ring.length / 2;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      const x0 = ring[2 * j], y0 = ring[2 * j + 1], x1 = ring[2 * i], y1 = ring[2 * i + 1];
      if (y0 <= y) {
        if (y1 > y && (x1 - x0) * (y - y0) - (x - x0) * (y1 - y0) > 0) w++;
      } else if (y1 <= y && (x1 - x0) * (y - y0) - (x - x0) * (y1 - y0) < 0) w--;
    }
  }
  return w;
}

function beyondPen(samples: readonly PenSample[], x: number, y: number): number {
  let best = Infinity;
  for (const s of samples) best = Math.min(best, Math.hypot(x - s.x, y - s.y) - s.r);
  return best;
}

function signedArea(ring: Ring): number {
  let a = 0;
  const n = ring.length / 2;
  for (let i = 0, j = n - 1; i < n; j = i++) a += ring[2 * j] * ring[2 * i + 1] - ring[2 * i] * ring[2 * j + 1];
  return a / 2;
}

interface Check {
  uncovered: number;
  worstBeyond: number;
  rings: number;
  vertices: number;
  negativeRings: number;
}

/** Points on (a hair inside, so that a tangent point is not on an edge) and inside each circle. */
function check(samples: readonly PenSample[]): Check {
  const rings = penOutline(samples);
  let uncovered = 0;
  for (const s of samples) {
    const pts: [number, number][] = [[s.x, s.y]];
    for (let k = 0; k < 16; k++) {
      const a = (2 * Math.PI * k) / 16 + 0.1;
      const rr = s.r * (1 - 1e-7);
      pts.push([s.x + rr * Math.cos(a), s.y + rr * Math.sin(a)]);
      if (k % 2 === 0) pts.push([s.x + 0.5 * s.r * Math.cos(a), s.y + 0.5 * s.r * Math.sin(a)]);
    }
    for (const [x, y] of pts) if (winding(rings, x, y) === 0) uncovered++;
  }
  let worst = -Infinity;
  let vertices = 0;
  let negativeRings = 0;
  for (const ring of rings) {
    const n = ring.length / 2;
    vertices += n;
    if (signedArea(ring) <= 0) negativeRings++;
    for (let i = 0; i < n; i++) {
      const j = (i + 1) % n;
      for (const t of [0, 0.25, 0.5, 0.75]) {
        const x = ring[2 * i] + t * (ring[2 * j] - ring[2 * i]);
        const y = ring[2 * i + 1] + t * (ring[2 * j + 1] - ring[2 * i + 1]);
        worst = Math.max(worst, beyondPen(samples, x, y));
      }
    }
  }
  return { uncovered, worstBeyond: worst, rings: rings.length, vertices, negativeRings };
}

/** A centreline from a heading walk: `turn(i)` radians per step, step lengths ≤ 1 px. */
function walk(n: number, step: (i: number) => number, turn: (i: number) => number, radius: (i: number) => number): PenSample[] {
  const out: PenSample[] = [];
  let x = 50, y = 50, h = 0;
  for (let i = 0; i < n; i++) {
    out.push({ x, y, r: radius(i) });
    h += turn(i);
    const l = step(i);
    x += l * Math.cos(h);
    y += l * Math.sin(h);
  }
  return out;
}

const strokeArb = fc.record({
  n: fc.integer({ min: 2, max: 120 }),
  spacing: fc.double({ min: 0.05, max: 1, noNaN: true }),
  r0: fc.double({ min: 0.5, max: 12, noNaN: true }),
  dr: fc.double({ min: 0, max: 0.4, noNaN: true }),
  curl: fc.double({ min: -0.6, max: 0.6, noNaN: true }),
  corners: fc.array(fc.record({ at: fc.integer({ min: 1, max: 118 }), angle: fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }) }), { maxLength: 4 }),
  jitter: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 120, maxLength: 120 }),
});

type StrokeParams = typeof strokeArb extends fc.Arbitrary<infer T> ? T : never;

function strokeFrom(p: StrokeParams): PenSample[] {
  let r = p.r0;
  const radii: number[] = [];
  for (let i = 0; i < p.n; i++) {
    radii.push(r);
    r = Math.min(12, Math.max(0.5, r + p.dr * p.jitter[i % 120]));
  }
  const corner = new Map(p.corners.map((c) => [c.at, c.angle]));
  return walk(p.n, (i) => p.spacing * (0.5 + 0.5 * Math.abs(p.jitter[(i * 7) % 120])),
    (i) => p.curl * p.jitter[(i * 3) % 120] * 0.5 + (corner.get(i) ?? 0), (i) => radii[i]);
}

describe('penOutline', () => {
  it('holds every pen disk and keeps its boundary within 0.25 px of the pen, random strokes', () => {
    let worst = -Infinity;
    let rings = 0, strokes = 0, vertices = 0, samples = 0;
    fc.assert(fc.property(strokeArb, (p) => {
      const s = strokeFrom(p);
      const c = check(s);
      worst = Math.max(worst, c.worstBeyond);
      rings += c.rings; strokes++; vertices += c.vertices; samples += s.length;
      return c.uncovered === 0 && c.worstBeyond <= 0.25 && c.negativeRings === 0 && c.rings >= 1;
    }), { numRuns: 300, seed: 17 });
    console.log(`outline property: ${strokes} strokes, ${rings} rings (${(rings / strokes).toFixed(2)} per stroke), ` +
      `${(vertices / samples).toFixed(2)} vertices per sample, worst boundary beyond pen ${worst.toFixed(3)} px`);
    // The requirement's own bound (0.25 px), and the disks' polygons lie at most OUTLINE_TOLERANCE out.
    expect(worst).toBeLessThanOrEqual(0.25);
    expect(OUTLINE_TOLERANCE).toBeLessThanOrEqual(0.25);
  });

  it('gives one ring for a smooth stroke, with about two vertices per sample', () => {
    const s = walk(300, () => 0.8, (i) => 0.02 * Math.sin(i / 20), (i) => 3 + Math.sin(i / 30));
    const c = check(s);
    expect(c.uncovered).toBe(0);
    expect(c.worstBeyond).toBeLessThanOrEqual(0.25);
    expect(c.rings).toBe(1);
    expect(c.vertices).toBeLessThan(3 * s.length);
  });

  it('cuts out the swallowtail of a bend tighter than the pen (one ring, every corner on the edge of the ink)', () => {
    const cases = {
      // A quarter turn over 3 px of arc (curvature radius 1.9 px) under a 6 px pen.
      'quarter turn': walk(80, () => 0.5, (i) => (i >= 30 && i < 36 ? Math.PI / 2 / 6 : 0), () => 6),
      // A corner of 115° under an 8 px pen.
      'sharp corner': walk(80, () => 0.7, (i) => (i === 40 ? 2 : 0), () => 8),
    };
    for (const [name, s] of Object.entries(cases)) {
      const c = check(s);
      expect(c.uncovered, name).toBe(0);
      expect(c.worstBeyond, name).toBeLessThanOrEqual(0.25);
      expect(c.rings, name).toBe(1);
      // Left in, the fold's corners would lie deep inside the ink (4.3 and 7.6 px here).
      let deepest = 0;
      for (const ring of penOutline(s)) {
        for (let i = 0; i < ring.length; i += 2) deepest = Math.max(deepest, -beyondPen(s, ring[i], ring[i + 1]));
      }
      expect(deepest, name).toBeLessThanOrEqual(0.25);
    }
  });

  it('handles degenerate strokes', () => {
    const cases: Record<string, PenSample[]> = {
      'two samples': [{ x: 10, y: 10, r: 3 }, { x: 10.8, y: 10.3, r: 2 }],
      'one sample': [{ x: 5, y: 5, r: 4 }],
      'zero-length step': [{ x: 10, y: 10, r: 3 }, { x: 10, y: 10, r: 3 }, { x: 11, y: 10, r: 3 }],
      'disk inside another': [{ x: 10, y: 10, r: 6 }, { x: 10.5, y: 10, r: 1 }, { x: 11, y: 10, r: 0.5 }, { x: 12, y: 10, r: 5 }],
      'shrinking fast': [{ x: 0, y: 0, r: 12 }, { x: 1, y: 0, r: 11.2 }, { x: 2, y: 0, r: 10.4 }, { x: 2.9, y: 0.2, r: 0.5 }],
      'hairpin': walk(60, () => 1, (i) => (i === 30 ? Math.PI : 0), () => 4),
      'spike back on itself': [...walk(20, () => 1, () => 0, () => 2), ...walk(20, () => 1, () => 0, () => 2).reverse()],
    };
    // A stroke that crosses itself: a loop of radius 10 px under a 3 px pen.
    cases['crosses itself'] = walk(120, () => 0.7, (i) => (i > 20 && i < 20 + (2.2 * Math.PI * 10) / 0.7 ? 0.07 : 0), () => 3);
    // A loop much tighter than the pen: radius 1 px under an 8 px pen.
    cases['tight loop'] = walk(60, () => 0.5, (i) => (i > 20 && i < 36 ? 0.5 : 0), () => 8);
    for (const [name, s] of Object.entries(cases)) {
      const c = check(s);
      expect(c.uncovered, name).toBe(0);
      expect(c.worstBeyond, name).toBeLessThanOrEqual(0.25);
      expect(c.negativeRings, name).toBe(0);
      expect(c.rings, name).toBeGreaterThanOrEqual(1);
    }
  });

  it('keeps the open eye of a curl open', () => {
    // Loop of radius 10 px, pen 3 px: the centre of the loop is 7 px from the nearest ink.
    const n = 20 + Math.ceil((2.2 * Math.PI * 10) / 0.7);
    const s = walk(n + 20, () => 0.7, (i) => (i > 20 && i < n ? 0.07 : 0), () => 3);
    // The loop's centre: 10 px to the side the heading turns to, from the loop's start.
    const start = s[21];
    const h = Math.atan2(s[22].y - s[21].y, s[22].x - s[21].x);
    const ex = start.x - 10 * Math.sin(h), ey = start.y + 10 * Math.cos(h);
    expect(beyondPen(s, ex, ey)).toBeGreaterThan(5);
    expect(winding(penOutline(s), ex, ey)).toBe(0);
  });

  it('a range gives the outline of that part only; an empty range gives nothing', () => {
    const s = walk(50, () => 1, () => 0, () => 2);
    const rings = penOutline(s, 10, 20);
    expect(winding(rings, s[15].x, s[15].y)).not.toBe(0);
    expect(winding(rings, s[30].x, s[30].y)).toBe(0);
    expect(penOutline(s, 30, 20)).toEqual([]);
    expect(penOutline([], 0, -1)).toEqual([]);
  });
});
