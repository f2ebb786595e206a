/**
 * The synthetic inscription generator: determinism, the demo and test-set recipes, and
 * the geometric promises the solver's accuracy tests rely on (sample spacing, ink under
 * every visible sample, erased ink in gaps, letter spacing, smooth strokes, the ruler),
 * plus the image model itself on a clean image.
 */
import { describe, expect, it } from 'vitest';
import {
  ALPHABET, DEGRADATION_PRESETS, DEMO_SEED, demoOptions, synthesize, testSetRecipe,
  type Degradation, type SynthOptions, type SynthResult, type TruthSample, type TruthStroke,
} from '../src/synth/index.ts';
import { paintStains } from '../src/synth/stains.ts';
import { buildSampleGrid } from '../src/synth/sampleGrid.ts';
import { createRandom } from '../src/util/random.ts';

/** FNV-1a over the bytes of a typed array. */
function hashBytes(a: Float32Array, h = 0x811c9dc5): number {
  const b = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  for (let i = 0; i < b.length; i++) h = Math.imul(h ^ b[i], 0x01000193) >>> 0;
  return h;
}

function hashResult(r: SynthResult): string {
  const parts = [...r.bands.map((b) => hashBytes(b.data)), hashBytes(r.inkMask), hashBytes(r.fullInkMask)];
  return `${parts.join('-')}:${JSON.stringify(r.truth).length}`;
}

function erasedAt(stroke: TruthStroke, k: number): boolean {
  return stroke.gaps.some((g) => g.from <= k && k <= g.to);
}

/** Visible samples of all strokes as flat arrays, bucketed on a grid for near queries. */
class SampleIndex {
  readonly cell = 12;
  private readonly buckets = new Map<number, number[]>();
  readonly xs: number[] = [];
  readonly ys: number[] = [];
  readonly rs: number[] = [];
  readonly owner: number[] = [];
  constructor(strokes: TruthStroke[], visibleOnly: boolean) {
    strokes.forEach((s, si) => s.samples.forEach((p, k) => {
      if (visibleOnly && erasedAt(s, k)) return;
      const id = this.xs.length;
      this.xs.push(p.x); this.ys.push(p.y); this.rs.push(p.r); this.owner.push(si);
      const key = this.key(Math.floor(p.x / this.cell), Math.floor(p.y / this.cell));
      const list = this.buckets.get(key);
      if (list) list.push(id); else this.buckets.set(key, [id]);
    }));
  }
  private key(cx: number, cy: number): number { return cy * 100000 + cx; }
  /** Ids of samples whose centre lies within `reach` px of (x, y). */
  near(x: number, y: number, reach: number): number[] {
    const out: number[] = [];
    for (let cy = Math.floor((y - reach) / this.cell); cy <= Math.floor((y + reach) / this.cell); cy++) {
      for (let cx = Math.floor((x - reach) / this.cell); cx <= Math.floor((x + reach) / this.cell); cx++) {
        for (const id of this.buckets.get(this.key(cx, cy)) ?? []) {
          if (Math.hypot(this.xs[id] - x, this.ys[id] - y) <= reach) out.push(id);
        }
      }
    }
    return out;
  }
}

const recipes = testSetRecipe();
const cache = new Map<SynthOptions, { result: SynthResult; ms: number }>();
function generated(options: SynthOptions): { result: SynthResult; ms: number } {
  let entry = cache.get(options);
  if (!entry) {
    const t0 = performance.now();
    const result = synthesize(options);
    entry = { result, ms: performance.now() - t0 };
    cache.set(options, entry);
  }
  return entry;
}
const demo = demoOptions();
const everything = (): SynthResult[] => [...recipes, demo].map((o) => generated(o).result);

const OFF: Degradation = {
  surface: 0, shading: 0, fade: 0, widthVariation: 0, abrasion: 0, stains: 0, cracks: 0, noise: 0, blockiness: 0,
};

