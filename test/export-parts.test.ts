/**
 * A stroke cut into inked and restored parts (src/export/strokeParts.ts): square cuts
 * half-way between the last inked and the first restored sample, the two parts meeting
 * there without overlap, together the whole pen (checked by nonzero winding numbers,
 * the fill rule of SVG 1.1 §11.3, against the pen disks themselves).
 */
import { describe, expect, it } from 'vitest';
import { penOutline, type Ring } from '../src/export/outline.ts';
import { strokeParts } from '../src/export/strokeParts.ts';

/** Winding number of the rings around (x, y) (nonzero: inside). */
function winding(rings: readonly Ring[], x: number, y: number): number {
  let w = 0;
  for (const r of rings) {
    for (let i = 0, j = r.length - 2; i < r.length; j = i, i += 2) {
      const y0 = r[j + 1], y1 = r[i + 1];
      const cross = (r[i] - r[j]) * (y - y0) - (x - r[j]) * (y1 - y0);
      if (y0 <= y && y1 > y && cross > 0) w++;
      else if (y1 <= y && y0 > y && cross < 0) w--;
    }
  }
  return w;
}

/** A straight stroke along y = 20 from x = 10 to 70, 1 px apart, radius 3, samples 25..35 restored. */
function stroke() {
  const samples = [];
  for (let x = 10; x <= 70; x++) samples.push({ x, y: 20, r: 3, support: x >= 35 && x <= 45 ? 0 : 1 });
  return { samples, restoredSpans: [{ from: 25, to: 35 }], overrides: [] };
}

describe('strokeParts', () => {
  it('cuts the ink square at the restored span, half-way between samples, with no overlap', () => {
    const parts = strokeParts(stroke());
    // Cuts at x = 34.5 and x = 45.5 (half-way between samples 24|25 and 35|36).
    for (const y of [18, 20, 22]) {
      expect(winding(parts.inked, 34.3, y)).not.toBe(0);
      expect(winding(parts.inked, 34.7, y)).toBe(0);
      expect(winding(parts.restored, 34.3, y)).toBe(0);
      expect(winding(parts.restored, 34.7, y)).not.toBe(0);
      expect(winding(parts.restored, 45.3, y)).not.toBe(0);
      expect(winding(parts.inked, 45.3, y)).toBe(0);
      expect(winding(parts.inked, 45.7, y)).not.toBe(0);
    }
  });

  it('inked and restored together are the whole pen, and nothing more', () => {
    const st = stroke();
    const parts = strokeParts(st);
    const whole = penOutline(st.samples);
    for (let y = 14.25; y <= 26; y += 0.5) {
      for (let x = 4.25; x <= 76; x += 0.5) {
        const inPen = st.samples.some((s) => Math.hypot(s.x - x, s.y - y) < s.r - 0.15);
        const covered = winding(parts.inked, x, y) !== 0 || winding(parts.restored, x, y) !== 0;
        if (inPen) expect(covered).toBe(true);
        if (covered) expect(winding(whole, x, y)).not.toBe(0);
      }
    }
  });

  it('leaves a stroke without restored spans as its pen outline', () => {
    const st = { ...stroke(), restoredSpans: [] };
    expect(strokeParts(st)).toEqual({ inked: penOutline(st.samples), restored: [] });
  });

  it('a restored span at the end of the stroke keeps its round pen end there', () => {
    const st = { ...stroke(), restoredSpans: [{ from: 50, to: 60 }] };
    const parts = strokeParts(st);
    expect(winding(parts.restored, 72.5, 20)).not.toBe(0); // 2.5 px past the last sample, inside its disk
    expect(winding(parts.inked, 59.7, 20)).toBe(0); // past the cut at 59.5
  });
});
