/**
 * The SVG and PNG facsimiles: well-formed, true to size, safe, tagged with their
 * resolution, and accurate against the ground truth of a synthetic inscription (the
 * finished example of "Sherd OT-17"-like finds of the Orvane terraces, all invented).
 */
import { Resvg } from '@resvg/resvg-js';
import { decode } from 'fast-png';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { beforeAll, describe, expect, it } from 'vitest';
import { canDraw, textRings, textWidth } from '../src/export/strokeFont.ts';
import { pngPhys } from './helpers/png.ts';
import type { Project } from '../src/doc/model.ts';
import { finishedExample, type FinishedExample } from '../src/example/finished.ts';
import { facsimileDrawing } from '../src/export/drawing.ts';
import { facsimileSvg } from '../src/export/facsimile.ts';
import { penOutline } from '../src/export/outline.ts';
import { drawingCoverage, facsimilePng } from '../src/export/png.ts';
import { rasterizeRings } from '../src/export/raster.ts';
import { ExportError, type ExportInput } from '../src/export/types.ts';
import { binarize, drd, fMeasure } from '../src/score/binarization.ts';

let ex: FinishedExample;
let input: ExportInput;

function inputOf(e: FinishedExample, project: Project = e.project): ExportInput {
  const images: ExportInput['images'] = {};
  for (const ref of project.surfaces[0].images) images[ref.id] = { bytes: e.images.get(ref.file)!, mime: ref.mime };
  return { project, images };
}

beforeAll(() => {
  ex = finishedExample({ seed: 4207, width: 640, height: 400, lines: 2, lettersPerLine: [5, 6], difficulty: 'medium', bands: 1, direction: 'rtl', title: 'Sherd OT-17' });
  input = inputOf(ex);
});

/** Every attribute name in a parsed document (fast-xml-parser, preserveOrder). */
function attributeNames(node: unknown, out: Set<string>): void {
  if (Array.isArray(node)) { for (const n of node) attributeNames(n, out); return; }
  if (!node || typeof node !== 'object') return;
  for (const [k, v] of Object.entries(node)) {
    if (k === ':@') for (const a of Object.keys(v as object)) out.add(a.replace(/^@_/, ''));
    else attributeNames(v, out);
  }
}

function withText(p: Project, text: string): Project {
  const letters = { ...p.letters };
  for (const id of Object.keys(letters)) letters[id] = { ...letters[id], label: text };
  return { ...p, title: `Sherd OT-17 ${text}`, inscription: { ...p.inscription, description: text, creator: text }, letters };
}