describe('synthesize: determinism', () => {
  it('the same options give bit-identical bands, masks and truth; another seed does not', () => {
    const options: SynthOptions = { ...recipes[2], bands: 2 };
    const a = synthesize(options);
    const b = synthesize(options);
    expect(hashResult(a)).toBe(hashResult(b));
    expect(JSON.stringify(a.truth)).toBe(JSON.stringify(b.truth));
    const c = synthesize({ ...options, seed: options.seed + 1 });
    expect(hashResult(c)).not.toBe(hashResult(a));
  });

  it('degradation strengths do not move the letters', () => {
    const base = synthesize({ ...recipes[1], degradation: OFF });
    const damaged = synthesize({ ...recipes[1], degradation: { ...OFF, stains: 1, cracks: 1, noise: 1, surface: 1 } });
    expect(damaged.truth.strokes.map((s) => s.samples.map((p) => [p.x, p.y])))
      .toEqual(base.truth.strokes.map((s) => s.samples.map((p) => [p.x, p.y])));
    expect(hashBytes(damaged.inkMask)).toBe(hashBytes(base.inkMask));
  });

  it('rejects impossible options with a plain message', () => {
    expect(() => synthesize({ seed: 1, width: 50, height: 40 })).toThrow(/image size/);
    expect(() => synthesize({ seed: 1, lettersPerLine: [4, 2] })).toThrow(/lettersPerLine/);
    expect(() => synthesize({ seed: 1.5 })).toThrow(/seed/);
    expect(() => synthesize({ seed: 1, degradation: { noise: -1 } })).toThrow(/noise/);
  });
});

describe('the demo inscription', () => {
  it('is about 2400×1600 px with 25–40 letters in 3–4 lines, two bands, right to left', () => {
    const { result } = generated(demo);
    const t = result.truth;
    expect(demo.seed).toBe(DEMO_SEED);
    expect([t.width, t.height]).toEqual([2400, 1600]);
    expect(result.bands.map((b) => [b.width, b.height])).toEqual([[2400, 1600], [2400, 1600]]);
    expect(t.bands).toEqual(['visible', 'infrared']);
    expect(t.difficulty).toBe('medium');
    expect(t.direction).toBe('rtl');
    expect(t.letters.length).toBeGreaterThanOrEqual(25);
    expect(t.letters.length).toBeLessThanOrEqual(40);
    const lines = new Set(t.letters.map((l) => l.line));
    expect(lines.size).toBeGreaterThanOrEqual(3);
    expect(lines.size).toBeLessThanOrEqual(4);
    // Letters 8–12 mm tall at the recorded scale.
    const heights = t.letters.map((l) => (l.box[3] - l.box[1]) / t.pxPerMm);
    expect(Math.min(...heights)).toBeGreaterThanOrEqual(7.5);
    expect(Math.max(...heights)).toBeLessThanOrEqual(12.5);
  });

  it('has pen radii of about 2.5–5 px', () => {
    const r = generated(demo).result.truth.strokes.flatMap((s) => s.samples.map((p) => p.r)).sort((a, b) => a - b);
    expect(r[Math.floor(0.02 * r.length)]).toBeGreaterThanOrEqual(2.5);
    expect(r[Math.floor(0.98 * r.length)]).toBeLessThanOrEqual(5);
    expect(r[0]).toBeGreaterThan(2);
    expect(r[r.length - 1]).toBeLessThan(5.6);
  });

  it('is generated within 6 s in Node (target ~3 s)', () => {
    expect(generated(demo).ms).toBeLessThan(6000);
  });
});

describe('the test-set recipe', () => {
  it('has small images over ≥ 4 seeds and all three difficulties, ≥ 60 strokes in all', () => {
    expect(new Set(recipes.map((r) => r.seed)).size).toBeGreaterThanOrEqual(4);
    expect(new Set(recipes.map((r) => r.difficulty))).toEqual(new Set(['easy', 'medium', 'hard']));
    let strokes = 0;
    for (const r of recipes) {
      const t = generated(r).result.truth;
      expect(t.width * t.height).toBeLessThanOrEqual(640 * 400);
      strokes += t.strokes.length;
    }
    expect(strokes).toBeGreaterThanOrEqual(60);
  });

  it('generates each image fast (median < 0.5 s)', () => {
    const ms = recipes.map((r) => generated(r).ms).sort((a, b) => a - b);
    expect(ms[Math.floor(ms.length / 2)]).toBeLessThan(500);
  });

  it('has pen radii of about 1.5–4 px', () => {
    const r = recipes.flatMap((o) => generated(o).result.truth.strokes.flatMap((s) => s.samples.map((p) => p.r)));
    expect(Math.min(...r)).toBeGreaterThanOrEqual(1.4);
    expect(Math.max(...r)).toBeLessThanOrEqual(4.2);
    // The easy images (little width variation) sit around 2–3 px.
    const easy = recipes.filter((o) => o.difficulty === 'easy')
      .flatMap((o) => generated(o).result.truth.strokes.flatMap((s) => s.samples.map((p) => p.r)));
    expect(Math.min(...easy)).toBeGreaterThan(1.8);
    expect(Math.max(...easy)).toBeLessThan(3.2);
  });
});

