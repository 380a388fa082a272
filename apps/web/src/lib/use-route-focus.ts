import { useEffect, useRef } from 'react';
import { useLocation, useNavigationType } from 'react-router-dom';
import { useStableCallback } from './use-stable-callback';

/** How long a page that is still loading is waited for before its heading is given up on (ms). */
export const ROUTE_FOCUS_WAIT_MS = 10_000;

/**
 * Whether the page has put the keyboard somewhere itself (a field it opens in, a dialog, the button it gives
 * back): anywhere in `main` but `main` itself, or in a dialog.
 */
function placedByPage(main: HTMLElement): boolean {
  const active = document.activeElement;
  if (!active || active === document.body || active === main) return false;
  return main.contains(active) || active.closest('[role="dialog"]') !== null;
}

/**
 * On every move to another page (a link followed, a page opened by a button, Back and Forward; not the first
 * page, nor a replaced address), the keyboard's focus goes to the new page's heading, its `h1` in `main`, so
 * that a screen reader says where the reader is and Tab goes on from the top of the page rather than from
 * the link left behind, or from the start of the document when the control that moved it has gone (WCAG 2.1,
 * 2.4.3). A page still loading is waited for; the page's own choice (a field it opens in, a dialog) stands.
 */
export function useRouteFocus(mainId: string): void {
  const { pathname } = useLocation();
  // Read when the address changes, not followed: a page that tidies its address up (replacing it with the
  // same path, without the state it was sent) does not stop the wait for its heading.
  const type = useNavigationType();
  const replaced = useStableCallback(() => type === 'REPLACE');
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    if (replaced()) return;
    const main = document.getElementById(mainId);
    if (!main) return;
    const tryFocus = (): boolean => {
      if (placedByPage(main)) return true;
      const heading = main.querySelector<HTMLElement>('h1');
      if (!heading) return false;
      if (!heading.hasAttribute('tabindex')) heading.setAttribute('tabindex', '-1');
      heading.focus({ preventScroll: true });
      return true;
    };
    if (tryFocus()) return;
    const observer = new MutationObserver(() => {
      if (tryFocus()) stop();
    });
    const timer = window.setTimeout(() => stop(), ROUTE_FOCUS_WAIT_MS);
    const stop = () => {
      observer.disconnect();
      window.clearTimeout(timer);
    };
    observer.observe(main, { childList: true, subtree: true });
    return stop;
  }, [pathname, mainId, replaced]);
}
