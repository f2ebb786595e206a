/**
 * chart.svg, the paleographic chart: well-formed (fast-xml-parser's validator), one row per
 * distinct label in code point order, every instance present, all drawn at one scale (a
 * known stroke's drawn width against its width in mm), doubtful instances framed in ochre.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { paleographicChart } from '../src/export/chart.ts';
import { ExportError } from '../src/export/types.ts';
import { NASTY_LABEL, textFixture } from './helpers/textExportFixture.ts';

type Node = Record<string, unknown>;
const parser = new XMLParser({
  ignoreAttributes: false, attributeNamePrefix: '@', trimValues: false, htmlEntities: true, // decodes &#10; (XML 1.0 §4.1 character references)
  isArray: (name) => ['g', 'path', 'rect', 'text'].includes(name),
});

/** Subpaths of an SVG path made of M/L/Z with absolute coordinates: their boxes. */
function subpathBoxes(d: string): [number, number, number, number][] {
  return d.split('Z').filter((s) => s.trim()).map((sub) => {
    const v = sub.replace(/[ML]/g, ' ').trim().split(/\s+/).map(Number);
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (let i = 0; i < v.length; i += 2) {
      x0 = Math.min(x0, v[i]); x1 = Math.max(x1, v[i]);
      y0 = Math.min(y0, v[i + 1]); y1 = Math.max(y1, v[i + 1]);
    }
    return [x0, y0, x1, y1];
  });
}