describe('truth geometry', () => {
  it('samples are at most 0.5 px apart along every stroke', () => {
    for (const res of everything()) {
      for (const s of res.truth.strokes) {
        expect(s.samples.length).toBeGreaterThan(20);
        let worst = 0;
        for (let k = 1; k < s.samples.length; k++) {
          worst = Math.max(worst, Math.hypot(s.samples[k].x - s.samples[k - 1].x, s.samples[k].y - s.samples[k - 1].y));
        }
        expect(worst, s.id).toBeLessThanOrEqual(0.5 + 1e-9);
      }
    }
  });

  it('no stroke turns by more than 45° over 3 px of arc', () => {
    for (const res of everything()) {
      for (const s of res.truth.strokes) {
        const p = s.samples;
        const n = p.length;
        const heading = (i: number): number => {
          const a = p[Math.max(0, i - 1)];
          const b = p[Math.min(n - 1, i + 1)];
          return Math.atan2(b.y - a.y, b.x - a.x);
        };
        let worst = 0;
        for (let i = 0; i + 6 < n; i++) {
          let turn = Math.abs(heading(i + 6) - heading(i));
          if (turn > Math.PI) turn = 2 * Math.PI - turn;
          worst = Math.max(worst, turn);
        }
        expect(worst, s.id).toBeLessThanOrEqual(Math.PI / 4);
      }
    }
  });

  it('strokes of different letters stay ≥ 3 pen radii + 4 px apart', () => {
    for (const res of everything()) {
      const strokes = res.truth.strokes;
      const index = new SampleIndex(strokes, false);
      const letterOf = strokes.map((s) => s.letterId);
      const rMax = Math.max(...index.rs);
      let closest = Infinity;
      for (let id = 0; id < index.xs.length; id += 3) {
        for (const other of index.near(index.xs[id], index.ys[id], 3 * rMax + 4)) {
          if (letterOf[index.owner[other]] === letterOf[index.owner[id]]) continue;
          const d = Math.hypot(index.xs[id] - index.xs[other], index.ys[id] - index.ys[other]);
          const need = 3 * Math.max(index.rs[id], index.rs[other]) + 4;
          closest = Math.min(closest, d - need);
        }
      }
      expect(closest, `seed ${res.truth.seed}`).toBeGreaterThanOrEqual(0);
    }
  });

  it('letters: box holds every pen disk tightly, order follows the reading direction', () => {
    for (const res of everything()) {
      const t = res.truth;
      const byId = new Map(t.strokes.map((s) => [s.id, s]));
      for (const l of t.letters) {
        const samples = l.strokeIds.flatMap((id) => byId.get(id)!.samples);
        expect(l.strokeIds.every((id) => byId.get(id)!.letterId === l.id)).toBe(true);
        expect(Math.min(...samples.map((p) => p.x - p.r))).toBeCloseTo(l.box[0], 9);
        expect(Math.min(...samples.map((p) => p.y - p.r))).toBeCloseTo(l.box[1], 9);
        expect(Math.max(...samples.map((p) => p.x + p.r))).toBeCloseTo(l.box[2], 9);
        expect(Math.max(...samples.map((p) => p.y + p.r))).toBeCloseTo(l.box[3], 9);
        expect(ALPHABET.some((a) => a.name === l.name)).toBe(true);
      }
      const lines = [...new Set(t.letters.map((l) => l.line))].sort((a, b) => a - b);
      expect(lines).toEqual(lines.map((_, i) => i + 1));
      let previousY = -Infinity;
      for (const line of lines) {
        const row = t.letters.filter((l) => l.line === line).sort((a, b) => a.order - b.order);
        expect(row.map((l) => l.order)).toEqual(row.map((_, i) => i + 1));
        for (let k = 1; k < row.length; k++) {
          // Right to left: each next letter lies wholly left of the previous one.
          if (t.direction === 'rtl') expect(row[k].box[2]).toBeLessThan(row[k - 1].box[0]);
          else expect(row[k].box[0]).toBeGreaterThan(row[k - 1].box[2]);
        }
        const midY = row.reduce((acc, l) => acc + (l.box[1] + l.box[3]) / 2, 0) / row.length;
        expect(midY).toBeGreaterThan(previousY);
        previousY = midY;
      }
    }
  });
});

