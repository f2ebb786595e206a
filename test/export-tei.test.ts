/**
 * transcription.tei.xml against the TEI P5 schema (tei_all.rng, validated by jing, the
 * RELAX NG validator), XML well-formedness (fast-xml-parser's validator) and the
 * facsimile's own links: every @facs names an existing zone or surface, every zone lies
 * on its surface.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { afterAll, describe, expect, it } from 'vitest';
import { teiTranscription, zoneId } from '../src/export/tei.ts';
import { ExportError } from '../src/export/types.ts';
import { NASTY_LABEL, RECTO_H, RECTO_W, textFixture } from './helpers/textExportFixture.ts';

const JING = '/usr/bin/jing';
const SCHEMA = '/work/shared/schemas/tei_all.rng';
const dir = mkdtempSync(join(tmpdir(), 'inkroute-tei-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Ray casting, even-odd: is (x, y) inside the polygon (flat x, y, …)? */
function inside(poly: number[], x: number, y: number): boolean {
  let c = false;
  for (let i = 0, j = poly.length - 2; i < poly.length; j = i, i += 2) {
    const yi = poly[i + 1], yj = poly[j + 1];
    if (yi > y !== yj > y && x < ((poly[j] - poly[i]) * (y - yi)) / (yj - yi) + poly[i]) c = !c;
  }
  return c;
}

const parsePoints = (s: string) => s.trim().split(/\s+/).flatMap((p) => p.split(',').map(Number));

interface Parsed {
  zones: Map<string, { surface: string; points: number[] }>;
  surfaces: Map<string, { ulx: number; uly: number; lrx: number; lry: number }>;
  facs: string[];
}

/** The zones, surfaces and every @facs of a TEI document, read by a real XML parser. */
function readFacsimile(xml: string): Parsed {
  const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@', preserveOrder: true, trimValues: false });
  const tree = parser.parse(xml) as unknown[];
  const out: Parsed = { zones: new Map(), surfaces: new Map(), facs: [] };
  const walk = (nodes: unknown[], surface: string | undefined) => {
    for (const node of nodes as Record<string, unknown>[]) {
      const attrs = (node[':@'] ?? {}) as Record<string, string>;
      const name = Object.keys(node).find((k) => k !== ':@')!;
      if (attrs['@facs']) out.facs.push(attrs['@facs']);
      let here = surface;
      if (name === 'surface') {
        here = attrs['@xml:id'];
        out.surfaces.set(here, { ulx: +attrs['@ulx'], uly: +attrs['@uly'], lrx: +attrs['@lrx'], lry: +attrs['@lry'] });
      }
      if (name === 'zone') out.zones.set(attrs['@xml:id'], { surface: surface!, points: parsePoints(attrs['@points']) });
      if (Array.isArray(node[name])) walk(node[name] as unknown[], here);
    }
  };
  walk(tree, undefined);
  return out;
}

