import { vi } from 'vitest';

/**
 * A screen of this many CSS pixels for the media queries (the theme's breakpoints: sm from 600 px). Undo with
 * vi.unstubAllGlobals().
 */
export function stubScreenWidth(px: number): void {
  const bound = (query: string, side: 'min' | 'max') => {
    const found = new RegExp(`${side}-width:\\s*([\\d.]+)px`).exec(query);
    return found ? Number(found[1]) : null;
  };
  vi.stubGlobal('matchMedia', (query: string) => {
    const min = bound(query, 'min');
    const max = bound(query, 'max');
    return {
      matches: (min === null || px >= min) && (max === null || px <= max),
      media: query,
      onchange: null,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      addListener: () => undefined,
      removeListener: () => undefined,
      dispatchEvent: () => false,
    };
  });
}
