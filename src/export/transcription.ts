/**
 * The plain transcription of a surface, line by line, with the Leiden marks of the trade
 * (common practice in epigraphic editions, the Leiden conventions of 1931): a combining
 * dot below (U+0323) under each character of a doubtful reading, square brackets around
 * restored letters (one pair around a run of them), `[...]` for a lacuna of unknown
 * extent and `[c.N]` for one of about N lost letters; a word divider is written `·`.
 */
import { textLines, type TextLine } from '../doc/layout.ts';
import type { Letter, Project } from '../doc/model.ts';

export const DOT_BELOW = '\u0323';
export const WORD_DIVIDER = '\u00b7';
/** A letter with no label yet; it still takes its place in the line. */
export const UNLABELLED = '?';

/** The label with a dot below each base character when the reading is doubtful. */
export function readingText(letter: Pick<Letter, 'label' | 'reading'>): string {
  const label = letter.label || UNLABELLED;
  if (letter.reading !== 'doubtful') return label;
  // One dot below per character: after a base character and the marks that follow it.
  let out = '';
  const chars = [...label.normalize('NFC')];
  for (let i = 0; i < chars.length; i++) {
    out += chars[i];
    const next = chars[i + 1];
    if (!(next && /\p{M}/u.test(next))) out += DOT_BELOW;
  }
  return out;
}

/** The lacuna as Leiden writes it. */
export function lacunaText(lost: number | undefined): string {
  return lost === undefined ? '[...]' : `[c.${lost}]`;
}

/** One line as plain text. */
export function lineText(line: TextLine): string {
  let out = '';
  let open = false;
  for (const item of line.items) {
    const restored = item.kind === 'letter' && item.letter.restored;
    if (open && !restored) {
      out += ']';
      open = false;
    }
    if (item.kind === 'letter') {
      if (restored && !open) {
        out += '[';
        open = true;
      }
      out += readingText(item.letter);
    } else if (item.mark.kind === 'divider') {
      out += ` ${WORD_DIVIDER} `;
    } else {
      out += lacunaText(item.mark.lost);
    }
  }
  if (open) out += ']';
  return out.replace(/ {2,}/g, ' ').trim();
}

/** The surface's transcription, one entry per line: its number and its text. */
export function transcription(p: Pick<Project, 'letters' | 'textMarks'>, surfaceId: string): { line: number; text: string }[] {
  return textLines(p, surfaceId).map((l) => ({ line: l.line, text: lineText(l) }));
}