describe('paleographicChart', () => {
  const f = textFixture();
  const svg = paleographicChart(f);
  const doc = parser.parse(svg);
  const rows = (doc.svg.g as Node[]).filter((g) => g['@class'] === 'row');

  it('is well-formed SVG with a title, a legend and a scale bar, the same every time', () => {
    expect(XMLValidator.validate(svg)).toBe(true); // XML 1.0 well-formedness
    expect(doc.svg['@xmlns']).toBe('http://www.w3.org/2000/svg');
    expect(doc.svg.title).toContain('paleographic chart');
    const groups = doc.svg.g as Node[];
    const legend = groups.find((g) => g['@class'] === 'legend')!;
    expect((legend.text as Node[]).map((t) => t['#text'])).toEqual(['doubtful reading', 'restored']);
    const bar = groups.find((g) => g['@class'] === 'scale-bar')!;
    expect(bar['@data-unit']).toBe('mm');
    // The bar's drawn length equals its stated length in user units (1 unit = 1 mm).
    expect(Number((bar.rect as Node[])[0]['@width'])).toBe(Number(bar['@data-length']));
    expect((bar.text as Node[])[0]['#text']).toBe(`${bar['@data-length']} mm`);
    expect(paleographicChart(f)).toBe(svg);
  });

  it('one row per distinct label, in code point order, the unlabelled last', () => {
    // Code point order (Unicode Standard: U+0391 Α < U+0392 Β < U+039E Ξ < U+03A7 Χ), and
    // the label starting with "a" (U+0061) before them all.
    const labels = rows.map((r) => r['@data-label']);
    expect(labels).toEqual([NASTY_LABEL, 'Α', 'Β', 'Ξ', 'Χ', '']);
    expect((rows[0].text as Node[])[0]['#text']).toBe(NASTY_LABEL); // escaped on the way, text on return
    expect(svg).not.toContain('<script>');
    expect((rows[5].text as Node[])[0]['#text']).toBe('?');
  });

  it('each row holds the project\'s instances of its label, in reading order', () => {
    const byLabel = new Map<string, string[]>();
    const rank = (id: string) => {
      const l = f.project.letters[id];
      return [f.project.surfaces.findIndex((s) => s.id === l.surfaceId), l.line, l.order];
    };
    for (const l of Object.values(f.project.letters)) byLabel.set(l.label, [...(byLabel.get(l.label) ?? []), l.id]);
    for (const row of rows) {
      const ids = (row.g as Node[]).map((g) => g['@data-letter'] as string);
      const expected = byLabel.get(row['@data-label'] as string)!.sort((a, b) => {
        const [ra, rb] = [rank(a), rank(b)];
        return ra[0] - rb[0] || ra[1] - rb[1] || ra[2] - rb[2];
      });
      expect(ids).toEqual(expected);
      expect(Number(row['@data-count'])).toBe(expected.length);
    }
    expect(rows.find((r) => r['@data-label'] === 'Α')!.g).toHaveLength(4);
  });

  it('draws every instance at one scale: widths in user units equal widths in mm on the object', () => {
    const inst = (id: string) => rows.flatMap((r) => r.g as Node[]).find((g) => g['@data-letter'] === id)!;
    const inkedBoxes = (id: string) => subpathBoxes(((inst(id).path as Node[]).find((p) => p['@class'] === 'inked'))!['@d'] as string);
    // The first Α on the recto (4 px/mm) is 20 px = 5 mm wide; the Α on the verso (8 px/mm)
    // is 40 px = 5 mm wide: both must be drawn 5 units wide (within the outline's 0.1 px).
    for (const [id, k] of [['lA1', 4], ['lA4', 8]] as const) {
      const boxes = inkedBoxes(id);
      const w = Math.max(...boxes.map((b) => b[2])) - Math.min(...boxes.map((b) => b[0]));
      expect(Math.abs(w - 5)).toBeLessThan(0.2 / k + 1e-3);
    }
    // A known stroke: Ξ's middle bar, r = 1.5 px at 4 px/mm, is 0.75 mm thick, drawn 0.75 units.
    const xi = inkedBoxes('lXi').sort((a, b) => a[1] - b[1]);
    expect(xi).toHaveLength(3); // three separate bars
    expect(Math.abs(xi[1][3] - xi[1][1] - 0.75)).toBeLessThan(0.2 / 4 + 1e-3);
    // and 10 px long plus its round ends, 13 px = 3.25 mm.
    expect(Math.abs(xi[1][2] - xi[1][0] - 3.25)).toBeLessThan(0.2 / 4 + 1e-3);
    // No instance is scaled: their groups are translated only.
    for (const g of rows.flatMap((r) => r.g as Node[])) expect(g['@transform']).toMatch(/^translate\([-\d.]+ [-\d.]+\)$/);
  });

  it('frames doubtful instances in ochre and dashes restored parts in slate', () => {
    const all = rows.flatMap((r) => r.g as Node[]);
    for (const g of all) {
      const letter = f.project.letters[g['@data-letter'] as string];
      const frames = ((g.rect as Node[] | undefined) ?? []).filter((r) => r['@class'] === 'doubtful');
      expect(frames.length, letter.id).toBe(letter.reading === 'doubtful' ? 1 : 0);
      if (frames.length) expect(frames[0]['@stroke']).toBe('#b7791f');
    }
    // lA2 has a restored span: a dashed slate path with no fill.
    const a2 = all.find((g) => g['@data-letter'] === 'lA2')!;
    const restored = (a2.path as Node[]).find((p) => p['@class'] === 'restored')!;
    expect(restored['@stroke']).toBe('#6b7280');
    expect(restored['@fill']).toBe('none');
    expect(restored['@stroke-dasharray']).toBeTruthy();
    expect((a2.path as Node[]).some((p) => p['@class'] === 'inked')).toBe(true);
    // A letter marked restored (lA3, supplied by the editor) is drawn wholly dashed, unfilled.
    const a3 = all.find((g) => g['@data-letter'] === 'lA3')!;
    expect((a3.path as Node[]).map((p) => p['@class'])).toEqual(['restored']);
  });

  it('works in px with a note when a surface is not calibrated; no letters is an ExportError', () => {
    const g = textFixture({ calibrated: false });
    const s = paleographicChart(g);
    expect(XMLValidator.validate(s)).toBe(true);
    expect(s).toContain('data-unit="px"');
    expect(s).toMatch(/not calibrated/i);
    expect(() => paleographicChart({ ...f, project: { ...f.project, letters: {} } })).toThrow(ExportError);
  });
});
