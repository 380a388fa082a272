/**
 * The forms a colour name (or any user text) takes in a cut pack: file names, the engraving (printable ASCII:
 * the stroke font's glyphs) and the PDFs (WinAnsi: the standard PDF fonts' character set).
 */

/** Letters that Unicode decomposition leaves whole, spelt in ASCII the usual way. */
const SPELT: Record<string, string> = {
  ß: 'ss',
  ẞ: 'SS',
  æ: 'ae',
  Æ: 'AE',
  œ: 'oe',
  Œ: 'OE',
  ø: 'o',
  Ø: 'O',
  ł: 'l',
  Ł: 'L',
  đ: 'd',
  Đ: 'D',
  ð: 'd',
  Ð: 'D',
  þ: 'th',
  Þ: 'Th',
  ı: 'i',
};

/** Latin text in plain ASCII where it can be: accents dropped, ß, æ, ø, ł and the like spelt out. */
export function asciiFold(text: string): string {
  return [...text.normalize('NFKD').replace(/\p{M}+/gu, '')].map((c) => SPELT[c] ?? c).join('');
}

/**
 * A file-name-safe form of a colour name: lower-case letters, digits and dashes; accents are dropped, not
 * turned into dashes ("Grün" → "grun", "Blå" → "bla").
 */
export function slug(text: string, fallback: string): string {
  const s = asciiFold(text)
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40);
  return s || fallback;
}

/** Code points outside Latin-1 that WinAnsi (the standard PDF fonts' encoding) also holds. */
const WIN_ANSI_EXTRA = new Set([...'€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ']);

function inWinAnsi(c: string): boolean {
  const code = c.codePointAt(0)!;
  return (
    (code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.has(c) || c === '\n'
  );
}

/** Text the standard PDF fonts can show: other characters folded to ASCII where they can be, else "?". */
export function winAnsiText(text: string): string {
  let out = '';
  for (const c of text) {
    if (inWinAnsi(c)) out += c;
    else {
      const f = asciiFold(c);
      out += [...f].every((x) => inWinAnsi(x)) && f.length > 0 ? f : '?';
    }
  }
  return out;
}

/**
 * The name a colour is printed under in the pack (sheet titles, PDFs): the name itself when the PDF fonts
 * hold every letter, its ASCII spelling when that has letters or digits ("Łódź" → "Lodz"), else "colour N"
 * (a name in a script the fonts lack, which they would print as gibberish).
 */
export function printableColourName(name: string, index: number): string {
  if ([...name].every(inWinAnsi)) return name;
  const folded = asciiFold(name);
  return /^[\x20-\x7e]*$/.test(folded) && /[A-Za-z0-9]/.test(folded) ? folded : `colour ${index + 1}`;
}

/** The colour's name as engraved (printable ASCII capitals): "Grün" → "GRUN"; "colour N" when none is left. */
export function engravedColourName(name: string, index: number): string {
  const s = asciiFold(printableColourName(name, index))
    .toUpperCase()
    .replace(/[^\x20-\x7e]+/g, '')
    .replace(/\s+/g, ' ')
    .trim();
  return /[A-Z0-9]/.test(s) ? s : `COLOUR ${index + 1}`;
}

/**
 * The first two colour names that a cut pack could not tell apart: the same file-name form, the same
 * engraving or the same printed name ("Opal" and "opal", "Amber #2" and "amber-2", "Gr?n" and "Grün"), or null.
 */
export function clashingColourNames(names: readonly string[]): [string, string] | null {
  const forms: ((name: string, i: number) => string)[] = [
    (n, i) => slug(n, `colour-${i + 1}`),
    engravedColourName,
    (n, i) => printableColourName(n, i).toLowerCase(),
  ];
  for (const form of forms) {
    const seen = new Map<string, string>();
    for (const [i, name] of names.entries()) {
      const key = form(name, i);
      const other = seen.get(key);
      if (other !== undefined) return [other, name];
      seen.set(key, name);
    }
  }
  return null;
}
