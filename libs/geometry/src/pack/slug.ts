/**
 * A file-name-safe form of a colour name: lower-case letters, digits and dashes; accents are dropped, not
 * turned into dashes ("Grün" → "grun", "Blå" → "bla").
 */
export function slug(text: string, fallback: string): string {
  const s = text
    .toLowerCase()
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40);
  return s || fallback;
}

/**
 * The first two colour names that a cut pack could not tell apart (the same file-name form, so the same sheet
 * file names and engraved name: "Opal" and "opal", "Amber #2" and "amber-2"), or null.
 */
export function clashingColourNames(names: readonly string[]): [string, string] | null {
  const seen = new Map<string, string>();
  for (const [i, name] of names.entries()) {
    const key = slug(name, `colour-${i + 1}`);
    const other = seen.get(key);
    if (other !== undefined) return [other, name];
    seen.set(key, name);
  }
  return null;
}
