/**
 * The true-scale SVG facsimile (`facsimile.svg`). `width`/`height` carry the size on paper
 * in mm (object size × scale) and the viewBox is in object mm, so at 1:1 one user unit is
 * one millimetre of the object. One `<g>` per layer, each with a `<title>`: the photo
 * (optional, embedded as a data: URI), the inked strokes (pen outlines filled ink black,
 * nonzero), the restored spans (slate: a dashed outer edge, or a fill), letter labels and
 * line numbers (optional), the scale bar. Dublin Core in `<metadata>`. No script, no event
 * attribute, no external reference; all user text goes through xml.ts. Deterministic: the
 * same project gives the same bytes.
 */
import { facsimileDrawing, INK_COLOUR, RESTORED_COLOUR, type DrawingText, type FacsimileDrawing } from './drawing.ts';
import type { Ring } from './outline.ts';
import type { ExportInput, FacsimileOptions } from './types.ts';
import { num, xmlAttr, xmlText } from './xml.ts';

/** What every facsimile says of itself (visible in its description). */
export const INTERPRETATION_NOTE =
  'This facsimile is an interpretation of the inscription, traced stroke by stroke; restored spans (slate) are the editor\'s and not supported by visible ink.';

/** Path coordinates are written in µm (integers, inside a group scaled by 1/1000): exact to
 * 1 µm of the object and much quicker to write than decimals. */
const UM = 1000;
const UM_SCALE = 'scale(0.001)';

/** Path data of rings (coordinates in mm, written in µm): one closed subpath each. */
export function pathData(rings: readonly Ring[]): string {
  const parts: string[] = [];
  for (const r of rings) {
    if (r.length < 6) continue;
    let x0 = Math.round(r[0] * UM), y0 = Math.round(r[1] * UM);
    let d = 'M' + x0 + ' ' + y0 + 'l';
    // Relative steps: shorter numbers for the neighbouring corners of an outline.
    for (let i = 2; i < r.length; i += 2) {
      const x = Math.round(r[i] * UM), y = Math.round(r[i + 1] * UM);
      d += (x - x0) + ' ' + (y - y0) + ' ';
      x0 = x; y0 = y;
    }
    parts.push(d + 'z');
  }
  return parts.join('');
}

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/** Base64 (RFC 4648 §4) of bytes. */
export function base64(bytes: Uint8Array): string {
  const out: string[] = [];
  let chunk = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i], b = bytes[i + 1], d = bytes[i + 2];
    const n = (a << 16) | ((b ?? 0) << 8) | (d ?? 0);
    chunk += B64[(n >> 18) & 63] + B64[(n >> 12) & 63] + (b === undefined ? '=' : B64[(n >> 6) & 63]) + (d === undefined ? '=' : B64[n & 63]);
    if (chunk.length >= 8192) { out.push(chunk); chunk = ''; }
  }
  out.push(chunk);
  return out.join('');
}

function text(t: DrawingText, cls: string): string {
  return `<text class="${cls}" x="${num(t.x)}" y="${num(t.y)}" font-size="${num(t.size)}" text-anchor="${t.anchor}">${xmlText(t.text)}</text>`;
}

function metadata(d: FacsimileDrawing, description: string): string {
  const p = d.project;
  const sources = d.surface.images.map((i) => i.file).join('; ');
  return '<metadata><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#" xmlns:dc="http://purl.org/dc/elements/1.1/">' +
    '<rdf:Description rdf:about="">' +
    `<dc:title>${xmlText(p.title)}</dc:title>` +
    `<dc:description>${xmlText(description)}</dc:description>` +
    `<dc:creator>${xmlText(p.inscription.creator)}</dc:creator>` +
    `<dc:date>${xmlText(p.modifiedAt)}</dc:date>` +
    '<dc:format>image/svg+xml</dc:format>' +
    '<dc:type>Image</dc:type>' +
    `<dc:source>${xmlText(sources)}</dc:source>` +
    '</rdf:Description></rdf:RDF></metadata>';
}

