/**
 * annotations.jsonld against the W3C Web Annotation Data Model (W3C Recommendation 2017):
 * the collection and page forms (§5), the required fields of an annotation (§3.1), the
 * TextualBody (§3.2.4) and the SvgSelector (§4.2.8), whose value must be an SVG document.
 */
import { Clipper, FillRule } from 'clipper2-ts';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { webAnnotations } from '../src/export/annotations.ts';
import { letterPolygon, letterShape } from '../src/export/letterGeometry.ts';
import { NASTY_LABEL, RECTO_W, textFixture } from './helpers/textExportFixture.ts';

type Anno = {
  id: string; type: string; body: Record<string, string>;
  target: { source: string; selector: { type: string; value: string } };
};

const polyArea = (p: number[]) => {
  let a = 0;
  for (let i = 0, j = p.length - 2; i < p.length; j = i, i += 2) a += p[j] * p[i + 1] - p[i] * p[j + 1];
  return Math.abs(a / 2);
};

describe('webAnnotations', () => {
  const f = textFixture();
  const text = webAnnotations(f);
  const doc = JSON.parse(text);
  const items: Anno[] = doc.first.items;

  it('is an AnnotationCollection with its first AnnotationPage embedded (Data Model §5)', () => {
    // W3C Web Annotation Data Model §3.1: the context IRI; §5.1/§5.2: collection and page.
    expect(doc['@context']).toBe('http://www.w3.org/ns/anno.jsonld');
    expect(doc.type).toBe('AnnotationCollection');
    expect(typeof doc.id).toBe('string');
    expect(doc.total).toBe(Object.keys(f.project.letters).length);
    expect(doc.first.type).toBe('AnnotationPage');
    expect(doc.first.startIndex).toBe(0);
    expect(items.length).toBe(doc.total);
    expect(webAnnotations(f)).toBe(text);
  });

  it('each annotation has the required fields: id (an IRI), type, body, target', () => {
    // Data Model §3.1: an Annotation MUST have exactly 1 IRI id, type "Annotation", and 1 or more targets.
    const ids = new Set<string>();
    for (const a of items) {
      expect(a.id).toMatch(/^urn:inkroute:[^\s]+:letter:[^\s]+$/);
      expect(() => new URL(a.id)).not.toThrow(); // a syntactically valid absolute IRI
      ids.add(a.id);
      expect(a.type).toBe('Annotation');
      // §3.2.4 Embedded Textual Body: type TextualBody, value, format; §3.3.5 purpose.
      expect(a.body.type).toBe('TextualBody');
      expect(typeof a.body.value).toBe('string');
      expect(a.body.format).toBe('text/plain');
      expect(a.body.purpose).toBe('transcribing');
      // §4 Specific Resources: source and selector; §4.2.8 SvgSelector.
      expect(a.target.source).toMatch(/^images\/.+\.png$/);
      expect(a.target.selector.type).toBe('SvgSelector');
    }
    expect(ids.size).toBe(items.length);
    expect(items.find((a) => a.id.endsWith(':letter:lA1'))!.target.source).toBe('images/recto-visible.png');
    expect(items.find((a) => a.id.endsWith(':letter:lA4'))!.target.source).toBe('images/verso.png');
  });

  it('the SvgSelector value is well-formed SVG whose polygon is the letter outline polygon', () => {
    const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@' });
    for (const a of items) {
      const svg = a.target.selector.value;
      expect(XMLValidator.validate(svg), svg.slice(0, 80)).toBe(true);
      const parsed = parser.parse(svg);
      expect(parsed.svg['@xmlns']).toBe('http://www.w3.org/2000/svg');
      const pts = (parsed.svg.polygon['@points'] as string).trim().split(/\s+/).flatMap((p) => p.split(',').map(Number));
      const letterId = decodeURIComponent(a.id.split(':letter:')[1]);
      const letter = f.project.letters[letterId];
      const shape = letterShape(f.project, letter)!;
      const img = shape.surface.images[0];
      const expected = letterPolygon(shape.outline, [0, 0, img.width, img.height]);
      expect(pts.length).toBe(expected.length);
      for (let i = 0; i < pts.length; i++) expect(Math.abs(pts[i] - expected[i])).toBeLessThanOrEqual(0.005 + 1e-9); // written with 2 decimals
      // Independent of our own code: for a connected letter inside the image the polygon's
      // area is the area of the outer boundary of clipper2's union of the pen disks.
      if (['lA1', 'lB1', 'lChi', 'lNone', 'lA4'].includes(letterId)) {
        const raw = shape.strokes.flatMap((st) => {
          const rings = [];
          // Disks as 64-gons, straight from the samples (not through penOutline).
          for (const s of st.samples) {
            const ring = [];
            for (let k = 0; k < 64; k++) ring.push({ x: s.x + s.r * Math.cos((k * Math.PI) / 32), y: s.y + s.r * Math.sin((k * Math.PI) / 32) });
            rings.push(ring);
          }
          return rings;
        });
        const union = Clipper.unionD(raw, [], FillRule.NonZero, 3);
        // The zone keeps the outer boundary only (a counter such as Α's is not cut out):
        // sum the outer rings, which clipper orients like the largest one.
        const areas = union.map((p) => Clipper.areaD(p));
        const big = areas.reduce((m, a) => (Math.abs(a) > Math.abs(m) ? a : m), 0);
        const unionArea = areas.filter((a) => Math.sign(a) === Math.sign(big)).reduce((s, a) => s + Math.abs(a), 0);
        // Samples lie ≤ 1 px apart, so the disks alone leave notches smaller than 1 % of the area.
        expect(Math.abs(polyArea(pts) - unionArea) / unionArea).toBeLessThan(0.02);
      }
    }
  });

  it('the polygon of a letter off the image edge stays on the image', () => {
    const a = items.find((x) => x.id.endsWith(':letter:lB3'))!;
    const xs = a.target.selector.value.match(/points="([^"]+)"/)![1].split(' ').map((p) => Number(p.split(',')[0]));
    expect(Math.max(...xs)).toBeLessThanOrEqual(RECTO_W);
  });

  it('labels with quotes and <script> survive as text', () => {
    const a = items.find((x) => x.id.endsWith(':letter:lNasty'))!;
    expect(a.body.value).toBe(NASTY_LABEL);
    // The JSON stays text: no raw markup from a label can end up inside the SVG selector.
    for (const x of items) expect(x.target.selector.value).not.toContain('<script');
    expect(items.find((x) => x.id.endsWith(':letter:lNone'))!.body.value).toBe('');
  });
});
