import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../testing/render-app';
import { MarkdownText, highestHeading } from './markdown-text';

describe('Markdown text under a page heading', () => {
  it("gives the text's highest heading the level below the page's, however many #s it has", () => {
    // Headings must not skip a level (WCAG 2.2 technique G141, from memory): under an h2, h3 comes next.
    renderWithProviders(
      <MarkdownText>{'## Millbrook local rules\n\nText.\n\n### Laser bay\n\nMore.'}</MarkdownText>,
    );
    expect(screen.getByRole('heading', { name: 'Millbrook local rules' }).tagName).toBe('H3');
    expect(screen.getByRole('heading', { name: 'Laser bay' }).tagName).toBe('H4');
  });

  it('counts only headings outside code, and a text without headings as starting at #', () => {
    expect(highestHeading('```\n# not a heading\n```\n\n### Real')).toBe(3);
    expect(highestHeading('No headings here.')).toBe(1);
    expect(highestHeading('#hashtag is no heading\n\n## Two')).toBe(2);
  });
});
