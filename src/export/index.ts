/**
 * The exports, one file each (../shared/naming.md): the CLI and the editor both call
 * exportFiles, so the same project gives byte-identical files.
 */
export * from './types.ts';
export { penOutline, type PenSample, type Ring } from './outline.ts';
export { transcription, lineText, readingText, lacunaText, DOT_BELOW, WORD_DIVIDER } from './transcription.ts';
