import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../testing/render-app';
import { SideNav } from './side-nav';

describe('SideNav', () => {
  it('puts every link of the Main navigation in an item of one list, so the list is read as one', () => {
    renderWithProviders(<SideNav role="supervisor" />);
    const nav = screen.getByRole('navigation', { name: 'Main' });
    const list = within(nav).getByRole('list');
    const links = within(list).getAllByRole('link');
    const items = within(list).getAllByRole('listitem');
    expect(links.length).toBeGreaterThan(2);
    expect(items).toHaveLength(links.length);
    // A list holds list items only (WCAG 2.1, 1.3.1; axe-core rule "list").
    for (const child of list.children) expect(child.tagName).toBe('LI');
    links.forEach((link, i) => expect(items[i]).toContainElement(link));
  });
});