describe('facsimileSvg', () => {
  it('is well-formed XML with a true size and a viewBox in object mm, at 1:1 and 2:1', () => {
    const px = ex.project.surfaces[0].pxPerMm!;
    const wMm = 640 / px, hMm = 400 / px;
    for (const scale of [1, 2]) {
      const svg = facsimileSvg(input, { scale, labels: true, lineNumbers: true });
      expect(XMLValidator.validate(svg)).toBe(true);
      const root = new XMLParser({ ignoreAttributes: false }).parse(svg).svg;
      expect(root['@_width']).toMatch(/mm$/);
      expect(parseFloat(root['@_width'])).toBeCloseTo(wMm * scale, 2);
      expect(parseFloat(root['@_height'])).toBeCloseTo(hMm * scale, 2);
      expect(root['@_viewBox'].split(' ').map(Number)).toEqual([0, 0, +wMm.toFixed(3), +hMm.toFixed(3)]);
      // CSS Values and Units Level 3: 1in = 96px = 25.4mm, so the drawing is this wide in CSS px.
      const cssPx = (parseFloat(root['@_width']) * 96) / 25.4;
      expect(cssPx).toBeCloseTo((640 / px) * scale * (96 / 25.4), 1);
      const groups = (root.g as { title: string }[]).map((g) => g.title);
      expect(groups).toContain('Inked strokes');
      expect(groups.some((t) => t.startsWith('Scale bar'))).toBe(true);
    }
  });

  it('draws a 100 mm scale bar 100 user units long (1 unit = 1 mm of the object)', () => {
    const svg = facsimileSvg(input, { scaleBarMm: 100, scale: 2 });
    const bar = /<g id="scale-bar"[^>]*><title>([^<]*)<\/title><rect x="([^"]+)" y="([^"]+)" width="([^"]+)"/.exec(svg);
    expect(bar).not.toBeNull();
    expect(Number(bar![4])).toBe(100);
    expect(bar![1]).toBe('Scale bar: 100 mm');
    expect(svg).toContain('>100 mm</text>');
  });

  it('defaults the scale bar to a round length near a fifth of the width', () => {
    const d = facsimileDrawing(input);
    expect(d.scaleBar).toBeDefined();
    expect([1, 2, 5, 10, 20, 50, 100]).toContain(d.scaleBar!.lengthMm);
    expect(d.scaleBar!.lengthMm).toBeLessThanOrEqual(d.widthMm / 5);
    expect(d.scaleBar!.lengthMm).toBeGreaterThan(d.widthMm / 5 / 2.5);
  });

  it('keeps script, event attributes and external references out; user text stays text', () => {
    const evil = '<script>alert(1)</script> ]]> " onload="alert(2)';
    const svg = facsimileSvg(inputOf(ex, withText(ex.project, evil)), { labels: true, lineNumbers: true, photoImageId: 'i-visible' });
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg).not.toMatch(/<script/i);
    const names = new Set<string>();
    attributeNames(new XMLParser({ ignoreAttributes: false, preserveOrder: true }).parse(svg), names);
    expect([...names].filter((n) => /^on/i.test(n))).toEqual([]);
    expect([...names].filter((n) => /href$/i.test(n)).length).toBe(1); // the photo's, a data: URI
    expect(svg).not.toMatch(/href="(?!data:)/);
    expect(svg).not.toContain(']]>');
    expect(svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt; ]]&gt;');
    const doc = new XMLParser({ ignoreAttributes: false }).parse(svg).svg;
    expect(doc.title).toBe(`Sherd OT-17 ${evil}`);
    // The photo is embedded, not linked.
    expect(svg).toMatch(/<image [^>]*href="data:image\/png;base64,iVBORw0KGgo/);
  });

  it('carries Dublin Core metadata and says it is an interpretation', () => {
    const svg = facsimileSvg(input);
    const meta = new XMLParser({ ignoreAttributes: false }).parse(svg).svg.metadata['rdf:RDF']['rdf:Description'];
    expect(meta['dc:title']).toBe(ex.project.title);
    expect(meta['dc:date']).toBe(ex.project.modifiedAt);
    expect(meta['dc:format']).toBe('image/svg+xml');
    expect(meta['dc:source']).toBe('images/visible.png');
    expect(svg).toMatch(/<desc>[^<]*interpretation[^<]*restored spans[^<]*editor/);
    // Deterministic: the same project gives the same bytes.
    expect(facsimileSvg(input)).toBe(svg);
  });

  it('marks doubtful letters with the dot below in their labels and leaves hidden strokes out', () => {
    const svg = facsimileSvg(input, { labels: true });
    expect(svg).toContain('\u0323</text>');
    const first = ex.project.surfaces[0].strokeOrder[0];
    const hidden = { ...ex.project, strokes: { ...ex.project.strokes, [first]: { ...ex.project.strokes[first], hidden: true } } };
    const a = facsimileDrawing(input).ink.length, b = facsimileDrawing(inputOf(ex, hidden)).ink.length;
    expect(b).toBeLessThan(a);
  });

  it('refuses an uncalibrated surface with a clear message', () => {
    const raw = { ...ex.project, surfaces: [{ ...ex.project.surfaces[0], pxPerMm: undefined }] };
    expect(() => facsimileSvg(inputOf(ex, raw))).toThrow(ExportError);
    expect(() => facsimileSvg(inputOf(ex, raw))).toThrow(/calibrate the surface first/);
    expect(() => facsimilePng(inputOf(ex, raw))).toThrow(/calibrate the surface first/);
  });
});