describe('ink masks against the truth', () => {
  const pixel = (res: SynthResult, p: TruthSample): number => Math.floor(p.y) * res.truth.width + Math.floor(p.x);

  it('every visible sample (over 1 px from a gap cut) has visible ink ≥ 0.5 at its pixel; every sample has full ink ≥ 0.5', () => {
    const failures: string[] = [];
    let checked = 0;
    for (const res of everything()) {
      for (const s of res.truth.strokes) {
        s.samples.forEach((p, k) => {
          if (res.fullInkMask[pixel(res, p)] < 0.5) failures.push(`${s.id} ${k}: full ink ${res.fullInkMask[pixel(res, p)]}`);
          // Within 1 px (2 samples) of a cut, the sample's pixel centre may lie past the cut.
          const nearCut = s.gaps.some((g) => k >= g.from - 2 && k <= g.to + 2);
          if (!erasedAt(s, k) && !nearCut) {
            checked++;
            if (res.inkMask[pixel(res, p)] < 0.5) failures.push(`${s.id} ${k}: visible ink ${res.inkMask[pixel(res, p)]}`);
          }
        });
      }
    }
    expect(checked).toBeGreaterThan(10000);
    expect(failures).toEqual([]);
  });

  it('gaps are erased across the stroke between square cuts: < 0.5 visible ink unless another stroke reaches the pixel', () => {
    let gaps = 0;
    let checked = 0;
    for (const res of everything()) {
      const visible = new SampleIndex(res.truth.strokes, true);
      const rMax = Math.max(...visible.rs);
      res.truth.strokes.forEach((s, si) => {
        for (const g of s.gaps) {
          gaps++;
          // Samples over 1 px inside both cuts, and the pixels across the stroke there.
          for (let k = g.from + 2; k <= g.to - 2; k++) {
            const p = s.samples[k];
            const a = s.samples[k - 1];
            const b = s.samples[k + 1];
            const l = Math.hypot(b.x - a.x, b.y - a.y);
            const nx = -(b.y - a.y) / l;
            const ny = (b.x - a.x) / l;
            for (const t of [-0.5 * p.r, 0, 0.5 * p.r]) {
              const qx = Math.floor(p.x + nx * t) + 0.5;
              const qy = Math.floor(p.y + ny * t) + 0.5;
              let outside = Infinity;
              for (const id of visible.near(qx, qy, rMax + 2)) {
                if (visible.owner[id] === si) continue;
                outside = Math.min(outside, Math.hypot(visible.xs[id] - qx, visible.ys[id] - qy) - visible.rs[id]);
              }
              if (outside <= 0) continue;
              checked++;
              expect(res.inkMask[Math.floor(qy) * res.truth.width + Math.floor(qx)], `${s.id} gap ${g.from}-${g.to} at ${k}`).toBeLessThan(0.5);
            }
          }
        }
      });
    }
    expect(gaps).toBeGreaterThanOrEqual(20);
    expect(checked).toBeGreaterThan(1000);
  });

  it('gaps are 5–40 px long, ≥ 8 px from the ends, apart from each other, mostly ≤ 30 px', () => {
    const lengths: number[] = [];
    for (const res of everything()) {
      for (const s of res.truth.strokes) {
        const arc = [0];
        for (let k = 1; k < s.samples.length; k++) {
          arc.push(arc[k - 1] + Math.hypot(s.samples[k].x - s.samples[k - 1].x, s.samples[k].y - s.samples[k - 1].y));
        }
        const total = arc[arc.length - 1];
        s.gaps.forEach((g, m) => {
          const len = arc[g.to] - arc[g.from];
          lengths.push(len);
          expect(len).toBeGreaterThanOrEqual(5);
          expect(len).toBeLessThanOrEqual(40);
          expect(arc[g.from]).toBeGreaterThanOrEqual(8 - 1e-9);
          expect(total - arc[g.to]).toBeGreaterThanOrEqual(8 - 1e-9);
          if (m > 0) expect(g.from).toBeGreaterThan(s.gaps[m - 1].to);
        });
      }
    }
    expect(lengths.filter((l) => l <= 30).length / lengths.length).toBeGreaterThanOrEqual(0.7);
  });
});

