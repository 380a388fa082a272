import { validateSync } from 'class-validator';
import { NoControlCharacters, countOf, orList, withArticle, withIndefinite } from './text';

class Named {
  @NoControlCharacters() name!: string;
}

const accepts = (name: string): boolean => validateSync(Object.assign(new Named(), { name })).length === 0;

describe('NoControlCharacters', () => {
  it('takes names in any script, with accents and symbols', () => {
    for (const name of ['Rosa Quintero', 'Lampe à étoiles ★ — 星', 'Ζωή', 'Jun Park (평일)'])
      expect(accepts(name)).toBe(true);
  });

  it('refuses controls, line breaks, bidi overrides and invisible format characters (UTR #36)', () => {
    for (const name of [
      'a\tb',
      'a\nb',
      'a\u2028b',
      'a\u202Eb',
      'Rosa\u200BQuintero',
      'Birch\u2060plywood',
      '\uFEFFMDF',
    ])
      expect(accepts(name)).toBe(false);
  });

  it('takes the joiners where scripts and emoji need them, not after a Latin letter', () => {
    // Persian "mikhaham" with a zero-width non-joiner, a Devanagari conjunct with a joiner, a family emoji.
    for (const name of [
      '\u0645\u06CC\u200C\u062E\u0648\u0627\u0647\u0645',
      '\u0915\u094D\u200D\u0937',
      '👨\u200D👩\u200D👧',
    ])
      expect(accepts(name)).toBe(true);
    for (const name of ['Rosa\u200DQuintero', 'Rosa\u200CQuintero', '\u200D\u200D', '\u200C'])
      expect(accepts(name)).toBe(false);
  });

  it('refuses letters and marks that draw nothing inside a name', () => {
    for (const name of ['Ply\u034Fwood', 'Birch\u3164ply', 'Rosa\u2800Quintero', 'Jun\u115FPark'])
      expect(accepts(name)).toBe(false);
  });

  it('asks for a character that shows', () => {
    for (const name of ['\u3164', '\u3164\u3164', '   ']) expect(accepts(name)).toBe(false);
  });
});

describe('withArticle', () => {
  it('puts "An" before a vowel and "A" before a consonant', () => {
    expect(withArticle('approved')).toBe('An approved');
    expect(withArticle('released')).toBe('A released');
    expect(withArticle('draft')).toBe('A draft');
  });
});

describe('withIndefinite and orList', () => {
  it('say "only an approved, draft or submitted version" as a sentence does', () => {
    expect(`only ${withIndefinite(orList(['approved', 'draft', 'submitted']))} version`).toBe(
      'only an approved, draft or submitted version',
    );
    expect(withIndefinite(orList(['draft']))).toBe('a draft');
    expect(orList(['submitted', 'approved'])).toBe('submitted or approved');
  });
});

describe('countOf', () => {
  it('gives the noun its plural s unless the count is one', () => {
    expect(countOf(1, 'material')).toBe('1 material');
    expect(countOf(0, 'material')).toBe('0 materials');
    expect(countOf(4, 'material')).toBe('4 materials');
  });
});