describe('facsimilePng', () => {
  it('tags its resolution: pHYs = round(dpi / 0.0254) px per metre, and is mm × dpi / 25.4 px wide', () => {
    const d = facsimileDrawing(input);
    // PNG specification 11.3.5.3 pHYs: pixels per unit, unit 1 = metre; 300 dpi = 11811 px/m.
    const expected: Record<number, number> = { 300: 11811, 600: 23622, 1200: 47244 };
    for (const dpi of [300, 600, 1200]) {
      const png = facsimilePng(input, { dpi, scale: dpi === 1200 ? 0.5 : 1 });
      expect(pngPhys(png)).toEqual({ x: expected[dpi], y: expected[dpi], unit: 1 });
      const img = decode(png);
      const scale = dpi === 1200 ? 0.5 : 1;
      expect(img.width).toBe(Math.round((d.widthMm * scale * dpi) / 25.4));
      expect(img.height).toBe(Math.round((d.heightMm * scale * dpi) / 25.4));
      expect(img.channels).toBe(1);
    }
  });

  it('is black on white or black on transparent, with the scale bar drawn', () => {
    const white = decode(facsimilePng(input, { dpi: 150 }));
    const clear = decode(facsimilePng(input, { dpi: 150, background: 'transparent' }));
    expect(clear.channels).toBe(2);
    expect(white.data[0]).toBe(255);
    expect(clear.data[1]).toBe(0);
    const d = facsimileDrawing(input);
    const k = 150 / 25.4;
    const b = d.scaleBar!;
    const cx = Math.floor((b.x + b.width / 2) * k), cy = Math.floor((b.y + b.height / 2) * k);
    expect(white.data[cy * white.width + cx]).toBeLessThan(40);
    expect(() => facsimilePng(input, { dpi: 0 })).toThrow(ExportError);
  });
});

describe('text in the PNG (our line font for digits, strokeFont.ts)', () => {
  it('draws the scale bar label and the line numbers as ink inside their boxes, and leaves letter labels out', () => {
    const opts = { dpi: 300, lineNumbers: true, labels: true } as const;
    const d = facsimileDrawing(input, opts);
    expect(d.lineNumbers.length).toBeGreaterThan(0);
    const { width, height, ink } = drawingCoverage(d, 300);
    const k = (d.scale * 300) / 25.4; // px per drawing mm: 300 dpi, 25.4 mm per inch
    const inkIn = (x0: number, y0: number, x1: number, y1: number) => {
      let sum = 0;
      for (let y = Math.max(0, Math.floor(y0 * k)); y < Math.min(height, Math.ceil(y1 * k)); y++) {
        for (let x = Math.max(0, Math.floor(x0 * k)); x < Math.min(width, Math.ceil(x1 * k)); x++) sum += ink[y * width + x];
      }
      return sum;
    };
    for (const t of [d.scaleBar!.label, ...d.lineNumbers]) {
      expect(canDraw(t.text)).toBe(true);
      const w = textWidth(t.text, t.size);
      const x0 = t.anchor === 'start' ? t.x : t.anchor === 'end' ? t.x - w : t.x - w / 2;
      const pen = 0.05 * t.size;
      const inside = inkIn(x0 - pen, t.y - 0.7 * t.size - pen, x0 + w + pen, t.y + pen);
      const rings = textRings(t);
      const alone = rasterizeRings(rings, width, height, { scale: k });
      let total = 0;
      for (const v of alone) total += v;
      expect(total).toBeGreaterThan(5);
      expect(inside).toBeGreaterThan(0.9 * total); // the text's ink is where the text is
    }
    // Letter labels (any script) have no glyphs here.
    expect(canDraw('ta')).toBe(false);
    expect(textRings({ x: 0, y: 0, size: 3, text: 'ab', anchor: 'start' })).toEqual([]);
    // An '8' holds more ink than a '1' of the same size.
    const area = (text: string) => rasterizeRings(textRings({ x: 1, y: 5, size: 4, text, anchor: 'start' }), 200, 200, { scale: 20 }).reduce((a, v) => a + v, 0);
    expect(area('8')).toBeGreaterThan(1.5 * area('1'));
  });
});

