import { withArticle } from './text';

describe('withArticle', () => {
  it('puts "An" before a vowel and "A" before a consonant', () => {
    expect(withArticle('approved')).toBe('An approved');
    expect(withArticle('released')).toBe('A released');
    expect(withArticle('draft')).toBe('A draft');
  });
});
