/**
 * chart.svg: the paleographic chart, the table of letter forms. One row per distinct label
 * in the script's order (scriptOrder: code point order), the label at the row's start and
 * its instances side by side in reading order (surface, line, place), each drawn from its
 * pen outlines at one common scale for the whole chart: user units are mm on the object
 * (px of the images when a surface is not calibrated, which the chart then says), and the
 * document is magnified by one factor so the tallest letter prints about 20 mm high.
 * Doubtful instances get an ochre frame, restored parts a dashed slate outline; a legend,
 * a scale bar and a title complete it.
 */
import { drawnParts, letterShape, lettersInReadingOrder, transformRings, type LetterShape } from './letterGeometry.ts';
import type { Ring } from './outline.ts';
import { scriptOrder } from './scripts.ts';
import { UNLABELLED } from './transcription.ts';
import { ExportError, type ExportInput } from './types.ts';
import { num, xmlAttr, xmlText } from './xml.ts';

const INK = '#1b1b1f';
const RESTORED = '#6b7280';
const DOUBTFUL = '#b7791f';
/** Height the tallest letter is printed at, mm on paper. */
const PRINTED_LETTER_MM = 20;

function pathData(rings: readonly Ring[]): string {
  let d = '';
  for (const r of rings) {
    for (let i = 0; i < r.length; i += 2) d += `${i === 0 ? 'M' : 'L'}${num(r[i], 4)} ${num(r[i + 1], 4)}`;
    d += 'Z';
  }
  return d;
}

/** A round length for the scale bar: 1, 2 or 5 × 10ⁿ, at most `max`. */
function niceLength(max: number): number {
  const p = Math.pow(10, Math.floor(Math.log10(max)));
  for (const m of [5, 2, 1]) if (m * p <= max) return m * p;
  return p;
}

/**
 * The paleographic chart of the project's letters (all surfaces unless `input.surfaceId`
 * names one) as SVG text. Letters with no stroke are left out (they have no form).
 * Throws ExportError when there is no letter to draw.
 */
