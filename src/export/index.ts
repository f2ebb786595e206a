/**
 * The exports, one file each (../shared/naming.md): the CLI and the editor both call
 * exportFiles, so the same project gives byte-identical files.
 */
export * from './types.ts';
export { penOutline, type PenSample, type Ring } from './outline.ts';
export { transcription, lineText, readingText, lacunaText, DOT_BELOW, WORD_DIVIDER } from './transcription.ts';
export { SCRIPTS, scriptPalette, scriptOrder, scriptInfo, isUnicodeLetter, LETTERS_ONLY_SCRIPTS, type ScriptInfo } from './scripts.ts';
export { teiTranscription, zoneId, teiSurfaceId } from './tei.ts';
export { webAnnotations, letterIri, svgSelectorValue, ANNO_CONTEXT } from './annotations.ts';
export { letterSet, lettersCsv, csvField, LETTER_COLUMNS, DEFAULT_MARGIN, type LetterRow } from './letterset.ts';
export { paleographicChart } from './chart.ts';
export { letterShape, letterPolygon, lettersInReadingOrder, fillNonzero, type LetterShape } from './letterGeometry.ts';
export { exportFiles, exportInputFromBundle, type ExportOptions } from './exportFiles.ts';
