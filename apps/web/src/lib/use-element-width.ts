import { useLayoutEffect, useState } from 'react';

/**
 * The rendered width of an element in CSS pixels, followed as the page resizes: spread `ref` on the element.
 * Null until it has been measured (and where the browser cannot measure, as jsdom cannot).
 */
export function useElementWidth<T extends HTMLElement = HTMLDivElement>() {
  const [element, setElement] = useState<T | null>(null);
  const [width, setWidth] = useState<number | null>(null);
  useLayoutEffect(() => {
    if (!element) return;
    const measure = () => {
      const w = element.getBoundingClientRect().width;
      setWidth(w > 0 ? Math.round(w) : null);
    };
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(measure);
    observer.observe(element);
    return () => observer.disconnect();
  }, [element]);
  return { ref: setElement, width };
}
