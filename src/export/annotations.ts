/**
 * annotations.jsonld: one W3C Web Annotation per letter (Web Annotation Data Model, W3C
 * Recommendation 23 February 2017): a TextualBody with the letter's label, purpose
 * "transcribing", on a target that is the surface's first image with an SvgSelector
 * holding the letter's polygon in image px.
 *
 * The annotations travel as an AnnotationCollection whose first AnnotationPage is embedded
 * and holds them all: that is the Data Model's own form for a set of annotations (§5,
 * Collections), so a reader that knows the model needs nothing else; a bare JSON array is
 * not a form the model defines. The JSON-LD context is given once, on the collection.
 */
import type { Letter, Project } from '../doc/model.ts';
import { firstImage, letterPolygon, letterShape, lettersInReadingOrder } from './letterGeometry.ts';
import type { ExportInput } from './types.ts';
import { num, xmlAttr } from './xml.ts';

/** The Web Annotation JSON-LD context (Data Model §3.1). */
export const ANNO_CONTEXT = 'http://www.w3.org/ns/anno.jsonld';

/** IRI of the collection of a project. */
export function collectionIri(project: Pick<Project, 'id'>): string {
  return `urn:inkroute:${encodeURIComponent(project.id)}:annotations`;
}

/** IRI of a letter's annotation: `urn:inkroute:<project id>:letter:<letter id>`. */
export function letterIri(project: Pick<Project, 'id'>, letter: Pick<Letter, 'id'>): string {
  return `urn:inkroute:${encodeURIComponent(project.id)}:letter:${encodeURIComponent(letter.id)}`;
}

/** The SVG document of an SvgSelector: one polygon, points in image px. */
export function svgSelectorValue(polygon: readonly number[]): string {
  const pts: string[] = [];
  for (let i = 0; i < polygon.length; i += 2) pts.push(`${num(polygon[i], 2)},${num(polygon[i + 1], 2)}`);
  return `<svg xmlns="http://www.w3.org/2000/svg"><polygon points="${xmlAttr(pts.join(' '))}"/></svg>`;
}

/**
 * The letters as a Web Annotation collection (JSON-LD, two-space indent). One annotation
 * per letter that has strokes, in reading order; its polygon is letterPolygon of its outline
 * cut to the image. All surfaces unless `input.surfaceId` names one. The label is JSON text
 * (never markup), so any label survives; the SVG inside the selector is escaped as XML.
 * Dates: the project's modifiedAt (no clock).
 */
export function webAnnotations(input: ExportInput): string {
  const { project } = input;
  const items: unknown[] = [];
  for (const letter of lettersInReadingOrder(project, input.surfaceId)) {
    const shape = letterShape(project, letter);
    if (!shape) continue;
    const img = firstImage(shape.surface);
    const polygon = letterPolygon(shape.outline, [0, 0, img.width, img.height]);
    if (polygon.length < 6) continue;
    const anno: Record<string, unknown> = {
      id: letterIri(project, letter),
      type: 'Annotation',
      motivation: 'transcribing',
      modified: project.modifiedAt,
      body: { type: 'TextualBody', value: letter.label, format: 'text/plain', purpose: 'transcribing' },
      target: {
        source: img.file,
        type: 'Image',
        format: img.mime,
        selector: { type: 'SvgSelector', value: svgSelectorValue(polygon) },
      },
    };
    if (project.inscription.creator) anno.creator = { name: project.inscription.creator };
    items.push(anno);
  }
  const collection = {
    '@context': ANNO_CONTEXT,
    id: collectionIri(project),
    type: 'AnnotationCollection',
    label: project.title,
    total: items.length,
    first: { id: `${collectionIri(project)}:page:1`, type: 'AnnotationPage', startIndex: 0, items },
  };
  return JSON.stringify(collection, null, 2) + '\n';
}