describe('the image model', () => {
  const clean = synthesize({ ...recipes[1], degradation: OFF });

  it('with every degradation off, bare surface is one constant value', () => {
    const t = clean.truth;
    const [bx0, by0, bx1, by1] = t.rulerBox!;
    const v = clean.bands[0].data;
    let background: number | undefined;
    let counted = 0;
    let differing = 0;
    for (let j = 0; j < t.height; j++) {
      for (let i = 0; i < t.width; i++) {
        const p = j * t.width + i;
        if (clean.fullInkMask[p] > 0 || (i + 1 > bx0 && i < bx1 && j + 1 > by0 && j < by1)) continue;
        background ??= v[p];
        if (v[p] !== background) differing++;
        counted++;
      }
    }
    expect(differing).toBe(0);
    expect(counted).toBeGreaterThan(0.8 * t.width * t.height);
    expect(clean.truth.strokes.every((s) => s.gaps.length === 0)).toBe(true);
    expect(clean.inkMask).toEqual(clean.fullInkMask);
    // No width variation: every sample has the inscription's pen radius.
    expect(t.strokes.every((s) => s.samples.every((p) => p.r === t.penRadius))).toBe(true);
  });

  it('ink darkens the surface by depth × contrast × coverage, depth 0.55–0.75', () => {
    const v = clean.bands[0].data;
    const background = v[0];
    const depths: number[] = [];
    for (let p = 0; p < v.length; p++) {
      if (clean.inkMask[p] > 0.05) depths.push((1 - v[p] / background) / clean.inkMask[p]);
    }
    const lo = Math.min(...depths);
    const hi = Math.max(...depths);
    expect(hi - lo).toBeLessThan(1e-5);
    expect(lo).toBeGreaterThanOrEqual(0.55);
    expect(hi).toBeLessThanOrEqual(0.75);
  });

  it('fading: contrast spans [0.3, 1] at fade 1 and the image follows each sample', () => {
    const faded = synthesize({ ...recipes[1], degradation: { ...OFF, fade: 1 } });
    const c = faded.truth.strokes.flatMap((s) => s.samples.map((p) => p.contrast));
    expect(Math.min(...c)).toBeGreaterThanOrEqual(0.3 - 1e-9);
    expect(Math.min(...c)).toBeLessThan(0.45);
    expect(Math.max(...c)).toBeGreaterThan(0.9);
    expect(Math.max(...c)).toBeLessThanOrEqual(1);
    const v = faded.bands[0].data;
    const background = v[0];
    const depth = (1 - clean.bands[0].data[ink(clean)] / background) / clean.inkMask[ink(clean)];
    const all = new SampleIndex(faded.truth.strokes, false);
    let checked = 0;
    faded.truth.strokes.forEach((s, si) => {
      for (let k = 0; k < s.samples.length; k += 25) {
        const p = s.samples[k];
        const q = Math.floor(p.y) * faded.truth.width + Math.floor(p.x);
        if (faded.inkMask[q] < 1) continue;
        // Where another stroke's pen reaches the pixel, its contrast may win.
        const qx = Math.floor(p.x) + 0.5;
        const qy = Math.floor(p.y) + 0.5;
        if (all.near(qx, qy, 2 * p.r + 2).some((id) => all.owner[id] !== si)) continue;
        checked++;
        // Contrast is smooth along the stroke, so the stamped nearest sample is within 0.03.
        expect(Math.abs((1 - v[q] / background) / depth - p.contrast)).toBeLessThan(0.03);
      }
    });
    expect(checked).toBeGreaterThan(100);
    function ink(r: SynthResult): number { return r.inkMask.findIndex((m) => m === 1); }
  });

  it('infrared: ink clearer (no fading below 70 %, depth ~0.8), stains faint; visible stains darker than ink', () => {
    const options: SynthOptions = { ...recipes[4], bands: 2, degradation: { ...OFF, fade: 1, stains: 1 } };
    const res = synthesize(options);
    const t = res.truth;
    const [bx0, by0, bx1, by1] = t.rulerBox!;
    const inRuler = (p: number): boolean => {
      const i = p % t.width, j = Math.floor(p / t.width);
      return i + 1 > bx0 && i < bx1 && j + 1 > by0 && j < by1;
    };
    expect(t.damage!.stains.length).toBeGreaterThan(0);
    for (const [band, name] of [[0, 'visible'], [1, 'infrared']] as const) {
      const v = res.bands[band].data;
      let background = 0;
      for (let p = 0; p < v.length; p++) if (!inRuler(p) && res.fullInkMask[p] === 0) background = Math.max(background, v[p]);
      let darkestStain = Infinity;
      let lightestInk = 0;
      for (let p = 0; p < v.length; p++) {
        if (inRuler(p)) continue;
        if (res.fullInkMask[p] === 0) darkestStain = Math.min(darkestStain, v[p] / background);
        else if (res.inkMask[p] === 1) lightestInk = Math.max(lightestInk, v[p] / background);
      }
      if (name === 'visible') {
        // Badly faded ink (down to 30 %) is pale; the stain cores are darker than full ink.
        expect(lightestInk, name).toBeGreaterThan(0.7);
        expect(darkestStain, name).toBeLessThan(1 - 0.75);
      } else {
        expect(lightestInk, name).toBeLessThanOrEqual(1 - 0.78 * 0.7 + 1e-6);
        expect(darkestStain, name).toBeGreaterThanOrEqual(1 - 0.15 * 0.96 - 1e-6);
      }
    }
  });
});

