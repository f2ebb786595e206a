/**
 * letters.zip: every entry opens (fflate's unzip, fast-png's decoder, JSON.parse, an XML
 * validator, csv-parse — a standard RFC 4180 parser); crops hold their letters' pen disks
 * and the source pixels unchanged; the mask agrees with the pen disks; the CSV and the JSON
 * carry the same rows.
 */
import { parse as parseCsv } from 'csv-parse/sync';
import { decode as decodePng } from 'fast-png';
import { XMLValidator } from 'fast-xml-parser';
import { strFromU8, unzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { LETTER_COLUMNS, letterSet, type LetterRow } from '../src/export/letterset.ts';
import { ExportError } from '../src/export/types.ts';
import { NASTY_LABEL, RECTO_PX_PER_MM, textFixture } from './helpers/textExportFixture.ts';

function open(bytes: Uint8Array) {
  const entries = unzipSync(bytes);
  const json = JSON.parse(strFromU8(entries['letters.json']));
  return { entries, rows: json.letters as LetterRow[], json };
}

/** Distance from a point to the segment a–b, px. */
function segDist(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const t = dx === 0 && dy === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

describe('letterSet', () => {
  const f = textFixture();
  const zip = letterSet(f);
  const { entries, rows, json } = open(zip);

  it('every entry opens, and the same project gives the same bytes', () => {
    const names = Object.keys(entries);
    expect(names).toContain('letters.csv');
    expect(names).toContain('letters.json');
    for (const name of names) {
      const data = entries[name];
      expect(data.length, name).toBeGreaterThan(0);
      if (name.endsWith('.png')) expect(decodePng(data).width, name).toBeGreaterThan(0);
      else if (name.endsWith('.json')) expect(() => JSON.parse(strFromU8(data)), name).not.toThrow();
      else if (name.endsWith('.svg')) expect(XMLValidator.validate(strFromU8(data)), name).toBe(true);
      else expect(name).toBe('letters.csv');
    }
    expect(letterSet(f)).toEqual(zip);
    // One folder per letter, each with its files; the recto has two bands.
    for (const r of rows) {
      expect(r.folder).not.toBe('');
      for (const file of ['mask.png', 'letter.svg', 'strokes.json', 'crop.json', 'crop-visible.png']) expect(names).toContain(`${r.folder}/${file}`);
      if (r.surface === 'recto') expect(names).toContain(`${r.folder}/crop-infrared.png`);
    }
    expect(new Set(rows.map((r) => r.folder)).size).toBe(rows.length);
    expect(rows.length).toBe(Object.keys(f.project.letters).length);
  });

  it('each crop contains all its pen disks with the 2 mm margin, cut to the image', () => {
    for (const r of rows) {
      const letter = f.project.letters[r.id];
      const surface = f.project.surfaces.find((s) => s.id === letter.surfaceId)!;
      const { width: W, height: H } = surface.images[0];
      const crop = JSON.parse(strFromU8(entries[`${r.folder}/crop.json`]));
      const png = decodePng(entries[`${r.folder}/crop-visible.png`]);
      expect([png.width, png.height]).toEqual([crop.x1 - crop.x0, crop.y1 - crop.y0]);
      const m = 2 * surface.pxPerMm!;
      for (const sid of letter.strokeIds) {
        for (const s of f.project.strokes[sid].samples) {
          expect(crop.x0).toBeLessThanOrEqual(Math.max(0, s.x - s.r - m));
          expect(crop.y0).toBeLessThanOrEqual(Math.max(0, s.y - s.r - m));
          expect(crop.x1).toBeGreaterThanOrEqual(Math.min(W, s.x + s.r + m));
          expect(crop.y1).toBeGreaterThanOrEqual(Math.min(H, s.y + s.r + m));
        }
      }
      expect(crop.x0).toBeGreaterThanOrEqual(0);
      expect(crop.x1).toBeLessThanOrEqual(W);
    }
  });

  it('crops keep the source pixels, channels and bit depth (the 16-bit band stays 16-bit)', () => {
    const r = rows.find((x) => x.id === 'lA1')!;
    const crop = JSON.parse(strFromU8(entries[`${r.folder}/crop.json`]));
    for (const [band, id, depth] of [['visible', 'img-recto-vis', 8], ['infrared', 'img-recto-ir', 16]] as const) {
      const src = decodePng(f.images[id].bytes);
      const out = decodePng(entries[`${r.folder}/crop-${band}.png`]);
      expect(out.depth).toBe(depth);
      expect(out.channels).toBe(src.channels);
      for (let y = 0; y < out.height; y++) {
        for (let x = 0; x < out.width; x++) {
          if (out.data[y * out.width + x] !== src.data[(crop.y0 + y) * src.width + crop.x0 + x]) {
            throw new Error(`${band} crop differs from the source at ${x},${y}`);
          }
        }
      }
      // The scale travels in the crop's pHYs chunk (PNG specification §11.3.5.3: pixels per metre).
      expect(out.resolution?.x).toBe(RECTO_PX_PER_MM * 1000);
    }
  });

  it('the mask marks pixel centres inside the pen disks and nothing far from them', () => {
    let inkPixels = 0, checked = 0;
    for (const r of rows) {
      const letter = f.project.letters[r.id];
      const crop = JSON.parse(strFromU8(entries[`${r.folder}/crop.json`]));
      const mask = decodePng(entries[`${r.folder}/mask.png`]);
      const strokes = letter.strokeIds.map((id) => f.project.strokes[id]);
      for (let y = 0; y < mask.height; y++) {
        for (let x = 0; x < mask.width; x++) {
          const px = crop.x0 + x + 0.5, py = crop.y0 + y + 0.5;
          // Signed distance to the union of capsules between consecutive disks (the pen's sweep).
          let d = Infinity;
          for (const st of strokes) {
            const s = st.samples;
            for (let i = 0; i + 1 < s.length; i++) d = Math.min(d, segDist(px, py, s[i].x, s[i].y, s[i + 1].x, s[i + 1].y) - Math.min(s[i].r, s[i + 1].r));
          }
          const v = mask.data[y * mask.width + x];
          expect(v === 0 || v === 255).toBe(true);
          // The outline's polygons lie within 0.1 px outside the circles (outline.ts).
          if (d < -0.05) { expect(v, `${r.id} ${px},${py} inside`).toBe(255); checked++; }
          if (d > 0.15) { expect(v, `${r.id} ${px},${py} outside`).toBe(0); checked++; }
          if (v) inkPixels++;
        }
      }
    }
    expect(inkPixels).toBeGreaterThan(500);
    expect(checked).toBeGreaterThan(5000);
  });

  it('letters.csv parses (RFC 4180, CRLF) and equals letters.json row for row', () => {
    const csv = strFromU8(entries['letters.csv']);
    // RFC 4180 §2: CRLF between records; csv-parse told the delimiter fails on a bare LF record end.
    const records: Record<string, string>[] = parseCsv(csv, { columns: true, record_delimiter: '\r\n', relax_quotes: false });
    expect(Object.keys(records[0])).toEqual([...LETTER_COLUMNS]);
    expect(records.length).toBe(rows.length);
    records.forEach((rec, i) => {
      const row = rows[i];
      for (const k of LETTER_COLUMNS) {
        const v = row[k];
        if (v === null) expect(rec[k], k).toBe('');
        else if (typeof v === 'number') expect(Number(rec[k]), k).toBe(v);
        else expect(rec[k], k).toBe(String(v));
      }
    });
    const nasty = records.find((r) => r.id === 'lNasty')!;
    expect(nasty.label).toBe(NASTY_LABEL);
    expect(rows.find((r) => r.id === 'lNasty')!.label).toBe(NASTY_LABEL);
    expect(nasty.codePoints).toBe('U+0061 U+002C U+0022 U+0062 U+0022 U+000A U+003C U+0073 U+0063 U+0072 U+0069 U+0070 U+0074 U+003E U+0026');
  });

  it('the rows hold the letter measures (worked by hand for the first Α)', () => {
    const a = rows.find((r) => r.id === 'lA1')!;
    // Strokes from (12,40)–(20,20), (20,20)–(28,40) with r 2 px and a bar at y 32 with r 1.5:
    // box 10..30 × 18..42 px; at 4 px/mm: 2.5..7.5 × 4.5..10.5 mm, 5 mm wide, 6 mm high.
    expect([a.x0Px, a.y0Px, a.x1Px, a.y1Px]).toEqual([10, 18, 30, 42]);
    expect([a.x0Mm, a.y0Mm, a.x1Mm, a.y1Mm]).toEqual([2.5, 4.5, 7.5, 10.5]);
    expect([a.widthMm, a.heightMm]).toEqual([5, 6]);
    expect(a.codePoints).toBe('U+0391');
    expect(a.strokeCount).toBe(3);
    // 23 + 23 samples of width 4 px and 11 of width 3 px: 217/57 px = 0.95175 mm.
    expect(a.meanPenWidthMm).toBeCloseTo(217 / 57 / 4, 4);
    expect(a.restoredShare).toBe(0);
    expect([a.sourceImage, a.band, a.pxPerMm, a.line, a.order]).toEqual(['images/recto-visible.png', 'visible', 4, 1, 1]);
    // lA2: its second stroke (22 steps) has samples 8..21 restored, 13 steps of 44 in the letter.
    expect(rows.find((r) => r.id === 'lA2')!.restoredShare).toBeCloseTo(13 / 44, 4);
    expect(rows.find((r) => r.id === 'lA4')!.pxPerMm).toBe(8);
    expect(json.note).toMatch(/mm/);
  });

  it('the vector drawing is in mm and marks the restored part dashed', () => {
    const r = rows.find((x) => x.id === 'lA2')!;
    const svg = strFromU8(entries[`${r.folder}/letter.svg`]);
    expect(svg).toMatch(/width="6mm" height="7mm"/); // 5 × 6 mm plus 0.5 mm each side
    expect(svg).toContain('class="restored"');
    expect(svg).toContain('stroke="#6b7280"');
    const clear = strFromU8(entries[`${rows.find((x) => x.id === 'lA1')!.folder}/letter.svg`]);
    expect(clear).not.toContain('class="restored"');
    const strokes = JSON.parse(strFromU8(entries[`${r.folder}/strokes.json`]));
    expect(strokes.strokes[1].restoredSpans).toEqual([{ from: 8, to: 21 }]);
    expect(strokes.strokes[1].mm[0]).toEqual([72 / 4, 20 / 4, 2 / 4]);
  });

  it('an uncalibrated surface leaves the mm fields empty and crops with a px margin', () => {
    const g = textFixture({ calibrated: false });
    const u = open(letterSet(g));
    const a = u.rows.find((r) => r.id === 'lA1')!;
    expect([a.x0Mm, a.widthMm, a.meanPenWidthMm, a.pxPerMm]).toEqual([null, null, null, null]);
    expect(u.json.note).toMatch(/not calibrated/);
    const crop = JSON.parse(strFromU8(u.entries[`${a.folder}/crop.json`]));
    expect([crop.x0, crop.y0, crop.x1, crop.y1]).toEqual([8, 16, 32, 44]); // box ± 2 px
    const csv = strFromU8(u.entries['letters.csv']);
    const rec = (parseCsv(csv, { columns: true }) as Record<string, string>[]).find((r) => r.id === 'lA1')!;
    expect(rec.widthMm).toBe('');
  });

  it('says plainly what is wrong with bad input', () => {
    expect(() => letterSet({ project: f.project, images: {} })).toThrow(ExportError);
    expect(() => letterSet({ project: f.project, images: {} })).toThrow(/missing/);
    expect(() => letterSet(f, { margin: -1 })).toThrow(/margin/);
    const broken = { ...f.images, 'img-verso': { bytes: new Uint8Array([137, 80, 78, 71, 1, 2, 3]), mime: 'image/png' as const } };
    expect(() => letterSet({ project: f.project, images: broken })).toThrow(/could not be decoded/);
  });
});
