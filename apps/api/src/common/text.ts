import { Transform } from 'class-transformer';
import { Matches } from 'class-validator';

/** class-transformer step: a string without its leading and trailing white space (other values as they are). */
export const Trimmed = () =>
  Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value));

/**
 * No control characters (C0, DEL, C1: \p{Cc}), no line or paragraph separators, and none of the bidirectional
 * embeddings, overrides and isolates (U+202A–U+202E, U+2066–U+2069) that make a name display as other text
 * than it holds (Unicode Technical Report #36, "Unicode Security Considerations"; CVE-2021-42574).
 */
const ONE_LINE_TEXT = /^[^\p{Cc}\u2028\u2029\u202A-\u202E\u2066-\u2069]*$/u;

/** A name is one line of visible text: refuses tabs, line breaks, escape sequences and other controls. */
export const NoControlCharacters = () =>
  Matches(ONE_LINE_TEXT, {
    message: ({ property }) => `${property} must not contain control characters or line breaks`,
  });

/** "A draft", "An approved": the indefinite article a word takes in a sentence's first place (by its spelling). */
export const withArticle = (word: string): string => `${/^[aeiou]/i.test(word) ? 'An' : 'A'} ${word}`;