describe('accuracy against the ground truth (visible ink)', () => {
  it('the true strokes drawn through penOutline and the rasteriser reproduce the true ink (F ≥ 99.5, DRD ≤ 0.1)', () => {
    // Reference: the synthesiser's own analytic disk coverage (src/synth/render.ts), binarised at 0.5.
    const W = ex.truth.width, H = ex.truth.height;
    const rings = ex.truth.strokes.flatMap((t) => penOutline(t.samples));
    const result = binarize(rasterizeRings(rings, W, H), 0.5);
    const truth = binarize(ex.masks.fullInkMask, 0.5);
    const f = fMeasure(result, truth);
    const e = drd(result, truth, W, H);
    console.log(`true strokes through the export vs all ink: F ${f.f.toFixed(2)} (P ${(100 * f.precision).toFixed(2)}, R ${(100 * f.recall).toFixed(2)}), DRD ${e.toFixed(3)}`);
    expect(f.f).toBeGreaterThanOrEqual(99.5);
    expect(e).toBeLessThanOrEqual(0.1);
  });

  it('the traced strokes\' inked outlines on the image grid reach F ≥ 95 and DRD ≤ 1.5', () => {
    const W = ex.truth.width, H = ex.truth.height;
    const d = facsimileDrawing(input, { scaleBarMm: 0, restoredStyle: 'grey' });
    // Back from mm to image px: 1 px per image px.
    const cover = rasterizeRings(d.ink, W, H, { scale: d.pxPerMm });
    const result = binarize(cover, 0.5);
    const truth = binarize(ex.masks.inkMask, 0.5);
    const f = fMeasure(result, truth);
    const e = drd(result, truth, W, H);
    console.log(`facsimile vs visible ink (${ex.truth.strokes.length} strokes, ${W}×${H}): F ${f.f.toFixed(2)} ` +
      `(P ${(100 * f.precision).toFixed(2)}, R ${(100 * f.recall).toFixed(2)}), DRD ${e.toFixed(3)}`);
    expect(f.f).toBeGreaterThanOrEqual(95);
    expect(e).toBeLessThanOrEqual(1.5);
  });

  it('resvg (a reference SVG renderer) and our rasteriser agree on the same grid (IoU ≥ 0.98)', () => {
    const W = ex.truth.width, H = ex.truth.height;
    const d = facsimileDrawing(input, { scaleBarMm: 0, restoredStyle: 'grey' });
    const cover = rasterizeRings(d.ink, W, H, { scale: d.pxPerMm });
    // resvg renders the SVG (transparent ground) at the same grid; compare all marks.
    const svg = facsimileSvg(input, { scaleBarMm: 0, restoredStyle: 'grey' });
    const rendered = new Resvg(svg, { fitTo: { mode: 'width', value: W } }).render();
    expect([rendered.width, rendered.height]).toEqual([W, H]);
    const rgba = rendered.pixels;
    const ours = rasterizeRings(d.restoredFill, W, H, { scale: d.pxPerMm, out: Float32Array.from(cover) });
    let both = 0, either = 0;
    for (let p = 0; p < W * H; p++) {
      const a = rgba[4 * p + 3] >= 128, b = ours[p] >= 0.5;
      if (a && b) both++;
      if (a || b) either++;
    }
    const iou = both / either;
    console.log(`resvg vs our rasteriser: IoU ${iou.toFixed(4)} over ${either} px`);
    expect(iou).toBeGreaterThanOrEqual(0.98);
  });
});
