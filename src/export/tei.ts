/**
 * transcription.tei.xml: the text as a TEI P5 document with a facsimile, in the manner of
 * EpiDoc editions (common practice for epigraphic TEI). Each letter is a `<c>` pointing by
 * @facs at its zone on the surface; Leiden's marks become TEI elements: a doubtful reading
 * `<unclear>`, restored letters `<supplied reason="lost">` (one around each run, as Leiden
 * brackets a run), a lacuna `<gap reason="lost">`, a letter traced but not yet labelled
 * `<gap reason="illegible" quantity="1" unit="character">` and a word divider
 * `<g type="interpunct">·</g>` (EpiDoc's word-divider form; `<g>` is TEI's element for a
 * non-standard character or glyph).
 */
import { textLines } from '../doc/layout.ts';
import type { Letter, Project, Surface } from '../doc/model.ts';
import { firstImage, letterPolygon, letterShape } from './letterGeometry.ts';
import { WORD_DIVIDER } from './transcription.ts';
import { ExportError, type ExportInput } from './types.ts';
import { num, xmlAttr, xmlText } from './xml.ts';

/** An xml:id from our ids: NCName characters only (TEI requires xml:id to be an NCName). */
function ncName(prefix: string, id: string): string {
  return prefix + id.replace(/[^A-Za-z0-9._-]/g, (c) => '_' + c.codePointAt(0)!.toString(16));
}

/** Id of a letter's zone in the TEI facsimile. */
export function zoneId(letterId: string): string {
  return ncName('zone-', letterId);
}

/** Id of a surface in the TEI facsimile. */
export function teiSurfaceId(surfaceId: string): string {
  return ncName('surface-', surfaceId);
}

function surfacesOf(project: Project, surfaceId?: string): Surface[] {
  if (surfaceId === undefined) return project.surfaces;
  const s = project.surfaces.find((x) => x.id === surfaceId);
  if (!s) throw new ExportError(`The project has no surface "${surfaceId}".`);
  return [s];
}

function letterElement(letter: Letter, facs: string | undefined): string {
  const at = facs ? ` facs="#${facs}"` : '';
  if (!letter.label) return `<gap reason="illegible" quantity="1" unit="character"${at}/>`;
  return `<c${at}>${xmlText(letter.label)}</c>`;
}

/**
 * The project as TEI P5 XML: header (title, publication with the project's modified date,
 * the object described by the project's title and description), a `<facsimile>` with one
 * `<surface>` per surface (its first image's size in px, a `<graphic>` and one `<zone>` per
 * letter; see letterPolygon for how the zone's polygon is chosen, cut to the image), and
 * the edition, one `<div type="textpart">` per surface and `<lb n="N"/>` per line.
 * All surfaces unless `input.surfaceId` names one. Deterministic: no clock.
 */
export function teiTranscription(input: ExportInput): string {
  const { project } = input;
  const surfaces = surfacesOf(project, input.surfaceId);
  const ins = project.inscription;
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push('<TEI xmlns="http://www.tei-c.org/ns/1.0">');
  out.push(' <teiHeader>');
  out.push('  <fileDesc>');
  out.push('   <titleStmt>');
  out.push(`    <title>${xmlText(project.title || 'Untitled inscription')}</title>`);
  if (ins.creator) out.push(`    <respStmt><resp>facsimile and transcription</resp><name>${xmlText(ins.creator)}</name></respStmt>`);
  out.push('   </titleStmt>');
  out.push('   <publicationStmt>');
  out.push(`    <p>Exported from an inkroute project, last changed <date when="${xmlAttr(project.modifiedAt)}">${xmlText(project.modifiedAt.slice(0, 10))}</date>.</p>`);
  out.push('   </publicationStmt>');
  out.push('   <sourceDesc>');
  out.push(`    <p>${xmlText(project.title || 'Untitled inscription')}${ins.description ? ': ' + xmlText(ins.description) : ''}</p>`);
  out.push('   </sourceDesc>');
  out.push('  </fileDesc>');
  out.push('  <encodingDesc>');
  out.push(`   <p>Coordinates are pixels of each surface's first image. Script: ${xmlText(ins.script)}, written ${ins.direction === 'rtl' ? 'right to left' : 'left to right'}.</p>`);
  out.push('  </encodingDesc>');
  out.push(' </teiHeader>');

  const zoned = new Set<string>();
  out.push(' <facsimile>');
  for (const surface of surfaces) {
    const img = firstImage(surface);
    out.push(`  <surface xml:id="${teiSurfaceId(surface.id)}" n="${xmlAttr(surface.name)}" ulx="0" uly="0" lrx="${img.width}" lry="${img.height}">`);
    out.push(`   <graphic url="${xmlAttr(img.file)}" width="${img.width}px" height="${img.height}px" mimeType="${img.mime}"/>`);
    for (const line of textLines(project, surface.id)) {
      for (const item of line.items) {
        if (item.kind !== 'letter') continue;
        const shape = letterShape(project, item.letter);
        if (!shape) continue;
        const poly = letterPolygon(shape.outline, [0, 0, img.width, img.height]);
        if (poly.length < 6) continue;
        const pts: string[] = [];
        for (let i = 0; i < poly.length; i += 2) pts.push(`${num(poly[i], 2)},${num(poly[i + 1], 2)}`);
        out.push(`   <zone xml:id="${zoneId(item.letter.id)}" points="${pts.join(' ')}"/>`);
        zoned.add(item.letter.id);
      }
    }
    out.push('  </surface>');
  }
  out.push(' </facsimile>');

  out.push(' <text>');
  out.push('  <body>');
  out.push('   <div type="edition">');
  for (const surface of surfaces) {
    out.push(`    <div type="textpart" n="${xmlAttr(surface.name)}" facs="#${teiSurfaceId(surface.id)}">`);
    out.push('     <ab>');
    for (const line of textLines(project, surface.id)) {
      let s = `      <lb n="${line.line}"/>`;
      // An open <supplied> run and its certainty: restored letters of one certainty share it.
      let open: 'clear' | 'doubtful' | undefined;
      const close = () => {
        if (open) s += '</supplied>';
        open = undefined;
      };
      for (const item of line.items) {
        if (item.kind === 'mark') {
          close();
          const m = item.mark;
          if (m.kind === 'divider') s += `<g type="interpunct">${WORD_DIVIDER}</g>`;
          else if (m.lost === undefined) s += '<gap reason="lost" extent="unknown" unit="character"/>';
          else s += `<gap reason="lost" quantity="${m.lost}" unit="character" precision="low"/>`;
          continue;
        }
        const l = item.letter;
        const el = letterElement(l, zoned.has(l.id) ? zoneId(l.id) : undefined);
        if (l.restored) {
          // A restored letter of doubtful reading: a restoration of low certainty (EpiDoc).
          if (open !== l.reading) {
            close();
            s += l.reading === 'doubtful' ? '<supplied reason="lost" cert="low">' : '<supplied reason="lost">';
            open = l.reading;
          }
          s += el;
        } else {
          close();
          s += l.reading === 'doubtful' && l.label ? `<unclear>${el}</unclear>` : el;
        }
      }
      close();
      out.push(s);
    }
    out.push('     </ab>');
    out.push('    </div>');
  }
  out.push('   </div>');
  out.push('  </body>');
  out.push(' </text>');
  out.push('</TEI>');
  return out.join('\n') + '\n';
}