describe('stains and cracks', () => {
  it("'easy' images keep stains and cracks clear of every stroke", () => {
    for (const r of recipes.filter((o) => o.difficulty === 'easy')) {
      const t = generated(r).result.truth;
      const all = new SampleIndex(t.strokes, false);
      const rMax = Math.max(...all.rs);
      expect(t.damage!.stains.length + t.damage!.cracks.length).toBeGreaterThan(0);
      for (const st of t.damage!.stains) {
        for (const id of all.near(st.x, st.y, st.radius + rMax + 1)) {
          expect(Math.hypot(all.xs[id] - st.x, all.ys[id] - st.y)).toBeGreaterThan(st.radius + all.rs[id]);
        }
      }
      for (const c of t.damage!.cracks) {
        for (const [x, y] of c.points) {
          for (const id of all.near(x, y, rMax + c.width)) {
            expect(Math.hypot(all.xs[id] - x, all.ys[id] - y)).toBeGreaterThan(all.rs[id] + c.width / 2);
          }
        }
      }
    }
  });

  it("'medium' and 'hard' images have cracks that cross strokes", () => {
    let crossings = 0;
    for (const r of recipes.filter((o) => o.difficulty !== 'easy')) {
      const t = generated(r).result.truth;
      const all = new SampleIndex(t.strokes, false);
      for (const c of t.damage!.cracks) {
        if (c.points.some(([x, y]) => all.near(x, y, 1.5).length > 0)) crossings++;
      }
    }
    expect(crossings).toBeGreaterThanOrEqual(2);
  });

  it('stains allowed on ink still cover at most 15 % of any stroke', () => {
    // A 300 px horizontal stroke and a vertical one crossing it, flooded with stains.
    const stroke = (id: string, x0: number, y0: number, x1: number, y1: number): TruthStroke => {
      const n = Math.ceil(Math.hypot(x1 - x0, y1 - y0) / 0.5);
      const samples = Array.from({ length: n + 1 }, (_, k) => ({
        x: x0 + ((x1 - x0) * k) / n, y: y0 + ((y1 - y0) * k) / n, r: 3, contrast: 1,
      }));
      return { id, letterId: id, samples, gaps: [] };
    };
    const strokes = [stroke('a', 50, 100, 350, 100), stroke('b', 200, 20, 200, 180)];
    const grid = buildSampleGrid(strokes, 400, 200);
    const counts = strokes.map((s) => s.samples.length);
    const dark = new Float32Array(400 * 200);
    {
      const placed = paintStains(dark, 400, 200, 60, grid, counts, { avoidInk: false, maxStrokeShare: 0.12, keepOut: [] }, createRandom(7));
      expect(placed.length).toBeGreaterThan(10);
      for (const s of strokes) {
        const under = s.samples.filter((p) => dark[Math.floor(p.y) * 400 + Math.floor(p.x)] > 0.3).length;
        expect(under / s.samples.length, s.id).toBeLessThanOrEqual(0.15);
      }
      const clearDark = new Float32Array(400 * 200);
      paintStains(clearDark, 400, 200, 60, grid, counts, { avoidInk: true, maxStrokeShare: 0, keepOut: [] }, createRandom(7));
      // Nothing within the pen radius (3 px) + 1 px of any sample.
      let touched = 0;
      for (const s of strokes) {
        for (const p of s.samples) {
          for (let dy = -4; dy <= 4; dy++) {
            for (let dx = -4; dx <= 4; dx++) {
              if (clearDark[(Math.floor(p.y) + dy) * 400 + Math.floor(p.x) + dx] !== 0) touched++;
            }
          }
        }
      }
      expect(touched).toBe(0);
      expect(clearDark.some((d) => d > 0.5)).toBe(true);
    }
  });
});