describe('teiTranscription', () => {
  const f = textFixture();
  const xml = teiTranscription(f);

  it('validates against tei_all.rng with jing (several documents in one call)', () => {
    // TEI P5 Guidelines: the tei_all schema; RELAX NG (ISO/IEC 19757-2) validated by jing.
    if (!existsSync(JING)) throw new Error(`jing is not installed at ${JING}: install the Debian package "jing" to validate TEI.`);
    if (!existsSync(SCHEMA)) throw new Error(`the TEI schema is missing at ${SCHEMA}.`);
    const docs = {
      'both.xml': xml,
      'verso.xml': teiTranscription({ ...f, surfaceId: 'verso' }),
      'uncalibrated.xml': teiTranscription(textFixture({ calibrated: false })),
    };
    const files = Object.entries(docs).map(([name, text]) => {
      const path = join(dir, name);
      writeFileSync(path, text);
      return path;
    });
    const run = spawnSync(JING, [SCHEMA, ...files], { encoding: 'utf8', timeout: 120_000 });
    expect(run.error, `jing could not run: ${run.error?.message}`).toBeUndefined();
    expect(run.status, `jing reported:\n${run.stdout}${run.stderr}`).toBe(0);
  }, 130_000);

  it('the validation does fail on an invalid document (the check can fail)', () => {
    if (!existsSync(JING)) throw new Error(`jing is not installed at ${JING}.`);
    const path = join(dir, 'bad.xml');
    writeFileSync(path, xml.replace('<g type="interpunct">', '<g type="interpunct" colour="red">'));
    const run = spawnSync(JING, [SCHEMA, path], { encoding: 'utf8', timeout: 120_000 });
    expect(run.status).not.toBe(0);
    expect(run.stdout).toMatch(/colour/);
  }, 130_000);

  it('is well-formed XML and the same bytes every time', () => {
    // XML 1.0 well-formedness, checked by fast-xml-parser's XMLValidator.
    expect(XMLValidator.validate(xml)).toBe(true);
    expect(teiTranscription(f)).toBe(xml);
  });

  it('every @facs points at an existing zone or surface, and every traced letter has one zone', () => {
    const p = readFacsimile(xml);
    expect(p.surfaces.size).toBe(2);
    for (const ref of p.facs) {
      expect(ref.startsWith('#')).toBe(true);
      const id = ref.slice(1);
      expect(p.zones.has(id) || p.surfaces.has(id), `dangling @facs ${ref}`).toBe(true);
    }
    const letters = Object.values(f.project.letters);
    expect(p.zones.size).toBe(letters.length);
    for (const l of letters) expect(p.facs).toContain(`#${zoneId(l.id)}`);
    expect(p.facs.filter((r) => p.zones.has(r.slice(1))).length).toBe(letters.length);
  });

  it('every zone lies inside its surface (the letter running off the image is cut to it)', () => {
    const p = readFacsimile(xml);
    expect(p.surfaces.get('surface-recto')).toEqual({ ulx: 0, uly: 0, lrx: RECTO_W, lry: RECTO_H });
    for (const [id, z] of p.zones) {
      const s = p.surfaces.get(z.surface)!;
      expect(z.points.length, id).toBeGreaterThanOrEqual(6);
      for (let i = 0; i < z.points.length; i += 2) {
        expect(z.points[i]).toBeGreaterThanOrEqual(s.ulx);
        expect(z.points[i]).toBeLessThanOrEqual(s.lrx);
        expect(z.points[i + 1]).toBeGreaterThanOrEqual(s.uly);
        expect(z.points[i + 1]).toBeLessThanOrEqual(s.lry);
      }
    }
    // The stroke of lB3 reaches x = 202 px; its zone stops at the image's right edge.
    const edge = p.zones.get(zoneId('lB3'))!.points.filter((_, i) => i % 2 === 0);
    expect(Math.max(...edge)).toBe(RECTO_W);
  });

  it('a zone covers its letter: every centreline sample inside; separate strokes get their convex hull', () => {
    const p = readFacsimile(xml);
    for (const l of Object.values(f.project.letters)) {
      const poly = p.zones.get(zoneId(l.id))!.points;
      for (const sid of l.strokeIds) {
        for (const s of f.project.strokes[sid].samples) {
          if (s.x >= RECTO_W - 0.5) continue; // cut at the image edge
          expect(inside(poly, s.x, s.y), `${l.id} sample ${s.x},${s.y}`).toBe(true);
        }
      }
    }
    // Ξ's three bars do not touch: its zone is their convex hull, here the rectangle with
    // rounded ends around the bars: a convex polygon (every turn the same way).
    const xi = p.zones.get(zoneId('lXi'))!.points;
    let sign = 0;
    for (let i = 0; i < xi.length; i += 2) {
      const n = xi.length;
      const [ax, ay, bx, by, cx, cy] = [xi[i], xi[i + 1], xi[(i + 2) % n], xi[(i + 3) % n], xi[(i + 4) % n], xi[(i + 5) % n]];
      const cross = (bx - ax) * (cy - by) - (by - ay) * (cx - bx);
      if (Math.abs(cross) < 1e-9) continue;
      if (sign === 0) sign = Math.sign(cross);
      expect(Math.sign(cross)).toBe(sign);
    }
    // The gap between the bars (y = 25, between bars at y 21 and 30) is inside the hull.
    expect(inside(xi, 97, 25)).toBe(true);
  });

  it('writes the Leiden marks as TEI/EpiDoc elements (common practice in EpiDoc editions)', () => {
    // EpiDoc Guidelines: <unclear> for a doubtful letter, <supplied reason="lost"> for a
    // restoration (cert="low" when doubtful), <gap reason="lost" quantity unit precision="low">
    // for "c. N letters", extent="unknown" otherwise, <g type="interpunct"> for a word divider.
    expect(xml).toContain('<unclear><c facs="#zone-lB1">Β</c></unclear>');
    expect(xml).toContain('<supplied reason="lost" cert="low"><c facs="#zone-lChi">Χ</c></supplied>');
    expect(xml).toContain('<supplied reason="lost"><c facs="#zone-lA3">Α</c><c facs="#zone-lB2">Β</c></supplied>');
    expect(xml).toContain('<gap reason="lost" quantity="3" unit="character" precision="low"/>');
    expect(xml).toContain('<gap reason="lost" extent="unknown" unit="character"/>');
    expect(xml).toContain('<g type="interpunct">·</g>');
    expect(xml).toContain('<gap reason="illegible" quantity="1" unit="character" facs="#zone-lNone"/>');
    expect(xml.match(/<lb n="\d+"\/>/g)).toEqual(['<lb n="1"/>', '<lb n="2"/>', '<lb n="1"/>']);
    // The title and description are in the header, escaped; the date is the project's.
    expect(xml).toContain('<title>Sherd OT-17 &lt;from the "Orvane" terraces&gt; &amp; more</title>');
    expect(xml).toContain('<date when="2024-05-06T07:08:09.000Z">');
    expect(xml).toContain('<graphic url="images/recto-visible.png" width="200px" height="120px"');
  });

  it('a label with markup, quotes and a line break comes back as the same text', () => {
    const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@', trimValues: false, isArray: (name) => name === 'c' });
    const doc = parser.parse(xml);
    const parts = doc.TEI.text.body.div.div;
    const cs = parts[0].ab.c as { '#text': string; '@facs': string }[];
    const nasty = cs.find((c) => c['@facs'] === '#zone-lNasty')!;
    expect(nasty['#text']).toBe(NASTY_LABEL);
    expect(xml).not.toContain('<script>');
  });

  it('the finished example (traced synthetic demo) validates too, one zone per letter', async () => {
    // Extra check on solver-made strokes; the core tests above do not depend on it.
    if (!existsSync(JING)) throw new Error(`jing is not installed at ${JING}.`);
    const { finishedExample } = await import('../src/example/finished.ts');
    const ex = finishedExample('demo');
    const images: Record<string, { bytes: Uint8Array; mime: 'image/png' }> = {};
    for (const s of ex.project.surfaces) for (const r of s.images) images[r.id] = { bytes: ex.images.get(r.file)!, mime: 'image/png' };
    const text = teiTranscription({ project: ex.project, images });
    const path = join(dir, 'example.xml');
    writeFileSync(path, text);
    const run = spawnSync(JING, [SCHEMA, path], { encoding: 'utf8', timeout: 120_000 });
    expect(run.status, `jing reported:\n${run.stdout}${run.stderr}`).toBe(0);
    const p = readFacsimile(text);
    expect(p.zones.size).toBe(Object.keys(ex.project.letters).length);
    for (const ref of p.facs) expect(p.zones.has(ref.slice(1)) || p.surfaces.has(ref.slice(1))).toBe(true);
  }, 180_000);

  it('says plainly what is wrong with bad input', () => {
    expect(() => teiTranscription({ ...f, surfaceId: 'nope' })).toThrow(ExportError);
    const bare = structuredClone(f.project);
    bare.surfaces[1].images = [];
    expect(() => teiTranscription({ project: bare, images: f.images })).toThrow(/has no image/);
  });
});
