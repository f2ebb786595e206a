/**
 * Latin transliterations of the invented letter names of the synthetic script
 * (src/synth/alphabet.ts): the name's first letter, or its first two letters where two
 * names share a first letter ('tark' and 'thenn'), so that every label names one letter.
 */

/** Letter name → its Latin label. One entry per name of ALPHABET; one-to-one. */
export const LETTER_LABELS: Readonly<Record<string, string>> = {
  vel: 'v',
  tark: 'ta',
  osh: 'o',
  merro: 'm',
  dulm: 'd',
  kesk: 'k',
  irun: 'i',
  ulo: 'u',
  fenn: 'f',
  sorv: 's',
  yeth: 'y',
  zir: 'z',
  pell: 'p',
  quon: 'q',
  brai: 'b',
  thenn: 'th',
};

/** The Latin label of an invented letter name; throws for a name the alphabet does not have. */
export function labelOf(name: string): string {
  const label = Object.hasOwn(LETTER_LABELS, name) ? LETTER_LABELS[name] : undefined;
  if (label === undefined) throw new RangeError(`the synthetic alphabet has no letter named "${name}".`);
  return label;
}
