import { applyDecorators } from '@nestjs/common';
import { Transform } from 'class-transformer';
import { IsString, Matches, MaxLength, MinLength } from 'class-validator';

/** class-transformer step: a string without its leading and trailing white space (other values as they are). */
export const Trimmed = () =>
  Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value));

/** The most a reason may hold (a job returned, a machine profile version sent back or taken out of use). */
export const REASON_MAX_LENGTH = 2000;

/**
 * Why someone acts (returns a job, sends a machine profile version back, takes one out of use): trimmed, then
 * 3 to `max` characters, so a reason says something and spaces alone do not count; the web's reason dialog
 * asks the same. Line breaks are allowed (a reason may list what to change).
 */
export const IsReason = (max = REASON_MAX_LENGTH) =>
  applyDecorators(
    Trimmed(),
    IsString(),
    MinLength(3, { message: 'reason must say why, in at least 3 characters (spaces alone do not count)' }),
    MaxLength(max),
  );

/**
 * No control characters (C0, DEL, C1: \p{Cc}), no line or paragraph separators, and no format characters
 * (\p{Cf}): the bidirectional embeddings, overrides and isolates (U+202A–U+202E, U+2066–U+2069) make a name
 * display as other text than it holds (Unicode Technical Report #36, "Unicode Security Considerations";
 * CVE-2021-42574), and the rest of the category (zero-width space and joiners, word joiner, soft hyphen,
 * invisible operators…) is invisible, so two names that look alike would differ, or a name would show nothing.
 * Except the zero-width non-joiner and joiner (U+200C, U+200D) after a letter, mark or pictograph outside ASCII:
 * Persian and the Indic scripts spell words with them, and emoji sequences join with them (Unicode Standard,
 * section 23.2); after a Latin letter they only hide in a name. Nor the letters and marks that draw nothing
 * anywhere in a name: the combining grapheme joiner, the Hangul fillers, the Khmer inherent vowels and the blank
 * braille pattern ("Ply\u034Fwood" looks like "Plywood").
 */
const ONE_LINE_TEXT =
  /^(?:(?!\u034F|\u17B4|\u17B5)[^\p{Cc}\p{Cf}\u2028\u2029\u115F\u1160\u2800\u3164\uFFA0]|(?<=[\p{L}\p{M}\p{Extended_Pictographic}])(?<!\p{ASCII})[\u200C\u200D])*$/u;

/**
 * A character that shows: a letter, digit, punctuation or symbol that is not one of the default-ignorable
 * code points (Unicode Standard, section 5.21; the Hangul fillers U+3164 and U+FFA0 are letters that draw
 * nothing).
 */
const VISIBLE = /(?![\p{Default_Ignorable_Code_Point}])[\p{L}\p{N}\p{P}\p{S}]/u;

/** A name is one line of visible text: refuses tabs, line breaks, escape sequences and other controls. */
export const NoControlCharacters = () =>
  applyDecorators(
    Matches(ONE_LINE_TEXT, {
      message: ({ property }) =>
        `${property} must not contain control characters, line breaks or invisible formatting characters (such as a zero-width space)`,
    }),
    Matches(VISIBLE, {
      message: ({ property }) => `${property} must contain at least one visible character`,
    }),
  );

/** "a draft", "an approved": the indefinite article a word takes (by its spelling). */
export const withIndefinite = (word: string): string => `${/^[aeiou]/i.test(word) ? 'an' : 'a'} ${word}`;

/** "A draft", "An approved": the same in a sentence's first place. */
export const withArticle = (word: string): string =>
  withIndefinite(word).charAt(0).toUpperCase() + withIndefinite(word).slice(1);

/** "approved, draft or submitted": words listed as a sentence lists them. */
export const orList = (words: readonly string[]): string =>
  words.length > 1 ? `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}` : (words[0] ?? '');

/** "1 material", "4 materials": a count with its noun (nouns that take an s). */
export const countOf = (n: number, noun: string): string => `${n} ${noun}${n === 1 ? '' : 's'}`;