/** The SVG of an already built drawing (see facsimileSvg). */
export function drawingSvg(d: FacsimileDrawing): string {
  const W = d.widthMm, H = d.heightMm;
  const p = d.project;
  const surfaceText = `${d.surface.name}, ${num(W, 1)} × ${num(H, 1)} mm, drawn at ${num(d.scale)}:1`;
  const description = [p.inscription.description, surfaceText, INTERPRETATION_NOTE].filter((s) => s).join(' — ');
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>\n');
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${num(W * d.scale)}mm" height="${num(H * d.scale)}mm" ` +
    `viewBox="0 0 ${num(W)} ${num(H)}">\n`);
  out.push(`<title>${xmlText(p.title)}</title>\n<desc>${xmlText(description)}</desc>\n`);
  out.push(metadata(d, description) + '\n');
  if (d.photo) {
    const href = `data:${d.photo.mime};base64,${base64(d.photo.bytes)}`;
    const pw = d.photo.ref.width / d.pxPerMm, ph = d.photo.ref.height / d.pxPerMm;
    out.push(`<g id="photo"><title>Photo: ${xmlText(d.photo.ref.band)} (${xmlText(d.photo.ref.file)})</title>` +
      `<image x="0" y="0" width="${num(pw)}" height="${num(ph)}" preserveAspectRatio="none" href="${xmlAttr(href)}"/></g>\n`);
  }
  out.push(`<g id="ink"><title>Inked strokes</title><path transform="${UM_SCALE}" fill="${INK_COLOUR}" fill-rule="nonzero" d="${pathData(d.ink)}"/></g>\n`);
  if (d.restoredStyle === 'grey') {
    out.push(`<g id="restored"><title>Restored spans (the editor's)</title><path transform="${UM_SCALE}" fill="${RESTORED_COLOUR}" fill-rule="nonzero" d="${pathData(d.restoredFill)}"/></g>\n`);
  } else {
    out.push(`<g id="restored"><title>Restored spans (the editor's)</title><path transform="${UM_SCALE}" fill="none" stroke="${RESTORED_COLOUR}" ` +
      `stroke-width="${num(d.line.width * UM, 1)}" stroke-dasharray="${num(d.line.dash * UM, 1)} ${num(d.line.gap * UM, 1)}" stroke-linejoin="round" d="${pathData(d.restoredEdge)}"/></g>\n`);
  }
  const font = 'font-family="serif" fill="#1b1b1f"';
  if (d.labels.length) out.push(`<g id="labels" ${font}><title>Letter labels</title>${d.labels.map((t) => text(t, 'label')).join('')}</g>\n`);
  if (d.lineNumbers.length) out.push(`<g id="line-numbers" ${font}><title>Line numbers</title>${d.lineNumbers.map((t) => text(t, 'line-number')).join('')}</g>\n`);
  if (d.scaleBar) {
    const b = d.scaleBar;
    out.push(`<g id="scale-bar" ${font}><title>Scale bar: ${num(b.lengthMm)} mm</title>` +
      `<rect x="${num(b.x)}" y="${num(b.y)}" width="${num(b.width)}" height="${num(b.height)}" fill="${INK_COLOUR}"/>${text(b.label, 'scale-label')}</g>\n`);
  }
  out.push('</svg>\n');
  return out.join('');
}

/**
 * The SVG facsimile of a surface (default the first), true to size. Options: `scale`
 * (default 1), `restoredStyle` ('dashed' default, or 'grey'), `labels` and `lineNumbers`
 * (default off), `scaleBarMm` (default a round length near a fifth of the object's width;
 * 0 for none), `photoImageId` (default none). Hidden strokes are left out. Throws
 * ExportError for an uncalibrated surface.
 */
export function facsimileSvg(input: ExportInput, opts: FacsimileOptions = {}): string {
  return drawingSvg(facsimileDrawing(input, opts));
}