export function paleographicChart(input: ExportInput): string {
  const { project } = input;
  const shapes: LetterShape[] = [];
  for (const l of lettersInReadingOrder(project, input.surfaceId)) {
    const s = letterShape(project, l);
    if (s) shapes.push(s);
  }
  if (shapes.length === 0) throw new ExportError('There is no letter with strokes to put in the chart.');
  const inMm = shapes.every((s) => s.pxPerMm !== undefined);
  const unit = inMm ? 'mm' : 'px';
  const k = (s: LetterShape) => (inMm ? 1 / s.pxPerMm! : 1);

  // Rows: distinct labels in the script's order; instances keep reading order.
  const rows = new Map<string, LetterShape[]>();
  for (const s of shapes) {
    const list = rows.get(s.letter.label) ?? [];
    list.push(s);
    rows.set(s.letter.label, list);
  }
  const labels = [...rows.keys()].sort(scriptOrder);

  let tallest = 0;
  for (const s of shapes) tallest = Math.max(tallest, (s.boxPx[3] - s.boxPx[1]) * k(s));
  const u = tallest; // the chart's module: everything is laid out in letter heights
  const pad = 0.25 * u, gap = 0.4 * u, rowH = 1.7 * u, line = 0.02 * u;
  const titleH = 1.2 * u;
  // Text widths estimated at 0.6 em a character (no font metrics without a DOM): the label
  // column fits the longest label, the chart the title.
  const chars = (t: string) => [...t].length;
  const labelW = Math.max(1.4 * u, pad + 0.6 * 0.6 * u * Math.max(...labels.map((l) => chars(l || UNLABELLED))) + 0.4 * u);
  const body: string[] = [];
  let width = 0;
  let y = titleH;
  for (const label of labels) {
    const list = rows.get(label)!;
    const cy = y + rowH / 2;
    body.push(`<g class="row" data-label="${xmlAttr(label)}" data-count="${list.length}">`);
    body.push(`<text class="label" x="${num(pad, 4)}" y="${num(cy + 0.2 * u, 4)}" font-size="${num(0.6 * u, 4)}">${xmlText(label || UNLABELLED)}</text>`);
    let x = labelW;
    for (const s of list) {
      const f = k(s);
      const [bx0, by0, bx1, by1] = s.boxPx;
      const w = (bx1 - bx0) * f, h = (by1 - by0) * f;
      // The letter's box goes to (x, cy − h/2): one translation, no scaling (common scale).
      const tx = x - bx0 * f, ty = cy - h / 2 - by0 * f;
      body.push(`<g class="instance" data-letter="${xmlAttr(s.letter.id)}" data-reading="${s.letter.reading}" transform="translate(${num(tx, 4)} ${num(ty, 4)})">`);
      const parts = drawnParts(s);
      const inked = transformRings(parts.inked, f);
      const restored = transformRings(parts.restored, f);
      if (inked.length) body.push(`<path class="inked" fill="${INK}" fill-rule="nonzero" d="${pathData(inked)}"/>`);
      if (restored.length) {
        body.push(`<path class="restored" fill="none" stroke="${RESTORED}" stroke-width="${num(line, 4)}" stroke-dasharray="${num(line * 4, 4)} ${num(line * 3, 4)}" d="${pathData(restored)}"/>`);
      }
      if (s.letter.reading === 'doubtful') {
        const m = 0.08 * u;
        body.push(`<rect class="doubtful" x="${num(bx0 * f - m, 4)}" y="${num(by0 * f - m, 4)}" width="${num(w + 2 * m, 4)}" height="${num(h + 2 * m, 4)}" fill="none" stroke="${DOUBTFUL}" stroke-width="${num(2 * line, 4)}"/>`);
      }
      body.push('</g>');
      const place = `${project.surfaces.length > 1 ? s.surface.name + ' ' : ''}${s.letter.line}.${s.letter.order}`;
      body.push(`<text class="place" x="${num(x + w / 2, 4)}" y="${num(cy + h / 2 + 0.3 * u, 4)}" font-size="${num(0.2 * u, 4)}" text-anchor="middle">${xmlText(place)}</text>`);
      x += w + gap;
    }
    body.push('</g>');
    width = Math.max(width, x);
    y += rowH;
  }
  const title = `${project.title || 'Untitled inscription'} — paleographic chart`;
  width = Math.max(width, 8 * u, 2 * pad + 0.6 * 0.45 * u * chars(title));

  // Legend and scale bar under the rows.
  const ly = y + 0.5 * u;
  const sw = 0.5 * u;
  const legend = [
    '<g class="legend">',
    `<rect x="${num(pad, 4)}" y="${num(ly, 4)}" width="${num(sw, 4)}" height="${num(sw, 4)}" fill="none" stroke="${DOUBTFUL}" stroke-width="${num(2 * line, 4)}"/>`,
    `<text x="${num(pad + sw * 1.4, 4)}" y="${num(ly + sw * 0.8, 4)}" font-size="${num(0.3 * u, 4)}">doubtful reading</text>`,
    `<rect x="${num(pad + 4 * u, 4)}" y="${num(ly, 4)}" width="${num(sw, 4)}" height="${num(sw, 4)}" fill="none" stroke="${RESTORED}" stroke-width="${num(line, 4)}" stroke-dasharray="${num(line * 4, 4)} ${num(line * 3, 4)}"/>`,
    `<text x="${num(pad + 4 * u + sw * 1.4, 4)}" y="${num(ly + sw * 0.8, 4)}" font-size="${num(0.3 * u, 4)}">restored</text>`,
    '</g>',
  ];
  const barLen = niceLength(Math.max(Math.min(width / 2, 4 * u), 1e-6));
  const by = ly + 1.2 * u;
  const bar = [
    `<g class="scale-bar" data-length="${barLen}" data-unit="${unit}">`,
    `<rect x="${num(pad, 4)}" y="${num(by, 4)}" width="${num(barLen, 4)}" height="${num(0.06 * u, 4)}" fill="${INK}"/>`,
    `<text x="${num(pad, 4)}" y="${num(by + 0.45 * u, 4)}" font-size="${num(0.3 * u, 4)}">${barLen} ${unit}${inMm ? '' : ' (not calibrated: image px)'}</text>`,
    '</g>',
  ];
  const height = by + 0.8 * u;
  // One magnification for the whole document: the tallest letter prints PRINTED_LETTER_MM high.
  const zoom = inMm ? PRINTED_LETTER_MM / u : 1;
  const docUnit = inMm ? 'mm' : 'px';
  const subtitle = inMm
    ? `Units: mm on the object; drawn at ${num(zoom, 2)}:1.`
    : 'Not calibrated: drawn in image px, sizes of different surfaces not comparable.';
  const out = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${num(width * zoom, 2)}${docUnit}" height="${num(height * zoom, 2)}${docUnit}" viewBox="0 0 ${num(width, 4)} ${num(height, 4)}" font-family="sans-serif" data-unit="${unit}">`,
    `<title>${xmlText(title)}</title>`,
    `<desc>${xmlText(subtitle)}</desc>`,
    `<text class="title" x="${num(pad, 4)}" y="${num(0.55 * u, 4)}" font-size="${num(0.45 * u, 4)}">${xmlText(title)}</text>`,
    `<text class="subtitle" x="${num(pad, 4)}" y="${num(0.95 * u, 4)}" font-size="${num(0.25 * u, 4)}">${xmlText(subtitle)}</text>`,
    ...body,
    ...legend,
    ...bar,
    '</svg>',
  ];
  return out.join('\n') + '\n';
}