describe('the ruler', () => {
  it('its length in px over pxPerMm is its length in mm, and it lies clear of the letters', () => {
    for (const res of everything()) {
      const t = res.truth;
      const { x0, y0, x1, y1, mm } = t.ruler;
      expect(Math.abs(Math.hypot(x1 - x0, y1 - y0) / t.pxPerMm - mm)).toBeLessThanOrEqual(1e-9);
      expect(mm).toBeGreaterThanOrEqual(5);
      const [bx0, by0, bx1, by1] = t.rulerBox!;
      expect(bx0).toBeGreaterThanOrEqual(0);
      expect(by0).toBeGreaterThanOrEqual(0);
      expect(bx1).toBeLessThanOrEqual(t.width);
      expect(by1).toBeLessThanOrEqual(t.height);
      expect(x0 > bx0 && x1 < bx1 && y0 > by0 && y0 < by1).toBe(true);
      for (const l of t.letters) {
        const apart = l.box[2] < bx0 || l.box[0] > bx1 || l.box[3] < by0 || l.box[1] > by1;
        expect(apart, l.id).toBe(true);
      }
    }
  });

  it('is drawn: the tick line is dark at every 10 mm tick on the clean image', () => {
    const res = synthesize({ ...recipes[0], degradation: OFF });
    const { x0, y0, mm } = res.truth.ruler;
    const v = res.bands[0].data;
    const w = res.truth.width;
    const paper = v[Math.floor(y0 - 0.5 * res.truth.pxPerMm) * w + Math.floor(x0 + 0.5 * res.truth.pxPerMm)];
    for (let k = 0; k <= mm; k += 10) {
      const x = x0 + k * res.truth.pxPerMm;
      const tick = v[Math.floor(y0 - 1.5) * w + Math.floor(x)];
      expect(tick).toBeLessThan(0.5 * paper);
    }
  });
});

describe('presets and alphabet', () => {
  it('difficulty raises every degradation, easy has no block artefacts', () => {
    const keys = Object.keys(DEGRADATION_PRESETS.easy) as (keyof Degradation)[];
    expect(keys.sort()).toEqual(Object.keys(OFF).sort());
    for (const k of keys) {
      expect(DEGRADATION_PRESETS.medium[k], k).toBeGreaterThanOrEqual(DEGRADATION_PRESETS.easy[k]);
      expect(DEGRADATION_PRESETS.hard[k], k).toBeGreaterThanOrEqual(DEGRADATION_PRESETS.medium[k]);
    }
    expect(DEGRADATION_PRESETS.easy.blockiness).toBe(0);
  });

  it('the invented alphabet has ≥ 14 distinct letters of 1–3 strokes', () => {
    expect(ALPHABET.length).toBeGreaterThanOrEqual(14);
    expect(new Set(ALPHABET.map((l) => l.name)).size).toBe(ALPHABET.length);
    for (const l of ALPHABET) {
      expect(l.strokes.length).toBeGreaterThanOrEqual(1);
      expect(l.strokes.length).toBeLessThanOrEqual(3);
    }
  });
});
