import { useEffect, useLayoutEffect, useRef } from 'react';
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

/** The control a page had the keyboard on, told again by its kind, its address (a link's) and its name. */
interface FocusMark {
  tag: string;
  href: string | null;
  name: string;
  /** Which of the page's controls of that kind, address and name (the second "Open" link, say). */
  index: number;
}

const nameOf = (el: Element) => (el.getAttribute('aria-label') ?? el.textContent ?? '').trim();

function sameControls(main: HTMLElement, tag: string, href: string | null, name: string): HTMLElement[] {
  return [...main.querySelectorAll<HTMLElement>(tag)].filter(
    (el) => el.getAttribute('href') === href && nameOf(el) === name,
  );
}

function markOf(main: HTMLElement, el: HTMLElement): FocusMark {
  const tag = el.tagName.toLowerCase();
  const href = el.getAttribute('href');
  const name = nameOf(el);
  return { tag, href, name, index: Math.max(0, sameControls(main, tag, href, name).indexOf(el)) };
}

function markedControl(main: HTMLElement, mark: FocusMark): HTMLElement | null {
  return sameControls(main, mark.tag, mark.href, mark.name)[mark.index] ?? null;
}

/**
 * On every move to another page (a link followed, a page opened by a button, Back and Forward; not the first
 * page, nor a replaced address), the keyboard's focus goes to the new page's heading, its `h1` in `main`, so
 * that a screen reader says where the reader is and Tab goes on from the top of the page rather than from
 * the link left behind, or from the start of the document when the control that moved it has gone (WCAG 2.1,
 * 2.4.3); so too on arriving from a page outside the layout (signed in, registered). A page still loading is waited for; the page's own choice (a field it opens in, a dialog) stands.
 * Back and Forward return to a page where the reader was, its scroll put back by the browser: the keyboard goes
 * back to the control it was on there (the link followed, say) while the page has it, so that it is where the
 * page is shown and Tab goes on from there, not from a heading scrolled out of sight above.
 */
export function useRouteFocus(mainId: string): void {
  const { pathname, key } = useLocation();
  // Read when the address changes, not followed: a page that tidies its address up (replacing it with the
  // same path, without the state it was sent) does not stop the wait for its heading.
  const type = useNavigationType();
  const replaced = useStableCallback(() => type === 'REPLACE');
  const first = useRef(true);
  // Where the keyboard was last in `main`, for each entry of the history (by its key).
  const marks = useRef(new Map<string, FocusMark>());
  const shownKey = useRef(key);
  useLayoutEffect(() => {
    shownKey.current = key;
  }, [key]);
  useEffect(() => {
    const onFocus = (e: FocusEvent) => {
      const main = document.getElementById(mainId);
      if (main && e.target instanceof HTMLElement && e.target !== main && main.contains(e.target))
        marks.current.set(shownKey.current, markOf(main, e.target));
    };
    document.addEventListener('focusin', onFocus);
    return () => document.removeEventListener('focusin', onFocus);
  }, [mainId]);
  const popped = useStableCallback(() => type === 'POP');
  const markFor = useStableCallback(() => marks.current.get(key));
  useEffect(() => {
    // The layout mounts with the first page the browser opened (left alone), or with a page moved to from one
    // outside it, as signing in replaces the sign-in page with the page asked for: that is a move too.
    const entered = first.current;
    first.current = false;
    if (entered ? popped() : replaced()) return;
    const main = document.getElementById(mainId);
    if (!main) return;
    const mark = popped() ? markFor() : undefined;
    const tryFocus = (): boolean => {
      if (placedByPage(main)) return true;
      const control = mark ? markedControl(main, mark) : null;
      // The heading itself is given the keyboard below, as on any move (it takes it only with a tabindex).
      if (control && control.tagName !== 'H1') {
        control.focus();
        if (document.activeElement === control) return true;
      }
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
  }, [pathname, mainId, replaced, popped, markFor]);
}
