import { useLayoutEffect, useState } from 'react';

/**
 * For a box that scrolls when its content is wider or taller than it (a table on a phone): while it scrolls,
 * the box takes the keyboard's focus and is a region named `label`, so the arrow keys reach what is hidden
 * (WCAG 2.1, 2.1.1; axe-core's rule scrollable-region-focusable). While everything shows it is no tab stop.
 * Spread the answer on the box: `<TableContainer {...scrollFocus} …>`. The box may come and go (a table shown
 * once its rows have loaded): it is watched from whenever it is there.
 */
export function useScrollFocus<T extends HTMLElement = HTMLDivElement>(label: string) {
  const [box, setBox] = useState<T | null>(null);
  const [scrolls, setScrolls] = useState(false);
  useLayoutEffect(() => {
    if (!box) return;
    // A pixel of slack: borders and rounding make the content a fraction wider than the box.
    const check = () =>
      setScrolls(box.scrollWidth > box.clientWidth + 1 || box.scrollHeight > box.clientHeight + 1);
    check();
    if (typeof ResizeObserver === 'undefined') return;
    // The box's size changes with the page; the content's with its rows.
    const observer = new ResizeObserver(check);
    observer.observe(box);
    if (box.firstElementChild) observer.observe(box.firstElementChild);
    return () => observer.disconnect();
  }, [box]);
  return scrolls && box
    ? { ref: setBox, tabIndex: 0, role: 'region' as const, 'aria-label': label }
    : { ref: setBox };
}
